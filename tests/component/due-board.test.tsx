// The due board screen and its words. Day counting follows the product brief §5: a test done on day D with
// an interval of N days is good through D + N and overdue from D + N + 1; the daily inspection
// (49 CFR 229.21) is good through the calendar day it was done only.
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { dueItems, unitDueState, type DueUnitInput } from '../../shared/due/board';
import DueBoardScreen from '../../src/features/due-board';
import type { DueBoard, DueUnit } from '../../src/features/due-board/api/due';
import { civilDateWords, daysWords } from '../../src/features/due-board/lib/due-words';

afterEach(() => vi.unstubAllGlobals());

const ON = '2026-03-10';
const unitInput = (over: Partial<DueUnitInput> = {}): DueUnitInput => ({
  serviceState: 'in_service',
  conditionMonitoring: false,
  lastDailyOn: ON,
  lastPeriodicOn: '2026-01-01',
  lastCmCheckOn: null,
  lastAnnualOn: '2025-06-01',
  lastHandBrakeOn: '2025-06-01',
  lastMainReservoirOn: '2025-01-01',
  custom: [],
  ...over,
});
const item = (u: DueUnitInput, key: string) => dueItems(u, ON).find((i) => i.key === key)!;

describe('due words (calendar days, brief §5)', () => {
  it('periodic, 49 CFR 229.23(a): 92 days — good through D + 92, overdue the day after', () => {
    // 2025-12-08 + 92 days = 2026-03-10 (Dec 23 + Jan 31 + Feb 28 + Mar 10 = 92).
    expect(daysWords(item(unitInput({ lastPeriodicOn: '2025-12-08' }), 'periodic'))).toBe('last good day today');
    expect(daysWords(item(unitInput({ lastPeriodicOn: '2025-12-07' }), 'periodic'))).toBe('overdue by 1 day');
    expect(daysWords(item(unitInput({ lastPeriodicOn: '2025-12-09' }), 'periodic'))).toBe('1 day left');
    expect(daysWords(item(unitInput({ lastPeriodicOn: '2025-12-01' }), 'periodic'))).toBe('overdue by 7 days');
  });

  it('daily, 49 CFR 229.21: done today, due today the next day, then missed', () => {
    expect(daysWords(item(unitInput({ lastDailyOn: ON }), 'daily'))).toBe('done today');
    expect(daysWords(item(unitInput({ lastDailyOn: '2026-03-09' }), 'daily'))).toBe('due today');
    expect(daysWords(item(unitInput({ lastDailyOn: '2026-03-07' }), 'daily'))).toBe('last done 3 days ago');
  });

  it('says when no date is on record and when a stored unit needs no daily', () => {
    expect(daysWords(item(unitInput({ lastAnnualOn: null }), 'annual'))).toBe('no date on record');
    expect(daysWords(item(unitInput({ serviceState: 'stored', lastDailyOn: '2026-01-05' }), 'daily'))).toBe('last 2026-01-05');
  });

  it('reads a civil date as a calendar day, whatever the device’s zone', () => {
    const tz = process.env.TZ;
    try {
      // Ten hours behind UTC: midnight UTC of the 29th is still the 28th there.
      process.env.TZ = 'Pacific/Honolulu';
      expect(new Date(Date.UTC(2028, 1, 29)).getDate()).toBe(28);
      expect(civilDateWords('2028-02-29')).toBe('Tuesday, 29 February 2028');
    } finally {
      if (tz === undefined) delete process.env.TZ;
      else process.env.TZ = tz;
    }
  });
});

const row = (roadNumber: string, over: Partial<DueUnitInput> = {}, extra: Partial<DueUnit> = {}): DueUnit => {
  const items = dueItems(unitInput(over), ON);
  return { unitId: `u-${roadNumber.replace(' ', '')}`, roadNumber, unitTypeKey: 'six_axle_road', yardId: 'y1', yardName: 'Marlow Yard', serviceState: 'in_service', nonComplying: false, state: unitDueState(items), items, ...extra };
};

