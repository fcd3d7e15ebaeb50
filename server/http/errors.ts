import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';

export type ErrorCode =
  | 'bad_request'
  | 'validation'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'stale'
  /** The same Idempotency-Key is being answered right now: retry in a moment. */
  | 'in_progress'
  | 'check_passed'
  | 'too_large'
  | 'unsupported_media_type'
  | 'rate_limited'
  | 'locked'
  | 'internal';

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  validation: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  stale: 409,
  in_progress: 409,
  check_passed: 409,
  too_large: 413,
  unsupported_media_type: 415,
  rate_limited: 429,
  locked: 423,
  internal: 500,
};

/** The one error type the server throws on purpose; the handler turns it into the one error shape. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
  get status() {
    return STATUS[this.code];
  }
}

export const notFound = (what: string) => new AppError('not_found', `${what} not found`);
export const forbidden = (msg = 'Your role cannot do this') => new AppError('forbidden', msg);
export const conflict = (msg: string, extra?: Record<string, unknown>) => new AppError('conflict', msg, undefined, extra);

export function zodFields(err: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of err.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    if (!(key in fields)) fields[key] = issue.message;
  }
  return fields;
}

export function errorBody(code: ErrorCode, message: string, fields?: Record<string, string>, extra?: Record<string, unknown>) {
  return { error: { code, message, ...(fields ? { fields } : {}), ...(extra ?? {}) } };
}

/** Maps body-parser, multer, zod and our own errors to the error shape; never leaks stacks or SQL. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return;
  if (err instanceof AppError) {
    res.status(err.status).json(errorBody(err.code, err.message, err.fields, err.extra));
    return;
  }
  if (err instanceof ZodError) {
    res.status(400).json(errorBody('validation', 'Some fields are not valid', zodFields(err)));
    return;
  }
  const e = err as { type?: string; status?: number; code?: string; message?: string };
  if (e.type === 'entity.parse.failed') {
    res.status(400).json(errorBody('bad_request', 'The request body is not valid JSON'));
    return;
  }
  if (e.type === 'entity.too.large' || e.code === 'LIMIT_FILE_SIZE') {
    res.status(413).json(errorBody('too_large', 'The request is too large'));
    return;
  }
  if (e.code?.startsWith?.('LIMIT_')) {
    res.status(400).json(errorBody('bad_request', e.message ?? 'Bad upload'));
    return;
  }
  if (typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
    res.status(e.status).json(errorBody('bad_request', 'The request could not be read'));
    return;
  }
  // Postgres: invalid text representation / numeric out of range etc. mean bad input that slipped past zod.
  if (typeof e.code === 'string' && /^22/.test(e.code)) {
    res.status(400).json(errorBody('bad_request', 'A value is out of range or of the wrong form'));
    return;
  }
  req.log?.(err);
  console.error('[hoodline] unexpected error on', req.method, req.originalUrl, err);
  res.status(500).json(errorBody('internal', 'Something went wrong on our side; nothing was saved'));
};

declare module 'express-serve-static-core' {
  interface Request {
    log?: (err: unknown) => void;
  }
}
