// The repair queue screen with the API mocked at fetch: what it shows, which sort and page it asks the server
// for, how "Show more" adds the next page. The server sorts and pages (tests/integration/repairs-queue.test.ts
// checks its order: non-complying units first, product brief §1/§6 and 49 CFR 229.9); the mock here pages
// by position and sorts only as far as the screen's expectations need. Weights read by shape and word as
// well as colour (brief §6b).
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes, useLocation } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { QueueItem, QueuePage } from '../../shared/api/repairs';
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

const ASSIGNEES = [
  { id: 'p-mae', name: 'Mae Achterberg' },
  { id: 'p-ray', name: 'Ray Lindqvist' },
];
const SUMMARY: Pick<QueuePage, 'assignees' | 'toVerify' | 'tagsToClear'> = { assignees: ASSIGNEES, toVerify: 0, tagsToClear: [] };

/**
 * GET /api/repairs as a stand-in: filters by yard, state and text, sorts by age when asked (non-complying
 * first), pages by position with the server's default of 100, and answers the summary as given.
 */
function queueServer(items: QueueItem[], summary = SUMMARY): Handler {
  return ({ url }) => {
    const p = url.searchParams;
    let rows = items.filter((i) => (!p.get('yard') || i.yardId === p.get('yard')) && (!p.get('state') || i.state === p.get('state')) && (!p.get('q') || i.label.toLowerCase().includes(p.get('q')!)));
    const sort = p.get('sort');
    if (sort?.startsWith('age.')) rows = [...rows].sort((a, b) => Number(b.nonComplying) - Number(a.nonComplying) || (sort === 'age.desc' ? b.ageDays - a.ageDays : a.ageDays - b.ageDays));
    const from = Number(p.get('cursor') ?? 0);
    const limit = Number(p.get('limit') ?? 100);
    const page = rows.slice(from, from + limit);
    const body: QueuePage = { items: page, total: rows.length, nextCursor: from + limit < rows.length ? String(from + limit) : null, ...summary };
    return { body };
  };
}

const ME = { id: 'p-ray', email: 'foreman@demo.example', name: 'Ray Lindqvist', role: 'foreman', yardId: YARD_A };
function baseRoutes(items: QueueItem[] = QUEUE, summary = SUMMARY): Record<string, Handler> {
  return {
    'GET /api/auth/me': () => ({ body: ME }),
    'GET /api/settings': () => ({ body: { name: 'Test Railroad', reportingMark: 'TR', timeZone: 'America/Chicago' } }),
    'GET /api/yards': () => ({ body: { items: [ { id: YARD_A, code: 'MRL', name: 'Marlow Yard' }, { id: YARD_B, code: 'BTJ', name: 'Bittern Junction' } ] } }),
    'GET /api/units': () => ({ body: { items: [] } }),
    'GET /api/repairs': queueServer(items, summary),
  };
}

/** Shows the address the screen keeps its filters and sort in. */
function Address() {
  const l = useLocation();
  return <output data-testid="address">{l.pathname + l.search}</output>;
}