function mockDue(board: (url: URL) => DueBoard) {
  const calls: URL[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL) => {
      const url = new URL(String(input), 'http://localhost');
      calls.push(url);
      const body =
        url.pathname === '/api/due'
          ? board(url)
          : url.pathname === '/api/yards'
            ? { items: [ { id: 'y1', code: 'MRL', name: 'Marlow Yard' }, { id: 'y2', code: 'BTJ', name: 'Bittern Junction' } ] }
            : { error: { code: 'not_found', message: 'no mock' } };
      return new Response(JSON.stringify(body), { status: url.pathname === '/api/due' || url.pathname === '/api/yards' ? 200 : 404, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return calls;
}

function renderBoard(path = '/due') {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route path="/due/*" element={<DueBoardScreen />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('due board screen', () => {
  const units = [
    // Worst first, as the server sends them.
    row('HRL 4104', { lastPeriodicOn: '2025-12-05' }, { nonComplying: true }),
    row('HRL 2201', { lastAnnualOn: '2025-03-10' }),
    row('HRL 4102', { conditionMonitoring: true, lastPeriodicOn: '2026-01-01', lastCmCheckOn: '2026-02-20' }),
  ];

  it('shows the day and zone it is computed for, every item with a status word and days, overdue units flagged on top', async () => {
    mockDue(() => ({ on: ON, timeZone: 'America/Chicago', items: units }));
    renderBoard();
    expect(await screen.findByTestId('due-computed-for')).toHaveTextContent('Computed for Tuesday, 10 March 2026 in the railroad’s time zone, America/Chicago');
    const rows = screen.getAllByTestId('due-row');
    expect(rows.map((r) => r.getAttribute('data-unit'))).toEqual(['HRL 4104', 'HRL 2201', 'HRL 4102']);
    // HRL 4104: periodic 2025-12-05 + 92 = 2026-03-07, so overdue by 3 days on 2026-03-10 (49 CFR 229.23).
    const periodic = within(rows[0]).getAllByRole('cell').find((c) => c.getAttribute('data-item') === 'periodic')!;
    expect(periodic).toHaveTextContent('Overdue');
    expect(periodic).toHaveTextContent('overdue by 3 days');
    expect(within(rows[0]).getByText('Overdue on 1 item')).toBeInTheDocument();
    expect(within(rows[0]).getByTestId('due-nc')).toHaveTextContent('NON-COMPLYING');
    // HRL 2201: annual 2025-03-10 + 368 = 2026-03-13, three days left, inside the 7-day warning.
    const annual = within(rows[1]).getAllByRole('cell').find((c) => c.getAttribute('data-item') === 'annual')!;
    expect(annual).toHaveTextContent('Due soon');
    expect(annual).toHaveTextContent('3 days left');
    // The condition-monitored unit has a 33-day column (49 CFR 229.23(b)): 2026-02-20 + 33 = 2026-03-25.
    const cm = within(rows[2]).getAllByRole('cell').find((c) => c.getAttribute('data-item') === 'cm_33_day')!;
    expect(cm).toHaveTextContent('Good');
    expect(cm).toHaveTextContent('15 days left');
    expect(screen.getByTestId('due-summary')).toHaveTextContent('1 unit overdue on something');
    expect(screen.getByTestId('due-summary')).toHaveTextContent('1 due within 7 days');
    // Status never by colour alone: each mark has its own shape.
    expect(periodic.querySelector('[data-shape="overdue"]')).not.toBeNull();
    expect(annual.querySelector('[data-shape="due_soon"]')).not.toBeNull();
  });

  it('filters by yard and state through the server and exports exactly that', async () => {
    const calls = mockDue((url) => ({ on: url.searchParams.get('on') ?? ON, timeZone: 'America/Chicago', items: units.filter((u) => !url.searchParams.get('state') || u.state === url.searchParams.get('state')) }));
    const user = userEvent.setup();
    renderBoard();
    await waitFor(() => expect(screen.getAllByTestId('due-row')).toHaveLength(3));
    await user.selectOptions(screen.getByLabelText('Yard'), 'y2');
    await user.selectOptions(screen.getByLabelText('State'), 'overdue');
    await waitFor(() => expect(screen.getAllByTestId('due-row')).toHaveLength(1));
    expect(calls.some((u) => u.pathname === '/api/due' && u.search === '?yard=y2&state=overdue')).toBe(true);
    expect(screen.getByRole('link', { name: 'Export CSV' })).toHaveAttribute('href', '/api/due.csv?yard=y2&state=overdue');
  });
});
