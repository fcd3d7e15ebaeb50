import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { defectTypesFor } from '../../shared/defects/catalogue';
import type { FindingTarget } from '../../src/features/walkaround/components/finding-form';

// The finding form and the offline queue: a reading within its limit (49 CFR 229.123(a): a pilot 3 in
// to 6 in above the top of rail) is asked about on the spot when the server cannot be reached, and a
// finding made while others wait goes behind them.

vi.setConfig({ testTimeout: 30_000 });

// jsdom has no IndexedDB: idb-keyval is swapped for a Map with the same get/set contract.
const mem = new Map<string, unknown>();
vi.mock('idb-keyval', () => ({
  get: async (k: string) => mem.get(k),
  set: async (k: string, v: unknown) => void mem.set(k, structuredClone(v)),
}));

const { FindingForm } = await import('../../src/features/walkaround/components/finding-form');
const { offlineQueue } = await import('../../src/features/walkaround/offline/sync');
const { isFinding } = await import('../../src/features/walkaround/offline/queue');

const PILOT_TYPES = defectTypesFor('pilot').map((d) => ({
  key: d.key,
  label: d.label,
  partKind: d.partKind,
  weight: d.weight,
  ...(d.rule ? { rule: d.rule, ruleConfidence: d.ruleConfidence } : {}),
  ...(d.check ? { check: d.check, checkPreset: d.checkPreset, measurement: d.measurement } : {}),
}));
const TARGET: FindingTarget = { partId: 'pl-pilot_sh', instanceId: 'pilot_sh', kind: 'pilot', label: 'Front pilot', view: 'plan', at: { u: 6, v: 0 }, centre: { x: 6, y: 0, z: 10 } };
const INSP = '0b0e8f7e-1c1d-4a43-9d5a-7d3e2f1a0b01';

let findingPosts: Record<string, unknown>[];
beforeEach(() => {
  mem.clear();
  findingPosts = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
      const url = String(input);
      if (url.startsWith('/api/defect-types')) return new Response(JSON.stringify({ items: PILOT_TYPES }), { status: 200 });
      if (url.endsWith('/findings') && init.method === 'POST') findingPosts.push(JSON.parse(String(init.body)));
      throw new TypeError('Failed to fetch');
    }),
  );
});
const accepted = { postFinding: async () => ({ id: 'f-1' }), uploadPhoto: async () => ({}), postCoverage: async () => ({}) };
afterEach(async () => {
  // Empty the shared queue for the next test (a send already running is waited for first).
  while (offlineQueue.snapshot().pending.length) await offlineQueue.flush(accepted);
  vi.unstubAllGlobals();
});

function renderForm() {
  const onClose = vi.fn();
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <FindingForm inspectionId={INSP} target={TARGET} humpStencilled={false} timeZone="America/Chicago" onClose={onClose} />
    </QueryClientProvider>,
  );
  return { onClose, user: userEvent.setup() };
}

async function pilotReading(user: ReturnType<typeof userEvent.setup>, value: string) {
  await user.click(await screen.findByRole('radio', { name: /Pilot height above rail out of limit/ }));
  await user.type(screen.getByLabelText('Reading'), value);
  await user.click(screen.getByRole('button', { name: 'Pin the finding' }));
}

describe('finding form without a connection', () => {
  it('asks about a reading within the limit there and then; kept as a note, it waits on the device as a note', async () => {
    const { user, onClose } = renderForm();
    // 4 in: inside 3 in to 6 in.
    await pilotReading(user, '4');
    const ask = await screen.findByRole('alertdialog', { name: 'Reading within the limit' });
    expect(ask).toHaveTextContent('49 CFR 229.123(a)');
    expect(ask).toHaveTextContent('No connection: a note is kept on this device and sent when the connection returns.');
    expect(offlineQueue.snapshot().pending).toEqual([]);
    await user.click(within(ask).getByRole('button', { name: 'Keep as a note' }));
    await waitFor(() => expect(onClose).toHaveBeenCalled());
    const [q] = offlineQueue.snapshot().pending;
    expect(isFinding(q) && q.body.keepAsNote).toBe(true);
    expect(isFinding(q) && q.preview.weight).toBe('note');
    // Every try (the question, the note, the queue's own) went with the one key.
    expect(findingPosts.length).toBeGreaterThanOrEqual(2);
    expect(new Set(findingPosts.map((p) => p.idempotencyKey))).toEqual(new Set([q.key]));
    expect(findingPosts[0].keepAsNote).toBeUndefined();
  });

  it('a reading out of limit is kept at once, no question asked', async () => {
    const { user, onClose } = renderForm();
    await pilotReading(user, '2.5');
    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(screen.queryByRole('alertdialog')).toBeNull();
    const [q] = offlineQueue.snapshot().pending;
    expect(isFinding(q) && q.body.keepAsNote).toBeFalsy();
  });

  it('while a change to this inspection waits, a new finding goes behind it without trying the server first', async () => {
    await offlineQueue.enqueueMark({ key: 'mark-1', inspectionId: INSP, body: { instanceIds: ['coupler_sh'], state: 'passed' }, preview: { parts: ['Front coupler'], area: null } });
    const { user, onClose } = renderForm();
    await pilotReading(user, '2.5');
    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(findingPosts).toEqual([]);
    expect(offlineQueue.snapshot().pending.map((p) => p.kind)).toEqual(['coverage', 'finding']);
  });
});
