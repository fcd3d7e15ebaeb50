import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import { expectedFor, type Answer, type Prompt, type StoredPrompt } from '../../shared/lab';
import { unitLayout } from '../../shared/layout/unit-layout';
import { Client, startTestApp, type TestApp } from './harness';

// The whole lab loop over HTTP against a real database: a trainer builds and shares a quiz, two
// inspectors take it, the trainer reads per-person results and the most-missed prompts; and nothing
// outside the lab's own tables changes.
const drawings = loadDrawingsFromDir('diagrams');
const LAB_TABLES = new Set(['training_groups', 'training_group_members', 'quizzes', 'quiz_attempts', 'quiz_answers']);
const LAB_AUDIT_ENTITIES = ['training_group', 'quiz', 'quiz_attempt'];
const INSPECTION_SIDE = ['units', 'inspections', 'findings', 'finding_events', 'inspection_items', 'photos', 'unit_tags'];

let t: TestApp;
let trainer: Client;
let dana: Client;
let luis: Client;
let foreman: Client;
beforeAll(async () => {
  t = await startTestApp();
  trainer = await t.as('trainer');
  dana = await t.as('inspector');
  foreman = await t.as('foreman');
  luis = t.client();
  expect((await luis.login('l.ferreira@demo.example')).status).toBe(200);
});
afterAll(() => t.close());

