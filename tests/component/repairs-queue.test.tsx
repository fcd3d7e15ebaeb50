// The repair queue screen with the API mocked at fetch: what it shows, how it sorts, what it asks the server.
// Expected order follows the product brief §1/§6 (non-complying units first, 49 CFR 229.9); weights read by
// shape and word as well as colour (brief §6b).
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { QueueItem } from '../../shared/api/repairs';
import RepairsScreen from '../../src/features/repairs';

type Reply = { status?: number; body?: unknown };
type Handler = (r: { url: URL; body: any }) => Reply | Promise<Reply>;

/** Answers fetch from a table of "METHOD /path" handlers and records every call. */
function mockApi(routes: Record<string, Handler>) {
  const calls: { method: string; path: string; search: URLSearchParams; body: any }[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      const method = init?.method ?? 'GET';
      const body = typeof init?.body === 'string' ? JSON.parse(init.body) : undefined;
      calls.push({ method, path: url.pathname, search: url.searchParams, body });
      const h = routes[`${method} ${url.pathname}`];
      const r: Reply = h ? await h({ url, body }) : { status: 404, body: { error: { code: 'not_found', message: `no mock for ${method} ${url.pathname}` } } };
      return new Response(r.body === undefined ? null : JSON.stringify(r.body), { status: r.status ?? 200, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return calls;
}
afterEach(() => {
  vi.unstubAllGlobals();
  vi.useRealTimers();
});

const YARD_A = '00000000-0000-4000-8000-0000000000a1';
const YARD_B = '00000000-0000-4000-8000-0000000000b2';
let n = 0;
const item = (over: Partial<QueueItem>): QueueItem => ({
  id: `00000000-0000-4000-8000-${String(++n).padStart(12, '0')}`,
  unitId: 'u-' + (over.roadNumber ?? 'HRL 1').replace(' ', ''),
  roadNumber: 'HRL 1',
  yardId: YARD_A,
  yardName: 'Marlow Yard',
  nonComplying: false,
  label: 'Left side, #2 traction motor',
  defectType: 'traction_motor_other',
  defectLabel: 'Traction motor: other',
  weight: 'shop',
  rule: null,
  state: 'open',
  assignedTo: null,
  assigneeName: null,
  createdAt: '2026-03-01T14:00:00.000Z',
  createdByName: 'Dana Okafor',
  ageDays: 3,
  version: 1,
  ...over,
});

// As the server orders them: non-complying units first, then federal, then oldest.
const QUEUE: QueueItem[] = [
  item({ roadNumber: 'HRL 4104', nonComplying: true, weight: 'federal', label: 'Front pilot', defectLabel: 'Pilot height above rail out of limit', rule: '49 CFR 229.123', ageDays: 1 }),
  item({ roadNumber: 'HRL 4104', nonComplying: true, weight: 'note', label: 'Right side, #1 sand box', defectLabel: 'Sand low', ageDays: 9, state: 'in_repair', assignedTo: 'p-ray', assigneeName: 'Ray Lindqvist' }),
  item({ roadNumber: 'HRL 2201', weight: 'shop', label: 'Left side, #2 traction motor', ageDays: 30, yardId: YARD_B, yardName: 'Bittern Junction' }),
  item({ roadNumber: 'HRL 1302', weight: 'note', label: 'Front headlight', defectLabel: 'Headlight dim', ageDays: 2 }),
];

const ME = { id: 'p-ray', email: 'foreman@demo.example', name: 'Ray Lindqvist', role: 'foreman', yardId: YARD_A };
function baseRoutes(items: QueueItem[] = QUEUE): Record<string, Handler> {
  return {
    'GET /api/auth/me': () => ({ body: ME }),
    'GET /api/settings': () => ({ body: { name: 'Test Railroad', reportingMark: 'TR', timeZone: 'America/Chicago' } }),
    'GET /api/yards': () => ({ body: { items: [ { id: YARD_A, code: 'MRL', name: 'Marlow Yard' }, { id: YARD_B, code: 'BTJ', name: 'Bittern Junction' } ] } }),
    'GET /api/units': () => ({ body: { items: [] } }),
    'GET /api/repairs': ({ url }) => ({ body: { items: items.filter((i) => !url.searchParams.get('yard') || i.yardId === url.searchParams.get('yard')) } }),
  };
}

function renderAt(path = '/repairs') {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route path="/repairs/*" element={<RepairsScreen />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

const rowTexts = () => screen.getAllByTestId('queue-row').map((r) => within(r).getAllByRole('cell')[1].textContent);
const rowUnits = () => screen.getAllByTestId('queue-row').map((r) => within(r).getAllByRole('cell')[0].textContent!.slice(0, 8));

describe('repair queue', () => {
  it('lists the findings, non-complying units first with a NON-COMPLYING badge, weights as shape and word', async () => {
    mockApi(baseRoutes());
    renderAt();
    expect(await screen.findByRole('heading', { level: 1, name: 'Repair queue' })).toBeInTheDocument();
    await waitFor(() => expect(screen.getAllByTestId('queue-row')).toHaveLength(4));
    expect(rowUnits()).toEqual(['HRL 4104', 'HRL 4104', 'HRL 2201', 'HRL 1302']);
    const rows = screen.getAllByTestId('queue-row');
    expect(within(rows[0]).getByText('NON-COMPLYING')).toBeInTheDocument();
    expect(within(rows[2]).queryByText('NON-COMPLYING')).toBeNull();
    // Federal: a filled diamond and the word; shop: a ring; note: a dot. Never colour alone.
    const fed = within(rows[0]).getByText('Federal').closest('[data-weight]')!;
    expect(fed.getAttribute('data-weight')).toBe('federal');
    expect(fed.querySelector('svg path')).not.toBeNull();
    expect(within(rows[2]).getByText('Shop').closest('[data-weight]')!.querySelector('circle')!.getAttribute('fill')).toBe('none');
    expect(within(rows[3]).getByText('Note').closest('[data-weight]')!.querySelector('circle')!.getAttribute('fill')).not.toBe('none');
    // Each finding opens its detail page.
    expect(within(rows[0]).getByRole('link', { name: /Front pilot/ })).toHaveAttribute('href', `/repairs/findings/${QUEUE[0].id}`);
    expect(screen.getByText(/4 findings · 1 non-complying unit first/)).toBeInTheDocument();
  });

  it('sorts by a column the user picks but keeps non-complying units on top', async () => {
    mockApi(baseRoutes());
    const user = userEvent.setup();
    renderAt();
    await waitFor(() => expect(screen.getAllByTestId('queue-row')).toHaveLength(4));
    const found = screen.getByRole('button', { name: /^Found/ });
    await user.click(found); // ages are numbers: the first click sorts oldest first
    const order = rowTexts();
    expect(rowUnits().slice(0, 2)).toEqual(['HRL 4104', 'HRL 4104']);
    // Within the non-complying group, 9 days before 1 day; below, 30 days before 2 days.
    expect(order[0]).toMatch(/sand box/);
    expect(order[2]).toMatch(/traction motor/);
    expect(found.closest('th')).toHaveAttribute('aria-sort', 'descending');
    await user.click(found);
    expect(rowTexts()[0]).toMatch(/Front pilot/);
    expect(rowTexts()[2]).toMatch(/headlight/);
    expect(found.closest('th')).toHaveAttribute('aria-sort', 'ascending');
  });

  it('sends the filters to the server, keeps them in the CSV link, and debounces the text search', { timeout: 15_000 }, async () => {
    const calls = mockApi(baseRoutes());
    const user = userEvent.setup();
    renderAt();
    await waitFor(() => expect(screen.getAllByTestId('queue-row')).toHaveLength(4));
    await user.selectOptions(screen.getByLabelText('Yard'), YARD_B);
    await waitFor(() => expect(screen.getAllByTestId('queue-row')).toHaveLength(1));
    expect(calls.some((c) => c.path === '/api/repairs' && c.search.get('yard') === YARD_B)).toBe(true);
    await user.selectOptions(screen.getByLabelText('Weight'), 'federal');
    expect(screen.getByRole('link', { name: 'Export CSV' })).toHaveAttribute('href', `/api/repairs.csv?yard=${YARD_B}&weight=federal`);
    const before = calls.filter((c) => c.path === '/api/repairs' && c.search.get('q')).length;
    await user.type(screen.getByLabelText('Search unit or part'), 'pilot');
    // The debounce timer fires outside any event; let it run inside act so React applies the navigation.
    await act(() => new Promise((r) => setTimeout(r, 450)));
    await waitFor(() => expect(calls.map((c) => c.path + '?' + c.search.toString())).toContain(`/api/repairs?yard=${YARD_B}&weight=federal&q=pilot`));
    // One request for the whole word, not one per key.
    expect(calls.filter((c) => c.path === '/api/repairs' && c.search.get('q')).length - before).toBe(1);
    expect(screen.getByRole('link', { name: 'Export CSV' }).getAttribute('href')).toContain('q=pilot');
  });

  it('flags a unit overdue on any interval of the due board wherever it appears in the queue', async () => {
    const r = baseRoutes();
    r['GET /api/due'] = () => ({ body: { on: '2026-03-04', timeZone: 'America/Chicago', items: [ { unitId: 'u-HRL2201', state: 'overdue' }, { unitId: 'u-HRL4104', state: 'due_soon' } ] } });
    mockApi(r);
    renderAt();
    await waitFor(() => expect(screen.getAllByTestId('queue-row')).toHaveLength(4));
    const rows = screen.getAllByTestId('queue-row');
    expect(await within(rows[2]).findByText('Intervals overdue')).toBeInTheDocument();
    expect(screen.getAllByText('Intervals overdue')).toHaveLength(1);
  });

  it('takes an inspector straight to the repairs waiting to be verified', async () => {
    const r = baseRoutes([...QUEUE, item({ roadNumber: 'HRL 2203', state: 'repaired', label: 'Front coupler' })]);
    r['GET /api/auth/me'] = () => ({ body: { ...ME, id: 'p-dana', name: 'Dana Okafor', role: 'inspector' } });
    const calls = mockApi(r);
    const user = userEvent.setup();
    renderAt();
    await user.click(await screen.findByRole('button', { name: 'Show the 1 repair waiting to be verified' }));
    await waitFor(() => expect(calls.some((c) => c.path === '/api/repairs' && c.search.get('state') === 'repaired')).toBe(true));
    expect(screen.getByLabelText('State')).toHaveValue('repaired');
    // Inspectors do not clear tags.
    expect(screen.queryByRole('heading', { name: 'Non-complying tags ready to clear' })).toBeNull();
  });

  it('says so when nothing is open, and when only the filters hide everything', async () => {
    mockApi(baseRoutes([]));
    renderAt();
    expect(await screen.findByText('No open findings — nothing to repair')).toBeInTheDocument();
    mockApi(baseRoutes([]));
    renderAt(`/repairs?yard=${YARD_A}`);
    expect(await screen.findByText('No findings match these filters')).toBeInTheDocument();
    await act(async () => {});
  });

  it('offers the foreman the tags ready to clear: tagged units with no federal finding needing work', async () => {
    const routes = baseRoutes();
    routes['GET /api/units'] = () => ({
      body: {
        items: [
          { id: 'u-HRL4104', roadNumber: 'HRL 4104', nonComplying: true },
          { id: 'u-HRL2204', roadNumber: 'HRL 2204', nonComplying: true },
        ],
      },
    });
    routes['POST /api/units/u-HRL2204/tag/clear'] = () => ({ body: { unitId: 'u-HRL2204', tagId: 't1', clearedBy: 'Ray Lindqvist', clearedAt: '2026-03-04T15:30:00.000Z' } });
    const calls = mockApi(routes);
    const user = userEvent.setup();
    renderAt();
    // HRL 4104 still has an open federal finding, so only HRL 2204 is offered.
    const btn = await screen.findByRole('button', { name: 'Clear the non-complying tag of HRL 2204' });
    expect(screen.queryByRole('button', { name: /tag of HRL 4104/ })).toBeNull();
    await user.click(btn);
    expect(await screen.findByText(/Tag of HRL 2204 cleared by Ray Lindqvist at 4 Mar 2026, 09:30/)).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'POST' && c.path === '/api/units/u-HRL2204/tag/clear')).toBe(true);
  });
});
