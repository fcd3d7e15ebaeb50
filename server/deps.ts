import type pg from 'pg';
import path from 'node:path';
import type { Drawing } from '../shared/drawings/types';
import type { Config } from './config';
import type { Db } from './db/client';
import type { Mailer, ReceivedMail } from './mail/mailer';
import { personCache } from './modules/auth/person-cache';
import { authService } from './modules/auth/service';
import { dueService } from './modules/due/service';
import { outboxService } from './modules/outbox/service';
import { peopleService } from './modules/people/service';
import { unitsService } from './modules/units/service';
import { diskStorage, s3Storage, type PhotoStorage } from './storage/storage';

export function buildStorage(config: Config): PhotoStorage {
  return config.STORAGE_DRIVER === 's3'
    ? s3Storage({ endpoint: config.S3_ENDPOINT, region: config.S3_REGION, bucket: config.S3_BUCKET, accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY })
    : diskStorage(path.resolve(config.PHOTO_DIR));
}

/** Everything a module needs, built once per app; tests build it against their own database. */
export function buildServices(db: Db, config: Config, drawings: ReadonlyMap<string, Drawing>, mailer: Mailer) {
  const signedIn = personCache(db, config.PERSON_CACHE_MS);
  return {
    signedIn,
    auth: authService(db, config, signedIn),
    people: peopleService(db, signedIn),
    units: unitsService(db, drawings),
    outbox: outboxService(db, mailer),
    due: dueService(db),
  };
}

export interface Deps {
  db: Db;
  pool: pg.Pool;
  config: Config;
  services: ReturnType<typeof buildServices>;
  /** Parsed unit drawings by unit type key, checked at start. */
  drawings: ReadonlyMap<string, Drawing>;
  storage: PhotoStorage;
  /** Mail the in-process fake SMTP server received, when it runs (dev and test). */
  mailbox: () => readonly ReceivedMail[] | null;
}