/** Row count of every table, and of audit rows outside the lab, keyed by name. */
async function snapshot(): Promise<Record<string, number>> {
  const tables = (await t.db.execute<{ tablename: string }>(sql`select tablename from pg_tables where schemaname = 'public' order by 1`)).rows.map((r) => r.tablename);
  const out: Record<string, number> = {};
  for (const name of tables) out[name] = Number((await t.db.execute<{ n: string }>(sql.raw(`select count(*)::text as n from "${name}"`))).rows[0].n);
  const nonLab = await t.db.execute<{ n: string }>(sql`select count(*)::text as n from audit_log where entity not in (${sql.join(LAB_AUDIT_ENTITIES.map((e) => sql`${e}`), sql`, `)})`);
  out['audit_log (not lab)'] = Number(nonLab.rows[0].n);
  const inspectionAudit = await t.db.execute<{ n: string }>(sql`select count(*)::text as n from audit_log where entity in ('unit', 'inspection', 'finding', 'photo', 'unit_tag', 'routine')`);
  out['audit_log (inspection entities)'] = Number(inspectionAudit.rows[0].n);
  return out;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** A right or a wrong answer to a prompt, worked out with the shared engine from the drawing. */
function answerFor(p: Prompt, right: boolean): Answer {
  const d = drawings.get(p.unitTypeKey)!;
  const e = expectedFor(p, d);
  switch (p.template) {
    case 'tap_part': {
      if (right) return { template: 'tap_part', partId: e.partIds[0] };
      const wrong = unitLayout(d, p.frontEnd).parts.find((x) => x.kind === p.kind && x.label !== p.targetLabel && p.views.includes(x.view))!;
      return { template: 'tap_part', partId: wrong.partId };
    }
    case 'name_part':
      return { template: 'name_part', label: right ? e.label : p.choices.find((c) => c !== e.label)! };
    case 'which_end':
      return { template: 'which_end', end: right ? e.end! : e.end === 'short_hood' ? 'long_hood' : 'short_hood' };
    case 'which_side':
      return { template: 'which_side', ySign: right ? e.ySign! : (-e.ySign! as 1 | -1) };
  }
}

const conceptKey = (p: Prompt) => (p.template === 'tap_part' || p.template === 'name_part' ? `${p.template}|${p.kind}|${p.frontEnd}` : `${p.template}|${p.ask}|${p.frontEnd}`);

describe('a trainer builds and shares a quiz; inspectors take it; results are kept', () => {
  it('runs the whole loop and leaves every inspection-side table as it was', async () => {
    const before = await snapshot();

    const people = (await trainer.get('/api/lab/people')).body.items as { id: string; name: string }[];
    const id = (name: string) => people.find((p) => p.name === name)!.id;
    const group = await trainer.post('/api/lab/groups', { name: 'Marlow new hires', memberIds: [id('Dana Okafor'), id('Luis Ferreira'), id('Ray Lindqvist')] });
    expect(group.status).toBe(201);
    expect(group.body.members.map((m: { name: string }) => m.name)).toEqual(['Dana Okafor', 'Luis Ferreira', 'Ray Lindqvist']);

    const templates = [
      { template: 'tap_part', count: 3, kinds: ['traction_motor', 'sand_box'] },
      { template: 'name_part', count: 2 },
      { template: 'which_end', count: 2 },
      { template: 'which_side', count: 1 },
    ];
    const created = await trainer.post('/api/lab/quizzes', { title: 'Week 1: which way is front', unitTypeKey: 'six_axle_road', templates, groupId: null });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ title: 'Week 1: which way is front', promptCount: 8, groupId: null, version: 1, createdByName: 'Tom Baptiste' });
    const quizId = created.body.id as string;

    // A draft is the trainer's alone.
    expect((await dana.get('/api/lab/my-quizzes')).body.items).toEqual([]);
    expect((await dana.post(`/api/lab/quizzes/${quizId}/attempts`, {})).status).toBe(404);

    const shared = await trainer.patch(`/api/lab/quizzes/${quizId}`, { version: 1, groupId: group.body.id });
    expect(shared.status).toBe(200);
    expect(shared.body).toMatchObject({ groupName: 'Marlow new hires', version: 2 });
    const mine = (await dana.get('/api/lab/my-quizzes')).body.items;
    expect(mine).toEqual([expect.objectContaining({ id: quizId, promptCount: 8, attempts: 0, best: null, openAttemptId: null })]);

    // Starting with a seed fixes the prompts; the learner is never sent the answers.
    const start = await dana.post(`/api/lab/quizzes/${quizId}/attempts`, { seed: 77 });
    expect(start.status).toBe(201);
    const prompts = start.body.prompts as Prompt[];
    expect(prompts).toHaveLength(8);
    expect(JSON.stringify(prompts)).not.toMatch(/expected|instanceIds/);
    expect(prompts.every((p) => p.unitTypeKey === 'six_axle_road')).toBe(true);
    const luisStart = await luis.post(`/api/lab/quizzes/${quizId}/attempts`, { seed: 77 });
    expect(luisStart.body.prompts).toEqual(prompts);
    expect((await dana.get('/api/lab/my-quizzes')).body.items[0].openAttemptId).toBe(start.body.id);

    // Dana: first five right, last three wrong. Luis: all right but the second.
    const danaPlan = prompts.map((_, i) => i < 5);
    const luisPlan = prompts.map((_, i) => i !== 1);
    const danaMs = prompts.map((_, i) => 200 + 10 * i);
    for (const [who, attemptId, plan, msList] of [
      [dana, start.body.id, danaPlan, danaMs],
      [luis, luisStart.body.id, luisPlan, prompts.map(() => 150)],
    ] as const) {
      for (const p of prompts) {
        await sleep(msList[p.index] + 60);
        const r = await who.post(`/api/lab/attempts/${attemptId}/answers`, { promptIndex: p.index, answer: answerFor(p, plan[p.index]), ms: msList[p.index] });
        expect(r.status, JSON.stringify(r.body)).toBe(201);
        expect(r.body.correct, p.text).toBe(plan[p.index]);
        expect(r.body.ms).toBe(msList[p.index]);
        expect(r.body.reason).toMatch(/The F is on the (short|long) hood end/);
        expect(r.body.expected.label).toBeTruthy();
        expect(r.body.finished).toBe(p.index === prompts.length - 1);
      }
    }
    const again = await dana.post(`/api/lab/attempts/${start.body.id}/answers`, { promptIndex: 0, answer: answerFor(prompts[0], true), ms: 100 });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('conflict');

    const danaAttempt = (await dana.get(`/api/lab/attempts/${start.body.id}`)).body;
    expect(danaAttempt).toMatchObject({ score: 5, quizTitle: 'Week 1: which way is front', personName: 'Dana Okafor' });
    expect(danaAttempt.finishedAt).not.toBeNull();
    expect(danaAttempt.answers.map((a: { correct: boolean }) => a.correct)).toEqual(danaPlan);
    expect((await dana.get('/api/lab/my-quizzes')).body.items[0]).toMatchObject({ attempts: 1, best: 5 / 8, openAttemptId: null });
    // Someone else's attempt does not exist for them; a trainer reads it.
    expect((await luis.get(`/api/lab/attempts/${start.body.id}`)).status).toBe(404);
    expect((await trainer.get(`/api/lab/attempts/${start.body.id}`)).status).toBe(200);

    // The trainer's view: per person, per prompt, and the most missed.
    const res = await trainer.get(`/api/lab/quizzes/${quizId}/results`);
    expect(res.status).toBe(200);
    expect(res.body.people.map((p: { name: string }) => p.name)).toEqual(['Dana Okafor', 'Luis Ferreira']);
    const [danaRes, luisRes] = res.body.people;
    expect(danaRes.attempts[0]).toMatchObject({ total: 8, answered: 8, correct: 5, totalMs: danaMs.reduce((a, b) => a + b, 0) });
    expect(danaRes.attempts[0].prompts.map((p: { ms: number }) => p.ms)).toEqual(danaMs);
    expect(danaRes.attempts[0].prompts.map((p: { correct: boolean }) => p.correct)).toEqual(danaPlan);
    expect(luisRes.attempts[0]).toMatchObject({ correct: 7, totalMs: 8 * 150 });
    expect(luisRes.best).toBe(7 / 8);
    expect(res.body.notStarted.map((m: { name: string }) => m.name)).toEqual(['Ray Lindqvist']);

    // Most missed, counted by hand from the plans above.
    const tally = new Map<string, { asked: number; wrong: number }>();
    for (const plan of [danaPlan, luisPlan]) {
      for (const p of prompts) {
        const k = conceptKey(p);
        const e = tally.get(k) ?? { asked: 0, wrong: 0 };
        e.asked += 1;
        if (!plan[p.index]) e.wrong += 1;
        tally.set(k, e);
      }
    }
    const missed = [...tally.entries()].filter(([, v]) => v.wrong > 0);
    expect(res.body.mostMissed.map((m: { key: string; asked: number; wrong: number }) => [m.key, m.asked, m.wrong]).sort()).toEqual(
      missed.map(([k, v]) => [k, v.asked, v.wrong]).sort(),
    );
    const wrongs = res.body.mostMissed.map((m: { wrong: number }) => m.wrong);
    expect(wrongs).toEqual([...wrongs].sort((a: number, b: number) => b - a));

    // The prompts kept with the attempt carry the engine's expected answers.
    const stored = (await t.db.execute<{ prompts: StoredPrompt[] }>(sql`select prompts from quiz_attempts where id = ${start.body.id}`)).rows[0].prompts;
    for (const p of stored) expect(p.expected).toEqual(expectedFor(p, drawings.get(p.unitTypeKey)!));

    // Separation: only the lab's tables (and its own audit rows) grew.
    const after = await snapshot();
    for (const [name, n] of Object.entries(before)) {
      if (LAB_TABLES.has(name) || name === 'audit_log' || name === 'session') continue;
      expect(after[name], name).toBe(n);
    }
    for (const name of INSPECTION_SIDE) expect(after[name], name).toBe(before[name]);
    expect(after['audit_log (inspection entities)']).toBe(before['audit_log (inspection entities)']);
    expect(after['audit_log (not lab)']).toBe(before['audit_log (not lab)']);
    expect(after.quiz_attempts - before.quiz_attempts).toBe(2);
    expect(after.quiz_answers - before.quiz_answers).toBe(16);
    expect(after.audit_log).toBeGreaterThan(before.audit_log);
    // Units are still there to compare against (a count of zero would prove nothing).
    expect(after.units).toBeGreaterThan(0);
  }, 60_000);

  it('keeps the time per prompt within what the server saw pass', async () => {
    const quizzes = (await trainer.get('/api/lab/quizzes')).body.items;
    const a = await foreman.post(`/api/lab/quizzes/${quizzes[0].id}/attempts`, {});
    expect(a.status).toBe(201);
    const p = a.body.prompts[0] as Prompt;
    const r = await foreman.post(`/api/lab/attempts/${a.body.id}/answers`, { promptIndex: 0, answer: answerFor(p, true), ms: 3_000_000 });
    expect(r.status).toBe(201);
    expect(r.body.ms).toBeLessThan(10_000);
    // Stopping early scores what was answered.
    const done = await foreman.post(`/api/lab/attempts/${a.body.id}/finish`);
    expect(done.status).toBe(200);
    expect(done.body.score).toBe(1);
    expect((await foreman.post(`/api/lab/attempts/${a.body.id}/finish`)).status).toBe(409);
    expect((await foreman.post(`/api/lab/attempts/${a.body.id}/answers`, { promptIndex: 1, answer: answerFor(a.body.prompts[1], true), ms: 5 })).status).toBe(409);
  });

  it('gives random prompts without a seed, with the F on either end', async () => {
    const q = await trainer.post('/api/lab/quizzes', { title: 'Mixed ends', unitTypeKey: null, templates: [{ template: 'which_end', count: 20 }], groupId: null });
    const ends = new Set<string>();
    const types = new Set<string>();
    for (let i = 0; i < 3; i++) {
      const a = await trainer.post(`/api/lab/quizzes/${q.body.id}/attempts`, {});
      for (const p of a.body.prompts) {
        ends.add(p.frontEnd);
        types.add(p.unitTypeKey);
      }
    }
    expect(ends).toEqual(new Set(['short_hood', 'long_hood']));
    expect(types.size).toBeGreaterThan(1);
  });
});

