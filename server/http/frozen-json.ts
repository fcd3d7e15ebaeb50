import { createHash } from 'node:crypto';
import type { Request, Response } from 'express';

/** A response body that never changes while the process runs (drawings, layouts): serialised and tagged once. */
export interface FrozenJson {
  json: string;
  etag: string;
}

export function frozenJson(value: unknown): FrozenJson {
  const json = JSON.stringify(value);
  return { json, etag: `"${createHash('sha1').update(json).digest('base64url')}"` };
}

/** Sends it with its tag; a client that already has it gets 304 (express compares If-None-Match). */
export function sendFrozen(req: Request, res: Response, body: FrozenJson): void {
  res.setHeader('ETag', body.etag);
  res.type('application/json');
  if (req.fresh) return void res.status(304).end();
  res.send(body.json);
}
