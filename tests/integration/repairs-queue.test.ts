// GET /api/repairs pages and sorts on the server (real PostgreSQL). The order checked here is the product
// brief's: non-complying units first (a defective unit must be repaired or tagged before use, 49 CFR 229.9),
// then the column the person sorts by, then federal before shop before note and oldest first (product
// brief §1, §6), then the id as a last tiebreaker. The expected order is computed in the test from the raw
// rows, independently of the server's SQL; text compares by code point, as the test cluster's C.UTF-8
// collation does.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FINDING_WEIGHTS } from '../../shared/domain/states';
import { pinFinding, startTestApp, type Client, type TestApp } from './harness';

let t: TestApp;
let foreman: Client;
let inspector: Client;
// More than the 2000 rows the queue used to stop at, so nothing may be cut off silently.
const N = 2150;
const Q = 'Paging part';
let units: { id: string; roadNumber: string }[];
let people: Record<string, string>;

interface Raw {
  id: string;
  road: string;
  label: string;
  weight: string;
  state: string;
  assignee: string;
  ts: string;
  nc: boolean;
}

beforeAll(async () => {
  t = await startTestApp();
  foreman = await t.as('foreman');
  inspector = await t.as('inspector');
  const { finding } = await pinFinding(inspector, 'HRL 2201', { partId: 'pl-traction_motor_2', view: 'plan', x: 173, y: 0, defectType: 'traction_motor_other', note: 'Template' });
  units = (await t.pool.query('select id, road_number as "roadNumber" from units order by road_number')).rows;
  people = Object.fromEntries((await t.pool.query('select name, id from people')).rows.map((p) => [p.name, p.id]));
  const assignees = [people['Ray Lindqvist'], people['Mae Achterberg'], people['Dana Okafor'], null];
  // Weights, states, assignees and units cycle with different periods; found times repeat every 40
  // rows, so many rows tie on everything but the id and page boundaries fall inside ties.
  await t.pool.query(
    `insert into findings (inspection_id, unit_id, unit_type_key, part_id, instance_id, part_kind, view, body_x, body_y, body_z, front_along, front_left,
                           front_end, label, part_label, side, defect_type, weight, state, assigned_to, created_by, created_at)
     select f.inspection_id, u.id, u.unit_type_key, f.part_id, f.instance_id, f.part_kind, f.view, f.body_x, f.body_y, f.body_z, f.front_along, f.front_left,
            f.front_end, $2 || ' ' || lpad(g::text, 4, '0'), f.part_label, f.side, f.defect_type,
            (array['federal', 'shop', 'note'])[1 + g % 3],
            (array['open', 'in_repair', 'repaired'])[1 + (g / 3) % 3],
            case when (g / 3) % 3 = 0 then null else ($3::uuid[])[1 + (g / 7) % 4] end,
            f.created_by, timestamptz '2026-02-01 08:00:00.123456+00' - (g % 40) * interval '1 hour'
       from findings f, generate_series(1, $4::int) g, units u
      where f.id = $1 and u.id = ($5::uuid[])[1 + g % $6::int]`,
    [finding.id, Q, assignees, N, units.map((u) => u.id), units.length],
  );
  // Three units tagged non-complying: units[0] has open federal rows; units[1] and units[5] get only
  // shop (1 % 3) and note (5 % 3) rows, so their tags are ready to clear.
  await t.pool.query('update units set non_complying_since = now() where id = any($1)', [[units[0].id, units[1].id, units[5].id]]);
}, 60_000);
afterAll(() => t.close());

async function rawRows(): Promise<Raw[]> {
  return (
    await t.pool.query<Raw>(
      `select f.id, u.road_number as road, f.label, f.weight, f.state, coalesce(a.name, '') as assignee,
              to_char(f.created_at at time zone 'UTC', 'YYYY-MM-DD HH24:MI:SS.US') as ts, (u.non_complying_since is not null) as nc
         from findings f join units u on u.id = f.unit_id left join people a on a.id = f.assigned_to
        where f.state in ('open', 'in_repair', 'repaired') and f.label like $1 || '%'`,
      [Q],
    )
  ).rows;
}

const cmp = (a: string | number, b: string | number) => (a < b ? -1 : a > b ? 1 : 0);
const STATE_ORDER = ['open', 'in_repair', 'repaired', 'verified', 'voided'];
const COLUMN: Record<string, (r: Raw) => string | number> = {
  unit: (r) => r.road,
  finding: (r) => r.label,
  weight: (r) => FINDING_WEIGHTS.indexOf(r.weight as never),
  state: (r) => STATE_ORDER.indexOf(r.state),
  assignee: (r) => r.assignee,
  // Age descending is oldest first.
  age: (r) => r.ts,
};