describe('who may do what in the lab', () => {
  it('refuses the wrong roles with the one error shape', async () => {
    const anon = await t.client().get('/api/lab/quizzes');
    expect(anon.status).toBe(401);
    expect(anon.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String) } });
    const checks: [Client, string, string, unknown?][] = [
      [dana, 'POST', '/api/lab/quizzes', { title: 'x', unitTypeKey: null, templates: [{ template: 'which_end', count: 1 }] }],
      [dana, 'GET', '/api/lab/quizzes'],
      [dana, 'POST', '/api/lab/groups', { name: 'mine', memberIds: [] }],
      [foreman, 'GET', '/api/lab/people'],
    ];
    const engineer = await t.as('engineer');
    const admin = await t.as('admin');
    const anyQuiz = (await trainer.get('/api/lab/quizzes')).body.items[0].id;
    checks.push([engineer, 'GET', `/api/lab/quizzes/${anyQuiz}/results`], [admin, 'PATCH', `/api/lab/quizzes/${anyQuiz}`, { version: 1, title: 'renamed' }], [admin, 'GET', '/api/lab/groups']);
    for (const [c, method, path, body] of checks) {
      const r = await c.req(method, path, body);
      expect(r.status, `${method} ${path}`).toBe(403);
      expect(r.body.error.code).toBe('forbidden');
    }
    // Anyone signed in takes quizzes.
    for (const c of [dana, foreman, engineer, admin, trainer]) expect((await c.get('/api/lab/my-quizzes')).status).toBe(200);
  });
});

