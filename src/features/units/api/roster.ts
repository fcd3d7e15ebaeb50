import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { UnitRow } from '../../../../shared/api/units';
import { api } from '../../../lib/api-client';
import { rosterSearch, type RosterFilters } from '../lib/filters';

export const unitKeys = {
  all: ['units'] as const,
  roster: (f: RosterFilters) => ['units', 'roster', rosterSearch(f)] as const,
  one: (id: string) => ['units', 'one', id] as const,
  history: (id: string) => ['units', 'history', id] as const,
  openFindings: (id: string) => ['units', 'open-findings', id] as const,
  finding: (id: string) => ['units', 'finding', id] as const,
  inspection: (id: string) => ['units', 'inspection', id] as const,
  due: ['units', 'due'] as const,
};

/** The roster as the server filters it (non-complying units first); the last list stays up while a new filter loads. */
export const rosterQuery = (f: RosterFilters) =>
  queryOptions({
    queryKey: unitKeys.roster(f),
    queryFn: ({ signal }) => {
      const s = rosterSearch(f);
      return api<{ items: UnitRow[] }>(`/units${s ? `?${s}` : ''}`, { signal });
    },
    placeholderData: keepPreviousData,
    staleTime: 15_000,
  });
