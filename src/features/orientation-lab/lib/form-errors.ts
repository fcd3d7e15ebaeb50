import type { ZodError } from 'zod';
import { ApiError } from '../../../lib/api-client';

/** Field messages keyed like the server's (`templates.0.count`), from the same zod schema or from the server. */
export function fieldErrors(err: ZodError | unknown): Record<string, string> {
  if (err instanceof ApiError) return err.fields ?? {};
  const issues = (err as ZodError | undefined)?.issues;
  if (!issues) return {};
  const out: Record<string, string> = {};
  for (const i of issues) {
    const key = i.path.length ? i.path.join('.') : '_';
    if (!(key in out)) out[key] = i.message;
  }
  return out;
}
