import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { RepairBody } from '../../../../shared/api/repairs';
import { BlueSignalCaution } from '../../../components/blue-signal-caution';
import { PhotoPicker } from './repair-photos';

const RepairFields = RepairBody.omit({ version: true });
type RepairFields = z.infer<typeof RepairFields>;

/** What was done, parts and time; photos go up once the repair is on record. */
export function RepairForm({ busy, onSubmit, onCancel }: { busy: boolean; onSubmit: (v: RepairFields, photos: File[]) => void; onCancel: () => void }) {
  const id = useId();
  const [photos, setPhotos] = useState<File[]>([]);
  const form = useForm<RepairFields>({ resolver: zodResolver(RepairFields) });
  const e = form.formState.errors;
  return (
    <form className="space-y-3" aria-label="Record the repair" noValidate onSubmit={form.handleSubmit((v) => onSubmit(v, photos))}>
      <BlueSignalCaution />
      <div>
        <label className="label" htmlFor={`${id}-done`}>
          What was done
        </label>
        <textarea id={`${id}-done`} rows={3} className="field py-2" aria-invalid={!!e.whatDone} {...form.register('whatDone')} />
        {e.whatDone && <p className="field-error">{e.whatDone.message}</p>}
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        <div className="sm:col-span-2">
          <label className="label" htmlFor={`${id}-parts`}>
            Parts used
          </label>
          <input id={`${id}-parts`} className="field" {...form.register('partsUsed', { setValueAs: (v: string) => (v?.trim() ? v : undefined) })} />
          {e.partsUsed && <p className="field-error">{e.partsUsed.message}</p>}
        </div>
        <div>
          <label className="label" htmlFor={`${id}-min`}>
            Time (minutes)
          </label>
          <input
            id={`${id}-min`}
            className="field"
            type="number"
            inputMode="numeric"
            min={0}
            step={1}
            {...form.register('minutes', { setValueAs: (v: string) => (v === '' || v == null ? undefined : Number(v)) })}
          />
          {e.minutes && <p className="field-error">Whole minutes, 0 or more</p>}
        </div>
      </div>
      <PhotoPicker files={photos} onChange={setPhotos} />
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          Record the repair
        </button>
        <button type="button" className="btn" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </form>
  );
}

/** A reason, for sending back or voiding; the shared schema says what is enough. */
export function ReasonForm({ title, submit, schema, busy, danger, onSubmit, onCancel }: { title: string; submit: string; schema: z.ZodType<{ reason: string }>; busy: boolean; danger?: boolean; onSubmit: (reason: string) => void; onCancel: () => void }) {
  const id = useId();
  const form = useForm<{ reason: string }>({ resolver: zodResolver(schema as never) });
  const e = form.formState.errors;
  return (
    <form className="space-y-3" aria-label={title} noValidate onSubmit={form.handleSubmit((v) => onSubmit(v.reason))}>
      <div>
        <label className="label" htmlFor={`${id}-reason`}>
          Reason
        </label>
        <textarea id={`${id}-reason`} rows={2} className="field py-2" aria-invalid={!!e.reason} {...form.register('reason')} />
        {e.reason && <p className="field-error">{e.reason.message}</p>}
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="submit" className={danger ? 'btn-danger' : 'btn-primary'} disabled={busy}>
          {submit}
        </button>
        <button type="button" className="btn" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </form>
  );
}
