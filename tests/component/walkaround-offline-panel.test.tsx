import { act, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

// jsdom has no IndexedDB: idb-keyval is swapped for a Map with the same get/set contract.
const mem = new Map<string, unknown>();
vi.mock('idb-keyval', () => ({
  get: async (k: string) => mem.get(k),
  set: async (k: string, v: unknown) => void mem.set(k, structuredClone(v)),
}));

const { OfflinePanel } = await import('../../src/features/walkaround/offline/offline-panel');
const { flushNow, offlineQueue, queueFinding, startOfflineSync } = await import('../../src/features/walkaround/offline/sync');
const { QueryClient } = await import('@tanstack/react-query');

const finding = (n: number) => ({
  inspectionId: 'insp-1',
  body: { partId: 'pilot', view: 'plan' as const, x: n, y: 0, defectType: 'pilot_height', measurement: { value: 2.5, unit: 'in' as const }, idempotencyKey: `k-${n}` },
  preview: { partId: 'pilot', instanceId: 'pilot_sh', partKind: 'pilot', view: 'plan', body: { x: n, y: 0, z: 0 }, label: 'Front pilot', partLabel: 'Front pilot', defectLabel: 'Pilot height above rail out of limit', weight: 'federal', rule: '49 CFR 229.123' },
  photos: [{ blob: new Blob([new Uint8Array([1])], { type: 'image/png' }), name: 'p.png' }],
});

describe('offline panel', () => {
  beforeEach(() => mem.clear());

  it('says the session has ended instead of retrying, keeps the work, and sends it once signed in again', async () => {
    const { MemoryRouter } = await import('react-router-dom');
    render(
      <MemoryRouter>
        <OfflinePanel />
      </MemoryRouter>,
    );
    const noPhoto = { ...finding(7), photos: [] };
    await act(() => offlineQueue.enqueue(noPhoto));
    const answers: Response[] = [new Response(JSON.stringify({ error: { code: 'unauthenticated', message: 'Sign in first' } }), { status: 401, headers: { 'content-type': 'application/json' } })];
    const fetchMock = vi.fn(async () => answers.shift() ?? new Response(JSON.stringify({ id: 'f-7' }), { status: 201, headers: { 'content-type': 'application/json' } }));
    vi.stubGlobal('fetch', fetchMock);
    try {
      await act(() => flushNow());
      const line = screen.getByTestId('offline-signed-out');
      expect(line.textContent).toMatch(/session has ended/);
      expect(within(line).getByRole('link', { name: 'sign in again' }).getAttribute('href')).toBe('/sign-in');
      expect(screen.getByTestId('offline-waiting').textContent).toContain('Waiting to send: 1 finding');
      expect(screen.queryByTestId('offline-failed')).toBeNull();
      // Signed in again: the next send carries it, once, and the panel goes.
      await act(() => flushNow());
      expect(fetchMock).toHaveBeenCalledTimes(2);
      expect(screen.queryByTestId('offline-waiting')).toBeNull();
      expect(screen.queryByTestId('offline-signed-out')).toBeNull();
    } finally {
      vi.unstubAllGlobals();
    }
  });

  it('lists what waits, then shows a refusal with the server message until dismissed; the note can be copied', async () => {
    render(<OfflinePanel />);
    expect(screen.queryByTestId('offline-waiting')).toBeNull();
    await act(() => offlineQueue.enqueue(finding(1)));
    const waiting = screen.getByTestId('offline-waiting');
    expect(waiting.textContent).toContain('Waiting to send: 1 finding');
    expect(waiting.textContent).toContain('Front pilot: Pilot height above rail out of limit (1 photo)');

    // The server refuses it: the record was signed meanwhile (409).
    await act(() =>
      offlineQueue.flush({
        postFinding: async () => {
          throw { status: 409, code: 'conflict', message: 'This record was signed meanwhile; add a correction' };
        },
        uploadPhoto: async () => ({}),
        postCoverage: async () => ({}),
      }),
    );
    expect(screen.queryByTestId('offline-waiting')).toBeNull();
    const failed = screen.getByRole('alert');
    expect(failed.textContent).toContain('Could not be sent');
    expect(failed.textContent).toContain('This record was signed meanwhile; add a correction');

    const writeText = vi.fn(async (_: string) => {});
    Object.defineProperty(navigator, 'clipboard', { value: { writeText }, configurable: true });
    await act(async () => fireEvent.click(within(failed).getByRole('button', { name: 'Copy the note' })));
    expect(writeText.mock.calls[0][0]).toContain('Front pilot: Pilot height above rail out of limit');
    expect(writeText.mock.calls[0][0]).toContain('Reading: 2.5 in');
    expect(within(failed).getByRole('button', { name: 'Note copied' })).toBeTruthy();

    // Kept in storage (a reload would show it) until dismissed.
    expect((mem.values().next().value as { failed: unknown[] }).failed).toHaveLength(1);
    await act(async () => fireEvent.click(within(failed).getByRole('button', { name: 'Dismiss' })));
    await act(async () => {});
    expect(screen.queryByRole('alert')).toBeNull();
    expect((mem.values().next().value as { failed: unknown[] }).failed).toHaveLength(0);
  });

  it('lists coverage marks with the findings, in order, and shows a refused mark with the reason in plain words', async () => {
    render(<OfflinePanel />);
    await act(() => offlineQueue.enqueue(finding(2)));
    await act(() =>
      offlineQueue.enqueueMark({ key: 'm-1', inspectionId: 'insp-1', body: { instanceIds: ['coupler_sh'], state: 'not_applicable', reason: 'Coupler removed for repair' }, preview: { parts: ['Front coupler'], area: null } }),
    );
    await act(() =>
      offlineQueue.enqueueMark({ key: 'm-2', inspectionId: 'insp-1', body: { instanceIds: ['a', 'b', 'c', 'd'], state: 'passed' }, preview: { parts: ['A', 'B', 'C', 'D'], area: 'Front end (short hood)' } }),
    );
    const waiting = screen.getByTestId('offline-waiting');
    expect(within(waiting).getByRole('heading').textContent).toBe('Waiting to send: 1 finding and 2 coverage marks');
    expect([...waiting.querySelectorAll('li')].map((l) => l.textContent)).toEqual([
      'Front pilot: Pilot height above rail out of limit (1 photo)',
      'Not applicable: Front coupler (Coupler removed for repair)',
      'Passed: 4 parts of Front end (short hood)',
    ]);

    const signed = { status: 409, code: 'conflict', message: 'This record is signed and can no longer change; add a correction instead' };
    await act(() =>
      offlineQueue.flush({
        postFinding: async () => ({ id: 'f-1' }),
        uploadPhoto: async () => ({}),
        postCoverage: async () => {
          throw signed;
        },
      }),
    );
    const failed = screen.getByTestId('offline-failed');
    const rows = within(failed).getAllByTestId('failed-entry');
    expect(rows.map((r) => r.dataset.kind)).toEqual(['coverage', 'coverage']);
    expect(rows[0]).toHaveTextContent('Not applicable: Front coupler (Coupler removed for repair)');
    expect(rows[0]).toHaveTextContent('This mark is not on the record: This record is signed and can no longer change; add a correction instead');
    expect(rows[0]).toHaveTextContent('Mark it again on the walk if the record is still open, or add it to a correction.');
    for (const r of rows) await act(async () => fireEvent.click(within(r).getByRole('button', { name: 'Dismiss' })));
    await act(async () => {});
    expect(screen.queryByTestId('offline-failed')).toBeNull();
  });
});

describe('a finding refused because its reading is within the limit', () => {
  const posts: { body: Record<string, unknown>; key: string | null }[] = [];
  let stop = () => {};
  let qc = new QueryClient();
  beforeEach(() => {
    mem.clear();
    posts.length = 0;
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
        const body = JSON.parse(String(init.body ?? '{}'));
        posts.push({ body, key: new Headers(init.headers).get('Idempotency-Key') });
        if (!body.keepAsNote)
          return new Response(JSON.stringify({ error: { code: 'check_passed', message: 'The reading is within the limit (3 in minimum, 6 in maximum above the top of rail, 49 CFR 229.123(a)). Keep it as a note, or drop it.' } }), { status: 409 });
        return new Response(JSON.stringify({ id: 'f-9' }), { status: 201 });
      }),
    );
    qc = new QueryClient();
    stop = startOfflineSync(qc);
  });
  afterEach(() => {
    stop();
    vi.unstubAllGlobals();
  });

  it('asks the question when the connection returns: kept as a note, it is sent again with its own key', async () => {
    render(<OfflinePanel />);
    // A 4 in pilot reading, queued while the server could not be asked (49 CFR 229.123(a): 3 in to 6 in passes).
    await act(() => queueFinding(qc, { ...finding(3), photos: [], body: { ...finding(3).body, measurement: { value: 4, unit: 'in' as const } } }));
    const failed = await screen.findByTestId('offline-failed');
    expect(failed).toHaveTextContent('The reading is within the limit (3 in minimum, 6 in maximum above the top of rail, 49 CFR 229.123(a)). Keep it as a note, or drop it.');
    expect(within(failed).queryByRole('button', { name: 'Copy the note' })).toBeNull();
    await act(async () => fireEvent.click(within(failed).getByRole('button', { name: 'Keep as a note' })));
    await vi.waitFor(() => expect(posts).toHaveLength(2));
    await vi.waitFor(() => expect(screen.queryByTestId('offline-failed')).toBeNull());
    expect(posts[1]).toEqual({ body: expect.objectContaining({ keepAsNote: true, idempotencyKey: 'k-3' }), key: 'k-3' });
    expect(posts[0].body.keepAsNote).toBeUndefined();
    await vi.waitFor(() => expect(offlineQueue.snapshot().pending).toEqual([]));
  });

  it('or drops it', async () => {
    render(<OfflinePanel />);
    await act(() => queueFinding(qc, { ...finding(4), photos: [] }));
    const failed = await screen.findByTestId('offline-failed');
    await act(async () => fireEvent.click(within(failed).getByRole('button', { name: 'Drop it' })));
    await vi.waitFor(() => expect(screen.queryByTestId('offline-failed')).toBeNull());
    expect(posts).toHaveLength(1);
  });
});

