// The units roster with the API answered at fetch: what it asks GET /api/units for each filter, what it
// shows, and how it marks units. Sources of the expectations: product brief §3 (the F end names the
// front), §6 (screen words), §6b (a weight or state reads by shape and word, blue kept for the
// blue-signal caution); non-complying units are listed first because they may move only as
// 49 CFR 229.9 allows; "overdue" is the due board's own state (49 CFR 229.21/229.23/229.27 intervals,
// computed by the server, not here).
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes, useLocation } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { UnitRow } from '../../shared/api/units';
import UnitsScreen from '../../src/features/units';

type Reply = { status?: number; body?: unknown };
type Handler = (url: URL) => Reply;

/** Answers fetch from "METHOD /path" handlers and records every request. */
function mockApi(routes: Record<string, Handler>) {
  const calls: URL[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      calls.push(url);
      const h = routes[`${init?.method ?? 'GET'} ${url.pathname}`];
      const r: Reply = h ? h(url) : { status: 404, body: { error: { code: 'not_found', message: `no mock for ${url.pathname}` } } };
      return new Response(JSON.stringify(r.body ?? null), { status: r.status ?? 200, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return calls;
}
afterEach(() => vi.unstubAllGlobals());

const MARLOW = '00000000-0000-4000-8000-0000000000a1';
const BITTERN = '00000000-0000-4000-8000-0000000000b2';
const TYPES = [
  { key: 'six_axle_road', name: 'Six-axle road unit, cab on short hood', lengthIn: 850, widthIn: 123, axleCount: 6, views: [] },
  { key: 'four_axle_switcher', name: 'Four-axle end-cab yard switcher', lengthIn: 530, widthIn: 120, axleCount: 4, views: [] },
];
let n = 0;
const unit = (over: Partial<UnitRow>): UnitRow => ({
  id: `00000000-0000-4000-8000-${String(++n).padStart(12, '0')}`,
  roadNumber: 'TR 1',
  unitTypeKey: 'six_axle_road',
  unitTypeName: TYPES[0].name,
  frontEnd: 'short_hood',
  yardId: MARLOW,
  yardName: 'Marlow Yard',
  serviceState: 'in_service',
  nonComplying: false,
  nonComplyingSince: null,
  conditionMonitoring: false,
  humpStencilled: false,
  lastPeriodicOn: null,
  lastAnnualOn: null,
  lastHandBrakeOn: null,
  lastMainReservoirOn: null,
  lastCmCheckOn: null,
  openFindings: 0,
  version: 1,
  ...over,
});

// In the server's order: non-complying first, then by road number.
const UNITS: UnitRow[] = [
  unit({ roadNumber: 'TR 4105', frontEnd: 'long_hood', yardId: BITTERN, yardName: 'Bittern Junction', nonComplying: true, nonComplyingSince: '2026-11-30T13:00:00Z', openFindings: 3 }),
  unit({ roadNumber: 'TR 1301', unitTypeKey: 'four_axle_switcher', unitTypeName: TYPES[1].name, openFindings: 0 }),
  unit({ roadNumber: 'TR 1302', unitTypeKey: 'four_axle_switcher', unitTypeName: TYPES[1].name, frontEnd: 'long_hood', serviceState: 'stored' }),
  unit({ roadNumber: 'TR 4101', openFindings: 1 }),
  unit({ roadNumber: 'TR 4103', frontEnd: 'long_hood', serviceState: 'out_of_service' }),
];

/** The server's filter (server/modules/units/repository.ts), reimplemented so the screen can be judged on what it asks. */
function serverFilter(url: URL): UnitRow[] {
  const p = url.searchParams;
  return UNITS.filter(
    (u) =>
      (!p.get('q') || u.roadNumber.toLowerCase().includes(p.get('q')!.toLowerCase())) &&
      (!p.get('yard') || u.yardId === p.get('yard')) &&
      (!p.get('type') || u.unitTypeKey === p.get('type')) &&
      (!p.get('frontEnd') || u.frontEnd === p.get('frontEnd')) &&
      (!p.get('state') || (p.get('state') === 'non_complying' ? u.nonComplying : u.serviceState === p.get('state'))),
  );
}

const dueRow = (u: UnitRow, state: 'overdue' | 'due_soon' | 'good') => ({ unitId: u.id, roadNumber: u.roadNumber, yardName: u.yardName, nonComplying: u.nonComplying, state, items: [] });

function routes(): Record<string, Handler> {
  return {
    'GET /api/auth/me': () => ({ body: { id: 'p1', email: 'engineer@demo.example', name: 'Sam Engineer', role: 'engineer', yardId: null } }),
    'GET /api/yards': () => ({ body: { items: [{ id: BITTERN, code: 'BTJ', name: 'Bittern Junction' }, { id: MARLOW, code: 'MRL', name: 'Marlow Yard' }] } }),
    'GET /api/unit-types': () => ({ body: { items: TYPES } }),
    'GET /api/units': (url) => ({ body: { items: serverFilter(url) } }),
    // TR 1301 is overdue (e.g. its main reservoir test); TR 4101 only has its daily due today.
    'GET /api/due': () => ({ body: { on: '2026-12-01', timeZone: 'America/Chicago', items: [dueRow(UNITS[1], 'overdue'), dueRow(UNITS[3], 'due_soon'), dueRow(UNITS[0], 'good')] } }),
  };
}

function Where() {
  const l = useLocation();
  return <output data-testid="where">{l.pathname + l.search}</output>;
}

function setup(path = '/units') {
  const calls = mockApi(routes());
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route path="/units/*" element={<UnitsScreen />} />
        </Routes>
        <Where />
      </MemoryRouter>
    </QueryClientProvider>,
  );
  return { calls, user: userEvent.setup() };
}

/** Road numbers in the table, top to bottom. */
const tableUnits = () =>
  within(screen.getByRole('table', { name: 'Units' }))
    .getAllByRole('row')
    .slice(1)
    .map((r) => within(r).getByRole('rowheader').textContent);
const lastUnitsQuery = (calls: URL[]) => calls.filter((c) => c.pathname === '/api/units').at(-1)!.searchParams;

describe('units roster', () => {
  it('lists every unit in the server’s order with type, F end, yard, state and open findings', async () => {
    setup();
    await waitFor(() => expect(tableUnits()).toEqual(['TR 4105', 'TR 1301', 'TR 1302', 'TR 4101', 'TR 4103']));
    const row = screen.getByRole('table', { name: 'Units' }).querySelector('[data-unit="TR 4105"]') as HTMLElement;
    expect(row).toHaveTextContent('Six-axle road unit, cab on short hood');
    expect(row).toHaveTextContent('F on long hood');
    expect(row.querySelector('svg[data-front-end="long_hood"]')).not.toBeNull();
    expect(row).toHaveTextContent('Bittern Junction');
    expect(row).toHaveTextContent('In service');
    expect(row).toHaveTextContent('3 open findings');
    expect(screen.getByTestId('roster-count')).toHaveTextContent('5 units · 1 non-complying, listed first');
    // Each road number is a link to the unit page, so the roster is walked with Tab and opened with Enter.
    expect(within(row).getByRole('link', { name: 'TR 4105' })).toHaveAttribute('href', `/units/${UNITS[0].id}`);
  });

  it('marks a non-complying unit by shape and word in deep red, never in blue (brief §6b)', async () => {
    setup();
    await waitFor(() => expect(tableUnits()).toHaveLength(5));
    const table = screen.getByRole('table', { name: 'Units' });
    const flags = table.querySelectorAll('[data-flag="non-complying"]');
    expect(flags).toHaveLength(1);
    const flag = flags[0] as HTMLElement;
    expect(flag.closest('[data-unit]')).toHaveAttribute('data-unit', 'TR 4105');
    expect(flag).toHaveTextContent('NON-COMPLYING');
    expect(flag.querySelector('svg path')).not.toBeNull(); // the diamond
    expect(flag.className).toMatch(/\bbg-federal\b/);
    expect(flag.outerHTML).not.toMatch(/bluesignal/);
  });

  it('flags a unit the due board has overdue, and not one that is merely due soon', async () => {
    setup();
    await waitFor(() => expect(screen.getByRole('table', { name: 'Units' }).querySelectorAll('[data-flag="overdue"]')).toHaveLength(1));
    const flag = screen.getByRole('table', { name: 'Units' }).querySelector('[data-flag="overdue"]')!;
    expect(flag.closest('[data-unit]')).toHaveAttribute('data-unit', 'TR 1301');
    expect(flag).toHaveTextContent('OVERDUE');
    expect(screen.getByTestId('roster-count')).toHaveTextContent('1 overdue on the due board');
  });

  it('searches by road number: the query goes to the server and the URL keeps it', async () => {
    const { calls, user } = setup();
    await waitFor(() => expect(tableUnits()).toHaveLength(5));
    await user.type(screen.getByLabelText('Road number'), '410');
    await waitFor(() => expect(tableUnits()).toEqual(['TR 4105', 'TR 4101', 'TR 4103']));
    expect(lastUnitsQuery(calls).get('q')).toBe('410');
    expect(screen.getByTestId('where')).toHaveTextContent('/units?q=410');
    expect(screen.getByTestId('roster-count')).toHaveTextContent('3 units match');
  });

  it('filters by yard, unit type, F end and state, each sent as the API spells it', async () => {
    const { calls, user } = setup();
    await waitFor(() => expect(tableUnits()).toHaveLength(5));

    await user.selectOptions(screen.getByLabelText('Yard'), 'Marlow Yard');
    await waitFor(() => expect(tableUnits()).toEqual(['TR 1301', 'TR 1302', 'TR 4101', 'TR 4103']));
    expect(lastUnitsQuery(calls).get('yard')).toBe(MARLOW);

    await user.selectOptions(screen.getByLabelText('F end'), 'F on long hood');
    await waitFor(() => expect(tableUnits()).toEqual(['TR 1302', 'TR 4103']));
    expect(lastUnitsQuery(calls).get('frontEnd')).toBe('long_hood');

    await user.selectOptions(screen.getByLabelText('Unit type'), 'Four-axle end-cab yard switcher');
    await waitFor(() => expect(tableUnits()).toEqual(['TR 1302']));
    expect(lastUnitsQuery(calls).get('type')).toBe('four_axle_switcher');

    await user.selectOptions(screen.getByLabelText('Unit type'), 'All types');
    await user.selectOptions(screen.getByLabelText('State'), 'Out of service');
    await waitFor(() => expect(tableUnits()).toEqual(['TR 4103']));
    const q = lastUnitsQuery(calls);
    expect(q.get('state')).toBe('out_of_service');
    expect(q.has('type')).toBe(false);
  });

  it('filters to non-complying units with the state filter', async () => {
    const { calls, user } = setup();
    await waitFor(() => expect(tableUnits()).toHaveLength(5));
    await user.selectOptions(screen.getByLabelText('State'), 'Non-complying');
    await waitFor(() => expect(tableUnits()).toEqual(['TR 4105']));
    expect(lastUnitsQuery(calls).get('state')).toBe('non_complying');
  });

  it('says so when nothing matches and clears every filter in one go', async () => {
    const { user } = setup('/units?yard=' + BITTERN + '&frontEnd=short_hood');
    await waitFor(() => expect(screen.getByText('No unit matches these filters')).toBeInTheDocument());
    expect(screen.queryByRole('table', { name: 'Units' })).toBeNull();
    expect(screen.getByLabelText('Yard')).toHaveValue(BITTERN);
    const clear = screen.getAllByRole('button', { name: 'Clear filters' });
    await user.click(clear[clear.length - 1]);
    await waitFor(() => expect(tableUnits()).toHaveLength(5));
    expect(screen.getByTestId('where')).toHaveTextContent(/^\/units$/);
    expect(screen.getByLabelText('Yard')).toHaveValue('');
  });

  it('ignores a hand-edited link with a value the API would refuse', async () => {
    const { calls } = setup('/units?frontEnd=sideways&state=parked&q=41');
    await waitFor(() => expect(tableUnits()).toEqual(['TR 4105', 'TR 4101', 'TR 4103']));
    const q = lastUnitsQuery(calls);
    expect([...q.keys()]).toEqual(['q']);
  });

  it('has a card per unit for phones, each card one link', async () => {
    setup();
    await waitFor(() => expect(tableUnits()).toHaveLength(5));
    const cards = within(screen.getByRole('list', { name: 'Units' })).getAllByRole('link');
    expect(cards.map((c) => c.getAttribute('href'))).toEqual(UNITS.map((u) => `/units/${u.id}`));
    expect(cards[0]).toHaveTextContent('TR 4105');
    expect(cards[0]).toHaveTextContent('NON-COMPLYING');
    expect(cards[0]).toHaveTextContent('F on long hood');
  });
});
