import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { StartScreen } from '../../src/features/walkaround/components/start-screen';

// Typing with user-event is slow on a busy two-core machine; the default 5 s is too tight.
vi.setConfig({ testTimeout: 30_000 });

const UNITS = [
  { id: '11111111-1111-4111-8111-111111111111', roadNumber: 'HRL 4101', unitTypeKey: 'six_axle_road', unitTypeName: 'Six-axle road unit, cab on short hood', frontEnd: 'short_hood', yardName: 'Marlow Yard', nonComplying: false },
  { id: '22222222-2222-4222-8222-222222222222', roadNumber: 'HRL 4103', unitTypeKey: 'six_axle_road', unitTypeName: 'Six-axle road unit, cab on short hood', frontEnd: 'long_hood', yardName: 'Marlow Yard', nonComplying: true },
];
let starts: Record<string, unknown>[];

beforeEach(() => {
  starts = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
      const url = String(input);
      const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
      if (url.startsWith('/api/inspections?')) return json(200, { items: [{ id: 'aaaaaaaa-aaaa-4aaa-8aaa-aaaaaaaaaaaa', kind: 'periodic', status: 'in_progress', startedAt: '2026-03-02T14:00:00Z', unitId: UNITS[0].id, roadNumber: 'HRL 4101', inspector: 'Dana Okafor', signedAt: null, correctsId: null }] });
      if (url.startsWith('/api/units')) {
        const q = new URL(url, 'http://x').searchParams.get('q') ?? '';
        return json(200, { items: UNITS.filter((u) => u.roadNumber.includes(q)) });
      }
      if (url === '/api/inspections' && init.method === 'POST') {
        starts.push(JSON.parse(String(init.body)));
        return json(201, { id: 'bbbbbbbb-bbbb-4bbb-8bbb-bbbbbbbbbbbb' });
      }
      throw new Error(`unexpected fetch ${url}`);
    }),
  );
});
afterEach(() => vi.unstubAllGlobals());

function renderStart() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={['/walkaround']}>
        <Routes>
          <Route path="/walkaround" element={<StartScreen />} />
          <Route path="/walkaround/inspections/:id" element={<p>walking</p>} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
  return userEvent.setup();
}

describe('walkaround start', () => {
  it('lists the open inspections to resume', async () => {
    renderStart();
    const link = await screen.findByRole('link', { name: /Resume periodic inspection of HRL 4101/ });
    expect(link).toHaveAttribute('href', '/walkaround/inspections/aaaaaaaa-aaaa-4aaa-8aaa-aaaaaaaaaaaa');
  });

  it('flags non-complying units and finds units by road number', async () => {
    const user = renderStart();
    const flagged = await screen.findByRole('radio', { name: /HRL 4103/ });
    expect(within(flagged).getByText('Non-complying')).toBeInTheDocument();
    expect(within(screen.getByRole('radio', { name: /HRL 4101/ })).queryByText('Non-complying')).toBeNull();
    await user.type(screen.getByLabelText('Road number'), '4103');
    await vi.waitFor(() => expect(screen.queryByRole('radio', { name: /HRL 4101/ })).toBeNull());
  });

  it('pre-selects the F end of the record, warns when the inspector sees the other, and starts with what was seen', async () => {
    const user = renderStart();
    await user.click(await screen.findByRole('radio', { name: /HRL 4103/ }));
    const onLong = screen.getByRole('radio', { name: /F on the long hood/ });
    expect(onLong).toHaveAttribute('aria-checked', 'true');
    expect(onLong).toHaveTextContent('The unit record says this');
    expect(screen.queryByRole('alert')).toBeNull();
    await user.click(screen.getByRole('radio', { name: /F on the short hood/ }));
    expect(screen.getByRole('alert')).toHaveTextContent('The foreman and admin will be told; this inspection uses what you saw');
    await user.click(screen.getByRole('radio', { name: 'Periodic (92-day)' }));
    await user.click(screen.getByRole('button', { name: 'Confirm F on the short hood and start' }));
    expect(await screen.findByText('walking')).toBeInTheDocument();
    expect(starts).toHaveLength(1);
    expect(starts[0]).toMatchObject({ unitId: UNITS[1].id, kind: 'periodic', frontEndSeen: 'short_hood' });
    expect(typeof starts[0].idempotencyKey).toBe('string');
  });
});
