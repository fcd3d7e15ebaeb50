import { z } from 'zod';
import { CivilDate } from '../../../../shared/api/common';
import { FindingBody, Measurement } from '../../../../shared/api/walkaround';
import type { DefectTypeItem } from '../api/defect-types';
import { readingKind, type ReadingDraft } from './check-input';

/** Numbers typed on a phone keypad: a decimal comma counts as a point. */
export const parseReading = (s: string | undefined): number | undefined => {
  const t = (s ?? '').trim().replace(',', '.');
  if (!t) return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : NaN;
};

const reading = z
  .string()
  .refine((s) => {
    const n = parseReading(s);
    return n === undefined || (n > 0 && n <= 10000);
  }, 'Enter a number greater than zero');

/**
 * The finding form: the shared FindingBody's fields as the inputs hold them (text, so a half-typed
 * number is not lost), checked the same way, plus what depends on the chosen defect type.
 */
export function findingFormSchema(defect: DefectTypeItem | undefined) {
  const kind = readingKind(defect);
  return z
    .object({
      defectType: z.string().min(1, 'Choose what is wrong').pipe(FindingBody.shape.defectType),
      value: reading,
      unit: Measurement.shape.unit,
      nominal: reading,
      adjoining: reading,
      lastDone: z.union([z.literal(''), CivilDate]),
      note: z.string().max(2000, 'At most 2000 characters'),
    })
    .superRefine((v, ctx) => {
      if (kind === 'chain' && v.value.trim() && !v.nominal.trim()) {
        ctx.addIssue({ code: 'custom', path: ['nominal'], message: 'Enter the nominal (new) diameter to compare with' });
      }
      if (defect?.key.endsWith('_other') && !v.note.trim()) {
        ctx.addIssue({ code: 'custom', path: ['note'], message: 'Say what is wrong' });
      }
    });
}

export type FindingFormValues = z.infer<ReturnType<typeof findingFormSchema>>;

export const emptyFindingForm = (unit: 'in' | 'mm' = 'in'): FindingFormValues => ({
  defectType: '',
  value: '',
  unit,
  nominal: '',
  adjoining: '',
  lastDone: '',
  note: '',
});

export function readingOf(v: FindingFormValues): ReadingDraft {
  const num = (s: string) => {
    const n = parseReading(s);
    return n !== undefined && Number.isFinite(n) && n > 0 ? n : undefined;
  };
  return { value: num(v.value), unit: v.unit, nominal: num(v.nominal), adjoining: num(v.adjoining), lastDone: v.lastDone || undefined };
}

/** The request body, checked against the shared contract the server uses. */
export function toFindingBody(
  v: FindingFormValues,
  defect: DefectTypeItem | undefined,
  where: { partId: string; view: FindingBody['view']; x: number; y: number },
  extra: { idempotencyKey: string; keepAsNote?: boolean },
): FindingBody {
  const kind = readingKind(defect);
  const r = readingOf(v);
  const measurement =
    (kind === 'length' || kind === 'chain' || kind === 'spot') && r.value !== undefined
      ? { value: r.value, unit: r.unit, ...(kind === 'chain' && r.nominal ? { nominal: r.nominal } : {}), ...(kind === 'spot' && r.adjoining ? { adjoining: r.adjoining } : {}) }
      : undefined;
  return FindingBody.parse({
    ...where,
    defectType: v.defectType,
    ...(measurement ? { measurement } : {}),
    ...(kind === 'date' && r.lastDone ? { lastDone: r.lastDone } : {}),
    ...(v.note.trim() ? { note: v.note.trim() } : {}),
    ...(extra.keepAsNote ? { keepAsNote: true } : {}),
    idempotencyKey: extra.idempotencyKey,
  });
}

/** Server field names (measurement.value, lastDone…) to the form's. */
export function formFieldOf(serverField: string): keyof FindingFormValues | null {
  switch (serverField) {
    case 'defectType':
      return 'defectType';
    case 'measurement.value':
    case 'measurement.measured':
    case 'measurement.length':
    case 'measurement':
      return 'value';
    case 'measurement.nominal':
      return 'nominal';
    case 'measurement.adjoining':
    case 'measurement.adjoiningLength':
      return 'adjoining';
    case 'measurement.unit':
      return 'unit';
    case 'lastDone':
    case 'measurement.lastDone':
    case 'measurement.discovered':
    case 'measurement.on':
      return 'lastDone';
    case 'note':
      return 'note';
    default:
      return null;
  }
}
