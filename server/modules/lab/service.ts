import { randomInt } from 'node:crypto';
import type { Db } from '../../db/client';
import type { Drawing } from '../../../shared/drawings/types';
import { can } from '../../../shared/domain/roles';
import type {
  AnswerBody,
  AnswerResult,
  AnswerView,
  AttemptView,
  CreateGroupBody,
  CreateQuizBody,
  MyQuizRow,
  QuizResults,
  QuizRow,
  StartAttemptBody,
  UpdateGroupBody,
  UpdateQuizBody,
} from '../../../shared/api/lab';
import { GradeError, PromptError, expectedFor, generatePrompts, gradeAnswer, reasonFor, summariseResults } from '../../../shared/lab';
import type { Prompt, StoredPrompt, TemplateSpec } from '../../../shared/lab/types';
import { SEED_MAX } from '../../../shared/lab/rng';
import { AppError, notFound } from '../../http/errors';
import type { Person } from '../../http/routes';
import { audit } from '../../lib/audit';
import { labRepository, type AttemptRecordRow, type StoredAnswer } from './repository';

/** A drawing whose unit type is not registered (foreign key) is the trainer's input, not our failure. */
async function withUnitTypeCheck<T>(run: () => Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (e) {
    if ((e as { code?: string }).code === '23503' || (e as { cause?: { code?: string } }).cause?.code === '23503') {
      throw new AppError('validation', 'That unit type is not registered', { unitTypeKey: 'No such unit type' });
    }
    throw e;
  }
}

/** What a learner may see of a stored prompt: everything but the expected answer. */
const publicPrompt = ({ expected: _expected, ...p }: StoredPrompt): Prompt => p as Prompt;

