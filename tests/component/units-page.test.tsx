// A unit's page with the API answered at fetch and the real committed six-axle drawing and layouts
// (shared/layout), the canvas replaced by a probe that records what the page hands it. Expectations:
// product brief §3 — a view is a projection of the carbody frame (plan x,y; side elevations x,z; end
// elevations y,z), +y is the right side with the F on the short hood; repeated parts are counted
// from the F end and the #1 traction motor is the one nearest the F (common practice, no source);
// a stale change answers 409 and the screen offers to reload (issue: concurrency).
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { UnitRow } from '../../shared/api/units';
import { parseDrawing } from '../../shared/drawings/parse-drawing';
import type { FrontEnd } from '../../shared/domain/frames';
import { unitLayout } from '../../shared/layout/unit-layout';
import type { DrawingCanvasProps } from '../../src/features/drawing/types';

const probe = vi.hoisted(() => ({ props: undefined as DrawingCanvasProps | undefined, mounts: 0 }));
vi.mock('../../src/features/drawing', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../src/features/drawing')>();
  const { useEffect } = await import('react');
  return {
    ...real,
    preloadDrawingCanvas: () => Promise.resolve(),
    DrawingCanvas: (p: DrawingCanvasProps) => {
      probe.props = p;
      useEffect(() => void probe.mounts++, []);
      return <div data-testid="canvas-probe" data-front-end={p.layout.frontEnd} data-view={p.view} />;
    },
  };
});

import UnitsScreen from '../../src/features/units';

// Parsed as server/drawings/load.ts does (that module finds its folder from import.meta.url, not a file URL under jsdom).
const drawing = parseDrawing(readFileSync(join(process.cwd(), 'diagrams', 'six_axle_road.svg'), 'utf8'), 'six_axle_road.svg');
const plan = drawing.views.find((v) => v.key === 'plan')!;
/** The plan's traction motor nearest the short hood end (smallest x). */
const motorNearShortHood = plan.parts.filter((p) => p.kind === 'traction_motor').sort((a, b) => a.centre.u - b.centre.u)[0];

const UNIT_ID = '00000000-0000-4000-8000-000000004101';
const FINDING = '00000000-0000-4000-8000-00000000f001';
const OLD_FINDING = '00000000-0000-4000-8000-00000000f002';
const INSPECTION = '00000000-0000-4000-8000-00000000a001';

const unitRow = (over: Partial<UnitRow> = {}): UnitRow => ({
  id: UNIT_ID,
  roadNumber: 'TR 4101',
  unitTypeKey: 'six_axle_road',
  unitTypeName: drawing.name,
  frontEnd: 'short_hood',
  yardId: null,
  yardName: 'Marlow Yard',
  serviceState: 'in_service',
  nonComplying: true,
  nonComplyingSince: '2026-11-30T13:21:00Z',
  conditionMonitoring: false,
  humpStencilled: false,
  lastPeriodicOn: null,
  lastAnnualOn: null,
  lastHandBrakeOn: null,
  lastMainReservoirOn: null,
  lastCmCheckOn: null,
  openFindings: 2,
  version: 3,
  ...over,
});

const queueItem = (id: string, label: string, weight: 'federal' | 'shop') => ({
  id, unitId: UNIT_ID, roadNumber: 'TR 4101', yardId: null, yardName: 'Marlow Yard', nonComplying: true, label, defectType: 'x', defectLabel: 'Bent',
  weight, rule: null, state: 'open', assignedTo: null, assigneeName: null, createdAt: '2026-11-30T13:21:00Z', createdByName: 'Dana Okafor', ageDays: 1, version: 1,
});
// Left of the centreline at the short hood end (y < 0 is the left with the F on the short hood).
const LEVER = { x: 8.5, y: -31.4, z: 43 };

type Reply = { status?: number; body?: unknown };
interface Call { method: string; path: string; body: any }