describe('bad input', () => {
  it('answers 4xx with field messages, never 500', async () => {
    const bad = async (c: Client, method: string, path: string, body: unknown, status: number, fields?: string[]) => {
      const r = await c.req(method, path, body);
      expect(r.status, `${method} ${path} ${JSON.stringify(body)}: ${JSON.stringify(r.body)}`).toBe(status);
      expect(typeof r.body.error.code).toBe('string');
      expect(typeof r.body.error.message).toBe('string');
      if (fields) expect(Object.keys(r.body.error.fields ?? {}).sort()).toEqual([...fields].sort());
      return r;
    };
    await bad(trainer, 'POST', '/api/lab/quizzes', { title: '', unitTypeKey: null, templates: [] }, 400, ['title', 'templates']);
    await bad(trainer, 'POST', '/api/lab/quizzes', { title: 'q', unitTypeKey: null, templates: [{ template: 'riddle', count: 0 }] }, 400, ['templates.0.template', 'templates.0.count']);
    await bad(trainer, 'POST', '/api/lab/quizzes', { title: 'q', unitTypeKey: null, templates: [{ template: 'tap_part', count: 2, kinds: ['cab'] }] }, 400, ['templates.0.kinds.0']);
    await bad(trainer, 'POST', '/api/lab/quizzes', { title: 'q', unitTypeKey: null, templates: [{ template: 'tap_part', count: 20 }, { template: 'name_part', count: 20 }, { template: 'which_end', count: 1 }] }, 400, ['templates']);
    await bad(trainer, 'POST', '/api/lab/quizzes', { title: 'q', unitTypeKey: 'no_such_type', templates: [{ template: 'which_end', count: 1 }] }, 400, ['unitTypeKey']);
    await bad(trainer, 'POST', '/api/lab/quizzes', { title: 'q', unitTypeKey: null, templates: [{ template: 'which_end', count: 1 }], groupId: '00000000-0000-4000-8000-000000000000' }, 400, ['groupId']);
    await bad(trainer, 'POST', '/api/lab/quizzes', { title: 'q', unitTypeKey: null, templates: [{ template: 'which_end', count: 1 }], extra: 1 }, 400);
    await bad(trainer, 'POST', '/api/lab/groups', { name: 'Marlow new hires', memberIds: [] }, 409, ['name']);
    await bad(trainer, 'POST', '/api/lab/groups', { name: 'Ghosts', memberIds: ['00000000-0000-4000-8000-000000000000'] }, 400, ['memberIds']);
    await bad(trainer, 'POST', '/api/lab/groups', { name: 'Ids', memberIds: ['not-an-id'] }, 400, ['memberIds.0']);
    await bad(trainer, 'GET', '/api/lab/quizzes/not-an-id', undefined, 400, ['id']);
    await bad(trainer, 'GET', '/api/lab/quizzes/00000000-0000-4000-8000-000000000000/results', undefined, 404);

    const quiz = (await trainer.get('/api/lab/quizzes')).body.items.find((q: { title: string }) => q.title === 'Week 1: which way is front');
    await bad(trainer, 'PATCH', `/api/lab/quizzes/${quiz.id}`, { version: 1, title: 'stale' }, 409);
    const a = await dana.post(`/api/lab/quizzes/${quiz.id}/attempts`, { seed: 5 });
    await bad(dana, 'POST', `/api/lab/quizzes/${quiz.id}/attempts`, { seed: -1 }, 400, ['seed']);
    const p0 = a.body.prompts[0] as Prompt;
    const url = `/api/lab/attempts/${a.body.id}/answers`;
    await bad(dana, 'POST', url, { promptIndex: 0, answer: { template: 'tap_part', partId: 'no-such-part' }, ms: 10 }, 400, ['answer']);
    await bad(dana, 'POST', url, { promptIndex: 30, answer: answerFor(p0, true), ms: 10 }, 400, ['promptIndex']);
    await bad(dana, 'POST', url, { promptIndex: 99, answer: answerFor(p0, true), ms: 10 }, 400, ['promptIndex']);
    await bad(dana, 'POST', url, { promptIndex: 0, answer: { template: 'guess' }, ms: 10 }, 400);
    await bad(dana, 'POST', url, { promptIndex: 0, answer: answerFor(p0, true), ms: -5 }, 400, ['ms']);
    const broken = await dana.req('POST', url, '{"promptIndex": 0,', { 'content-type': 'application/json' });
    expect(broken.status).toBe(400);
    expect(broken.body.error.code).toBe('bad_request');
    const nonJson = await dana.req('POST', url, 'promptIndex=0', { 'content-type': 'text/plain' });
    expect(nonJson.status).toBe(415);
    // Someone else's attempt is not there to answer.
    await bad(luis, 'POST', url, { promptIndex: 0, answer: answerFor(p0, true), ms: 10 }, 404);
    // Nothing above stored an answer.
    expect((await dana.get(`/api/lab/attempts/${a.body.id}`)).body.answers).toEqual([]);
  });
});