export function labService(db: Db, drawings: ReadonlyMap<string, Drawing>) {
  const drawingFor = (key: string): Drawing => {
    const d = drawings.get(key);
    if (!d) throw new AppError('conflict', `The drawing for unit type ${key} is no longer there`);
    return d;
  };

  /** The quiz can be built on today's drawings; a trainer hears why not before anyone starts it. */
  const checkBuildable = (unitTypeKey: string | null, templates: readonly TemplateSpec[]) => {
    if (unitTypeKey !== null && !drawings.has(unitTypeKey)) throw new AppError('validation', 'There is no drawing for that unit type', { unitTypeKey: 'No such unit type' });
    try {
      generatePrompts(templates, [...drawings.values()], unitTypeKey, 1);
    } catch (e) {
      if (e instanceof PromptError) throw new AppError('validation', e.message, { templates: e.message });
      throw e;
    }
  };

  const checkGroup = async (repo: ReturnType<typeof labRepository>, groupId: string | null | undefined) => {
    if (groupId && !(await repo.groupExists(groupId))) throw new AppError('validation', 'There is no such group', { groupId: 'No such group' });
  };

  const checkMembers = async (repo: ReturnType<typeof labRepository>, ids: readonly string[]) => {
    const found = await repo.existingPeople(ids);
    const missing = ids.filter((id) => !found.has(id));
    if (missing.length) throw new AppError('validation', 'Some of the people chosen are not active accounts', { memberIds: `Unknown or inactive: ${missing.length}` });
  };

  const answerView = (prompt: StoredPrompt, a: StoredAnswer): AnswerView => {
    const d = drawings.get(prompt.unitTypeKey);
    return {
      promptIndex: a.promptIndex,
      correct: a.correct,
      ms: a.ms,
      given: a.answer.given ?? '',
      expected: prompt.expected,
      reason: d ? reasonFor(prompt, d, prompt.expected) : '',
    };
  };

  const attemptView = async (repo: ReturnType<typeof labRepository>, a: AttemptRecordRow): Promise<AttemptView> => {
    const quiz = await repo.quiz(a.quizId);
    const answers = await repo.answers(a.id);
    return {
      id: a.id,
      quizId: a.quizId,
      quizTitle: quiz?.title ?? '',
      personName: await repo.personName(a.personId),
      startedAt: a.startedAt.toISOString(),
      finishedAt: a.finishedAt ? a.finishedAt.toISOString() : null,
      score: a.score,
      prompts: a.prompts.map(publicPrompt),
      answers: answers.map((x) => answerView(a.prompts[x.promptIndex], x)),
    };
  };

  /** Only the person who started an attempt answers it; anyone else is told it does not exist. */
  const ownAttempt = async (repo: ReturnType<typeof labRepository>, actor: Person, id: string, lock = false) => {
    const a = await repo.attempt(id, lock);
    if (!a || a.personId !== actor.id) throw notFound('Quiz attempt');
    return a;
  };

  return {
    people: () => labRepository(db).activePeople(),
    groups: () => labRepository(db).groups(),

    async createGroup(actor: Person, ip: string, body: CreateGroupBody) {
      return db.transaction(async (tx) => {
        const repo = labRepository(tx);
        if (await repo.groupNameTaken(body.name)) throw new AppError('conflict', 'A group already has that name', { name: 'Already in use' });
        await checkMembers(repo, body.memberIds);
        const id = await repo.insertGroup(body.name, actor.id);
        await repo.replaceMembers(id, body.memberIds);
        await audit(tx, { actorId: actor.id, action: 'training_group_created', entity: 'training_group', entityId: id, ip, details: { name: body.name, members: body.memberIds.length } });
        return (await repo.group(id))!;
      });
    },

    async updateGroup(actor: Person, ip: string, id: string, body: UpdateGroupBody) {
      return db.transaction(async (tx) => {
        const repo = labRepository(tx);
        const before = await repo.group(id);
        if (!before) throw notFound('Group');
        if (body.name !== undefined && body.name !== before.name) {
          if (await repo.groupNameTaken(body.name, id)) throw new AppError('conflict', 'A group already has that name', { name: 'Already in use' });
          await repo.renameGroup(id, body.name);
        }
        if (body.memberIds) {
          await checkMembers(repo, body.memberIds);
          await repo.replaceMembers(id, body.memberIds);
        }
        await audit(tx, { actorId: actor.id, action: 'training_group_updated', entity: 'training_group', entityId: id, ip, details: { name: body.name, members: body.memberIds?.length } });
        return (await repo.group(id))!;
      });
    },

    quizzes: () => labRepository(db).quizRows(),

    async quiz(id: string): Promise<QuizRow> {
      const [q] = await labRepository(db).quizRows(id);
      if (!q) throw notFound('Quiz');
      return q;
    },

    async createQuiz(actor: Person, ip: string, body: CreateQuizBody): Promise<QuizRow> {
      checkBuildable(body.unitTypeKey, body.templates);
      return withUnitTypeCheck(() => db.transaction(async (tx) => {
        const repo = labRepository(tx);
        await checkGroup(repo, body.groupId);
        const id = await repo.insertQuiz({ title: body.title, unitTypeKey: body.unitTypeKey, templates: body.templates, groupId: body.groupId ?? null, createdBy: actor.id });
        await audit(tx, { actorId: actor.id, action: 'quiz_created', entity: 'quiz', entityId: id, ip, details: { title: body.title, groupId: body.groupId ?? null } });
        return (await repo.quizRows(id))[0];
      }));
    },

    async updateQuiz(actor: Person, ip: string, id: string, body: UpdateQuizBody): Promise<QuizRow> {
      const { version, ...patch } = body;
      return withUnitTypeCheck(() => db.transaction(async (tx) => {
        const repo = labRepository(tx);
        const before = await repo.quiz(id);
        if (!before) throw notFound('Quiz');
        checkBuildable(patch.unitTypeKey !== undefined ? patch.unitTypeKey : before.unitTypeKey, patch.templates ?? before.templates);
        await checkGroup(repo, patch.groupId);
        if (!(await repo.updateQuiz(id, version, patch))) {
          throw new AppError('stale', `"${before.title}" was changed by someone else since you opened it (now version ${before.version}); reload to see the change`);
        }
        const shared = patch.groupId !== undefined && patch.groupId !== before.groupId;
        await audit(tx, { actorId: actor.id, action: shared ? 'quiz_shared' : 'quiz_updated', entity: 'quiz', entityId: id, ip, details: patch });
        return (await repo.quizRows(id))[0];
      }));
    },

    async myQuizzes(actor: Person): Promise<MyQuizRow[]> {
      return labRepository(db).quizzesFor(actor.id);
    },

    /**
     * Starts an attempt: prompts are generated once, with the F placed at random, and kept with the
     * attempt so grading and results never depend on a later change to the quiz.
     */
    async start(actor: Person, ip: string, quizId: string, body: StartAttemptBody): Promise<AttemptView> {
      const repo = labRepository(db);
      const quiz = await repo.quiz(quizId);
      // A quiz not yet shared is a trainer's draft: to everyone else it does not exist.
      if (!quiz || (quiz.groupId === null && !can(actor.role, 'train'))) throw notFound('Quiz');
      const seed = body.seed ?? randomInt(0, SEED_MAX);
      let prompts: Prompt[];
      try {
        prompts = generatePrompts(quiz.templates, [...drawings.values()], quiz.unitTypeKey, seed);
      } catch (e) {
        if (e instanceof PromptError) throw new AppError('conflict', `This quiz cannot be built on the current drawings: ${e.message}`);
        throw e;
      }
      const stored: StoredPrompt[] = prompts.map((p) => ({ ...p, expected: expectedFor(p, drawingFor(p.unitTypeKey)) }) as StoredPrompt);
      return db.transaction(async (tx) => {
        const r = labRepository(tx);
        const a = await r.insertAttempt(quiz.id, actor.id, stored);
        await audit(tx, { actorId: actor.id, action: 'quiz_attempt_started', entity: 'quiz_attempt', entityId: a.id, ip, details: { quizId, seed, prompts: stored.length } });
        return attemptView(r, a);
      });
    },

    async attempt(actor: Person, id: string): Promise<AttemptView> {
      const repo = labRepository(db);
      const a = await repo.attempt(id);
      // Trainers see anyone's attempt; everyone else only their own.
      if (!a || (a.personId !== actor.id && !can(actor.role, 'train'))) throw notFound('Quiz attempt');
      return attemptView(repo, a);
    },

    async answer(actor: Person, ip: string, attemptId: string, body: AnswerBody): Promise<AnswerResult> {
      return db.transaction(async (tx) => {
        const repo = labRepository(tx);
        const a = await ownAttempt(repo, actor, attemptId, true);
        if (a.finishedAt) throw new AppError('conflict', 'This attempt is finished; start a new one to try again');
        const prompt = a.prompts[body.promptIndex];
        if (!prompt) throw new AppError('validation', `This attempt has ${a.prompts.length} prompts`, { promptIndex: `0 to ${a.prompts.length - 1}` });
        const answers = await repo.answers(a.id);
        if (answers.some((x) => x.promptIndex === body.promptIndex)) throw new AppError('conflict', 'That prompt is already answered', { promptIndex: 'Already answered' });
        let grade;
        try {
          grade = gradeAnswer(prompt, body.answer, drawingFor(prompt.unitTypeKey));
        } catch (e) {
          if (e instanceof GradeError) throw new AppError('validation', e.message, { answer: e.message });
          throw e;
        }
        // Time per prompt as the device measured it, but never more than the server saw pass since the
        // attempt started or the previous answer.
        const since = Math.max(a.startedAt.getTime(), ...answers.map((x) => x.at.getTime()));
        const ms = Math.max(0, Math.min(body.ms, Date.now() - since));
        await repo.insertAnswer({ attemptId: a.id, promptIndex: body.promptIndex, answer: { ...body.answer, given: grade.given }, correct: grade.correct, ms });
        const answered = answers.length + 1;
        const correctSoFar = answers.filter((x) => x.correct).length + (grade.correct ? 1 : 0);
        const finished = answered === a.prompts.length;
        if (finished) {
          await repo.finishAttempt(a.id, correctSoFar);
          await audit(tx, { actorId: actor.id, action: 'quiz_attempt_finished', entity: 'quiz_attempt', entityId: a.id, ip, details: { score: correctSoFar, total: a.prompts.length } });
        }
        return {
          promptIndex: body.promptIndex,
          correct: grade.correct,
          ms,
          given: grade.given,
          expected: grade.expected,
          reason: grade.reason,
          answered,
          total: a.prompts.length,
          finished,
          score: finished ? correctSoFar : null,
        };
      });
    },

    /** Stops an attempt early; prompts not answered count as not right. */
    async finish(actor: Person, ip: string, attemptId: string): Promise<AttemptView> {
      return db.transaction(async (tx) => {
        const repo = labRepository(tx);
        const a = await ownAttempt(repo, actor, attemptId, true);
        if (a.finishedAt) throw new AppError('conflict', 'This attempt is already finished');
        const answers = await repo.answers(a.id);
        const score = answers.filter((x) => x.correct).length;
        await repo.finishAttempt(a.id, score);
        await audit(tx, { actorId: actor.id, action: 'quiz_attempt_finished', entity: 'quiz_attempt', entityId: a.id, ip, details: { score, total: a.prompts.length, early: true } });
        return attemptView(repo, (await repo.attempt(a.id))!);
      });
    },

    async results(quizId: string): Promise<QuizResults> {
      const repo = labRepository(db);
      const [quiz] = await repo.quizRows(quizId);
      if (!quiz) throw notFound('Quiz');
      const summary = summariseResults(await repo.attemptsForQuiz(quizId));
      const took = new Set(summary.people.map((p) => p.personId));
      const notStarted = quiz.groupId ? (await repo.groupMembers(quiz.groupId)).filter((m) => !took.has(m.id)) : [];
      return { quiz, people: [...summary.people], mostMissed: [...summary.mostMissed], notStarted };
    },
  };
}
export type LabService = ReturnType<typeof labService>;
