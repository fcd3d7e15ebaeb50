import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useId, useRef, useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { repairKeys } from '../api/queue';
import { uploadRepairPhoto } from '../api/repair-photo';

export const PHOTO_ACCEPT = 'image/jpeg,image/png,image/webp';

export interface UploadJob {
  key: string;
  file: File;
  progress: number;
  status: 'waiting' | 'sending' | 'done' | 'failed';
  error?: string;
}

/** Sends repair photos one at a time (a yard's mobile link is narrow), keeping a progress bar for each. */
export function useRepairUploads(findingId: string) {
  const qc = useQueryClient();
  const [jobs, setJobs] = useState<UploadJob[]>([]);
  const seq = useRef(0);
  const patch = (key: string, p: Partial<UploadJob>) => setJobs((js) => js.map((j) => (j.key === key ? { ...j, ...p } : j)));
  const run = useCallback(
    async (list: UploadJob[]) => {
      for (const j of list) {
        patch(j.key, { status: 'sending', progress: 0, error: undefined });
        try {
          await uploadRepairPhoto(findingId, j.file, j.file.name, (f) => patch(j.key, { progress: f }));
          patch(j.key, { status: 'done', progress: 1 });
        } catch (e) {
          patch(j.key, { status: 'failed', error: e instanceof ApiError ? e.message : 'The photo was not sent' });
        }
      }
      void qc.invalidateQueries({ queryKey: repairKeys.finding(findingId) });
    },
    [findingId, qc],
  );
  const send = useCallback(
    (files: File[]) => {
      const list = files.map((file) => ({ key: `p${++seq.current}`, file, progress: 0, status: 'waiting' as const }));
      setJobs((js) => [...js, ...list]);
      void run(list);
    },
    [run],
  );
  const retry = useCallback((job: UploadJob) => void run([job]), [run]);
  return { jobs, send, retry };
}

export function PhotoPicker({ files, onChange, label = 'Add photos of the repair' }: { files: File[]; onChange: (f: File[]) => void; label?: string }) {
  const id = useId();
  return (
    <div className="space-y-2">
      <label htmlFor={id} className="btn cursor-pointer focus-within:outline-3 focus-within:outline-accent">
        {label}
        <input
          id={id}
          type="file"
          accept={PHOTO_ACCEPT}
          multiple
          className="sr-only"
          onChange={(e) => {
            onChange([...files, ...Array.from(e.target.files ?? [])]);
            e.target.value = '';
          }}
        />
      </label>
      {files.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Photos to send">
          {files.map((f, i) => (
            <li key={`${f.name}-${i}`} className="card flex items-center gap-2 p-1 pl-3">
              <span className="max-w-48 truncate text-base">{f.name}</span>
              <button type="button" className="btn min-w-12 px-2 text-base" aria-label={`Remove ${f.name}`} onClick={() => onChange(files.filter((_, j) => j !== i))}>
                ✕
              </button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

export function UploadList({ jobs, onRetry }: { jobs: UploadJob[]; onRetry: (j: UploadJob) => void }) {
  if (!jobs.length) return null;
  return (
    <ul className="space-y-2" aria-label="Repair photos being sent">
      {jobs.map((j) => (
        <li key={j.key} className="card flex flex-wrap items-center gap-3 p-2">
          <span className="max-w-56 truncate font-bold">{j.file.name}</span>
          <progress className="h-3 w-40 accent-graphite" max={1} value={j.progress} aria-label={`Sending ${j.file.name}`} />
          <span className="text-base">
            {j.status === 'done' ? 'Sent' : j.status === 'failed' ? 'Not sent' : j.status === 'waiting' ? 'Waiting' : `${Math.round(j.progress * 100)} %`}
          </span>
          {j.status === 'failed' && (
            <>
              <span className="field-error mt-0">{j.error}</span>
              <button type="button" className="btn" onClick={() => onRetry(j)}>
                Send again
              </button>
            </>
          )}
        </li>
      ))}
    </ul>
  );
}
