import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useId, useMemo, useRef, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import type { FindingView } from '../../../../shared/api/walkaround';
import { civilDateInZone } from '../../../../shared/checks/civil-date';
import { bodyPoint, type ViewKey } from '../../../../shared/domain/frames';
import type { ViewCoord } from '../../../../shared/drawings/types';
import { viewPointToBody } from '../../../../shared/orientation';
import { ApiError } from '../../../lib/api-client';
import { defectTypesQuery, type DefectTypeItem } from '../api/defect-types';
import { newIdempotencyKey, useAddFinding } from '../api/inspections';
import { liveCheck, readingKind } from '../lib/check-input';
import { emptyFindingForm, findingFormSchema, formFieldOf, readingOf, toFindingBody, type FindingFormValues } from '../lib/finding-form';
import { PhotoPicker, PhotoUploads } from './photo-uploads';
import { mustQueue, queueFinding } from '../offline/sync';
import { WeightMark } from '../../../components/weight-mark';

/** The part and spot a finding is pinned on. */
export interface FindingTarget {
  partId: string;
  instanceId: string;
  kind: string;
  label: string;
  view: ViewKey;
  at: ViewCoord;
  /** The part's centre in the carbody frame: fills the axis the view cannot show. */
  centre: { x: number; y: number; z: number };
}

export interface FindingDraft {
  target: FindingTarget;
  values: FindingFormValues;
  idempotencyKey: string;
}

export interface FindingFormProps {
  inspectionId: string;
  target: FindingTarget;
  humpStencilled: boolean;
  timeZone: string;
  draft?: FindingDraft | null;
  /** Called with the form as typed, so an unsent finding survives a reload; null once it is stored or dropped. */
  onDraft?(d: FindingDraft | null): void;
  onClose(): void;
}


function RuleRef({ d }: { d: DefectTypeItem }) {
  if (!d.rule) return <span className="text-graphite-2">{d.weight === 'shop' ? 'Railroad standard' : 'Worth watching'}</span>;
  return (
    <span>
      {d.rule}
      {d.ruleConfidence === 'memory' ? ' (from memory)' : ''}
    </span>
  );
}

function CheckResult({ outcome, defect }: { outcome: ReturnType<typeof liveCheck>; defect: DefectTypeItem }) {
  if (!defect.check) return null;
  if (!outcome)
    return (
      <p className="text-base text-graphite-2" data-testid="check-result">
        Enter the reading to check it against the limit.
      </p>
    );
  if (!outcome.ok) {
    const i = outcome.error.issues[0];
    return (
      <p className="field-error" data-testid="check-result">
        {i.path.length ? `${String(i.path.at(-1))}: ` : ''}
        {i.message}
      </p>
    );
  }
  const o = outcome.output as unknown as { result: 'pass' | 'fail'; limit: string; source: string; percentLost?: number; lastGoodDay?: string };
  const pass = o.result === 'pass';
  return (
    <div
      role="status"
      data-testid="check-result"
      data-result={o.result}
      className={`rounded-md border-l-8 bg-paper-2 p-3 ${pass ? 'border-ok' : 'border-federal'}`}
    >
      <p className={`text-xl font-bold ${pass ? 'text-ok' : 'text-federal'}`}>{pass ? 'Pass: within the limit' : 'Fail: out of limit'}</p>
      {o.percentLost !== undefined && <p>Area lost: {o.percentLost} %</p>}
      {o.lastGoodDay && <p>Good through {o.lastGoodDay}</p>}
      <p>Limit: {o.limit}</p>
      <p>Source: {o.source}</p>
    </div>
  );
}

