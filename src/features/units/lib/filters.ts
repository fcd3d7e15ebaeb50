import type { FrontEnd } from '../../../../shared/domain/frames';
import { FRONT_ENDS } from '../../../../shared/domain/frames';
import { UNIT_SERVICE_STATES } from '../../../../shared/domain/states';

/** The roster's filters, as the URL and GET /api/units both spell them. */
export const ROSTER_FILTER_KEYS = ['q', 'yard', 'type', 'frontEnd', 'state'] as const;
export type RosterFilterKey = (typeof ROSTER_FILTER_KEYS)[number];
export type RosterFilters = Partial<Record<RosterFilterKey, string>>;

export const ROSTER_STATES = [...UNIT_SERVICE_STATES, 'non_complying'] as const;

/** Reads the filters from a URL, dropping empty and unknown values so a hand-edited link never breaks the query. */
export function filtersFromSearch(params: URLSearchParams): RosterFilters {
  const f: RosterFilters = {};
  for (const k of ROSTER_FILTER_KEYS) {
    const v = params.get(k)?.trim();
    if (!v) continue;
    if (k === 'frontEnd' && !(FRONT_ENDS as readonly string[]).includes(v)) continue;
    if (k === 'state' && !(ROSTER_STATES as readonly string[]).includes(v)) continue;
    f[k] = k === 'q' ? v.slice(0, 40) : v;
  }
  return f;
}

/** The query string for GET /api/units, keys in a fixed order so equal filters share a cache entry. */
export function rosterSearch(f: RosterFilters): string {
  const p = new URLSearchParams();
  for (const k of ROSTER_FILTER_KEYS) if (f[k]) p.set(k, f[k]!);
  return p.toString();
}

export const isFrontEnd = (v: string): v is FrontEnd => (FRONT_ENDS as readonly string[]).includes(v);
