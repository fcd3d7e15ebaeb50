import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { HotSpotFindingsResponse, HotSpotsParams, HotSpotsResponse } from '../../../../shared/api/hot-spots';
import { api } from '../../../lib/api-client';
import { toQueryString } from '../lib/params';

/** The screen's data: one request, one query in PostgreSQL. */
export const hotSpotsQuery = (f: HotSpotsParams) =>
  queryOptions({
    queryKey: ['hot-spots', f.unitType, f.from, f.to, f.defectTypes, f.weights, f.yards],
    queryFn: ({ signal }) => api<HotSpotsResponse>(`/hot-spots?${toQueryString(f)}`, { signal }),
    placeholderData: keepPreviousData,
    staleTime: 60_000,
  });

export const useHotSpots = (f: HotSpotsParams, enabled = true) => useQuery({ ...hotSpotsQuery(f), enabled });

/** The findings behind one row. */
export const rowFindingsQuery = (f: HotSpotsParams, label: string) =>
  queryOptions({
    queryKey: ['hot-spots', f.unitType, f.from, f.to, f.defectTypes, f.weights, f.yards, 'findings', label],
    queryFn: ({ signal }) => api<HotSpotFindingsResponse>(`/hot-spots/findings?${toQueryString(f, { label, limit: '200' })}`, { signal }),
    staleTime: 60_000,
  });

export const useRowFindings = (f: HotSpotsParams, label: string | null) => useQuery({ ...rowFindingsQuery(f, label ?? ''), enabled: !!label });

/** Download addresses of the two exports (the browser saves the file; the session cookie goes along). */
export const tableCsvHref = (f: HotSpotsParams) => `/api/hot-spots/table.csv?${toQueryString(f)}`;
export const findingsCsvHref = (f: HotSpotsParams, label?: string) => `/api/hot-spots/findings.csv?${toQueryString(f, { label })}`;
