import { queryOptions } from '@tanstack/react-query';
import { QUEUE_PAGE_MAX, type QueuePage } from '../../../../shared/api/repairs';
import type { FrontEnd, ViewKey } from '../../../../shared/domain/frames';
import type { FindingState, FindingWeight } from '../../../../shared/domain/states';
import { api } from '../../../lib/api-client';
import { unitKeys } from './roster';

/** What the unit page needs of one finding: where it is pinned and under which front end. */
export interface FindingPinDetail {
  id: string;
  label: string;
  partLabel: string;
  partId: string;
  view: ViewKey;
  body: { x: number; y: number; z: number };
  frontEnd: FrontEnd;
  defectLabel: string;
  weight: FindingWeight;
  rule: string | null;
  state: FindingState;
  note: string | null;
  createdByName: string;
  createdAt: string;
  version: number;
}

/**
 * Open, in repair and repaired findings of one unit (the repair queue filtered to it): one page as large
 * as the server gives, more than a unit should ever have; `total` says when there are more still.
 */
export const openFindingsQuery = (unitId: string) =>
  queryOptions({
    queryKey: unitKeys.openFindings(unitId),
    queryFn: ({ signal }) => api<QueuePage>(`/repairs?unit=${encodeURIComponent(unitId)}&limit=${QUEUE_PAGE_MAX}`, { signal }),
  });

export const findingQuery = (id: string) =>
  queryOptions({ queryKey: unitKeys.finding(id), queryFn: ({ signal }) => api<FindingPinDetail>(`/findings/${encodeURIComponent(id)}`, { signal }), staleTime: 30_000 });