function renderAt(path = '/repairs') {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route
            path="/repairs/*"
            element={
              <>
                <RepairsScreen />
                <Address />
              </>
            }
          />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

// Cells by tag: role queries over hundreds of rows are slow in jsdom.
const rowTexts = () => screen.getAllByTestId('queue-row').map((r) => r.querySelectorAll('td')[1].textContent);
const rowUnits = () => screen.getAllByTestId('queue-row').map((r) => r.querySelectorAll('td')[0].textContent!.slice(0, 8));
const queueCalls = (calls: ReturnType<typeof mockApi>) => calls.filter((c) => c.path === '/api/repairs');
const address = () => new URL(screen.getByTestId('address').textContent!, 'http://localhost').searchParams;

/** `n` shop findings on ordinary units, as the server would order them (oldest first). */
const many = (n: number) => Array.from({ length: n }, (_, i) => item({ roadNumber: `HRL ${3000 + (i % 9)}`, label: `Walkway ${String(i + 1).padStart(3, '0')}`, ageDays: n - i }));

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
    expect(screen.getByText('4 findings · non-complying units first')).toBeInTheDocument();
    // Everything is on the one page: nothing more to show.
    expect(screen.queryByRole('button', { name: 'Show more' })).toBeNull();
  });

  it('asks the server to sort by the column picked, keeps the sort in the address, and shows the rows as they come', async () => {
    const calls = mockApi(baseRoutes());
    const user = userEvent.setup();
    renderAt();
    await waitFor(() => expect(screen.getAllByTestId('queue-row')).toHaveLength(4));
    expect(queueCalls(calls).every((c) => !c.search.has('sort'))).toBe(true);
    const found = screen.getByRole('button', { name: /^Found/ });
    await user.click(found); // ages: the first tap puts the oldest first
    await waitFor(() => expect(queueCalls(calls).at(-1)!.search.get('sort')).toBe('age.desc'));
    expect(address().get('sort')).toBe('age.desc');
    expect(found.closest('th')).toHaveAttribute('aria-sort', 'descending');
    // The server keeps non-complying units on top: 9 days before 1 day, then 30 days before 2 days.
    await waitFor(() => expect(rowTexts()[0]).toMatch(/sand box/));
    expect(rowTexts()[2]).toMatch(/traction motor/);
    expect(screen.getByRole('link', { name: 'Export CSV' })).toHaveAttribute('href', '/api/repairs.csv?sort=age.desc');
    await user.click(found);
    await waitFor(() => expect(queueCalls(calls).at(-1)!.search.get('sort')).toBe('age.asc'));
    expect(found.closest('th')).toHaveAttribute('aria-sort', 'ascending');
    await waitFor(() => expect(rowTexts()[0]).toMatch(/Front pilot/));
    expect(rowTexts()[2]).toMatch(/headlight/);
    // A third tap goes back to the queue's own order.
    await user.click(found);
    await waitFor(() => expect(address().has('sort')).toBe(false));
    expect(found.closest('th')).toHaveAttribute('aria-sort', 'none');
    // Sorting is the server's: the table never reorders the rows it was given.
    expect(rowTexts()[0]).toMatch(/Front pilot/);
    expect(rowTexts()[1]).toMatch(/sand box/);
  });

  it('takes the sort from the address, and ignores one the server does not know', async () => {
    const calls = mockApi(baseRoutes());
    renderAt(`/repairs?sort=unit.asc&yard=${YARD_A}`);
    await waitFor(() => expect(screen.getAllByTestId('queue-row').length).toBeGreaterThan(0));
    expect(queueCalls(calls).map((c) => c.search.toString())).toEqual([`yard=${YARD_A}&sort=unit.asc`]);
    expect(screen.getByRole('button', { name: /^Unit/ }).closest('th')).toHaveAttribute('aria-sort', 'ascending');
    const calls2 = mockApi(baseRoutes());
    renderAt('/repairs?sort=created_at.sideways');
    await waitFor(() => expect(queueCalls(calls2)).toHaveLength(1));
    expect(queueCalls(calls2)[0].search.has('sort')).toBe(false);
  });

  it('shows 100 of a long queue and adds the next page with "Show more", by mouse or keyboard', { timeout: 30_000 }, async () => {
    const rows = many(250);
    const calls = mockApi(baseRoutes(rows));
    const user = userEvent.setup();
    renderAt();
    expect(await screen.findByText('Showing 100 of 250 findings')).toBeInTheDocument();
    expect(screen.getAllByTestId('queue-row')).toHaveLength(100);
    // By text, not by role: role queries over hundreds of rows are slow in jsdom. A real button (keyboard
    // reachable), with a big target (the btn class is min-h-12, 48 px), next to how many are left.
    const more = screen.getByText('Show more');
    expect(more.tagName).toBe('BUTTON');
    expect(more).toHaveClass('btn');
    expect(screen.getByText('150 more findings')).toBeInTheDocument();
    await user.click(more);
    expect(await screen.findByText('Showing 200 of 250 findings')).toBeInTheDocument();
    expect(queueCalls(calls).at(-1)!.search.get('cursor')).toBe('100');
    // Keyboard: focus the button and press Enter.
    screen.getByText('Show more').focus();
    await user.keyboard('{Enter}');
    expect(await screen.findByText('250 findings')).toBeInTheDocument();
    expect(screen.getAllByTestId('queue-row')).toHaveLength(250);
    expect(rowTexts().slice(98, 102)).toEqual(rows.slice(98, 102).map((r) => expect.stringContaining(r.label)));
    expect(new Set(rowTexts()).size).toBe(250);
    expect(screen.queryByText('Show more')).toBeNull();
    // The CSV is every row matching, not only the pages shown.
    expect(screen.getByText('Export CSV')).toHaveAttribute('href', '/api/repairs.csv');
  });

  it('keeps the rows shown and says so when the next page cannot be loaded', { timeout: 15_000 }, async () => {
    const r = baseRoutes(many(150));
    const page = r['GET /api/repairs'];
    r['GET /api/repairs'] = (req) => (req.url.searchParams.get('cursor') ? { status: 500, body: { error: { code: 'internal', message: 'Something went wrong on the server' } } } : page(req));
    mockApi(r);
    const user = userEvent.setup();
    renderAt();
    await user.click(await screen.findByRole('button', { name: 'Show more' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('More of the queue could not be loaded: Something went wrong on the server');
    expect(screen.getAllByTestId('queue-row')).toHaveLength(100);
    expect(screen.getByRole('button', { name: 'Show more' })).toBeEnabled();
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

  it('offers everyone with work in the queue as "assigned to" from the answer itself, with no second fetch', async () => {
    const calls = mockApi(baseRoutes());
    renderAt(`/repairs?yard=${YARD_B}`);
    await waitFor(() => expect(screen.getAllByTestId('queue-row')).toHaveLength(1));
    const picker = screen.getByLabelText('Assigned to');
    expect(within(picker).getAllByRole('option').map((o) => o.textContent)).toEqual(['Anyone', 'Mae Achterberg', 'Ray Lindqvist']);
    // Every queue request carried the filter: none fetched the whole queue for the names.
    expect(queueCalls(calls).length).toBeGreaterThan(0);
    expect(queueCalls(calls).every((c) => c.search.get('yard') === YARD_B)).toBe(true);
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

  it('takes an inspector straight to the repairs waiting to be verified, counted by the server', async () => {
    const r = baseRoutes([...QUEUE, item({ roadNumber: 'HRL 2203', state: 'repaired', label: 'Front coupler' })], { ...SUMMARY, toVerify: 7 });
    r['GET /api/auth/me'] = () => ({ body: { ...ME, id: 'p-dana', name: 'Dana Okafor', role: 'inspector' } });
    const calls = mockApi(r);
    const user = userEvent.setup();
    renderAt();
    await user.click(await screen.findByRole('button', { name: 'Show the 7 repairs waiting to be verified' }));
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

  it('says so when the queue cannot be loaded', async () => {
    const r = baseRoutes();
    r['GET /api/repairs'] = () => ({ status: 400, body: { error: { code: 'validation', message: 'The query is not valid' } } });
    mockApi(r);
    renderAt();
    expect(await screen.findByRole('alert')).toHaveTextContent('The queue could not be loaded: The query is not valid');
  });

  it('offers the foreman the tags ready to clear as the server lists them, and confirms who cleared one', async () => {
    const routes = baseRoutes(QUEUE, { ...SUMMARY, tagsToClear: [{ unitId: 'u-HRL2204', roadNumber: 'HRL 2204' }] });
    routes['POST /api/units/u-HRL2204/tag/clear'] = () => ({ body: { unitId: 'u-HRL2204', tagId: 't1', clearedBy: 'Ray Lindqvist', clearedAt: '2026-03-04T15:30:00.000Z' } });
    const calls = mockApi(routes);
    const user = userEvent.setup();
    renderAt();
    const btn = await screen.findByRole('button', { name: 'Clear the non-complying tag of HRL 2204' });
    expect(screen.queryByRole('button', { name: /tag of HRL 4104/ })).toBeNull();
    await user.click(btn);
    expect(await screen.findByText(/Tag of HRL 2204 cleared by Ray Lindqvist at 4 Mar 2026, 09:30/)).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'POST' && c.path === '/api/units/u-HRL2204/tag/clear')).toBe(true);
  });
});
