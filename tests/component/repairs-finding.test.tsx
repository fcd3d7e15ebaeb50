// The finding page with the API mocked at fetch. Which actions are offered follows the role table of the
// product brief §2 and the transitions of §6 (shared/repairs/transitions.ts); every change carries the
// version it was based on, and a stale one (409 'stale') is answered with the server's words and a reload.
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { FindingDetail } from '../../src/features/repairs/api/finding';
import RepairsScreen from '../../src/features/repairs';

type Reply = { status?: number; body?: unknown };
type Handler = (r: { url: URL; body: any }) => Reply | Promise<Reply>;

function mockApi(routes: Record<string, Handler>) {
  const calls: { method: string; path: string; body: any }[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      const method = init?.method ?? 'GET';
      const body = typeof init?.body === 'string' ? JSON.parse(init.body) : undefined;
      calls.push({ method, path: url.pathname, body });
      const h = routes[`${method} ${url.pathname}`];
      const r: Reply = h ? await h({ url, body }) : { status: 404, body: { error: { code: 'not_found', message: `no mock for ${method} ${url.pathname}` } } };
      return new Response(r.body === undefined ? null : JSON.stringify(r.body), { status: r.status ?? 200, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return calls;
}
afterEach(() => vi.unstubAllGlobals());

const FID = '00000000-0000-4000-8000-00000000f001';
const UNIT = '00000000-0000-4000-8000-0000000000u1'.replace('u', 'a');
const PEOPLE = {
  inspector: { id: 'p-dana', email: 'inspector@demo.example', name: 'Dana Okafor', role: 'inspector', yardId: null },
  foreman: { id: 'p-ray', email: 'foreman@demo.example', name: 'Ray Lindqvist', role: 'foreman', yardId: null },
  engineer: { id: 'p-priya', email: 'engineer@demo.example', name: 'Priya Raman', role: 'engineer', yardId: null },
} as const;

const created = { id: 'e1', kind: 'created', fromState: null, toState: 'open', at: '2026-03-02T13:05:00.000Z', actor: 'Dana Okafor', details: null } as const;
const finding = (over: Partial<FindingDetail> = {}): FindingDetail => ({
  id: FID,
  unitId: UNIT,
  roadNumber: 'HRL 4104',
  inspectionId: 'i1',
  label: 'Front pilot',
  partLabel: 'Front pilot',
  defectType: 'pilot_height_out_of_limit',
  defectLabel: 'Pilot height above rail out of limit',
  weight: 'federal',
  rule: '49 CFR 229.123',
  measurement: { value: 2.5, unit: 'in', inches: 2.5 },
  checkResult: { result: 'fail', limit: '3 in to 6 in above the top of rail', source: '49 CFR 229.123(a)' },
  note: null,
  state: 'open',
  voidReason: null,
  assignedTo: null,
  assigneeName: null,
  createdByName: 'Dana Okafor',
  createdAt: '2026-03-02T13:05:00.000Z',
  version: 1,
  events: [created],
  photos: [],
  ...over,
});

function routes(role: keyof typeof PEOPLE, f: FindingDetail | (() => FindingDetail), tag?: unknown): Record<string, Handler> {
  return {
    'GET /api/auth/me': () => ({ body: PEOPLE[role] }),
    'GET /api/settings': () => ({ body: { name: 'Test Railroad', reportingMark: 'TR', timeZone: 'America/Chicago' } }),
    'GET /api/repairs': () => ({ body: { items: [], total: 0, nextCursor: null, assignees: [], toVerify: 0, tagsToClear: [] } }),
    [`GET /api/findings/${FID}`]: () => ({ body: typeof f === 'function' ? f() : f }),
    [`GET /api/units/${UNIT}/tag`]: () => ({
      body: tag ?? {
        open: true,
        railroad: { name: 'Test', reportingMark: 'TR', timeZone: 'America/Chicago' },
        unit: { id: UNIT, roadNumber: 'HRL 4104', yardName: 'Bittern Junction' },
        tag: { id: 't1', openedAt: '2026-03-02T13:05:00.000Z', openedBy: 'Dana Okafor', place: null, destination: null, restrictions: null },
        defects: [{ id: FID, label: 'Front pilot', defect: 'Pilot height', rule: '49 CFR 229.123', createdAt: '2026-03-02T13:05:00.000Z', state: 'open' }],
      },
    }),
    [`GET /api/units/${UNIT}/history`]: () => ({ body: { items: [] } }),
  };
}

function renderFinding() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[`/repairs/findings/${FID}`]}>
        <Routes>
          <Route path="/repairs/*" element={<RepairsScreen />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

const actions = async () => within(await screen.findByRole('group', { name: 'Actions' })).getAllByRole('button').map((b) => b.textContent);

describe('finding page', () => {
  it('shows what was found, the reading against its limit, and the history with who and when (in the railroad’s zone)', async () => {
    mockApi(routes('engineer', finding({ events: [{ id: 'e2', kind: 'assigned', fromState: 'open', toState: 'in_repair', at: '2026-03-02T15:00:00.000Z', actor: 'Ray Lindqvist', details: { assigneeId: 'p-ray', assigneeName: 'Ray Lindqvist' } }, created] })));
    renderFinding();
    expect(await screen.findByRole('heading', { level: 1, name: 'Front pilot' })).toBeInTheDocument();
    expect(screen.getByText(/2.5 in — limit 3 in to 6 in above the top of rail \(49 CFR 229.123\(a\)\)/)).toBeInTheDocument();
    const events = within(screen.getByRole('list', { name: 'Events, newest first' })).getAllByRole('listitem');
    expect(events.map((e) => e.textContent)).toEqual([
      // 15:00 UTC is 09:00 in Chicago in early March (CST, UTC−6).
      expect.stringMatching(/Ray Lindqvist · 2 Mar 2026, 09:00.*Assigned it to Ray Lindqvist/),
      expect.stringMatching(/Dana Okafor · 2 Mar 2026, 07:05.*Pinned the finding/),
    ]);
    // Engineers read records and change none (brief §2).
    expect(screen.queryByRole('group', { name: 'Actions' })).toBeNull();
    expect(await screen.findByText(/tagged non-complying/)).toBeInTheDocument();
  });

  it('offers each role only what the state machine allows', async () => {
    mockApi(routes('foreman', finding({ state: 'open' })));
    renderFinding();
    expect(await actions()).toEqual(['Assign', 'Record the repair', 'Void (entered in error)']);
  });

  it('offers the inspector verify and send back on a repaired finding, and not to whoever recorded the repair', async () => {
    const repaired = { id: 'e3', kind: 'repaired', fromState: 'in_repair', toState: 'repaired', at: '2026-03-03T10:00:00.000Z', actor: 'Ray Lindqvist', details: { whatDone: 'Reset pilot' } } as const;
    mockApi(routes('inspector', finding({ state: 'repaired', version: 3, events: [repaired, created] })));
    const first = renderFinding();
    expect(await actions()).toEqual(['Verify the repair', 'Send back', 'Void (entered in error)']);
    first.unmount();
    mockApi(routes('foreman', finding({ state: 'repaired', version: 3, events: [repaired, created] })));
    renderFinding();
    expect(await actions()).toEqual(['Void (entered in error)']);
    expect(screen.getByText('You recorded this repair, so someone else verifies it.')).toBeInTheDocument();
  });

  it('records a repair with the version it was based on, behind the blue-signal caution, and checks the words first', async () => {
    let current = finding({ state: 'in_repair', version: 2, assignedTo: 'p-ray', assigneeName: 'Ray Lindqvist' });
    const r = routes('foreman', () => current);
    r[`POST /api/findings/${FID}/repair`] = () => {
      current = finding({ state: 'repaired', version: 3 });
      return { body: { id: FID, state: 'repaired', version: 3, eventId: 'e9', unitId: UNIT, federalOpenOnUnit: 0 } };
    };
    const calls = mockApi(r);
    const user = userEvent.setup();
    renderFinding();
    await user.click(await screen.findByRole('button', { name: 'Record the repair' }));
    const form = screen.getByRole('form', { name: 'Record the repair' });
    expect(within(form).getByRole('note', { name: 'Blue-signal caution' })).toHaveTextContent(/49 CFR Part 218/);
    await user.type(within(form).getByLabelText('What was done'), 'ok');
    await user.click(within(form).getByRole('button', { name: 'Record the repair' }));
    expect(await within(form).findByText('Say what was done')).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
    await user.type(within(form).getByLabelText('What was done'), ' — reset pilot to 4 in above rail');
    await user.type(within(form).getByLabelText('Parts used'), 'Shims x2');
    await user.type(within(form).getByLabelText('Time (minutes)'), '45');
    await user.click(within(form).getByRole('button', { name: 'Record the repair' }));
    await waitFor(() => expect(calls.find((c) => c.method === 'POST')).toBeTruthy());
    expect(calls.find((c) => c.method === 'POST')).toMatchObject({
      path: `/api/findings/${FID}/repair`,
      body: { version: 2, whatDone: 'ok — reset pilot to 4 in above rail', partsUsed: 'Shims x2', minutes: 45 },
    });
    expect(await screen.findByText('Repaired')).toBeInTheDocument();
  });

  it('sends chosen repair photos after the repair is on record, with a progress bar each', async () => {
    let current = finding({ state: 'in_repair', version: 2 });
    const r = routes('foreman', () => current);
    const order: string[] = [];
    r[`POST /api/findings/${FID}/repair`] = () => {
      order.push('repair');
      current = finding({ state: 'repaired', version: 3 });
      return { body: { id: FID, state: 'repaired', version: 3, eventId: 'e9', unitId: UNIT, federalOpenOnUnit: 0 } };
    };
    mockApi(r);
    // A stand-in XMLHttpRequest that the test drives: fetch cannot report upload progress, so the page uses XHR.
    const sent: FakeXhr[] = [];
    class FakeXhr {
      upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
      onload: (() => void) | null = null;
      onerror: (() => void) | null = null;
      status = 0;
      responseText = '';
      withCredentials = false;
      method = '';
      url = '';
      body: FormData | null = null;
      open(m: string, u: string) {
        this.method = m;
        this.url = u;
      }
      setRequestHeader() {}
      send(b: FormData) {
        this.body = b;
        order.push('photo');
        sent.push(this);
      }
    }
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    const user = userEvent.setup();
    renderFinding();
    await user.click(await screen.findByRole('button', { name: 'Record the repair' }));
    const form = screen.getByRole('form', { name: 'Record the repair' });
    await user.upload(within(form).getByLabelText('Add photos of the repair'), new File([new Uint8Array([0xff, 0xd8, 0xff])], 'pilot-after.jpg', { type: 'image/jpeg' }));
    expect(within(form).getByRole('list', { name: 'Photos to send' })).toHaveTextContent('pilot-after.jpg');
    await user.type(within(form).getByLabelText('What was done'), 'Reset pilot to 4 in');
    await user.click(within(form).getByRole('button', { name: 'Record the repair' }));
    await waitFor(() => expect(sent).toHaveLength(1));
    expect(order).toEqual(['repair', 'photo']);
    expect(sent[0]).toMatchObject({ method: 'POST', url: `/api/findings/${FID}/repair-photos` });
    expect((sent[0].body!.get('photo') as File).name).toBe('pilot-after.jpg');
    const bar = await screen.findByRole('progressbar', { name: 'Sending pilot-after.jpg' });
    act(() => sent[0].upload.onprogress!({ lengthComputable: true, loaded: 50, total: 100 }));
    expect(bar).toHaveAttribute('value', '0.5');
    expect(screen.getByText('50 %')).toBeInTheDocument();
    act(() => {
      sent[0].status = 201;
      sent[0].responseText = JSON.stringify({ id: 'ph1', thumb: '/api/photos/ph1?size=thumb', full: '/api/photos/ph1' });
      sent[0].onload!();
    });
    expect(await screen.findByText('Sent')).toBeInTheDocument();
  });

  it('answers a stale change with the server’s message and a Reload that fetches the finding again', async () => {
    let version = 2;
    let gets = 0;
    const r = routes('foreman', () => {
      gets++;
      return finding({ state: 'in_repair', version, assignedTo: 'p-ray', assigneeName: 'Ray Lindqvist' });
    });
    r[`POST /api/findings/${FID}/void`] = ({ body }) =>
      body.version === version
        ? { body: { id: FID, state: 'voided', version: version + 1, eventId: 'e5', unitId: UNIT, federalOpenOnUnit: 0 } }
        : { status: 409, body: { error: { code: 'stale', message: 'This finding changed since you opened it: Mae Achterberg recorded its repair at 14:02 UTC. Reload to see it.', currentVersion: version } } };
    const calls = mockApi(r);
    const user = userEvent.setup();
    renderFinding();
    await user.click(await screen.findByRole('button', { name: 'Void (entered in error)' }));
    version = 3; // someone else changes it meanwhile
    await user.type(screen.getByLabelText('Reason'), 'Pinned on the wrong unit');
    await user.click(screen.getByRole('button', { name: 'Void the finding' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Mae Achterberg recorded its repair at 14:02 UTC');
    expect(calls.filter((c) => c.method === 'POST').map((c) => c.body.version)).toEqual([2]);
    const before = gets;
    await user.click(within(alert).getByRole('button', { name: 'Reload' }));
    await waitFor(() => expect(gets).toBeGreaterThan(before));
    await waitFor(() => expect(screen.queryByRole('alert')).toBeNull());
    // The form is still open with the reason typed; sending again carries the fresh version.
    await user.click(screen.getByRole('button', { name: 'Void the finding' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'POST').map((c) => c.body.version)).toEqual([2, 3]));
  });

  it('assigns to a person picked from a list that includes the foreman', async () => {
    const r = routes('foreman', finding({ state: 'open' }));
    // Whoever holds work in the queue (the queue's assignees, whatever its filters) is named too.
    r['GET /api/repairs'] = () => ({ body: { items: [], total: 0, nextCursor: null, assignees: [{ id: 'p-mae', name: 'Mae Achterberg' }], toVerify: 0, tagsToClear: [] } });
    r[`POST /api/findings/${FID}/assign`] = () => ({ body: { id: FID, state: 'in_repair', version: 2, eventId: 'e7', unitId: UNIT, federalOpenOnUnit: 1 } });
    const calls = mockApi(r);
    const user = userEvent.setup();
    renderFinding();
    await user.click(await screen.findByRole('button', { name: 'Assign' }));
    const picker = screen.getByLabelText('Assign to');
    await waitFor(() => expect(within(picker).getAllByRole('option').map((o) => o.textContent)).toEqual(['Ray Lindqvist (you)', 'Mae Achterberg']));
    await user.selectOptions(picker, 'p-mae');
    await user.click(within(screen.getByRole('form', { name: 'Assign the finding' })).getByRole('button', { name: 'Assign' }));
    await waitFor(() => expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ version: 1, assigneeId: 'p-mae' }));
  });

  it('offers the foreman to clear the tag once no federal finding needs work, then says who cleared it and when', async () => {
    const cleared = { unitId: UNIT, tagId: 't1', clearedBy: 'Ray Lindqvist', clearedAt: '2026-03-03T16:45:00.000Z' };
    let open = true;
    const r = routes('foreman', finding({ state: 'repaired', version: 3 }));
    r[`GET /api/units/${UNIT}/tag`] = () => ({
      body: {
        open,
        railroad: { name: 'Test', reportingMark: 'TR', timeZone: 'America/Chicago' },
        unit: { id: UNIT, roadNumber: 'HRL 4104', yardName: null },
        tag: open ? { id: 't1', openedAt: '2026-03-02T13:05:00.000Z', openedBy: 'Dana Okafor', place: null, destination: null, restrictions: null } : null,
        defects: [],
      },
    });
    r[`GET /api/units/${UNIT}/history`] = () => ({ body: { items: open ? [] : [{ kind: 'tag_cleared', at: cleared.clearedAt, actor: 'Ray Lindqvist', ref: 't1', text: 'non-complying tag cleared', weight: null }] } });
    r[`POST /api/units/${UNIT}/tag/clear`] = () => {
      open = false;
      return { body: cleared };
    };
    const calls = mockApi(r);
    const user = userEvent.setup();
    renderFinding();
    await user.click(await screen.findByRole('button', { name: 'Clear the non-complying tag' }));
    expect(await screen.findByText('HRL 4104 is compliant: tag cleared by Ray Lindqvist at 3 Mar 2026, 10:45.')).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'POST' && c.path === `/api/units/${UNIT}/tag/clear`)).toBe(true);
  });

  it('counts only open and in-repair federal findings as keeping the tag on; repaired ones wait for verification', async () => {
    const r = routes('foreman', finding({ state: 'repaired', version: 3 }), {
      open: true,
      railroad: { name: 'Test', reportingMark: 'TR', timeZone: 'America/Chicago' },
      unit: { id: UNIT, roadNumber: 'HRL 4104', yardName: null },
      tag: { id: 't1', openedAt: '2026-03-02T13:05:00.000Z', openedBy: 'Dana Okafor', place: null, destination: null, restrictions: null },
      defects: [{ id: FID, label: 'Front pilot', defect: 'Pilot height', rule: '49 CFR 229.123', createdAt: '2026-03-02T13:05:00.000Z', state: 'repaired' }],
    });
    mockApi(r);
    renderFinding();
    expect(await screen.findByRole('button', { name: 'Clear the non-complying tag' })).toBeInTheDocument();
    expect(screen.getByText('Repaired, waiting for an inspector to verify: Front pilot.')).toBeInTheDocument();
  });

  it('after a reload, reads who cleared the tag and when from the unit history', async () => {
    const r = routes('inspector', finding({ state: 'verified', version: 4 }), {
      open: false,
      railroad: { name: 'Test', reportingMark: 'TR', timeZone: 'America/Chicago' },
      unit: { id: UNIT, roadNumber: 'HRL 4104', yardName: null },
      tag: null,
      defects: [],
    });
    r[`GET /api/units/${UNIT}/history`] = () => ({
      body: {
        items: [
          { kind: 'finding_verified', at: '2026-03-03T18:00:00.000Z', actor: 'Dana Okafor', ref: FID, text: 'x', weight: 'federal' },
          { kind: 'tag_cleared', at: '2026-03-03T16:45:00.000Z', actor: 'Mae Achterberg', ref: 't1', text: 'non-complying tag cleared', weight: null },
          { kind: 'tag_opened', at: '2026-03-02T13:05:00.000Z', actor: 'Dana Okafor', ref: 't1', text: 'non-complying tag opened', weight: 'federal' },
        ],
      },
    });
    mockApi(r);
    renderFinding();
    expect(await screen.findByText('HRL 4104 is compliant: tag cleared by Mae Achterberg at 3 Mar 2026, 10:45.')).toBeInTheDocument();
    expect(screen.getByText('Nothing more to do: this finding is closed.')).toBeInTheDocument();
  });
});
