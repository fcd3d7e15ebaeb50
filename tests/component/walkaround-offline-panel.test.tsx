import { act, fireEvent, render, screen, within } from '@testing-library/react';
import { beforeEach, describe, expect, it, vi } from 'vitest';

// jsdom has no IndexedDB: idb-keyval is swapped for a Map with the same get/set contract.
const mem = new Map<string, unknown>();
vi.mock('idb-keyval', () => ({
  get: async (k: string) => mem.get(k),
  set: async (k: string, v: unknown) => void mem.set(k, structuredClone(v)),
}));

const { OfflinePanel } = await import('../../src/features/walkaround/offline/offline-panel');
const { offlineQueue } = await import('../../src/features/walkaround/offline/sync');

const finding = (n: number) => ({
  inspectionId: 'insp-1',
  body: { partId: 'pilot', view: 'plan' as const, x: n, y: 0, defectType: 'pilot_height', measurement: { value: 2.5, unit: 'in' as const }, idempotencyKey: `k-${n}` },
  preview: { partId: 'pilot', instanceId: 'pilot_sh', partKind: 'pilot', view: 'plan', body: { x: n, y: 0, z: 0 }, label: 'Front pilot', partLabel: 'Front pilot', defectLabel: 'Pilot height above rail out of limit', weight: 'federal', rule: '49 CFR 229.123' },
  photos: [{ blob: new Blob([new Uint8Array([1])], { type: 'image/png' }), name: 'p.png' }],
});

describe('offline panel', () => {
  beforeEach(() => mem.clear());

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
});
