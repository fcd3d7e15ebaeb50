import { z } from 'zod';
import { FRONT_ENDS } from '../domain/frames';
import type { PartKind } from '../domain/parts';
import type { Role } from '../domain/roles';
import type { Expected, Prompt } from '../lab/types';
import type { MissedConcept, PersonResults } from '../lab/results';
import { MAX_PER_TEMPLATE, MAX_PROMPTS, ORIENTATION_KINDS, TEMPLATE_KEYS, type TemplateKey } from '../lab/templates';
import { SEED_MAX } from '../lab/rng';
import { Uuid, Version } from './common';

// Contracts of the orientation lab: quizzes, groups, attempts and results. Nothing here refers to
// inspections, findings or units.

const UnitTypeKey = z.string().regex(/^[a-z0-9_]{1,60}$/, 'Not a unit type key');

export const TemplateSpecSchema = z
  .object({
    template: z.enum(TEMPLATE_KEYS, { message: 'Choose a prompt template' }),
    count: z.number({ message: 'How many prompts?' }).int('Whole prompts only').min(1, 'At least 1').max(MAX_PER_TEMPLATE, `At most ${MAX_PER_TEMPLATE}`),
    kinds: z
      .array(z.enum(ORIENTATION_KINDS as [PartKind, ...PartKind[]], { message: 'Only parts whose name follows the F' }))
      .max(ORIENTATION_KINDS.length)
      .optional(),
  })
  .strict();
export type TemplateSpecBody = z.infer<typeof TemplateSpecSchema>;

const Templates = z
  .array(TemplateSpecSchema)
  .min(1, 'Add at least one prompt template')
  .max(8, 'At most 8 template lines')
  .refine((ts) => ts.reduce((n, t) => n + t.count, 0) <= MAX_PROMPTS, `A quiz holds at most ${MAX_PROMPTS} prompts`);

const Title = z.string({ message: 'Give the quiz a title' }).trim().min(1, 'Give the quiz a title').max(120, 'At most 120 characters');

export const CreateQuizBody = z
  .object({
    title: Title,
    /** Null: each prompt picks a unit type at random. */
    unitTypeKey: UnitTypeKey.nullable(),
    templates: Templates,
    /** Sharing: the group that sees the quiz; null keeps it a draft only trainers see. */
    groupId: Uuid.nullable().optional(),
  })
  .strict();
export type CreateQuizBody = z.infer<typeof CreateQuizBody>;

export const UpdateQuizBody = z
  .object({
    version: Version,
    title: Title.optional(),
    unitTypeKey: UnitTypeKey.nullable().optional(),
    templates: Templates.optional(),
    groupId: Uuid.nullable().optional(),
  })
  .strict();
export type UpdateQuizBody = z.infer<typeof UpdateQuizBody>;

const GroupName = z.string({ message: 'Name the group' }).trim().min(1, 'Name the group').max(80, 'At most 80 characters');
const MemberIds = z.array(Uuid).max(300, 'At most 300 people in a group');

export const CreateGroupBody = z.object({ name: GroupName, memberIds: MemberIds }).strict();
export type CreateGroupBody = z.infer<typeof CreateGroupBody>;
export const UpdateGroupBody = z.object({ name: GroupName.optional(), memberIds: MemberIds.optional() }).strict();
export type UpdateGroupBody = z.infer<typeof UpdateGroupBody>;

export const StartAttemptBody = z
  .object({
    /** Fixes the prompts (a class working through the same sheet, or a repeatable test). */
    seed: z.number().int().min(0).max(SEED_MAX).optional(),
  })
  .strict();
export type StartAttemptBody = z.infer<typeof StartAttemptBody>;

const ViewPointSchema = z.object({ u: z.number().finite(), v: z.number().finite() }).strict();
export const AnswerSchema = z.discriminatedUnion('template', [
  z.object({ template: z.literal('tap_part'), partId: z.string().min(1).max(120), point: ViewPointSchema.optional() }).strict(),
  z.object({ template: z.literal('name_part'), label: z.string().min(1).max(200) }).strict(),
  z.object({ template: z.literal('which_end'), end: z.enum(FRONT_ENDS) }).strict(),
  z.object({ template: z.literal('which_side'), ySign: z.union([z.literal(1), z.literal(-1)]) }).strict(),
]);

export const AnswerBody = z
  .object({
    promptIndex: z.number().int().min(0).max(MAX_PROMPTS - 1),
    answer: AnswerSchema,
    /** Time from the prompt showing to the answer, as the learner's device measured it. */
    ms: z.number().int().min(0).max(3_600_000),
  })
  .strict();
export type AnswerBody = z.infer<typeof AnswerBody>;

// Responses.

export interface GroupMember {
  id: string;
  name: string;
  role: Role;
}
export interface GroupRow {
  id: string;
  name: string;
  members: GroupMember[];
  createdAt: string;
}
export interface LabPerson {
  id: string;
  name: string;
  role: Role;
  yardName: string | null;
}

export interface QuizRow {
  id: string;
  title: string;
  unitTypeKey: string | null;
  templates: { template: TemplateKey; count: number; kinds?: PartKind[] }[];
  groupId: string | null;
  groupName: string | null;
  createdByName: string;
  createdAt: string;
  version: number;
  promptCount: number;
  attempts: number;
  people: number;
}

export interface MyQuizRow {
  id: string;
  title: string;
  unitTypeKey: string | null;
  groupName: string | null;
  promptCount: number;
  attempts: number;
  /** Best share right over finished attempts, 0..1. */
  best: number | null;
  /** An attempt started and not finished, to carry on with. */
  openAttemptId: string | null;
}

export interface AnswerView {
  promptIndex: number;
  correct: boolean;
  ms: number;
  given: string;
  expected: Expected;
  reason: string;
}

export interface AttemptView {
  id: string;
  quizId: string;
  quizTitle: string;
  personName: string;
  startedAt: string;
  finishedAt: string | null;
  score: number | null;
  prompts: Prompt[];
  answers: AnswerView[];
}

export interface AnswerResult extends AnswerView {
  answered: number;
  total: number;
  finished: boolean;
  score: number | null;
}

export interface QuizResults {
  quiz: QuizRow;
  people: PersonResults[];
  mostMissed: MissedConcept[];
  /** Group members who have not started the quiz. */
  notStarted: GroupMember[];
}