export function FindingForm({ inspectionId, target, humpStencilled, timeZone, draft, onDraft, onClose }: FindingFormProps) {
  const ids = { heading: useId(), value: useId(), nominal: useId(), adjoining: useId(), lastDone: useId(), note: useId(), photos: useId() };
  const types = useQuery(defectTypesQuery(target.kind));
  const add = useAddFinding(inspectionId);
  const qc = useQueryClient();
  const [idem] = useState(() => draft?.idempotencyKey ?? newIdempotencyKey());
  const [files, setFiles] = useState<File[]>([]);
  const [moreFiles, setMoreFiles] = useState<File[]>([]);
  /** The reading is within its limit: keep it as a note, or drop it? `offline` when this device answered for the server. */
  const [asking, setAsking] = useState<{ limit: string; source: string; offline?: boolean } | null>(null);
  const [general, setGeneral] = useState<string | null>(null);
  const [stored, setStored] = useState<FindingView | null>(null);
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => heading.current?.focus(), []);

  const [defectKey, setDefectKey] = useState(draft?.values.defectType ?? '');
  const defect = types.data?.items.find((d) => d.key === defectKey);
  const schema = useMemo(() => findingFormSchema(defect), [defect]);
  const form = useForm<FindingFormValues>({
    resolver: zodResolver(schema),
    defaultValues: draft?.values ?? emptyFindingForm(),
    mode: 'onTouched',
  });
  const { register, handleSubmit, setError, control, setValue, formState } = form;
  const values = useWatch({ control }) as FindingFormValues;
  useEffect(() => {
    if (values.defectType !== defectKey) setDefectKey(values.defectType);
  }, [values.defectType, defectKey]);
  const typed = JSON.stringify(values);
  useEffect(() => {
    if (stored) return;
    onDraft?.({ target, values: { ...emptyFindingForm(), ...values }, idempotencyKey: idem });
    // A changed reading is a new question.
    setAsking(null);
  }, [typed, stored]);

  // A gauged defect offers its own unit first, until a reading is typed.
  useEffect(() => {
    if (defect?.measurement && !values.value) setValue('unit', defect.measurement.defaultUnit);
  }, [defect?.key]);

  const today = civilDateInZone(new Date(), timeZone);
  const kind = readingKind(defect);
  const outcome = liveCheck(defect, readingOf({ ...emptyFindingForm(), ...values }), { humpStencilled, today });

  const send = (v: FindingFormValues, keepAsNote = false) => {
    setGeneral(null);
    let body;
    try {
      body = toFindingBody(v, defect, { partId: target.partId, view: target.view, x: target.at.u, y: target.at.v }, { idempotencyKey: idem, keepAsNote });
    } catch {
      setGeneral('The finding could not be prepared; check the fields.');
      return;
    }
    const passed = outcome?.ok && (outcome.output as { result: string }).result === 'pass';
    const weight = keepAsNote || passed ? 'note' : (defect?.weight ?? 'note');
    const preview = {
      partId: target.partId,
      instanceId: target.instanceId,
      partKind: target.kind,
      view: target.view,
      body: viewPointToBody(target.view, target.at, bodyPoint(target.centre.x, target.centre.y, target.centre.z)),
      label: target.label,
      partLabel: target.label,
      defectLabel: defect?.label ?? v.defectType,
      weight,
      rule: defect?.rule ?? null,
    };
    // Kept on the device with its photos and sent when the connection returns. A reading within its
    // limit is asked about first, here, from the same check the server runs (shared/), rather than
    // refused later when the inspector has walked on.
    const keep = () => {
      if (passed && outcome?.ok && !keepAsNote) {
        const o = outcome.output as unknown as { limit: string; source: string };
        setAsking({ limit: o.limit, source: o.source, offline: true });
        return;
      }
      void queueFinding(qc, { inspectionId, body: { ...body, idempotencyKey: idem }, preview, photos: files.map((f) => ({ blob: f, name: f.name })) }).then(
        () => {
          onDraft?.(null);
          onClose();
        },
        () => setGeneral('No connection, and this device could not keep the finding; it stays in this form.'),
      );
    };
    // Earlier changes to this inspection still wait on the device: this one goes behind them, never ahead.
    if (mustQueue(inspectionId)) return keep();
    add.mutate(
      { body, preview },
      {
        onSuccess: (f) => {
          setAsking(null);
          setStored(f);
          onDraft?.(null);
        },
        onError: (e) => {
          if (!(e instanceof ApiError)) return setGeneral('Something went wrong; the finding was not stored.');
          if (e.status === 0) return keep();
          if (e.code === 'check_passed') {
            const c = (e.extra?.check ?? {}) as { limit?: string; source?: string };
            setAsking({ limit: c.limit ?? '', source: c.source ?? '' });
            return;
          }
          // Field errors go next to their fields; the message says what happened overall.
          for (const [k, msg] of Object.entries(e.fields ?? {})) {
            const f = formFieldOf(k);
            if (f) setError(f, { type: 'server', message: msg });
          }
          setGeneral(e.message);
        },
      },
    );
  };

  const drop = () => {
    onDraft?.(null);
    onClose();
  };

  const err = (name: keyof FindingFormValues, id: string) =>
    formState.errors[name] ? (
      <p id={`${id}-error`} className="field-error">
        {formState.errors[name]?.message}
      </p>
    ) : null;
  const aria = (name: keyof FindingFormValues, id: string) => ({
    'aria-invalid': formState.errors[name] ? true : undefined,
    'aria-describedby': formState.errors[name] ? `${id}-error` : undefined,
  });

  if (stored) {
    return (
      <section aria-labelledby={ids.heading} className="space-y-3" data-testid="finding-stored">
        <h2 id={ids.heading} ref={heading} tabIndex={-1} className="text-2xl font-bold">
          Pinned: {stored.label}
        </h2>
        <p className="flex flex-wrap items-center gap-2 text-lg">
          <WeightMark weight={stored.weight} /> {stored.defectLabel}
          {stored.rule && <span className="text-graphite-2">({stored.rule})</span>}
        </p>
        <PhotoUploads findingId={stored.id} inspectionId={inspectionId} files={[...files, ...moreFiles]} />
        <PhotoPicker id={ids.photos} files={[]} onChange={(f) => setMoreFiles((m) => [...m, ...f])} />
        <button type="button" className="btn-primary w-full" onClick={onClose}>
          Done
        </button>
      </section>
    );
  }

  const offline = add.error instanceof ApiError && add.error.status === 0;
  return (
    <form
      noValidate
      aria-labelledby={ids.heading}
      className="space-y-4"
      onSubmit={handleSubmit((v) => send(v))}
      data-testid="finding-form"
    >
      <div className="flex items-start justify-between gap-2">
        <h2 id={ids.heading} ref={heading} tabIndex={-1} className="text-2xl font-bold">
          Finding on {target.label}
        </h2>
        <button type="button" className="btn shrink-0 px-3" onClick={drop}>
          Cancel
        </button>
      </div>

      <fieldset>
        <legend className="label">What is wrong</legend>
        {types.isPending && <p>Loading the defect types…</p>}
        {types.isError && (
          <p role="alert" className="field-error">
            {types.error.message}
          </p>
        )}
        <div className="space-y-1.5" role="radiogroup" aria-label="Defect type" {...aria('defectType', 'defectType')}>
          {types.data?.items.map((d) => (
            <label
              key={d.key}
              className={`flex min-h-12 cursor-pointer items-start gap-3 rounded-md border-2 p-2 has-[:checked]:border-accent has-[:checked]:bg-accent-soft has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-accent ${
                formState.errors.defectType ? 'border-federal' : 'border-rule'
              }`}
            >
              <input type="radio" value={d.key} {...register('defectType')} className="mt-1 h-6 w-6 shrink-0 accent-accent" />
              <span className="min-w-0 flex-1">
                <span className="block text-lg leading-tight">{d.label}</span>
                <span className="flex flex-wrap items-center gap-x-3 text-base">
                  <WeightMark weight={d.weight} size={16} />
                  <RuleRef d={d} />
                </span>
              </span>
            </label>
          ))}
        </div>
        {err('defectType', 'defectType')}
      </fieldset>

      {defect && kind !== 'none' && (
        <fieldset className="space-y-3">
          <legend className="label">{kind === 'date' ? 'Date' : 'Measurement'}</legend>
          {kind === 'date' ? (
            <div>
              <label htmlFor={ids.lastDone} className="label">
                {defect.check === 'sanders' ? 'Day the failure was found' : 'Date on the card (last done)'}
              </label>
              <input id={ids.lastDone} type="date" className="field max-w-xs" max={today} {...register('lastDone')} {...aria('lastDone', ids.lastDone)} />
              {err('lastDone', ids.lastDone)}
            </div>
          ) : (
            <>
              <div className="flex flex-wrap items-end gap-3">
                <div className="min-w-40 flex-1">
                  <label htmlFor={ids.value} className="label">
                    {kind === 'chain' ? 'Measured diameter (worn spot)' : kind === 'spot' ? 'Length of the spot' : 'Reading'}
                  </label>
                  <input id={ids.value} className="field" inputMode="decimal" autoComplete="off" {...register('value')} {...aria('value', ids.value)} />
                </div>
                <div role="radiogroup" aria-label="Unit" className="flex gap-1.5">
                  {(['in', 'mm'] as const).map((u) => (
                    <label key={u} className="btn relative min-w-16 cursor-pointer has-[:checked]:bg-graphite has-[:checked]:text-paper has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-accent">
                      <input type="radio" value={u} {...register('unit')} className="sr-only" />
                      {u}
                    </label>
                  ))}
                </div>
              </div>
              {err('value', ids.value)}
              {err('unit', ids.value)}
              {kind === 'chain' && (
                <div>
                  <label htmlFor={ids.nominal} className="label">
                    Nominal diameter (new link)
                  </label>
                  <input id={ids.nominal} className="field max-w-xs" inputMode="decimal" autoComplete="off" {...register('nominal')} {...aria('nominal', ids.nominal)} />
                  {err('nominal', ids.nominal)}
                </div>
              )}
              {kind === 'spot' && (
                <div>
                  <label htmlFor={ids.adjoining} className="label">
                    Adjoining spot length (if two spots)
                  </label>
                  <input id={ids.adjoining} className="field max-w-xs" inputMode="decimal" autoComplete="off" {...register('adjoining')} {...aria('adjoining', ids.adjoining)} />
                  {err('adjoining', ids.adjoining)}
                </div>
              )}
            </>
          )}
          <CheckResult outcome={outcome} defect={defect} />
        </fieldset>
      )}

      <div>
        <label htmlFor={ids.note} className="label">
          Note
        </label>
        <textarea id={ids.note} rows={3} className="field py-2" {...register('note')} {...aria('note', ids.note)} />
        {err('note', ids.note)}
      </div>

      <div>
        <span className="label">Photos</span>
        <PhotoPicker id={ids.photos} files={files} onChange={setFiles} />
        <p className="text-base text-graphite-2">JPEG, PNG or WebP. They are sent once the finding is stored.</p>
      </div>

      {general && (
        <p role="alert" className="field-error">
          {general}
        </p>
      )}

      {asking ? (
        <div role="alertdialog" aria-label="Reading within the limit" className="space-y-3 rounded-md border-l-8 border-ok bg-paper-2 p-3">
          <p className="text-lg">
            <strong>The reading is within the limit</strong>
            {asking.limit && ` (${asking.limit}, ${asking.source})`}. Keep it as a note, or drop it?
          </p>
          {asking.offline && <p className="text-base">No connection: a note is kept on this device and sent when the connection returns.</p>}
          <div className="flex flex-wrap gap-2">
            <button type="button" className="btn-primary" disabled={add.isPending} onClick={handleSubmit((v) => send(v, true))}>
              Keep as a note
            </button>
            <button type="button" className="btn" onClick={drop}>
              Drop it
            </button>
          </div>
        </div>
      ) : (
        <button type="submit" className="btn-primary w-full text-xl" disabled={add.isPending}>
          {add.isPending ? 'Pinning…' : offline ? 'Send again' : 'Pin the finding'}
        </button>
      )}
    </form>
  );
}
