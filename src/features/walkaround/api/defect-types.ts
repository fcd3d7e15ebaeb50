import { queryOptions } from '@tanstack/react-query';
import type { CheckKey } from '../../../../shared/api/checks';
import type { LengthUnit } from '../../../../shared/checks/units';
import { api } from '../../../lib/api-client';

export interface DefectTypeItem {
  key: string;
  label: string;
  partKind: string;
  weight: 'federal' | 'shop' | 'note';
  rule?: string;
  ruleConfidence?: 'seen' | 'memory';
  check?: CheckKey;
  checkPreset?: Record<string, string | boolean>;
  measurement?: { quantity: 'length'; defaultUnit: LengthUnit };
}

export const defectTypesQuery = (partKind: string) =>
  queryOptions({
    queryKey: ['defect-types', partKind],
    queryFn: ({ signal }) => api<{ items: DefectTypeItem[] }>(`/defect-types?partKind=${encodeURIComponent(partKind)}`, { signal }),
    staleTime: 30 * 60_000,
  });
