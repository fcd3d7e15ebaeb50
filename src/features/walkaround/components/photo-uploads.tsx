import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { inspectionKeys } from '../api/inspections';
import { uploadPhoto } from '../api/photos';

export const PHOTO_ACCEPT = 'image/jpeg,image/png,image/webp';

interface Job {
  key: string;
  file: File;
  progress: number;
  status: 'waiting' | 'sending' | 'done' | 'failed';
  error?: string;
}

/** Chosen photos before the finding exists: names and local previews; they are sent once it is stored. */
export function PhotoPicker({ files, onChange, id }: { files: File[]; onChange: (f: File[]) => void; id: string }) {
  const urls = useRef(new Map<File, string>());
  useEffect(() => () => urls.current.forEach((u) => URL.revokeObjectURL(u)), []);
  const urlOf = (f: File) => {
    let u = urls.current.get(f);
    if (!u && typeof URL.createObjectURL === 'function') urls.current.set(f, (u = URL.createObjectURL(f)));
    return u;
  };
  return (
    <div className="space-y-2">
      <label htmlFor={id} className="btn relative cursor-pointer">
        Add photos
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
            <li key={`${f.name}-${i}`} className="card flex items-center gap-2 p-1 pr-2">
              {urlOf(f) ? <img src={urlOf(f)} alt="" className="h-12 w-12 rounded object-cover" /> : null}
              <span className="max-w-40 truncate text-base">{f.name}</span>
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

/** Sends photos to a stored finding one by one, with a progress bar each; a failed one can be sent again. */
export function PhotoUploads({ findingId, inspectionId, files, onAllDone }: { findingId: string; inspectionId: string; files: File[]; onAllDone?: () => void }) {
  const qc = useQueryClient();
  const [jobs, setJobs] = useState<Job[]>([]);
  const started = useRef(new Set<File>());
  const inflight = useRef(new Set<string>());

  useEffect(() => {
    const fresh = files.filter((f) => !started.current.has(f));
    if (!fresh.length) return;
    fresh.forEach((f) => started.current.add(f));
    setJobs((j) => [...j, ...fresh.map((file, i) => ({ key: `${Date.now()}-${i}-${file.name}`, file, progress: 0, status: 'waiting' as const }))]);
  }, [files]);

  const busy = jobs.some((j) => j.status === 'sending');
  const next = jobs.find((j) => j.status === 'waiting');
  useEffect(() => {
    if (busy || !next) {
      if (!busy && !next && jobs.length && jobs.every((j) => j.status === 'done')) onAllDone?.();
      return;
    }
    if (inflight.current.has(next.key)) return;
    inflight.current.add(next.key);
    const patch = (p: Partial<Job>) => setJobs((js) => js.map((x) => (x.key === next.key ? { ...x, ...p } : x)));
    patch({ status: 'sending', progress: 0, error: undefined });
    uploadPhoto(findingId, next.file, next.file.name, (progress) => patch({ progress }))
      .then(() => {
        patch({ status: 'done', progress: 1 });
        void qc.invalidateQueries({ queryKey: inspectionKeys.one(inspectionId) });
      })
      .catch((e: unknown) => patch({ status: 'failed', error: e instanceof ApiError ? e.message : 'The photo was not sent' }))
      .finally(() => inflight.current.delete(next.key));
  }, [busy, next?.key]);

  if (!jobs.length) return null;
  return (
    <ul className="space-y-2" aria-label="Photo uploads">
      {jobs.map((j) => (
        <li key={j.key} className="space-y-1">
          <div className="flex items-center justify-between gap-2 text-base">
            <span className="truncate">{j.file.name}</span>
            <span className="shrink-0 font-bold">
              {j.status === 'done' ? 'Sent' : j.status === 'failed' ? 'Not sent' : j.status === 'waiting' ? 'Waiting' : `${Math.round(j.progress * 100)} %`}
            </span>
          </div>
          <progress className="h-3 w-full accent-graphite" max={1} value={j.progress} aria-label={`Upload of ${j.file.name}`} />
          {j.status === 'failed' && (
            <div className="flex flex-wrap items-center gap-2">
              <p role="alert" className="field-error mt-0">
                {j.error}
              </p>
              <button type="button" className="btn px-3 text-base" onClick={() => setJobs((js) => js.map((x) => (x.key === j.key ? { ...x, status: 'waiting' } : x)))}>
                Send again
              </button>
            </div>
          )}
        </li>
      ))}
    </ul>
  );
}