function mockApi(over: { role?: string; unit?: () => UnitRow; patch?: (body: any) => Reply; tagOpen?: boolean; openTotal?: number } = {}) {
  const calls: Call[] = [];
  let unit = unitRow();
  const routes: Record<string, (body: any) => Reply> = {
    'GET /api/auth/me': () => ({ body: { id: 'p1', email: 'x@demo.example', name: 'Pat', role: over.role ?? 'admin', yardId: null } }),
    'GET /api/settings': () => ({ body: { name: 'Test', reportingMark: 'TR', timeZone: 'UTC' } }),
    [`GET /api/units/${UNIT_ID}`]: () => ({ body: over.unit ? over.unit() : unit }),
    'GET /api/unit-types/six_axle_road': () => ({ body: drawing }),
    'GET /api/unit-types/six_axle_road/layout/short_hood': () => ({ body: unitLayout(drawing, 'short_hood') }),
    'GET /api/unit-types/six_axle_road/layout/long_hood': () => ({ body: unitLayout(drawing, 'long_hood') }),
    'GET /api/repairs': () => ({
      body: { items: [queueItem(FINDING, 'Front left uncoupling lever', 'federal'), queueItem(OLD_FINDING, '#6 traction motor', 'shop')], total: over.openTotal ?? 2, nextCursor: over.openTotal ? 'next' : null, assignees: [], toVerify: 0, tagsToClear: [] },
    }),
    [`GET /api/findings/${FINDING}`]: () => ({
      body: { id: FINDING, label: 'Front left uncoupling lever', partLabel: 'Front left uncoupling lever', partId: 'pl-uncoupling_lever_sh_my', view: 'plan', body: LEVER, frontEnd: 'short_hood', defectLabel: 'Bent', weight: 'federal', rule: null, state: 'open', note: null, createdByName: 'Dana Okafor', createdAt: '2026-11-30T13:21:00Z', version: 1 },
    }),
    // Pinned while the record had the F on the long hood: then this motor was #6.
    [`GET /api/findings/${OLD_FINDING}`]: () => ({
      body: { id: OLD_FINDING, label: '#6 traction motor', partLabel: '#6 traction motor', partId: motorNearShortHood.id, view: 'plan', body: { x: motorNearShortHood.centre.u, y: motorNearShortHood.centre.v, z: 30 }, frontEnd: 'long_hood', defectLabel: 'Bent', weight: 'shop', rule: null, state: 'open', note: null, createdByName: 'Dana Okafor', createdAt: '2026-10-01T13:21:00Z', version: 1 },
    }),
    [`GET /api/units/${UNIT_ID}/history`]: () => ({
      body: {
        items: [
          { kind: 'unit_changed', at: '2026-12-01T10:00:00Z', actor: 'Ines Carvalho', ref: UNIT_ID, text: 'unit_front_end_changed: {"frontEnd": {"from": "long_hood", "to": "short_hood"}}', weight: null },
          { kind: 'finding_created', at: '2026-11-30T13:21:00Z', actor: 'Dana Okafor', ref: FINDING, text: 'Front left uncoupling lever — uncoupling_lever_bent', weight: 'federal' },
          { kind: 'inspection_signed', at: '2026-11-30T13:21:00Z', actor: 'Dana Okafor', ref: INSPECTION, text: 'daily inspection signed', weight: null },
          { kind: 'inspection_started', at: '2026-11-30T12:41:00Z', actor: 'Dana Okafor', ref: INSPECTION, text: 'daily inspection started', weight: null },
        ],
      },
    }),
    [`GET /api/units/${UNIT_ID}/tag`]: () => ({
      body: over.tagOpen
        ? { open: true, unit: { id: UNIT_ID, roadNumber: 'TR 4101', yardName: 'Marlow Yard' }, tag: { id: 't1', openedAt: '2026-11-30T13:21:00Z', openedBy: 'Dana Okafor', place: 'Marlow Yard', destination: null, restrictions: null }, defects: [{ id: FINDING, label: 'Front left uncoupling lever', defect: 'Uncoupling lever bent', rule: '49 CFR Part 231', createdAt: '2026-11-30T13:21:00Z', state: 'open' }] }
        : { open: false, unit: { id: UNIT_ID, roadNumber: 'TR 4101', yardName: null }, tag: null, defects: [] },
    }),
    'GET /api/due': () => ({ body: { on: '2026-12-01', timeZone: 'UTC', items: [] } }),
    [`GET /api/inspections/${INSPECTION}`]: () => ({
      body: { id: INSPECTION, kind: 'daily', status: 'signed', inspector: { id: 'p2', name: 'Dana Okafor' }, startedAt: '2026-11-30T12:41:00Z', signedAt: '2026-11-30T13:21:00Z', place: 'Marlow Yard', frontEndSeen: 'short_hood', coverage: { total: 115, done: 115, passed: 114, findings: 1, notApplicable: 0, complete: true }, findings: [] },
    }),
    [`PATCH /api/units/${UNIT_ID}`]: (body) => {
      if (over.patch) return over.patch(body);
      unit = { ...unit, frontEnd: body.frontEnd as FrontEnd, version: unit.version + 1 };
      return { body: unit };
    },
  };
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      const method = init?.method ?? 'GET';
      const body = typeof init?.body === 'string' ? JSON.parse(init.body) : undefined;
      calls.push({ method, path: url.pathname + url.search, body });
      const h = routes[`${method} ${url.pathname}`];
      const r = h ? h(body) : { status: 404, body: { error: { code: 'not_found', message: `no mock for ${method} ${url.pathname}` } } };
      return new Response(JSON.stringify(r.body ?? null), { status: r.status ?? 200, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return calls;
}

beforeEach(() => {
  probe.props = undefined;
  probe.mounts = 0;
});
afterEach(() => vi.unstubAllGlobals());

function setup(over: Parameters<typeof mockApi>[0] = {}) {
  const calls = mockApi(over);
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[`/units/${UNIT_ID}`]}>
        <Routes>
          <Route path="/units/*" element={<UnitsScreen />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
  return { calls, user: userEvent.setup() };
}

const canvasReady = () => waitFor(() => expect(probe.props).toBeDefined());
const pinsById = () => new Map((probe.props?.pins ?? []).map((p) => [p.id, p]));
/** What the page does when the canvas reports a tap on a part. */
async function tap(partId: string) {
  const row = probe.props!.layout.parts.find((p) => p.partId === partId)!;
  probe.props!.onSelectPart(row, { u: 0, v: 0 });
}

describe('unit page', () => {
  it('pins each open finding where its body point projects on the view shown', async () => {
    const { user } = setup();
    await canvasReady();
    await waitFor(() => expect(pinsById().get(FINDING)).toEqual({ id: FINDING, u: LEVER.x, v: LEVER.y, weight: 'federal', state: 'open' })); // plan: (x, y)
    // F on the short hood: the left side is −y, drawn in the side_minus_y elevation as (x, z).
    await user.click(screen.getByRole('radio', { name: 'Left side' }));
    await waitFor(() => expect(probe.props!.view).toBe('side_minus_y'));
    expect(pinsById().get(FINDING)).toMatchObject({ u: LEVER.x, v: LEVER.z });
    // The right side does not show a pin that sits 31 in left of the centreline.
    await user.click(screen.getByRole('radio', { name: 'Right side' }));
    await waitFor(() => expect(probe.props!.view).toBe('side_plus_y'));
    expect(pinsById().has(FINDING)).toBe(false);
    // The front end (the short hood end here) shows it as (y, z); the rear end does not.
    await user.click(screen.getByRole('radio', { name: 'Front end' }));
    await waitFor(() => expect(probe.props!.view).toBe('end_short_hood'));
    expect(pinsById().get(FINDING)).toMatchObject({ u: LEVER.y, v: LEVER.z });
    await user.click(screen.getByRole('radio', { name: 'Rear end' }));
    await waitFor(() => expect(probe.props!.view).toBe('end_long_hood'));
    expect(pinsById().has(FINDING)).toBe(false);
  });

  it('names a tapped motor from the F, and the what-if preview counts it from the other end without writing', async () => {
    const { calls, user } = setup({ role: 'inspector' });
    await canvasReady();
    await tap(motorNearShortHood.id);
    await waitFor(() => expect(screen.getByTestId('selected-part-label')).toHaveTextContent('#1 traction motor'));
    await user.click(screen.getByRole('button', { name: /What if the F were on the other end\?/ }));
    await waitFor(() => expect(probe.props!.layout.frontEnd).toBe('long_hood'));
    expect(screen.getByTestId('selected-part-label')).toHaveTextContent('#6 traction motor');
    expect(screen.getByTestId('selected-part')).toHaveTextContent('this part is #1 traction motor');
    expect(screen.getByTestId('preview-banner')).toHaveTextContent('nothing is saved');
    expect(calls.filter((c) => c.method !== 'GET')).toEqual([]);
    expect(screen.queryByRole('button', { name: 'Change F end…' })).toBeNull(); // the admin's alone
  });

  it('admin: moves the F with the version on screen and a reason; every label changes at once', async () => {
    const { calls, user } = setup();
    await canvasReady();
    await tap(motorNearShortHood.id);
    await waitFor(() => expect(screen.getByTestId('selected-part-label')).toHaveTextContent('#1 traction motor'));
    await user.click(screen.getByRole('button', { name: 'Change F end…' }));
    const dialog = screen.getByRole('dialog', { name: 'Move the F of TR 4101 to the long hood?' });
    expect(dialog).toHaveTextContent('#1 traction motor will be #6 traction motor');
    // No reason, no change.
    await user.click(within(dialog).getByRole('button', { name: 'Move the F to the long hood' }));
    expect(within(dialog).getByText(/Say why the F end changes/)).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'PATCH')).toBe(false);
    await user.type(within(dialog).getByLabelText(/Reason/), 'Stencil seen on the long hood');
    await user.click(within(dialog).getByRole('button', { name: 'Move the F to the long hood' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(calls.find((c) => c.method === 'PATCH')!.body).toEqual({ version: 3, frontEnd: 'long_hood', reason: 'Stencil seen on the long hood' });
    await waitFor(() => expect(probe.props!.layout.frontEnd).toBe('long_hood'));
    expect(screen.getByTestId('selected-part-label')).toHaveTextContent('#6 traction motor');
    expect(screen.getByText(/The F is now on the long hood of TR 4101/)).toBeInTheDocument();
    // The new labels were in hand before the unit changed: the canvas stayed up (no loading gap), so it animates the flip once.
    expect(probe.mounts).toBe(1);
  });

  it('admin: a stale change (409) says who changed it and offers a reload that shows the current record', async () => {
    let version = 3;
    let frontEnd: FrontEnd = 'short_hood';
    const { user } = setup({
      unit: () => unitRow({ version, frontEnd }),
      patch: () => {
        // Someone else moved it meanwhile.
        version = 4;
        frontEnd = 'long_hood';
        return { status: 409, body: { error: { code: 'stale', message: 'TR 4101 was changed by someone else since you opened it (now version 4); reload to see the change' } } };
      },
    });
    await canvasReady();
    await user.click(screen.getByRole('button', { name: 'Change F end…' }));
    const dialog = screen.getByRole('dialog');
    await user.type(within(dialog).getByLabelText(/Reason/), 'Stencil seen on the long hood');
    await user.click(within(dialog).getByRole('button', { name: 'Move the F to the long hood' }));
    const alert = await within(dialog).findByRole('alert');
    expect(alert).toHaveTextContent('changed by someone else');
    expect(within(dialog).getByRole('button', { name: 'Move the F to the long hood' })).toBeDisabled();
    await user.click(within(alert).getByRole('button', { name: 'Reload the unit' }));
    await waitFor(() => expect(within(dialog).getByRole('status')).toHaveTextContent('now carries its F on the long hood (version 4)'));
    expect(within(dialog).getByRole('heading')).toHaveTextContent('Move the F of TR 4101 to the short hood?');
    await waitFor(() => expect(probe.props!.layout.frontEnd).toBe('long_hood'));
  });

  it('says when a finding was pinned under the other front end, with the name the part has now', async () => {
    setup();
    const note = await screen.findByTestId('pinned-other-end');
    expect(note).toHaveTextContent('Pinned when the F was on the long hood. With the F on the short hood this part is “#1 traction motor”.');
    expect(note.closest('[data-finding]')).toHaveAttribute('data-finding', OLD_FINDING);
  });

  it('asks the queue for one page of up to 500 findings of this unit, and says when the unit has more than that', async () => {
    const { calls } = setup({ openTotal: 612 });
    const more = await screen.findByTestId('open-findings-more');
    expect(more).toHaveTextContent('Showing 2 of 612 open findings.');
    expect(within(more).getByRole('link', { name: 'See them all in the repair queue' })).toHaveAttribute('href', `/repairs?unit=${UNIT_ID}`);
    expect(calls.filter((c) => c.path.startsWith('/api/repairs')).map((c) => c.path)).toEqual([`/api/repairs?unit=${UNIT_ID}&limit=500`]);
  });

  it('says nothing more when every open finding of the unit is listed', async () => {
    setup();
    await screen.findByRole('link', { name: '#6 traction motor' });
    expect(screen.queryByTestId('open-findings-more')).toBeNull();
  });

  it('lists the history newest first, folds a signed inspection’s start into it, and links to the finding and record', async () => {
    setup({ role: 'inspector' });
    const list = await screen.findByTestId('history');
    const items = within(list).getAllByRole('listitem');
    expect(items.map((i) => i.dataset.kind)).toEqual(['unit_changed', 'finding_created', 'inspection_signed']);
    expect(items[0]).toHaveTextContent('F moved from the long hood to the short hood');
    expect(within(items[1]).getByRole('link', { name: 'Front left uncoupling lever — Uncoupling lever bent' })).toHaveAttribute('href', `/repairs/findings/${FINDING}`);
    expect(items[2]).toHaveTextContent('30 Nov 2026, 12:41–13:21');
    expect(within(items[2]).getByRole('link', { name: 'Record' })).toHaveAttribute('href', `/walkaround/inspections/${INSPECTION}/record`);
  });

  it('shows a record in place for a role without the walkaround screen', async () => {
    const { user } = setup({ role: 'admin' });
    const list = await screen.findByTestId('history');
    const signed = within(list).getAllByRole('listitem').find((i) => i.dataset.kind === 'inspection_signed')!;
    expect(within(signed).queryByRole('link', { name: 'Record' })).toBeNull();
    await user.click(within(signed).getByRole('button', { name: 'Show record' }));
    expect(await within(signed).findByTestId('inspection-inline')).toHaveTextContent('115 of 115 parts covered: 114 passed, 1 finding');
  });

  it('shows the open non-complying tag (49 CFR 229.9) with a link to the tag page for those who print it', async () => {
    setup({ role: 'inspector', tagOpen: true });
    const card = (await screen.findByRole('heading', { name: 'Non-complying tag open' })).closest('section')!;
    expect(card).toHaveTextContent('Opened 30 Nov 2026, 13:21 by Dana Okafor at Marlow Yard');
    expect(card).toHaveTextContent('Front left uncoupling lever: Uncoupling lever bent');
    expect(within(card).getByRole('link', { name: 'Open the tag' })).toHaveAttribute('href', `/walkaround/units/${UNIT_ID}/tag`);
  });

  it('shows no tag card when no tag is open', async () => {
    setup({ role: 'inspector' });
    await screen.findByTestId('history');
    expect(screen.queryByRole('heading', { name: 'Non-complying tag open' })).toBeNull();
  });
});
