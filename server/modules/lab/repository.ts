import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { people, quizAnswers, quizAttempts, quizzes, trainingGroupMembers, trainingGroups, yards } from '../../db/schema';
import type { GroupMember, GroupRow, LabPerson, QuizRow } from '../../../shared/api/lab';
import type { StoredPrompt } from '../../../shared/lab/types';
import type { Role } from '../../../shared/domain/roles';

// The lab's tables only: training groups, quizzes, attempts and answers. Nothing here reads or
// writes units, inspections, findings or any inspection-side table.

export interface QuizRecord {
  id: string;
  title: string;
  unitTypeKey: string | null;
  templates: QuizRow['templates'];
  groupId: string | null;
  createdBy: string;
  version: number;
}

export interface AttemptRecordRow {
  id: string;
  quizId: string;
  personId: string;
  prompts: StoredPrompt[];
  startedAt: Date;
  finishedAt: Date | null;
  score: number | null;
}

export interface StoredAnswer {
  promptIndex: number;
  answer: Record<string, unknown> & { given?: string };
  correct: boolean;
  ms: number;
  at: Date;
}

const iso = (d: Date | string) => (d instanceof Date ? d.toISOString() : new Date(d).toISOString());

export const labRepository = (db: DbOrTx) => ({
  async activePeople(): Promise<LabPerson[]> {
    const r = await db
      .select({ id: people.id, name: people.name, role: people.role, yardName: yards.name })
      .from(people)
      .leftJoin(yards, eq(yards.id, people.yardId))
      .where(eq(people.active, true))
      .orderBy(asc(people.name));
    return r.map((p) => ({ ...p, role: p.role as Role }));
  },
  async existingPeople(ids: readonly string[]): Promise<Set<string>> {
    if (ids.length === 0) return new Set();
    const r = await db.select({ id: people.id }).from(people).where(and(inArray(people.id, [...ids]), eq(people.active, true)));
    return new Set(r.map((x) => x.id));
  },

  // Groups.
  async groups(): Promise<GroupRow[]> {
    const gs = await db.select().from(trainingGroups).orderBy(asc(trainingGroups.name));
    const members = await db
      .select({ groupId: trainingGroupMembers.groupId, id: people.id, name: people.name, role: people.role })
      .from(trainingGroupMembers)
      .innerJoin(people, eq(people.id, trainingGroupMembers.personId))
      .orderBy(asc(people.name));
    return gs.map((g) => ({
      id: g.id,
      name: g.name,
      createdAt: iso(g.createdAt),
      members: members.filter((m) => m.groupId === g.id).map((m) => ({ id: m.id, name: m.name, role: m.role as Role })),
    }));
  },
  async group(id: string): Promise<GroupRow | null> {
    return (await this.groups()).find((g) => g.id === id) ?? null;
  },
  async groupNameTaken(name: string, exceptId?: string): Promise<boolean> {
    const r = await db
      .select({ id: trainingGroups.id })
      .from(trainingGroups)
      .where(sql`lower(${trainingGroups.name}) = ${name.toLowerCase()} and (${exceptId ?? null}::uuid is null or ${trainingGroups.id} <> ${exceptId ?? null}::uuid)`)
      .limit(1);
    return r.length > 0;
  },
  async insertGroup(name: string, createdBy: string): Promise<string> {
    const [r] = await db.insert(trainingGroups).values({ name, createdBy }).returning({ id: trainingGroups.id });
    return r.id;
  },
  async renameGroup(id: string, name: string) {
    await db.update(trainingGroups).set({ name }).where(eq(trainingGroups.id, id));
  },
  async replaceMembers(groupId: string, personIds: readonly string[]) {
    await db.delete(trainingGroupMembers).where(eq(trainingGroupMembers.groupId, groupId));
    if (personIds.length) await db.insert(trainingGroupMembers).values([...new Set(personIds)].map((personId) => ({ groupId, personId })));
  },
  async groupMembers(groupId: string): Promise<GroupMember[]> {
    const r = await db
      .select({ id: people.id, name: people.name, role: people.role })
      .from(trainingGroupMembers)
      .innerJoin(people, eq(people.id, trainingGroupMembers.personId))
      .where(eq(trainingGroupMembers.groupId, groupId))
      .orderBy(asc(people.name));
    return r.map((m) => ({ ...m, role: m.role as Role }));
  },

  // Quizzes.
  async quizRows(id?: string): Promise<QuizRow[]> {
    const r = await db.execute<Record<string, unknown>>(sql`
      select q.id, q.title, q.unit_type_key as "unitTypeKey", q.templates, q.group_id as "groupId", g.name as "groupName",
             p.name as "createdByName", q.created_at as "createdAt", q.version,
             (select count(*)::int from quiz_attempts a where a.quiz_id = q.id) as attempts,
             (select count(distinct a.person_id)::int from quiz_attempts a where a.quiz_id = q.id) as people
        from quizzes q
        join people p on p.id = q.created_by
        left join training_groups g on g.id = q.group_id
       where (${id ?? null}::uuid is null or q.id = ${id ?? null}::uuid)
       order by q.created_at desc, q.title`);
    return r.rows.map((row) => {
      const templates = row.templates as QuizRow['templates'];
      return {
        ...(row as unknown as QuizRow),
        createdAt: iso(row.createdAt as Date),
        templates,
        promptCount: templates.reduce((n, t) => n + t.count, 0),
      };
    });
  },
  async quiz(id: string): Promise<QuizRecord | null> {
    const r = await db.select().from(quizzes).where(eq(quizzes.id, id)).limit(1);
    if (!r[0]) return null;
    const q = r[0];
    return { id: q.id, title: q.title, unitTypeKey: q.unitTypeKey, templates: q.templates as QuizRow['templates'], groupId: q.groupId, createdBy: q.createdBy, version: q.version };
  },
  async groupExists(id: string): Promise<boolean> {
    return (await db.select({ id: trainingGroups.id }).from(trainingGroups).where(eq(trainingGroups.id, id)).limit(1)).length > 0;
  },
  async insertQuiz(v: { title: string; unitTypeKey: string | null; templates: unknown; groupId: string | null; createdBy: string }): Promise<string> {
    const [r] = await db.insert(quizzes).values(v).returning({ id: quizzes.id });
    return r.id;
  },
  /** Applies a patch only when the stored version matches; false means stale. */
  async updateQuiz(id: string, version: number, patch: Partial<{ title: string; unitTypeKey: string | null; templates: unknown; groupId: string | null }>) {
    const r = await db
      .update(quizzes)
      .set({ ...patch, version: sql`${quizzes.version} + 1` })
      .where(and(eq(quizzes.id, id), eq(quizzes.version, version)))
      .returning({ id: quizzes.id });
    return r.length > 0;
  },
  /** Quizzes shared with a group the person is in, with their own attempts. */
  async quizzesFor(personId: string) {
    const r = await db.execute<Record<string, unknown>>(sql`
      select q.id, q.title, q.unit_type_key as "unitTypeKey", g.name as "groupName", q.templates,
             (select count(*)::int from quiz_attempts a where a.quiz_id = q.id and a.person_id = ${personId}) as attempts,
             (select max(a.score::float / nullif(jsonb_array_length(a.prompts), 0)) from quiz_attempts a
               where a.quiz_id = q.id and a.person_id = ${personId} and a.finished_at is not null) as best,
             (select a.id from quiz_attempts a where a.quiz_id = q.id and a.person_id = ${personId} and a.finished_at is null
               order by a.started_at desc limit 1) as "openAttemptId"
        from quizzes q
        join training_groups g on g.id = q.group_id
        join training_group_members m on m.group_id = g.id and m.person_id = ${personId}
       order by q.created_at desc, q.title`);
    return r.rows.map((row) => {
      const templates = row.templates as QuizRow['templates'];
      return {
        id: row.id as string,
        title: row.title as string,
        unitTypeKey: row.unitTypeKey as string | null,
        groupName: row.groupName as string | null,
        promptCount: templates.reduce((n, t) => n + t.count, 0),
        attempts: row.attempts as number,
        best: row.best === null ? null : Number(row.best),
        openAttemptId: (row.openAttemptId as string | null) ?? null,
      };
    });
  },
  async isMember(groupId: string, personId: string): Promise<boolean> {
    const r = await db
      .select({ g: trainingGroupMembers.groupId })
      .from(trainingGroupMembers)
      .where(and(eq(trainingGroupMembers.groupId, groupId), eq(trainingGroupMembers.personId, personId)))
      .limit(1);
    return r.length > 0;
  },

  // Attempts and answers.
  async insertAttempt(quizId: string, personId: string, prompts: StoredPrompt[]): Promise<AttemptRecordRow> {
    const [r] = await db.insert(quizAttempts).values({ quizId, personId, prompts }).returning();
    return { ...r, prompts: r.prompts as StoredPrompt[] };
  },
  /** The attempt, locked for the rest of the transaction when `lock` is set (one answer at a time). */
  async attempt(id: string, lock = false): Promise<AttemptRecordRow | null> {
    const q = db.select().from(quizAttempts).where(eq(quizAttempts.id, id)).limit(1);
    const r = lock ? await q.for('update') : await q;
    return r[0] ? { ...r[0], prompts: r[0].prompts as StoredPrompt[] } : null;
  },
  async answers(attemptId: string): Promise<StoredAnswer[]> {
    const r = await db.select().from(quizAnswers).where(eq(quizAnswers.attemptId, attemptId)).orderBy(asc(quizAnswers.promptIndex));
    return r.map((a) => ({ promptIndex: a.promptIndex, answer: a.answer as StoredAnswer['answer'], correct: a.correct, ms: a.ms, at: a.at }));
  },
  async insertAnswer(v: { attemptId: string; promptIndex: number; answer: unknown; correct: boolean; ms: number }) {
    await db.insert(quizAnswers).values(v);
  },
  async finishAttempt(id: string, score: number) {
    await db.update(quizAttempts).set({ finishedAt: new Date(), score }).where(eq(quizAttempts.id, id));
  },
  async personName(id: string): Promise<string> {
    const r = await db.select({ name: people.name }).from(people).where(eq(people.id, id)).limit(1);
    return r[0]?.name ?? '';
  },
  /** Every attempt at a quiz with who made it and every answer. */
  async attemptsForQuiz(quizId: string) {
    const attempts = await db
      .select({
        id: quizAttempts.id,
        personId: quizAttempts.personId,
        personName: people.name,
        role: people.role,
        prompts: quizAttempts.prompts,
        startedAt: quizAttempts.startedAt,
        finishedAt: quizAttempts.finishedAt,
      })
      .from(quizAttempts)
      .innerJoin(people, eq(people.id, quizAttempts.personId))
      .where(eq(quizAttempts.quizId, quizId));
    const ids = attempts.map((a) => a.id);
    const answers = ids.length ? await db.select().from(quizAnswers).where(inArray(quizAnswers.attemptId, ids)) : [];
    return attempts.map((a) => ({
      attemptId: a.id,
      personId: a.personId,
      personName: a.personName,
      role: a.role,
      startedAt: iso(a.startedAt),
      finishedAt: a.finishedAt ? iso(a.finishedAt) : null,
      prompts: a.prompts as StoredPrompt[],
      answers: answers
        .filter((x) => x.attemptId === a.id)
        .map((x) => ({ promptIndex: x.promptIndex, correct: x.correct, ms: x.ms, given: (x.answer as { given?: string }).given })),
    }));
  },
});
