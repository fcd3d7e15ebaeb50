import { queryOptions } from '@tanstack/react-query';
import type { DueItem, UnitDueState } from '../../../../shared/due/board';
import { api } from '../../../lib/api-client';
import { unitKeys } from './roster';

export interface DueBoardRow {
  unitId: string;
  roadNumber: string;
  yardName: string | null;
  nonComplying: boolean;
  state: UnitDueState;
  items: DueItem[];
}

export interface DueBoard {
  on: string;
  timeZone: string;
  items: DueBoardRow[];
}

/** The whole due board (one row per unit): the roster flags overdue units, a unit page lists its items. */
export const dueBoardQuery = () =>
  queryOptions({ queryKey: unitKeys.due, queryFn: ({ signal }) => api<DueBoard>('/due', { signal }), staleTime: 60_000 });
