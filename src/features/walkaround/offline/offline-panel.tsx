import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { noteText, type FailedFinding } from './queue';
import { flushNow, offlineQueue, startOfflineSync, useOfflineQueue } from './sync';

/** Starts the queue's sending for the walkaround screens (app start, connection back, retry timer). */
export function OfflineSync() {
  const qc = useQueryClient();
  useEffect(() => startOfflineSync(qc), [qc]);
  return null;
}

function FailedRow({ f }: { f: FailedFinding }) {
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
    <li className="card space-y-2 p-3" data-testid="failed-finding">
      <p className="text-lg font-bold">
        {f.entry.preview.label}: {f.entry.preview.defectLabel}
      </p>
      <p>{f.message}</p>
      {copied === 'no' && <pre className="whitespace-pre-wrap rounded bg-paper-2 p-2 text-base select-all">{text}</pre>}
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn min-h-12" onClick={() => void copy()}>
          {copied === 'yes' ? 'Note copied' : 'Copy the note'}
        </button>
        <button type="button" className="btn min-h-12" onClick={() => void offlineQueue.dismiss(f.entry.key)}>
          Dismiss
        </button>
      </div>
    </li>
  );
}

/** What is waiting to be sent, and what the server refused (never dropped without the inspector seeing it). */
export function OfflinePanel() {
  const { pending, failed } = useOfflineQueue();
  if (pending.length === 0 && failed.length === 0) return null;
  return (
    <div className="no-print space-y-3">
      {pending.length > 0 && (
        <section aria-labelledby="offline-waiting" className="rounded-md border-l-8 border-shop bg-paper-2 p-3" data-testid="offline-waiting">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="offline-waiting" className="text-xl font-bold">
              Waiting to send: {pending.length} {pending.length === 1 ? 'finding' : 'findings'}
            </h2>
            <button type="button" className="btn min-h-12" onClick={() => void flushNow()}>
              Send now
            </button>
          </div>
          <p>Kept on this device; sent in the order pinned when the connection returns. Each is stored once, however often it is sent.</p>
          <ol className="list-decimal pl-6">
            {pending.map((q) => (
              <li key={q.key}>
                {q.preview.label}: {q.preview.defectLabel}
                {q.photos.length > 0 && ` (${q.photos.length} ${q.photos.length === 1 ? 'photo' : 'photos'})`}
                {q.findingId && ' — stored, photos still to send'}
              </li>
            ))}
          </ol>
        </section>
      )}
      {failed.length > 0 && (
        <section aria-labelledby="offline-failed" role="alert" className="rounded-md border-l-8 border-federal bg-paper-2 p-3" data-testid="offline-failed">
          <h2 id="offline-failed" className="text-xl font-bold text-federal">
            Could not be sent
          </h2>
          <p>The server refused these; they are not on the record. Copy the note to add it where it belongs, then dismiss it.</p>
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
