// The outbox screen (admin) with the API mocked at fetch, and the reading of raw mail from the local SMTP
// server: quoted-printable per RFC 2045 §6.7 (soft line breaks "=" at line end, "=XX" bytes, UTF-8 text).
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import OutboxScreen from '../../src/features/outbox';
import type { OutboxMessage } from '../../src/features/outbox/api/outbox';
import { decodeQuotedPrintable, mailBody } from '../../src/features/outbox/lib/mail-body';

afterEach(() => vi.unstubAllGlobals());

describe('mail body', () => {
  it('undoes quoted-printable: soft breaks, =XX bytes and multi-byte UTF-8', () => {
    expect(decodeQuotedPrintable('Marlow Yard: the unit=E2=80=99s pilot is 2.5 in, below the 3 in mi=\nnimum')).toBe('Marlow Yard: the unit’s pilot is 2.5 in, below the 3 in minimum');
    expect(decodeQuotedPrintable('a =3D b')).toBe('a = b');
  });

  it('takes the text after the headers, decoding by the transfer encoding', () => {
    const raw = ['Subject: x', 'Content-Type: text/plain; charset=utf-8', 'Content-Transfer-Encoding: quoted-printable', '', 'HRL 4104 =E2=80=94 front pilot', ''].join('\r\n');
    expect(mailBody(raw)).toBe('HRL 4104 — front pilot');
    const b64 = ['Subject: y', 'Content-Transfer-Encoding: base64', '', Buffer.from('Due: HRL 2201 annual tests', 'utf8').toString('base64')].join('\r\n');
    expect(mailBody(b64)).toBe('Due: HRL 2201 annual tests');
    expect(mailBody('Subject: z\r\n\r\nplain 7bit text\r\n')).toBe('plain 7bit text');
  });
});

const msg = (over: Partial<OutboxMessage>): OutboxMessage => ({
  id: 'm1',
  kind: 'non_complying',
  to: 'foreman@demo.example',
  subject: 'HRL 4104 is non-complying',
  body: 'Front pilot: pilot height 2.5 in',
  status: 'sent',
  attempts: 1,
  nextAttemptAt: null,
  lastError: null,
  createdAt: '2026-03-02T13:05:00.000Z',
  sentAt: '2026-03-02T13:05:02.000Z',
  ...over,
});

function mockOutbox(items: OutboxMessage[], received: { enabled: boolean; items: unknown[] }) {
  const calls: { method: string; path: string }[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      const method = init?.method ?? 'GET';
      calls.push({ method, path: url.pathname });
      let body: unknown = { error: { code: 'not_found', message: 'no mock' } };
      if (url.pathname === '/api/outbox') body = { items };
      else if (url.pathname === '/api/outbox/received') body = received;
      else if (method === 'POST' && /^\/api\/outbox\/[^/]+\/retry$/.test(url.pathname)) body = { ok: true };
      return new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return calls;
}

function renderOutbox() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={['/outbox']}>
        <Routes>
          <Route path="/outbox/*" element={<OutboxScreen />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('outbox screen', () => {
  it('lists messages with status in words, attempts and last error, and retries failed or waiting ones', async () => {
    const calls = mockOutbox(
      [
        msg({ id: 'm3', status: 'failed', attempts: 8, lastError: 'connect ECONNREFUSED 127.0.0.1:2525', subject: 'Marlow Yard: due and overdue', kind: 'digest', sentAt: null }),
        msg({ id: 'm2', status: 'pending', attempts: 2, lastError: 'timeout', nextAttemptAt: '2026-03-02T13:10:00.000Z', sentAt: null, subject: 'HRL 2201 is non-complying' }),
        msg({ id: 'm1' }),
      ],
      { enabled: false, items: [] },
    );
    const user = userEvent.setup();
    renderOutbox();
    await waitFor(() => expect(screen.getAllByTestId('outbox-row')).toHaveLength(3));
    const [failed, pending, sent] = screen.getAllByTestId('outbox-row');
    expect(failed).toHaveTextContent('Failed');
    expect(failed).toHaveTextContent('ECONNREFUSED');
    expect(within(failed).getAllByRole('cell')[2]).toHaveTextContent('8');
    expect(pending).toHaveTextContent('Waiting to send');
    expect(sent).toHaveTextContent('Sent');
    expect(within(sent).queryByRole('button', { name: /Send again/ })).toBeNull();
    expect(screen.getByRole('heading', { name: 'Messages (3, 1 failed)' })).toBeInTheDocument();
    await user.click(within(failed).getByRole('button', { name: 'Send again: Marlow Yard: due and overdue' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'POST' && c.path === '/api/outbox/m3/retry')).toBe(true));
    // The list is fetched again after a retry.
    await waitFor(() => expect(calls.filter((c) => c.path === '/api/outbox').length).toBeGreaterThan(1));
    // The body opens on demand.
    const summary = within(failed).getByText('Marlow Yard: due and overdue');
    expect(summary.closest('details')).not.toHaveAttribute('open');
    await user.click(summary);
    expect(summary.closest('details')).toHaveAttribute('open');
    expect(screen.queryByRole('heading', { name: /Received by the local test mail server/ })).toBeNull();
  });

  it('shows what the local SMTP server received when it runs, with the body decoded', async () => {
    mockOutbox([], {
      enabled: true,
      items: [{ to: ['foreman@demo.example'], from: 'hoodline@demo.example', subject: 'HRL 4104 is non-complying', at: '2026-03-02T13:05:02.000Z', raw: 'Subject: HRL 4104 is non-complying\r\nContent-Transfer-Encoding: quoted-printable\r\n\r\nFront pilot =E2=80=94 2.5 in above rail\r\n' }],
    });
    renderOutbox();
    expect(await screen.findByText('Nothing queued yet')).toBeInTheDocument();
    const list = await screen.findByRole('list', { name: 'Received mail' });
    expect(list).toHaveTextContent('HRL 4104 is non-complying');
    expect(list).toHaveTextContent('to foreman@demo.example');
    expect(within(list).getByText('Front pilot — 2.5 in above rail')).toBeInTheDocument();
  });
});
