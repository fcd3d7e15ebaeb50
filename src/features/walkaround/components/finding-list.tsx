import { useId, useState } from 'react';
import type { ClientFinding } from '../api/inspections';
import { measurementText } from '../lib/format';
import { PhotoPicker, PhotoUploads } from './photo-uploads';
import { WeightMark } from '../../../components/weight-mark';

function CheckLine({ f }: { f: ClientFinding }) {
  const c = f.checkResult as { result?: string; limit?: string; source?: string } | null;
  if (!c?.limit) return null;
  return (
    <p className="text-base">
      Check: <strong>{c.result === 'pass' ? 'within the limit' : 'out of limit'}</strong> — {c.limit} ({c.source})
    </p>
  );
}

function AddPhotos({ f, inspectionId }: { f: ClientFinding; inspectionId: string }) {
  const [files, setFiles] = useState<File[]>([]);
  const id = useId();
  return (
    <div className="space-y-2">
      <PhotoUploads findingId={f.id} inspectionId={inspectionId} files={files} />
      <PhotoPicker id={id} files={[]} onChange={(more) => setFiles((x) => [...x, ...more])} />
    </div>
  );
}

/** Findings with their labels, weight, rule, reading and photos; `editable` lets photos be added while the inspection is open. */
export function FindingList({ findings, inspectionId, editable = false, empty = 'No findings.' }: { findings: readonly ClientFinding[]; inspectionId: string; editable?: boolean; empty?: string }) {
  if (!findings.length) return <p className="text-graphite-2">{empty}</p>;
  return (
    <ul className="space-y-2" aria-label="Findings">
      {findings.map((f) => (
        <li key={f.id} className="card space-y-1 p-3" data-testid="finding" data-pending={f.pending ? 'true' : undefined}>
          <p className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <WeightMark weight={f.weight} />
            <strong className="text-lg">{f.label}</strong>
            {f.pending && <span className="rounded bg-paper-2 px-1.5 text-base">{f.id.startsWith('queued-') ? 'Waiting to send' : 'Sending…'}</span>}
            {!f.pending && f.state !== 'open' && <span className="rounded bg-paper-2 px-1.5 text-base">{f.state.replace('_', ' ')}</span>}
          </p>
          <p className="text-lg">{f.defectLabel}</p>
          <p className="text-base text-graphite-2">{f.rule ? `Rule: ${f.rule}` : 'No federal rule cited'}</p>
          {f.measurement && <p className="text-base">Reading: {measurementText(f.measurement)}</p>}
          <CheckLine f={f} />
          {f.note && <p className="text-base">Note: {f.note}</p>}
          {f.photos.length > 0 && (
            <ul className="flex flex-wrap gap-2 pt-1" aria-label="Photos">
              {f.photos.map((p) => (
                <li key={p.id}>
                  <a href={p.full} target="_blank" rel="noreferrer" className="block rounded focus-visible:outline-3 focus-visible:outline-accent">
                    <img src={p.thumb} alt={`Photo of ${f.label}`} className="h-20 w-20 rounded border-2 border-rule object-cover" loading="lazy" />
                  </a>
                </li>
              ))}
            </ul>
          )}
          {editable && !f.pending && <AddPhotos f={f} inspectionId={inspectionId} />}
        </li>
      ))}
    </ul>
  );
}
