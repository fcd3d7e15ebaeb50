import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES } from '../../shared/domain/roles';
import { FINDING_ACTIONS, TRANSITIONS } from '../../shared/repairs/transitions';
import { pinFinding, startTestApp, type Client, type TestApp } from './harness';

let t: TestApp;
let inspector: Client;
let foreman: Client;
beforeAll(async () => {
  t = await startTestApp();
  inspector = await t.as('inspector');
  foreman = await t.as('foreman');
});
afterAll(() => t.close());

const pilotLow = { partId: 'pl-pilot_sh', view: 'plan', x: 18, y: 0, defectType: 'pilot_height_out_of_limit', measurement: { value: 2.5, unit: 'in' } };
const motorNote = (y = 0) => ({ partId: 'pl-traction_motor_2', view: 'plan', x: 173, y, defectType: 'traction_motor_other', note: 'Weeping oil' });
const foremanId = async () => (await foreman.get('/api/auth/me')).body.id;

describe('finding transitions', () => {
  it('runs a federal finding through assign → repair → verify, with an event for each and the unit compliant after the tag is cleared', async () => {
    const { unit, finding } = await pinFinding(inspector, 'HRL 2201', pilotLow);
    expect(finding.weight).toBe('federal');
    const q = (await foreman.get('/api/repairs')).body.items;
    expect(q[0].nonComplying).toBe(true); // non-complying units come first
    const assignee = await foremanId();
    const a = await foreman.post(`/api/findings/${finding.id}/assign`, { version: finding.version, assigneeId: assignee });
    expect(a.status).toBe(200);
    expect(a.body.state).toBe('in_repair');
    // The tag cannot be cleared while the federal finding needs work.
    const early = await foreman.post(`/api/units/${unit.id}/tag/clear`);
    expect(early.status).toBe(409);
    const r = await foreman.post(`/api/findings/${finding.id}/repair`, { version: a.body.version, whatDone: 'Reset pilot to 4 in above rail', partsUsed: 'Shims x2', minutes: 45 });
    expect(r.body.state).toBe('repaired');
    expect(r.body.federalOpenOnUnit).toBe(0);
    const v = await inspector.post(`/api/findings/${finding.id}/verify`, { version: r.body.version });
    expect(v.status).toBe(200);
    expect(v.body.state).toBe('verified');
    const clear = await foreman.post(`/api/units/${unit.id}/tag/clear`);
    expect(clear.status).toBe(200);
    expect(clear.body.clearedBy).toBe('Ray Lindqvist');
    const u = (await foreman.get(`/api/units/${unit.id}`)).body;
    expect(u.nonComplying).toBe(false);
    const d = (await foreman.get(`/api/findings/${finding.id}`)).body;
    expect(d.events.map((e: any) => e.kind)).toEqual(['verified', 'repaired', 'assigned', 'created']);
    expect(d.events.find((e: any) => e.kind === 'repaired').details).toMatchObject({ whatDone: 'Reset pilot to 4 in above rail', minutes: 45 });
    const hist = (await foreman.get(`/api/units/${unit.id}/history`)).body.items.map((h: any) => h.kind);
    expect(hist).toEqual(expect.arrayContaining(['tag_cleared', 'finding_verified', 'finding_repaired', 'finding_assigned', 'tag_opened']));
  });

  it('sends a repair back with a reason, and refuses a verify by whoever recorded the repair', async () => {
    const { finding } = await pinFinding(inspector, 'HRL 2202', motorNote(-8));
    const r = await foreman.post(`/api/findings/${finding.id}/repair`, { version: finding.version, whatDone: 'Cleaned and re-sealed' });
    const self = await foreman.post(`/api/findings/${finding.id}/verify`, { version: r.body.version });
    expect(self.status).toBe(403);
    const noReason = await inspector.post(`/api/findings/${finding.id}/send-back`, { version: r.body.version, reason: '' });
    expect(noReason.status).toBe(400);
    const back = await inspector.post(`/api/findings/${finding.id}/send-back`, { version: r.body.version, reason: 'Still weeping at the seal' });
    expect(back.body.state).toBe('in_repair');
  });

  it('answers a stale change with 409 saying who changed what', async () => {
    const { finding } = await pinFinding(inspector, 'HRL 2203', motorNote());
    const first = await foreman.post(`/api/findings/${finding.id}/assign`, { version: finding.version, assigneeId: await foremanId() });
    expect(first.status).toBe(200);
    const stale = await foreman.post(`/api/findings/${finding.id}/repair`, { version: finding.version, whatDone: 'Done twice?' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale');
    expect(stale.body.error.message).toMatch(/Ray Lindqvist assigned it/);
    expect(stale.body.error.currentVersion).toBe(first.body.version);
  });

  it('voids a finding entered in error with a reason and keeps it in the history, never deleted', async () => {
    const { unit, finding } = await pinFinding(inspector, 'HRL 2204', motorNote(5));
    const noReason = await inspector.post(`/api/findings/${finding.id}/void`, { version: finding.version });
    expect(noReason.status).toBe(400);
    const v = await inspector.post(`/api/findings/${finding.id}/void`, { version: finding.version, reason: 'Pinned on the wrong unit' });
    expect(v.body.state).toBe('voided');
    const d = (await foreman.get(`/api/findings/${finding.id}`)).body;
    expect(d).toMatchObject({ state: 'voided', voidReason: 'Pinned on the wrong unit' });
    expect((await foreman.get('/api/repairs')).body.items.some((i: any) => i.id === finding.id)).toBe(false);
    expect((await foreman.get(`/api/repairs?state=voided`)).body.items.some((i: any) => i.id === finding.id)).toBe(true);
    const hist = (await foreman.get(`/api/units/${unit.id}/history`)).body.items;
    expect(hist.some((h: any) => h.kind === 'finding_voided' && /wrong unit/.test(h.text))).toBe(true);
    // Voided is final.
    expect((await foreman.post(`/api/findings/${finding.id}/repair`, { version: v.body.version, whatDone: 'x x x' })).status).toBe(409);
    expect((await t.pool.query('select count(*)::int n from findings where id = $1', [finding.id])).rows[0].n).toBe(1);
  });

  it('refuses transitions the state machine does not allow, for every action', async () => {
    const { finding } = await pinFinding(inspector, 'HRL 4104', motorNote());
    // From "open": verify and send-back are not allowed (nothing was repaired).
    for (const action of ['verify', 'send-back'] as const) {
      const r = await inspector.post(`/api/findings/${finding.id}/${action}`, { version: finding.version, reason: 'because' });
      expect(r.status).toBe(409);
    }
  });

  it('allows each action to exactly the roles the table names, and refuses the rest with 403', async () => {
    const clients = Object.fromEntries(await Promise.all(ROLES.map(async (r) => [r, await t.as(r)] as const)));
    for (const action of FINDING_ACTIONS) {
      for (const role of ROLES) {
        const { finding } = await pinFinding(inspector, 'HRL 4105', motorNote(role.length));
        const path = `/api/findings/${finding.id}/${action.replace('_', '-')}`;
        const r = await clients[role].post(path, { version: finding.version });
        const allowed = (TRANSITIONS[action].roles as readonly string[]).includes(role);
        // Allowed roles get past the access check (400 for the missing fields, or 409 for the state); others get 403.
        if (allowed) expect([200, 400, 409]).toContain(r.status);
        else expect(r.status).toBe(403);
      }
    }
  }, 60_000);

  it('exports the queue as CSV', async () => {
    const r = await foreman.get('/api/repairs.csv');
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/text\/csv/);
    const lines = String(r.body).trim().split('\n');
    expect(lines[0]).toBe('Unit,Yard,Non-complying,Part,Defect,Weight,Rule,State,Assigned to,Found at,Found by,Age (days)');
    expect(lines.length).toBeGreaterThan(2);
  });
});
