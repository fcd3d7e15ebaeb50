import { readFileSync } from 'node:fs';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes, useLocation } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { InspectionView } from '../../shared/api/walkaround';
import { parseDrawing } from '../../shared/drawings/parse-drawing';
import { unitLayout } from '../../shared/layout/unit-layout';
import { areaLabel, coverageOf, defaultRoutine } from '../../shared/walkaround/routine';

// Typing with user-event is slow on a busy two-core machine; the default 5 s is too tight.
vi.setConfig({ testTimeout: 30_000 });

// The canvas is another feature's (Konva); here a stand-in offers each part of the view as a button,
// and reports what the walk asks it to draw.
const canvasProps: { view?: string; pins?: unknown[]; selectedPartId?: string | null }[] = [];
vi.mock('../../src/features/drawing', () => ({
  preloadDrawingCanvas: () => Promise.resolve(),
  DrawingCanvas: (p: { view: string; layout: { parts: { partId: string; view: string; label: string; x: number; y: number; z: number }[] }; pins: unknown[]; selectedPartId: string | null; onSelectPart(part: unknown, at: { u: number; v: number }): void }) => {
    canvasProps.push({ view: p.view, pins: p.pins, selectedPartId: p.selectedPartId });
    return (
      <div data-testid="canvas" data-view={p.view}>
        {p.layout.parts
          .filter((x) => x.view === p.view)
          .map((x) => (
            <button key={x.partId} type="button" onClick={() => p.onSelectPart(x, { u: x.x, v: x.y })}>
              tap {x.partId}
            </button>
          ))}
      </div>
    );
  },
}));

const { WalkScreen } = await import('../../src/features/walkaround/components/walk-screen');

const drawing = parseDrawing(readFileSync('diagrams/four_axle_road.svg', 'utf8'), 'four_axle_road.svg');
const routine = defaultRoutine(drawing);
const ID = '7c9e6679-7425-40de-944b-e07fc1f90ae7';
const UNIT_ID = '3f2504e0-4f89-41d3-9a0c-0305e82c3301';

function inspection(items: InspectionView['items'] = []): InspectionView {
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

let items: InspectionView['items'];
let coveragePosts: { instanceIds: string[]; state: string; reason?: string }[];

beforeEach(() => {
  sessionStorage.clear();
  canvasProps.length = 0;
  items = [];
  coveragePosts = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
      const url = String(input);
      const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
      if (url === `/api/inspections/${ID}/coverage`) {
        const b = JSON.parse(String(init.body));
        coveragePosts.push(b);
        const byId = new Map(items.map((i) => [i.instanceId, i]));
        for (const id of b.instanceIds) byId.set(id, { instanceId: id, state: b.state, reason: b.reason ?? null });
        items = [...byId.values()];
        return json(200, inspection(items));
      }
      if (url === `/api/inspections/${ID}`) return json(200, inspection(items));
      if (url === `/api/unit-types/${drawing.key}`) return json(200, drawing);
      if (url === `/api/units/${UNIT_ID}`) return json(200, { id: UNIT_ID, humpStencilled: false });
      if (url.startsWith('/api/defect-types')) return json(200, { items: [] });
      throw new Error(`unexpected fetch ${url}`);
    }),
  );
});
afterEach(() => vi.unstubAllGlobals());

function Where() {
  const l = useLocation();
  return <output data-testid="where">{l.pathname + l.search}</output>;
}

function renderWalk(path = `/walkaround/inspections/${ID}`) {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const utils = render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route path="/walkaround/inspections/:id" element={<WalkScreen />} />
        </Routes>
        <Where />
      </MemoryRouter>
    </QueryClientProvider>,
  );
  return { ...utils, user: userEvent.setup() };
}

const routineNav = () => screen.getByRole('navigation', { name: 'Routine' });
/** An area's own button (the open area also lists its parts' buttons). */
const areaButton = (name: RegExp) => {
  const b = within(routineNav())
    .getAllByRole('button')
    .filter((x) => x.id.startsWith('walk-area-') && name.test(x.textContent ?? ''));
  expect(b).toHaveLength(1);
  return b[0];
};

