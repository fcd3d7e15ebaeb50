import { readFileSync } from 'node:fs';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { InspectionView } from '../../shared/api/walkaround';
import { parseDrawing } from '../../shared/drawings/parse-drawing';
import { unitLayout } from '../../shared/layout/unit-layout';
import { areaLabel, coverageOf, defaultRoutine } from '../../shared/walkaround/routine';

// Coverage marks made without a connection: kept in the offline queue with the findings, shown as
// waiting, sent in order the moment the connection returns. The server's side is modelled as
// POST /api/inspections/:id/coverage behind the generic Idempotency-Key layer does it: one run per key.

vi.setConfig({ testTimeout: 30_000 });

// jsdom has no IndexedDB: idb-keyval is swapped for a Map with the same get/set contract.
const mem = new Map<string, unknown>();
vi.mock('idb-keyval', () => ({
  get: async (k: string) => mem.get(k),
  set: async (k: string, v: unknown) => void mem.set(k, structuredClone(v)),
}));

// The canvas is another feature's (Konva); a stand-in is enough here.
vi.mock('../../src/features/drawing', () => ({
  preloadDrawingCanvas: () => Promise.resolve(),
  DrawingCanvas: () => <div data-testid="canvas" />,
}));

const { WalkScreen } = await import('../../src/features/walkaround/components/walk-screen');
const { OfflinePanel, OfflineSync } = await import('../../src/features/walkaround/offline/offline-panel');
const { SignScreen } = await import('../../src/features/walkaround/components/sign-screen');
const { offlineQueue, withQueued } = await import('../../src/features/walkaround/offline/sync');

const drawing = parseDrawing(readFileSync('diagrams/four_axle_road.svg', 'utf8'), 'four_axle_road.svg');
const routine = defaultRoutine(drawing);
const layout = unitLayout(drawing, 'short_hood');
const labelOf = (id: string) => layout.parts.find((p) => p.instanceId === id)!.label;
const ID = '7c9e6679-7425-40de-944b-e07fc1f90ae7';
const UNIT_ID = '3f2504e0-4f89-41d3-9a0c-0305e82c3301';

function inspection(items: InspectionView['items']): InspectionView {
  const areas = routine.areas.map((a) => ({ ...a, label: areaLabel(a.key, 'short_hood', a.label) }));
  return {
    id: ID,
    unit: { id: UNIT_ID, roadNumber: 'HRL 2201', unitTypeKey: drawing.key, frontEnd: 'short_hood', yardName: 'Marlow Yard' },
    inspector: { id: 'p1', name: 'Dana Okafor' },
    kind: 'daily',
    status: 'in_progress',
    frontEndSeen: 'short_hood',
    frontEndRecorded: 'short_hood',
    startedAt: '2026-03-02T14:00:00Z',
    signedAt: null,
    place: 'Marlow Yard',
    routine: { id: null, unitTypeKey: drawing.key, personal: false, ...routine, areas, version: 0 },
    items,
    coverage: coverageOf(routine.areas, items as never),
    findings: [],
    corrections: [],
    correctsId: null,
    railroad: { name: 'Hollins Ridge & Lakeshore Railroad', reportingMark: 'HRL', timeZone: 'America/Chicago' },
    version: 1,
  };
}

let online: boolean;
let items: InspectionView['items'];
/** Every coverage request that left the browser, with its key, and whether the server ran it. */
let tries: { key: string | null; body: { instanceIds: string[]; state: string; reason?: string }; reached: boolean }[];
const ran = new Set<string>();

