import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { entryTitle, isFinding, isMark, noteText, type FailedEntry, type QueuedEntry } from './queue';
import { Link } from 'react-router-dom';
import { flushNow, keepRefusedAsNote, offlineQueue, startOfflineSync, useOfflineQueue, useQueueSignedOut } from './sync';

/** Starts the queue's sending for the walkaround screens (app start, connection back, page shown again, retry timer). */
export function OfflineSync() {
  const qc = useQueryClient();
  useEffect(() => startOfflineSync(qc), [qc]);
  return null;
}

function CopyNote({ f }: { f: FailedEntry }) {
  const [copied, setCopied] = useState<'yes' | 'no' | null>(null);
  const text = noteText(f);
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(text);
      setCopied('yes');
    } catch {
      // No clipboard (permission, old browser): the note is shown selectable below.
      setCopied('no');
    }
  };
  return (
    <>
      {copied === 'no' && <pre className="whitespace-pre-wrap rounded bg-paper-2 p-2 text-base select-all">{text}</pre>}
      <button type="button" className="btn min-h-12" onClick={() => void copy()}>
        {copied === 'yes' ? 'Note copied' : 'Copy the note'}
      </button>
    </>
  );
}

function FailedRow({ f }: { f: FailedEntry }) {
  // The server asks whether a reading within its limit is worth keeping: the same question the form asks online.
  const asks = isFinding(f.entry) && f.code === 'check_passed';
  return (
    <li className="card space-y-2 p-3" data-testid="failed-entry" data-kind={isMark(f.entry) ? 'coverage' : 'finding'}>
      <p className="text-lg font-bold">{entryTitle(f.entry)}</p>
      <p>{f.message}</p>
      {isMark(f.entry) && !asks && <p className="text-base">Mark it again on the walk if the record is still open, or add it to a correction.</p>}
      <div className="flex flex-wrap gap-2">
        {asks ? (
          <>
            <button type="button" className="btn-primary min-h-12" onClick={() => void keepRefusedAsNote(f.entry.key)}>
              Keep as a note
            </button>
            <button type="button" className="btn min-h-12" onClick={() => void offlineQueue.dismiss(f.entry.key)}>
              Drop it
            </button>
          </>
        ) : (
          <>
            <CopyNote f={f} />
            <button type="button" className="btn min-h-12" onClick={() => void offlineQueue.dismiss(f.entry.key)}>
              Dismiss
            </button>
          </>
        )}
      </div>
    </li>
  );
}

/** Rows listed before the rest folds away. */
const SHOWN = 5;

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** "3 findings and 2 coverage marks": what waits, in the inspector's words. */
export function waitingSummary(pending: readonly QueuedEntry[]) {
  const findings = pending.filter(isFinding).length;
  const marks = pending.length - findings;
  return [findings && plural(findings, 'finding', 'findings'), marks && plural(marks, 'coverage mark', 'coverage marks')].filter(Boolean).join(' and ');
}

function WaitingRow({ q }: { q: QueuedEntry }) {
  if (isMark(q)) return <li data-kind="coverage">{entryTitle(q)}</li>;
  return (
    <li data-kind="finding">
      {entryTitle(q)}
      {q.photos.length > 0 && ` (${plural(q.photos.length, 'photo', 'photos')})`}
      {q.findingId && ' — stored, photos still to send'}
    </li>
  );
}

/** What is waiting to be sent, and what the server refused (never dropped without the inspector seeing it). */
export function OfflinePanel() {
  const { pending, failed } = useOfflineQueue();
  const signedOut = useQueueSignedOut();
  if (pending.length === 0 && failed.length === 0) return null;
  return (
    <div className="no-print space-y-3">
      {pending.length > 0 && (
        <section aria-labelledby="offline-waiting" className="rounded-md border-l-8 border-shop bg-paper-2 p-3" data-testid="offline-waiting">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="offline-waiting" className="text-xl font-bold">
              Waiting to send: {waitingSummary(pending)}
            </h2>
            <button type="button" className="btn min-h-12" onClick={() => void flushNow()}>
              Send now
            </button>
          </div>
          {signedOut ? (
            <p className="font-bold" role="alert" data-testid="offline-signed-out">
              Your session has ended, so these cannot be sent. They stay on this device:{' '}
              <Link className="underline" to="/sign-in">
                sign in again
              </Link>{' '}
              as the same inspector and they are sent at once.
            </p>
          ) : (
            <p>Kept on this device; sent in the order made, the moment the connection returns. Each is stored once, however often it is sent.</p>
          )}
          <ol className="list-decimal pl-6">
            {pending.slice(0, SHOWN).map((q) => (
              <WaitingRow key={q.key} q={q} />
            ))}
          </ol>
          {pending.length > SHOWN && (
            // A long spell without signal must not push the walk off the screen; the rest is one tap away.
            <details>
              <summary className="flex min-h-12 cursor-pointer items-center font-bold">{pending.length - SHOWN} more, sent after these</summary>
              <ol className="list-decimal pl-6" start={SHOWN + 1}>
                {pending.slice(SHOWN).map((q) => (
                  <WaitingRow key={q.key} q={q} />
                ))}
              </ol>
            </details>
          )}
        </section>
      )}
      {failed.length > 0 && (
        <section aria-labelledby="offline-failed" role="alert" className="rounded-md border-l-8 border-federal bg-paper-2 p-3" data-testid="offline-failed">
          <h2 id="offline-failed" className="text-xl font-bold text-federal">
            Could not be sent
          </h2>
          <p>The server refused these; they are not on the record. Each says why: copy the note to add it where it belongs, then dismiss it.</p>
          <ul className="space-y-2">
            {failed.map((f) => (
              <FailedRow key={f.entry.key} f={f} />
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}