describe('the walk', () => {
  it('walks the routine in order, names areas by the F seen, and shows each area on its own view', async () => {
    renderWalk();
    await screen.findByTestId('canvas');
    const labels = within(routineNav())
      .getAllByRole('button')
      .filter((b) => b.id.startsWith('walk-area-'))
      .map((b) => b.textContent);
    // F on the short hood: -y is the left side (product.md §3).
    expect(labels.map((l) => l?.replace(/Blue signal|\d+\/\d+|^\d/g, '').trim())).toEqual([
      'Front end (short hood)',
      'Left side',
      'Cab',
      'Running gear, trucks and under the unit',
      'Rear end (long hood)',
      'Right side',
    ]);
    expect(areaButton(/Front end \(short hood\)/)).toHaveAttribute('aria-current', 'step');
    expect(screen.getByTestId('canvas')).toHaveAttribute('data-view', 'end_short_hood');
    expect(screen.getByTestId('coverage-left')).toHaveTextContent(`${routine.areas.flatMap((a) => a.instanceIds).length} left`);
  });

  it('asks for blue-signal protection once per hazard area per inspection, and not for the cab', async () => {
    const { user, unmount } = renderWalk();
    await screen.findByTestId('canvas');
    expect(screen.getByRole('note', { name: 'Blue-signal caution' })).toHaveTextContent('49 CFR Part 218');
    expect(screen.queryByRole('button', { name: /Pass the rest/ })).toBeNull();
    await user.click(screen.getByRole('button', { name: 'Blue signal is up — continue' }));
    expect(screen.getByRole('button', { name: /Pass the rest/ })).toBeEnabled();
    await user.click(areaButton(/Cab/));
    expect(screen.queryByTestId('hazard-gate')).toBeNull();
    await user.click(areaButton(/Left side/));
    expect(screen.getByTestId('hazard-gate')).toBeInTheDocument();
    // Back at the first area, and after a reload: not asked again.
    await user.click(areaButton(/Front end \(short hood\)/));
    expect(screen.queryByTestId('hazard-gate')).toBeNull();
    unmount();
    renderWalk(`/walkaround/inspections/${ID}?area=0`);
    await screen.findByTestId('canvas');
    expect(screen.queryByTestId('hazard-gate')).toBeNull();
  });

  it('passes the rest of an area in one request and counts it at once', async () => {
    const { user } = renderWalk();
    await screen.findByTestId('canvas');
    await user.click(screen.getByRole('button', { name: 'Blue signal is up — continue' }));
    const first = routine.areas[0];
    const layout = unitLayout(drawing, 'short_hood');
    const label = layout.parts.find((p) => p.instanceId === first.instanceIds[0])!.label;
    await user.click(screen.getByRole('button', { name: `Pass ${label}` }));
    await user.click(screen.getByRole('button', { name: /Pass the rest of this area/ }));
    expect(coveragePosts).toEqual([
      { instanceIds: [first.instanceIds[0]], state: 'passed' },
      { instanceIds: first.instanceIds.slice(1), state: 'passed' },
    ]);
    expect(await screen.findByText(`${first.instanceIds.length} passed`)).toBeInTheDocument();
    expect(areaButton(/Front end \(short hood\)/)).toHaveTextContent(`${first.instanceIds.length}/${first.instanceIds.length}`);
    await user.click(screen.getByRole('button', { name: /^Next: Left side/ }));
    expect(areaButton(/Left side/)).toHaveAttribute('aria-current', 'step');
    expect(screen.getByTestId('canvas')).toHaveAttribute('data-view', 'side_minus_y');
  });

  it('marks a part not applicable only with a reason', async () => {
    const { user } = renderWalk();
    await screen.findByTestId('canvas');
    await user.click(screen.getByRole('button', { name: 'Blue signal is up — continue' }));
    const id = routine.areas[0].instanceIds[0];
    const label = unitLayout(drawing, 'short_hood').parts.find((p) => p.instanceId === id)!.label;
    await user.click(screen.getByRole('button', { name: `Not applicable: ${label}` }));
    const mark = screen.getByRole('button', { name: 'Mark n.a.' });
    expect(mark).toBeDisabled();
    await user.type(screen.getByLabelText('Why it does not apply'), 'Not fitted on this unit');
    await user.click(mark);
    expect(coveragePosts).toEqual([{ instanceIds: [id], state: 'not_applicable', reason: 'Not fitted on this unit' }]);
  });

  it('a tap on a part of a hazard area not yet cleared asks for blue signal first, then opens the finding form for that part', async () => {
    const { user } = renderWalk(`/walkaround/inspections/${ID}?area=2`);
    await screen.findByTestId('canvas');
    expect(areaButton(/Cab/)).toHaveAttribute('aria-current', 'step');
    await user.click(screen.getByRole('radio', { name: 'Plan' }));
    const pilot = unitLayout(drawing, 'short_hood').parts.find((p) => p.kind === 'pilot' && p.view === 'plan' && p.x < drawing.lengthIn / 2)!;
    await user.click(screen.getByRole('button', { name: `tap ${pilot.partId}` }));
    expect(areaButton(/Front end \(short hood\)/)).toHaveAttribute('aria-current', 'step');
    expect(screen.getByTestId('hazard-gate')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Blue signal is up — continue' }));
    expect(await screen.findByRole('heading', { name: `Finding on ${pilot.label}` })).toBeInTheDocument();
    expect(canvasProps.at(-1)?.selectedPartId).toBe(pilot.partId);
  });

  it('keeps the area and view in the address, so a reload comes back to them', async () => {
    const { user, unmount } = renderWalk();
    await screen.findByTestId('canvas');
    await user.click(areaButton(/Rear end/));
    await user.click(screen.getByRole('radio', { name: 'Plan' }));
    const where = screen.getByTestId('where').textContent!;
    expect(where).toBe(`/walkaround/inspections/${ID}?area=4&view=plan`);
    unmount();
    renderWalk(where);
    await screen.findByTestId('canvas');
    expect(areaButton(/Rear end/)).toHaveAttribute('aria-current', 'step');
    expect(screen.getByTestId('canvas')).toHaveAttribute('data-view', 'plan');
  });
});