function expectedOrder(rows: Raw[], sort?: string): string[] {
  const [col, dir] = (sort ?? '').split('.');
  const user = (a: Raw, b: Raw) => {
    if (!col) return 0;
    const c = cmp(COLUMN[col](a), COLUMN[col](b));
    // Age grows as the found time falls: "age ascending" is the newest first.
    return col === 'age' ? (dir === 'desc' ? c : -c) : dir === 'desc' ? -c : c;
  };
  return [...rows]
    .sort(
      (a, b) =>
        Number(b.nc) - Number(a.nc) ||
        user(a, b) ||
        FINDING_WEIGHTS.indexOf(a.weight as never) - FINDING_WEIGHTS.indexOf(b.weight as never) ||
        cmp(a.ts, b.ts) ||
        cmp(a.id, b.id),
    )
    .map((r) => r.id);
}

/** Follows nextCursor to the end; returns every page. */
async function allPages(query: string) {
  const pages: any[] = [];
  let cursor: string | null = null;
  do {
    const r: { status: number; body: any } = await foreman.get(`/api/repairs?${query}${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    pages.push(r.body);
    cursor = r.body.nextCursor;
  } while (cursor && pages.length < 200);
  return pages;
}

describe('repair queue pages and sorts on the server', () => {
  it.each([
    [undefined, 500],
    ['unit.asc', 100],
    ['assignee.desc', 37],
    ['age.desc', 250],
    ['finding.desc', 500],
  ])('returns each row exactly once in order, sort %s, %i a page', async (sort, limit) => {
    const expected = expectedOrder(await rawRows(), sort);
    expect(expected).toHaveLength(N);
    const pages = await allPages(`q=${encodeURIComponent(Q)}&limit=${limit}${sort ? `&sort=${sort}` : ''}`);
    expect(pages).toHaveLength(Math.ceil(N / limit));
    for (const [i, p] of pages.entries()) {
      expect(p.total).toBe(N);
      expect(p.items).toHaveLength(i < pages.length - 1 ? limit : N - limit * (pages.length - 1));
    }
    expect(pages.at(-1).nextCursor).toBeNull();
    const ids = pages.flatMap((p) => p.items.map((x: any) => x.id));
    expect(new Set(ids).size).toBe(N);
    expect(ids).toEqual(expected);
    // Non-complying units lead whatever the sort.
    const nc = pages.flatMap((p) => p.items.map((x: any) => x.nonComplying));
    expect(nc.indexOf(false)).toBe(nc.lastIndexOf(true) + 1);
  }, 60_000);

  it('pages 100 rows by default, with the filters applied on every page', async () => {
    const r = await foreman.get(`/api/repairs?q=${encodeURIComponent(Q)}&weight=federal&state=open`);
    expect(r.status).toBe(200);
    const raw = (await rawRows()).filter((x) => x.weight === 'federal' && x.state === 'open');
    expect(r.body.total).toBe(raw.length);
    expect(r.body.items).toHaveLength(100);
    expect(r.body.items.every((i: any) => i.weight === 'federal' && i.state === 'open')).toBe(true);
    expect(r.body.nextCursor).toEqual(expect.any(String));
    const all = await allPages(`q=${encodeURIComponent(Q)}&weight=federal&state=open&limit=100`);
    expect(all.flatMap((p) => p.items.map((x: any) => x.id))).toEqual(expectedOrder(raw));
  });

  it('neither repeats nor skips a row when findings are added or change between pages', async () => {
    const query = `q=${encodeURIComponent(Q)}&limit=300&sort=unit.asc`;
    const before = expectedOrder(await rawRows(), 'unit.asc');
    const first = (await foreman.get(`/api/repairs?${query}`)).body;
    // Meanwhile a row of the first page leaves the queue (counting by offset would skip one row) and a new
    // federal finding on a non-complying unit sorts onto the first page (by offset, one row twice).
    const gone = first.items[0].id;
    await t.pool.query(`update findings set state = 'voided', void_reason = 'test' where id = $1`, [gone]);
    const { finding } = await pinFinding(inspector, units[0].roadNumber, { partId: 'pl-pilot_sh', view: 'plan', x: 18, y: 0, defectType: 'pilot_height_out_of_limit', measurement: { value: 2.5, unit: 'in' } });
    await t.pool.query(`update findings set label = $2 || ' 9999' where id = $1`, [finding.id, Q]);
    const rest: string[] = [];
    let cursor = first.nextCursor;
    while (cursor) {
      const p = (await foreman.get(`/api/repairs?${query}&cursor=${encodeURIComponent(cursor)}`)).body;
      rest.push(...p.items.map((x: any) => x.id));
      cursor = p.nextCursor;
    }
    const seen = [...first.items.map((x: any) => x.id), ...rest];
    expect(seen).toEqual(before);
    await t.pool.query(`update findings set state = 'voided', void_reason = 'test row' where id = $1`, [finding.id]);
    await t.pool.query(`update findings set state = $2, void_reason = null where id = $1`, [gone, first.items[0].state]);
  });

  it('refuses a bad limit, sort or cursor with 400 and the one error shape', async () => {
    const cases: [string, string][] = [
      ['limit=0', 'limit'],
      ['limit=501', 'limit'],
      ['limit=ten', 'limit'],
      ['limit=2.5', 'limit'],
      ['sort=created_at.asc', 'sort'],
      ['sort=unit', 'sort'],
      ['sort=unit.asc;drop table findings', 'sort'],
      ['cursor=not-a-cursor', 'cursor'],
    ];
    for (const [query, field] of cases) {
      const r = await foreman.get(`/api/repairs?${query}`);
      expect(r.status, query).toBe(400);
      expect(r.body.error).toMatchObject({ code: 'validation', message: expect.any(String) });
      expect(Object.keys(r.body.error.fields), query).toContain(field);
    }
    expect((await foreman.get('/api/repairs?limit=500')).status).toBe(200);
    // A cursor belongs to its sort: handed to another sort it is refused, not misread.
    const c = (await foreman.get(`/api/repairs?q=${encodeURIComponent(Q)}&limit=5&sort=unit.asc`)).body.nextCursor;
    const other = await foreman.get(`/api/repairs?q=${encodeURIComponent(Q)}&limit=5&sort=age.desc&cursor=${encodeURIComponent(c)}`);
    expect(other.status).toBe(400);
    expect(other.body.error.fields.cursor).toMatch(/first page/);
    // A cursor whose values do not fit the keys is refused before any SQL sees them.
    const forged = Buffer.from(JSON.stringify({ s: 'unit.asc', k: [0, "x'; --", 0, 'not a time', 'nope'] })).toString('base64url');
    expect((await foreman.get(`/api/repairs?sort=unit.asc&cursor=${forged}`)).status).toBe(400);
    expect((await t.pool.query('select count(*)::int n from findings')).rows[0].n).toBeGreaterThan(N);
  });

  it('lists the assignees, the repairs waiting to be verified and the tags ready to clear whatever the filters', async () => {
    const holders = (await t.pool.query(`select distinct p.id, p.name from findings f join people p on p.id = f.assigned_to where f.state in ('open', 'in_repair', 'repaired')`)).rows;
    const waiting = (await t.pool.query(`select count(*)::int n from findings where state = 'repaired'`)).rows[0].n;
    expect(holders.length).toBeGreaterThanOrEqual(3);
    expect(waiting).toBeGreaterThan(100);
    const byName = [...holders].sort((a, b) => cmp(a.name, b.name));
    for (const query of ['', `assignee=${people['Ray Lindqvist']}`, 'state=open&weight=note', `unit=${units[3].id}&q=nothing-matches-this`]) {
      const r = await foreman.get(`/api/repairs?${query}`);
      expect(r.status).toBe(200);
      expect(r.body.assignees, query).toEqual(byName.map((p) => ({ id: p.id, name: p.name })));
      expect(r.body.toVerify, query).toBe(waiting);
      const ready = r.body.tagsToClear.map((x: any) => x.roadNumber);
      expect(ready, query).toEqual(expect.arrayContaining([units[1].roadNumber, units[5].roadNumber]));
      expect(ready, query).not.toContain(units[0].roadNumber);
    }
    const none = (await foreman.get(`/api/repairs?unit=${units[3].id}&q=nothing-matches-this`)).body;
    expect(none).toMatchObject({ items: [], total: 0, nextCursor: null });
  });

  it('exports every matching row as CSV, past any page size, in the sort asked for', async () => {
    const expected = expectedOrder(await rawRows(), 'finding.desc');
    const labels = new Map((await rawRows()).map((r) => [r.id, r.label]));
    const r = await foreman.get(`/api/repairs.csv?q=${encodeURIComponent(Q)}&sort=finding.desc&limit=10`);
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/text\/csv/);
    const lines = String(r.body).trim().split('\n');
    expect(lines[0]).toBe('Unit,Yard,Non-complying,Part,Defect,Weight,Rule,State,Assigned to,Found at,Found by,Age (days)');
    expect(lines).toHaveLength(N + 1);
    expect(lines.slice(1).map((l) => l.match(new RegExp(`${Q} \\d{4}`))?.[0])).toEqual(expected.map((id) => labels.get(id)));
    const bad = await foreman.get('/api/repairs.csv?sort=label.sideways');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.sort).toBeDefined();
  });

  it('matches the search words literally: %, _ and backslash are not wildcards, in the queue and the units roster', async () => {
    const total = (q: string) => foreman.get(`/api/repairs?q=${encodeURIComponent(q)}`).then((r) => r.body.total as number);
    const roster = (q: string) => foreman.get(`/api/units?q=${encodeURIComponent(q)}`).then((r) => (r.body.items as unknown[]).length);
    expect(await total(Q)).toBeGreaterThanOrEqual(N - 100); // earlier tests here move a few rows on
    // As wildcards these would match every row: no label or road number holds them.
    for (const q of ['%', '_', `${Q.replace(' ', '_')}`, '\\']) expect({ q, n: await total(q) }).toEqual({ q, n: 0 });
    expect(await total(`${Q} 000`)).toBeGreaterThan(0);
    expect(await roster('HRL 2201')).toBe(1);
    for (const q of ['%', 'HRL_2201', 'HRL%']) expect({ q, n: await roster(q) }).toEqual({ q, n: 0 });
  });
});