beforeEach(() => {
  mem.clear();
  ran.clear();
  sessionStorage.clear();
  online = true;
  items = [];
  tries = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
      const url = String(input);
      const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
      if (url === `/api/inspections/${ID}/coverage`) {
        const key = new Headers(init.headers).get('Idempotency-Key');
        const body = JSON.parse(String(init.body));
        tries.push({ key, body, reached: online });
        if (!online) throw new TypeError('Failed to fetch');
        if (key && !ran.has(key)) {
          ran.add(key);
          const byId = new Map(items.map((i) => [i.instanceId, i]));
          for (const id of body.instanceIds) byId.set(id, { instanceId: id, state: body.state, reason: body.reason ?? null });
          items = [...byId.values()];
        }
        return json(200, inspection(items));
      }
      if (!online) throw new TypeError('Failed to fetch');
      if (url === `/api/inspections/${ID}`) return json(200, inspection(items));
      if (url === `/api/unit-types/${drawing.key}`) return json(200, drawing);
      if (url === `/api/units/${UNIT_ID}`) return json(200, { id: UNIT_ID, humpStencilled: false });
      if (url.startsWith('/api/defect-types')) return json(200, { items: [] });
      throw new Error(`unexpected fetch ${url}`);
    }),
  );
});
afterEach(() => vi.unstubAllGlobals());

function renderWalk() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const utils = render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[`/walkaround/inspections/${ID}`]}>
        <OfflineSync />
        <OfflinePanel />
        <Routes>
          <Route path="/walkaround/inspections/:id" element={<WalkScreen />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
  return { ...utils, user: userEvent.setup() };
}

const row = (id: string) => document.querySelector<HTMLElement>(`li[data-instance="${id}"]`)!;

describe('coverage marks without a connection', () => {
  it('are kept and shown as waiting, counted in the coverage, and sent in order with their own keys the moment the connection returns', async () => {
    const { user } = renderWalk();
    await screen.findByTestId('canvas');
    await user.click(screen.getByRole('button', { name: 'Blue signal is up — continue' }));
    const area = routine.areas[0];
    const [naId, ...rest] = area.instanceIds;

    online = false;
    await user.click(screen.getByRole('button', { name: `Not applicable: ${labelOf(naId)}` }));
    await user.type(screen.getByLabelText('Why it does not apply'), 'Not fitted on this unit');
    await user.click(screen.getByRole('button', { name: 'Mark n.a.' }));
    await waitFor(() => expect(row(naId)).toHaveAttribute('data-pending', 'true'));
    expect(row(naId)).toHaveAttribute('data-state', 'not_applicable');
    expect(row(naId)).toHaveTextContent('Waiting to send');
    expect(row(naId)).toHaveTextContent('Not applicable: Not fitted on this unit');
    await user.click(screen.getByRole('button', { name: /Pass the rest of this area/ }));
    await waitFor(() => expect(row(rest[0])).toHaveAttribute('data-pending', 'true'));
    for (const id of rest) expect(row(id)).toHaveAttribute('data-state', 'passed');

    // The coverage on screen counts them, and says they wait.
    const coverage = screen.getByTestId('coverage');
    expect(coverage).toHaveTextContent(`${rest.length} passed`);
    expect(coverage).toHaveTextContent('1 n.a.');
    expect(screen.getByTestId('coverage-waiting')).toHaveTextContent(`${area.instanceIds.length} parts waiting to send`);
    const waiting = screen.getByTestId('offline-waiting');
    expect(within(waiting).getByRole('heading')).toHaveTextContent('Waiting to send: 2 coverage marks');
    expect([...waiting.querySelectorAll('li')].map((l) => l.textContent)).toEqual([
      `Not applicable: ${labelOf(naId)} (Not fitted on this unit)`,
      rest.length <= 3 ? `Passed: ${rest.map(labelOf).join(', ')}` : `Passed: ${rest.length} parts of Front end (short hood)`,
    ]);
    // Nothing reached the server.
    expect(tries.every((t) => !t.reached)).toBe(true);
    expect(items).toEqual([]);

    // The connection returns: sent at once (the backoff's first wait is 2 s; this waits at most 1.5 s).
    online = true;
    await act(async () => void window.dispatchEvent(new Event('online')));
    await waitFor(() => expect(screen.queryByTestId('offline-waiting')).toBeNull(), { timeout: 1500 });
    const reached = tries.filter((t) => t.reached);
    expect(reached.map((t) => t.body)).toEqual([
      { instanceIds: [naId], state: 'not_applicable', reason: 'Not fitted on this unit' },
      { instanceIds: rest, state: 'passed' },
    ]);
    // The n.a. mark carries the key of its first try, made before the connection went.
    expect(reached[0].key).toBe(tries[0].key);
    expect(new Set(tries.map((t) => t.key)).size).toBe(2);
    expect(items.map((i) => [i.instanceId, i.state])).toEqual(area.instanceIds.map((id) => [id, id === naId ? 'not_applicable' : 'passed']));
    // Once the server's copy is back, nothing on screen says waiting.
    await waitFor(() => expect(screen.queryByTestId('coverage-waiting')).toBeNull());
    expect(row(naId)).not.toHaveAttribute('data-pending');
  });

  it('are sent when the page is shown again, too', async () => {
    const { user } = renderWalk();
    await screen.findByTestId('canvas');
    await user.click(areaButtonCab());
    const id = routine.areas[2].instanceIds[0];
    online = false;
    await user.click(screen.getByRole('button', { name: `Pass ${labelOf(id)}` }));
    await waitFor(() => expect(row(id)).toHaveAttribute('data-pending', 'true'));
    online = true;
    // No online event (the device never noticed it was gone); the inspector comes back to the tab.
    await act(async () => void document.dispatchEvent(new Event('visibilitychange')));
    await waitFor(() => expect(items).toEqual([{ instanceId: id, state: 'passed', reason: null }]), { timeout: 1500 });
    await waitFor(() => expect(screen.queryByTestId('offline-waiting')).toBeNull());
  });
});

