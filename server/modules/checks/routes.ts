import { z } from 'zod';
import { CHECKS, CHECK_KEYS, runCheck } from '../../../shared/api/checks';
import { defectTypesFor, DEFECT_TYPES } from '../../../shared/defects/catalogue';
import { isPartKind, PART_KIND_KEYS } from '../../../shared/domain/parts';
import { AppError, zodFields } from '../../http/errors';
import { route, type RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

const CheckParams = z.object({ check: z.enum(CHECK_KEYS, { message: `Unknown check; use one of ${CHECK_KEYS.join(', ')}` }) });
const DefectQuery = z.object({ partKind: z.string().refine(isPartKind, 'Unknown part kind').optional() });

/** The rule checks, served for other tools at the railroad, and the defect catalogue the finding form uses. */
export function checksRoutes(_deps: Deps): RouteDef[] {
  return [
    route({
      method: 'get',
      path: '/checks',
      access: 'signed_in',
      summary: 'The rule checks available',
      handler: () => ({ body: { items: CHECK_KEYS.map((key) => ({ key, label: CHECKS[key].label })) } }),
    }),
    route({
      method: 'post',
      path: '/checks/:check',
      access: 'signed_in',
      summary: 'Run one rule check: { result, limit, source, ... }',
      params: CheckParams,
      handler: ({ params, req }) => {
        const outcome = runCheck(params.check, req.body ?? {});
        if (!outcome.ok) throw new AppError('validation', 'The measurement is not valid', zodFields(outcome.error));
        return { body: outcome.output };
      },
    }),
    route({
      method: 'get',
      path: '/defect-types',
      access: 'signed_in',
      summary: 'Defect types, optionally for one part kind',
      query: DefectQuery,
      handler: ({ query }) => {
        const list = query.partKind && isPartKind(query.partKind) ? defectTypesFor(query.partKind) : DEFECT_TYPES;
        return {
          body: {
            items: list.map((d) => ({
              key: d.key,
              label: d.label,
              partKind: d.partKind,
              weight: d.weight,
              ...(d.rule ? { rule: d.rule, ruleConfidence: d.ruleConfidence } : {}),
              ...(d.check ? { check: d.check, checkPreset: d.checkPreset, measurement: d.measurement } : {}),
            })),
          },
        };
      },
    }),
    route({
      method: 'get',
      path: '/part-kinds',
      access: 'signed_in',
      summary: 'The part catalogue keys',
      handler: () => ({ body: { items: PART_KIND_KEYS } }),
    }),
  ];
}
