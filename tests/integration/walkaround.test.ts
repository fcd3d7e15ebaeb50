import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, startTestApp, type Client, type TestApp } from './harness';

let t: TestApp;
const photoDir = fs.mkdtempSync(path.join(os.tmpdir(), 'hoodline-photos-'));
beforeAll(async () => {
  t = await startTestApp({ FAKE_SMTP: '1', SMTP_PORT: '0', WORKERS: '1', OUTBOX_POLL_MS: '100', PHOTO_DIR: photoDir, PHOTO_MAX_BYTES: String(300 * 1024) });
});
afterAll(async () => {
  await t.close();
  fs.rmSync(photoDir, { recursive: true, force: true });
});

async function unitByNumber(c: Client, roadNumber: string) {
  const r = await c.get(`/api/units?q=${encodeURIComponent(roadNumber)}`);
  return r.body.items.find((u: any) => u.roadNumber === roadNumber);
}
async function partOf(c: Client, unitId: string, partId: string) {
  const l = await c.get(`/api/units/${unitId}/layout`);
  return l.body.parts.find((p: any) => p.partId === partId);
}
async function waitFor<T>(fn: () => Promise<T | undefined | false>, ms = 8000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('walkaround', () => {
  let insp: Client;
  let unit: any;
  let inspection: any;

  it('starts a daily inspection with the routine and an empty coverage bar', async () => {
    insp = await t.as('inspector');
    unit = await unitByNumber(insp, 'HRL 4101');
    const r = await insp.post('/api/inspections', { unitId: unit.id, kind: 'daily', frontEndSeen: 'short_hood' });
    expect(r.status).toBe(201);
    inspection = r.body;
    expect(inspection.status).toBe('in_progress');
    expect(inspection.routine.areas.length).toBeGreaterThan(3);
    expect(inspection.coverage.done).toBe(0);
    expect(inspection.coverage.total).toBe(new Set(inspection.routine.areas.flatMap((a: any) => a.instanceIds)).size);
    // Starting again resumes the same inspection (a reload or a retry makes no second record).
    const again = await insp.post('/api/inspections', { unitId: unit.id, kind: 'daily', frontEndSeen: 'short_hood' });
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(inspection.id);
  });

  it('refuses roles that do not inspect', async () => {
    for (const role of ['engineer', 'trainer', 'admin'] as const) {
      const c = await t.as(role);
      const r = await c.post('/api/inspections', { unitId: unit.id, kind: 'daily' });
      expect(r.status).toBe(403);
      const f = await c.post(`/api/inspections/${inspection.id}/findings`, { partId: 'pl-traction_motor_1', view: 'plan', x: 92, y: -10, defectType: 'traction_motor_other' });
      expect(f.status).toBe(403);
    }
  });

  it('pins a finding on the left of #3 traction motor with its labels derived from the F end', async () => {
    const r = await insp.post(`/api/inspections/${inspection.id}/findings`, { partId: 'pl-traction_motor_3', view: 'plan', x: 218, y: -12, defectType: 'traction_motor_other', note: 'Oil on the frame' });
    expect(r.status).toBe(201);
    // F on the short hood: -y is left (product.md §3); the #3 motor is the third from the F.
    expect(r.body.label).toBe('Left side, #3 traction motor');
    expect(r.body.partLabel).toBe('#3 traction motor');
    expect(r.body.frontEnd).toBe('short_hood');
    expect(r.body.body).toMatchObject({ x: 218, y: -12 });
    expect(r.body.front).toMatchObject({ along: 218, left: 12 });
    expect(r.body.state).toBe('open');
  });

  it('refuses an unknown part, a part of another unit type, a pin outside the view, and a defect of another part kind', async () => {
    const base = `/api/inspections/${inspection.id}/findings`;
    const unknown = await insp.post(base, { partId: 'pl-warp_core', view: 'plan', x: 100, y: 0, defectType: 'traction_motor_other' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields.partId).toMatch(/No part/);
    const six = (await insp.get('/api/unit-types/six_axle_road')).body;
    const sw = (await insp.get('/api/unit-types/four_axle_switcher')).body;
    const sixIds = new Set(six.views.flatMap((v: any) => v.parts.map((p: any) => p.id)));
    const foreign = sw.views.flatMap((v: any) => v.parts.map((p: any) => ({ ...p, view: v.key }))).find((p: any) => !sixIds.has(p.id));
    expect(foreign).toBeTruthy();
    const other = await insp.post(base, { partId: foreign.id, view: foreign.view, x: foreign.centre.u, y: foreign.centre.v, defectType: `${foreign.kind}_other` });
    expect(other.status).toBe(400);
    expect(other.body.error.fields.partId).toMatch(/another unit type/);
    const outside = await insp.post(base, { partId: 'pl-traction_motor_3', view: 'plan', x: 218, y: 500, defectType: 'traction_motor_other' });
    expect(outside.status).toBe(400);
    expect(outside.body.error.fields.y).toMatch(/Outside the view/);
    const wrongKind = await insp.post(base, { partId: 'pl-traction_motor_3', view: 'plan', x: 218, y: 0, defectType: 'pilot_height_out_of_limit' });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.fields.defectType).toBeTruthy();
    const types = await insp.post(base, { partId: 7, view: 'roof', x: 'a', y: null, defectType: '' });
    expect(types.status).toBe(400);
    expect(Object.keys(types.body.error.fields)).toEqual(expect.arrayContaining(['partId', 'view', 'x', 'y']));
  });

  it('checks a pilot height against 49 CFR 229.123 and asks before keeping a reading within the limit', async () => {
    const pilot = await partOf(insp, unit.id, 'pl-pilot_sh');
    const base = `/api/inspections/${inspection.id}/findings`;
    const body = { partId: 'pl-pilot_sh', view: 'plan', x: pilot.x, y: 0, defectType: 'pilot_height_out_of_limit' };
    // 2.5 in is below the 3 in minimum of 49 CFR 229.123(a): federal, the unit turns non-complying.
    const low = await insp.post(base, { ...body, measurement: { value: 63.5, unit: 'mm' } });
    expect(low.status).toBe(201);
    expect(low.body.weight).toBe('federal');
    expect(low.body.checkResult).toMatchObject({ result: 'fail', source: '49 CFR 229.123(a)' });
    expect(low.body.measurement.inches).toBeCloseTo(2.5, 12);
    expect(low.body.label).toBe('Front pilot');
    // 4 in is inside 3–6 in: the server asks (409 check_passed) and keeps it only as a note.
    const ok = await insp.post(base, { ...body, measurement: { value: 4, unit: 'in' } });
    expect(ok.status).toBe(409);
    expect(ok.body.error.code).toBe('check_passed');
    const kept = await insp.post(base, { ...body, measurement: { value: 4, unit: 'in' }, keepAsNote: true });
    expect(kept.status).toBe(201);
    expect(kept.body.weight).toBe('note');
  });

  it('makes the unit non-complying, opens a tag, and mails the yard foreman through the outbox', async () => {
    const u = await unitByNumber(insp, 'HRL 4101');
    expect(u.nonComplying).toBe(true);
    const tag = await insp.get(`/api/units/${unit.id}/tag`);
    expect(tag.body.open).toBe(true);
    expect(tag.body.defects.map((d: any) => d.label)).toContain('Front pilot');
    const admin = await t.as('admin');
    const mail = await waitFor(async () => {
      const r = await admin.get('/api/outbox/received');
      return r.body.items.find((m: any) => m.to.includes('foreman@demo.example') && /HRL 4101 is non-complying/.test(m.subject));
    });
    expect(mail.raw).toMatch(/49 CFR 229\.9/);
    // Only the foreman of the unit's own yard (Marlow) gets it.
    const all = (await admin.get('/api/outbox/received')).body.items;
    expect(all.some((m: any) => m.to.includes('m.achterberg@demo.example') && /HRL 4101/.test(m.subject))).toBe(false);
    const out = (await admin.get('/api/outbox')).body.items;
    expect(out.find((m: any) => /HRL 4101 is non-complying/.test(m.subject)).status).toBe('sent');
  });

  it('treats a double submit with the same idempotency key as one finding', async () => {
    const before = await count(t.db, 'findings');
    const body = { partId: 'pl-traction_motor_1', view: 'plan', x: 92, y: 10, defectType: 'traction_motor_other', idempotencyKey: 'double-submit-0001' };
    const [a, b] = await Promise.all([
      insp.post(`/api/inspections/${inspection.id}/findings`, body),
      insp.post(`/api/inspections/${inspection.id}/findings`, body),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(a.body.id).toBe(b.body.id);
    const c = await insp.post(`/api/inspections/${inspection.id}/findings`, { ...body, idempotencyKey: undefined }, { 'idempotency-key': 'double-submit-0001' });
    expect(c.status).toBe(200);
    expect(c.body.id).toBe(a.body.id);
    expect(await count(t.db, 'findings')).toBe(before + 1);
  });

  it('takes photos by content: PNG yes with a thumbnail, a GIF or text no (415), too large no (413)', async () => {
    const f = await insp.post(`/api/inspections/${inspection.id}/findings`, { partId: 'pl-traction_motor_2', view: 'plan', x: 173, y: 0, defectType: 'traction_motor_other' });
    const png = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#888' } }).png().toBuffer();
    const form = new FormData();
    form.append('photo', new Blob([png], { type: 'application/octet-stream' }), '../../etc/passwd.png');
    const up = await insp.post(`/api/findings/${f.body.id}/photos`, form);
    expect(up.status).toBe(201);
    expect(up.body).toMatchObject({ contentType: 'image/png', width: 800, height: 600 });
    const thumb = await fetch(t.url + up.body.thumb, { headers: { cookie: insp.cookie } });
    expect(thumb.headers.get('content-type')).toBe('image/webp');
    const meta = await sharp(Buffer.from(await thumb.arrayBuffer())).metadata();
    expect(Math.max(meta.width!, meta.height!)).toBe(320);
    // The client's file name never becomes a path.
    expect(fs.existsSync(path.join(photoDir, 'etc'))).toBe(false);

    const gif = Buffer.from('R0lGODlhAQABAIAAAAAAAP///yH5BAEAAAAALAAAAAABAAEAAAIBRAA7', 'base64');
    const g = new FormData();
    g.append('photo', new Blob([gif], { type: 'image/jpeg' }), 'x.jpg');
    const rg = await insp.post(`/api/findings/${f.body.id}/photos`, g);
    expect(rg.status).toBe(415);
    expect(rg.body.error.message).toMatch(/JPEG, PNG or WebP/);
    const txt = new FormData();
    txt.append('photo', new Blob(['just text'], { type: 'image/png' }), 'x.png');
    expect((await insp.post(`/api/findings/${f.body.id}/photos`, txt)).status).toBe(415);
    const big = new FormData();
    big.append('photo', new Blob([Buffer.concat([png, Buffer.alloc(400 * 1024)])]), 'big.png');
    const rb = await insp.post(`/api/findings/${f.body.id}/photos`, big);
    expect(rb.status).toBe(413);
    expect(await count(t.db, 'photos')).toBe(1);
    const stored = fs.readdirSync(photoDir, { recursive: true }).filter((n) => String(n).match(/\.(png|webp|part)$/));
    expect(stored.length).toBe(2);
  });

  it('will not sign with open coverage, nor with a wrong password', async () => {
    const wrong = await insp.post(`/api/inspections/${inspection.id}/sign`, { password: 'not-mine' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.password).toBeTruthy();
    const open = await insp.post(`/api/inspections/${inspection.id}/sign`, { password: 'hoodline-demo' });
    expect(open.status).toBe(409);
    expect(open.body.error.message).toMatch(/no result and no reason/);
  });

  it('walks the routine, passes the rest, gives a reason for a gap, and signs', async () => {
    const cur = (await insp.get(`/api/inspections/${inspection.id}`)).body;
    const todo = cur.coverage.gaps.map((g: any) => g.instanceId);
    const [gap, ...rest] = todo;
    const na = await insp.post(`/api/inspections/${inspection.id}/coverage`, { instanceIds: [gap], state: 'not_applicable' });
    expect(na.status).toBe(400);
    const passed = await insp.post(`/api/inspections/${inspection.id}/coverage`, { instanceIds: rest, state: 'passed' });
    expect(passed.status).toBe(200);
    expect(passed.body.coverage.gaps.length).toBe(1);
    // Passing a part that has a live finding does not hide the finding.
    const again = await insp.post(`/api/inspections/${inspection.id}/coverage`, { instanceIds: ['traction_motor_3'], state: 'passed' });
    expect(again.body.items.find((i: any) => i.instanceId === 'traction_motor_3').state).toBe('finding');
    const g = await insp.post(`/api/inspections/${inspection.id}/coverage`, { instanceIds: [gap], state: 'gap', reason: 'Blocked by a fuel truck' });
    expect(g.body.coverage.complete).toBe(false);
    const signed = await insp.post(`/api/inspections/${inspection.id}/sign`, { password: 'hoodline-demo' });
    expect(signed.status).toBe(200);
    expect(signed.body.status).toBe('signed');
    expect(signed.body.signedAt).toBeTruthy();
  });

  it('refuses to sign twice, to add a finding to a signed record, or to change coverage; the database refuses an edit too', async () => {
    expect((await insp.post(`/api/inspections/${inspection.id}/sign`, { password: 'hoodline-demo' })).status).toBe(409);
    const f = await insp.post(`/api/inspections/${inspection.id}/findings`, { partId: 'pl-traction_motor_1', view: 'plan', x: 92, y: 0, defectType: 'traction_motor_other' });
    expect(f.status).toBe(409);
    expect((await insp.post(`/api/inspections/${inspection.id}/coverage`, { instanceIds: ['traction_motor_1'], state: 'gap', reason: 'x' })).status).toBe(409);
    await expect(t.pool.query(`update inspections set kind = 'periodic' where id = $1`, [inspection.id])).rejects.toThrow(/never changed/);
  });

  it('takes a correction as a new signed entry linked to the record', async () => {
    const c = await insp.post(`/api/inspections/${inspection.id}/corrections`, { note: 'The gap was the left battery box, not the right.', password: 'hoodline-demo' });
    expect(c.status).toBe(201);
    const rec = (await insp.get(`/api/inspections/${inspection.id}`)).body;
    expect(rec.corrections).toHaveLength(1);
    expect(rec.corrections[0].note).toMatch(/left battery box/);
    expect(rec.railroad.name).toBe('Hollins Ridge & Lakeshore Railroad');
  });

  it('uses the F end the inspector saw when it differs from the record, and tells the foreman and admin', async () => {
    const u = await unitByNumber(insp, 'HRL 4103'); // the record says long hood
    expect(u.frontEnd).toBe('long_hood');
    const r = await insp.post('/api/inspections', { unitId: u.id, kind: 'daily', frontEndSeen: 'short_hood' });
    expect(r.status).toBe(201);
    expect(r.body.frontEndSeen).toBe('short_hood');
    expect(r.body.frontEndRecorded).toBe('long_hood');
    expect(r.body.findings.map((f: any) => f.defectType)).toContain('front_marking_mismatch');
    const f = await insp.post(`/api/inspections/${r.body.id}/findings`, { partId: 'pl-traction_motor_1', view: 'plan', x: 92, y: -10, defectType: 'traction_motor_other' });
    // With the F seen on the short hood, traction_motor_1 is #1 and -y is left.
    expect(f.body.label).toBe('Left side, #1 traction motor');
    const admin = await t.as('admin');
    const got = await waitFor(async () => {
      const m = (await admin.get('/api/outbox/received')).body.items.filter((x: any) => /HRL 4103: F found/.test(x.subject));
      return m.length >= 2 && m;
    });
    const to = got.flatMap((m: any) => m.to);
    expect(to).toEqual(expect.arrayContaining(['foreman@demo.example', 'admin@demo.example']));
  });

  it('lists defect types for a part kind with their weight and rule', async () => {
    const r = await insp.get('/api/defect-types?partKind=pilot');
    expect(r.status).toBe(200);
    const h = r.body.items.find((d: any) => d.key === 'pilot_height_out_of_limit');
    expect(h).toMatchObject({ partKind: 'pilot', weight: 'federal', check: 'pilot_height' });
    expect(h.rule).toMatch(/229\.123/);
    expect((await insp.get('/api/defect-types?partKind=warp_core')).status).toBe(400);
  });

  it('serves the rule checks for other tools', async () => {
    const c = await t.as('engineer');
    const r = await c.post('/api/checks/chain_wear', { nominal: 0.5, measured: 0.41, unit: 'in' });
    expect(r.status).toBe(200);
    // 1 - (0.41/0.5)^2 = 0.3276: over 30 % (common practice (no source); the area formula is plain geometry).
    expect(r.body).toMatchObject({ result: 'fail' });
    expect(r.body.percentLost).toBeCloseTo(32.8, 1);
    const iv = await c.post('/api/checks/interval', { interval: 'annual', lastDone: '2025-01-01', on: '2026-01-04' });
    // 49 CFR 229.27: 368 days; 2025-01-01 + 368 = 2026-01-04, the last good day.
    expect(iv.body).toMatchObject({ result: 'pass', lastGoodDay: '2026-01-04' });
    expect((await c.post('/api/checks/nope', {})).status).toBe(400);
    expect((await c.post('/api/checks/pilot_height', { value: 'high', unit: 'ft' })).status).toBe(400);
  });
});