describe('signing with changes still on the device', () => {
  it('waits until they have arrived (signed first, they would reach a closed record and be refused)', async () => {
    items = routine.areas.flatMap((a) => a.instanceIds).map((instanceId) => ({ instanceId, state: 'passed', reason: null }));
    await offlineQueue.enqueueMark({ key: 'sign-wait-1', inspectionId: ID, body: { instanceIds: [routine.areas[0].instanceIds[0]], state: 'not_applicable', reason: 'Not fitted' }, preview: { parts: ['x'], area: null } });
    const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    const user = userEvent.setup();
    render(
      <QueryClientProvider client={qc}>
        <MemoryRouter initialEntries={[`/walkaround/inspections/${ID}/sign`]}>
          <Routes>
            <Route path="/walkaround/inspections/:id/sign" element={<SignScreen />} />
          </Routes>
        </MemoryRouter>
      </QueryClientProvider>,
    );
    await user.type(await screen.findByLabelText('Your password'), 'hoodline-demo');
    expect(screen.getByTestId('sign-waiting')).toHaveTextContent('1 change is still waiting on this device to be sent; signing opens once it has arrived.');
    const sign = screen.getByRole('button', { name: 'Sign the record' });
    expect(sign).toBeDisabled();
    await act(() => offlineQueue.flush({ postFinding: async () => ({ id: 'x' }), uploadPhoto: async () => ({}), postCoverage: async () => ({}) }));
    expect(screen.queryByTestId('sign-waiting')).toBeNull();
    expect(sign).toBeEnabled();
  });
});

describe('the record as shown', () => {
  it('lays waiting marks over an open inspection, and never over a signed record', async () => {
    const part = routine.areas[0].instanceIds[0];
    await offlineQueue.enqueueMark({ key: 'shown-1', inspectionId: ID, body: { instanceIds: [part], state: 'passed' }, preview: { parts: ['x'], area: null } });
    const open = withQueued(inspection([]) as never);
    expect(open.items).toEqual([{ instanceId: part, state: 'passed', reason: null, pending: true }]);
    expect(open.coverage.passed).toBe(1);
    const signed = { ...inspection([]), status: 'signed' as const, signedAt: '2026-03-02T15:00:00Z' };
    expect(withQueued(signed as never)).toBe(signed);
    await offlineQueue.flush({ postFinding: async () => ({ id: 'x' }), uploadPhoto: async () => ({}), postCoverage: async () => ({}) });
  });
});

function areaButtonCab() {
  return within(screen.getByRole('navigation', { name: 'Routine' }))
    .getAllByRole('button')
    .find((b) => b.id.startsWith('walk-area-') && /Cab/.test(b.textContent ?? ''))!;
}
