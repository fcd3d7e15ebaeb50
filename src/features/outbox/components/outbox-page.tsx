import { useQuery } from '@tanstack/react-query';
import { ApiError } from '../../../lib/api-client';
import { outboxQuery, receivedQuery, useRetry, type OutboxMessage } from '../api/outbox';
import { mailBody } from '../lib/mail-body';

const when = (iso: string | null) =>
  iso ? new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(new Date(iso)) : '—';

const STATUS: Record<OutboxMessage['status'], { word: string; cls: string; mark: string }> = {
  sent: { word: 'Sent', cls: 'border-ok text-ok', mark: '✓' },
  pending: { word: 'Waiting to send', cls: 'border-shop text-shop', mark: '…' },
  failed: { word: 'Failed', cls: 'border-federal bg-federal text-paper', mark: '✕' },
};

const th = 'border-b-2 border-graphite px-2 py-1 align-bottom text-sm font-bold tracking-wider text-graphite-2 uppercase';
const td =
  'flex gap-3 py-1 before:w-28 before:shrink-0 before:text-sm before:font-bold before:tracking-wider before:text-graphite-2 before:uppercase before:content-[attr(data-label)] md:table-cell md:px-2 md:py-2 md:align-top md:before:hidden';
const tr = 'card mb-3 block p-2 md:mb-0 md:table-row md:rounded-none md:border-0 md:border-b md:border-rule md:p-0';

export function OutboxPage() {
  const list = useQuery(outboxQuery());
  const received = useQuery(receivedQuery());
  const retry = useRetry();
  const items = list.data?.items ?? [];
  const failed = items.filter((m) => m.status === 'failed').length;
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-3xl font-bold">Outbox</h1>
        <p className="text-graphite-2">
          E-mail Hoodline has queued: non-complying findings to the yard’s foremen and the daily due digest. A failed message is tried again with growing pauses; send
          it again here once the mail server is back.
        </p>
      </div>
      {retry.error instanceof ApiError && (
        <p role="alert" className="card border-federal p-3 font-bold text-federal">
          {retry.error.message}
        </p>
      )}
      <section aria-labelledby="outbox-messages" className="space-y-2">
        <h2 id="outbox-messages" className="text-2xl font-bold">
          Messages{list.data && ` (${items.length}${failed ? `, ${failed} failed` : ''})`}
        </h2>
        {list.isPending && <p>Loading the outbox…</p>}
        {list.isError && (
          <p role="alert" className="field-error">
            The outbox could not be loaded: {list.error.message}
          </p>
        )}
        {list.data && items.length === 0 && <p className="card p-6 text-center text-xl font-bold">Nothing queued yet</p>}
        {items.length > 0 && (
          <table className="w-full border-collapse text-left" aria-label="Outbox messages">
            <thead className="hidden md:table-header-group">
              <tr>
                <th className={th}>Message</th>
                <th className={th}>Status</th>
                <th className={th}>Attempts</th>
                <th className={th}>Last error</th>
                <th className={th}>
                  <span className="sr-only">Action</span>
                </th>
              </tr>
            </thead>
            <tbody className="block md:table-row-group">
              {items.map((m) => (
                <tr key={m.id} className={tr} data-testid="outbox-row" data-status={m.status}>
                  <td className={td} data-label="Message">
                    <div className="min-w-0">
                      <details className="group">
                        <summary className="flex min-h-12 cursor-pointer items-center gap-2 font-bold break-words">
                          <Chevron />
                          {m.subject}
                        </summary>
                        <pre className="mt-1 max-h-72 overflow-auto rounded bg-paper-2 p-2 font-sans text-base whitespace-pre-wrap">{m.body}</pre>
                      </details>
                      <div className="text-base break-all">To {m.to}</div>
                      <div className="text-sm text-graphite-2">
                        {m.kind.replace(/_/g, ' ')} · queued {when(m.createdAt)}
                        {m.sentAt && ` · sent ${when(m.sentAt)}`}
                      </div>
                    </div>
                  </td>
                  <td className={td} data-label="Status">
                    <div>
                      <span className={`inline-flex items-center gap-1 rounded border-2 px-1.5 py-0.5 text-sm leading-none font-bold whitespace-nowrap uppercase ${STATUS[m.status].cls}`}>
                        <span aria-hidden="true">{STATUS[m.status].mark}</span>
                        {STATUS[m.status].word}
                      </span>
                      {m.status === 'pending' && m.nextAttemptAt && <div className="text-sm text-graphite-2">next try {when(m.nextAttemptAt)}</div>}
                    </div>
                  </td>
                  <td className={td} data-label="Attempts">
                    {m.attempts}
                  </td>
                  <td className={td} data-label="Last error">
                    <span className={m.lastError ? 'break-words text-federal' : 'text-graphite-2'}>{m.lastError ?? 'None'}</span>
                  </td>
                  <td className={td} data-label="">
                    {m.status !== 'sent' && (
                      <button type="button" className="btn" disabled={retry.isPending && retry.variables === m.id} onClick={() => retry.mutate(m.id)} aria-label={`Send again: ${m.subject}`}>
                        Send again
                      </button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      {received.data?.enabled && (
        <section aria-labelledby="outbox-received" className="space-y-2">
          <h2 id="outbox-received" className="text-2xl font-bold">
            Received by the local test mail server ({received.data.items.length})
          </h2>
          <p className="text-graphite-2">This server runs only in development and tests; it keeps what it receives in memory until it restarts.</p>
          {received.data.items.length === 0 ? (
            <p className="card p-4">Nothing received yet.</p>
          ) : (
            <ul className="space-y-2" aria-label="Received mail">
              {received.data.items.map((m, i) => (
                <li key={`${m.at}-${i}`} className="card p-2">
                  <details className="group">
                    <summary className="flex min-h-12 cursor-pointer flex-wrap items-center gap-x-3">
                      <span className="inline-flex items-center gap-2 font-bold break-words">
                        <Chevron />
                        {m.subject}
                      </span>
                      <span className="text-base break-all">to {m.to.join(', ')}</span>
                      <span className="text-sm text-graphite-2">{when(m.at)}</span>
                    </summary>
                    <pre className="mt-1 max-h-96 overflow-auto rounded bg-paper-2 p-2 font-sans text-base whitespace-pre-wrap">{mailBody(m.raw)}</pre>
                  </details>
                </li>
              ))}
            </ul>
          )}
        </section>
      )}
    </div>
  );
}

function Chevron() {
  return (
    <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true" className="shrink-0 transition-transform group-open:rotate-90">
      <path d="M4 2 L10 7 L4 12" fill="none" stroke="currentColor" strokeWidth="2.5" />
    </svg>
  );
}
