import type pg from 'pg';
import type { Drawing } from '../shared/drawings/types';
import type { Config } from './config';
import type { Db } from './db/client';
import { authService } from './modules/auth/service';
import { peopleService } from './modules/people/service';
import { unitsService } from './modules/units/service';

/** Everything a module needs, built once per app; tests build it against their own database. */
export function buildServices(db: Db, config: Config, drawings: ReadonlyMap<string, Drawing>) {
  return {
    auth: authService(db, config),
    people: peopleService(db),
    units: unitsService(db, drawings),
  };
}

export interface Deps {
  db: Db;
  pool: pg.Pool;
  config: Config;
  services: ReturnType<typeof buildServices>;
  /** Parsed unit drawings by unit type key, checked at start. */
  drawings: ReadonlyMap<string, Drawing>;
}
