import { z } from 'zod';

export const Uuid = z.uuid({ message: 'Must be an id' });
export const IdParams = z.object({ id: Uuid });
export const Version = z.number({ message: 'The version you edited is required' }).int().min(1);
/** Calendar date YYYY-MM-DD that really exists (no Feb 30). */
export const CivilDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD')
  .refine((s) => {
    const [y, m, d] = s.split('-').map(Number);
    const dt = new Date(Date.UTC(y, m - 1, d));
    return dt.getUTCFullYear() === y && dt.getUTCMonth() === m - 1 && dt.getUTCDate() === d;
  }, 'Not a calendar date');
export const ShortText = (max = 200) => z.string().trim().max(max, `At most ${max} characters`);

export type ApiError = { error: { code: string; message: string; fields?: Record<string, string> } };
export type ListResponse<T> = { items: T[] };