describe('a long waiting list', () => {
  beforeEach(() => mem.clear());
  it('shows the first five and folds the rest, in order, one tap away', async () => {
    render(<OfflinePanel />);
    for (let i = 1; i <= 7; i++)
      await act(() => offlineQueue.enqueueMark({ key: `long-${i}`, inspectionId: 'insp-long', body: { instanceIds: [`p${i}`], state: 'passed' }, preview: { parts: [`Part ${i}`], area: null } }));
    const waiting = screen.getByTestId('offline-waiting');
    expect(within(waiting).getByRole('heading')).toHaveTextContent('Waiting to send: 7 coverage marks');
    const [first, rest] = waiting.querySelectorAll('ol');
    expect([...first.querySelectorAll('li')].map((l) => l.textContent)).toEqual([1, 2, 3, 4, 5].map((i) => `Passed: Part ${i}`));
    expect(rest.getAttribute('start')).toBe('6');
    expect([...rest.querySelectorAll('li')].map((l) => l.textContent)).toEqual(['Passed: Part 6', 'Passed: Part 7']);
    expect(within(waiting).getByText('2 more, sent after these').closest('details')).not.toHaveAttribute('open');
    await act(() => offlineQueue.flush({ postFinding: async () => ({ id: 'x' }), uploadPhoto: async () => ({}), postCoverage: async () => ({}) }));
    expect(screen.queryByTestId('offline-waiting')).toBeNull();
  });
});
