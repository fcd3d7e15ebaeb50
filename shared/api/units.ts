import { z } from 'zod';
import { FRONT_ENDS } from '../domain/frames';
import { UNIT_SERVICE_STATES } from '../domain/states';
import { CivilDate, Uuid, Version } from './common';

export const UnitsQuery = z.object({
  q: z.string().trim().max(40).optional(),
  yard: Uuid.optional(),
  type: z.string().max(60).optional(),
  frontEnd: z.enum(FRONT_ENDS).optional(),
  state: z.enum([...UNIT_SERVICE_STATES, 'non_complying']).optional(),
});

export const UpdateUnitBody = z
  .object({
    version: Version,
    frontEnd: z.enum(FRONT_ENDS).optional(),
    yardId: Uuid.nullable().optional(),
    serviceState: z.enum(UNIT_SERVICE_STATES).optional(),
    conditionMonitoring: z.boolean().optional(),
    humpStencilled: z.boolean().optional(),
    lastPeriodicOn: CivilDate.optional(),
    lastAnnualOn: CivilDate.optional(),
    lastHandBrakeOn: CivilDate.optional(),
    lastMainReservoirOn: CivilDate.optional(),
    lastCmCheckOn: CivilDate.optional(),
    reason: z.string().trim().max(500).optional(),
  })
  .strict();
export type UpdateUnitBody = z.infer<typeof UpdateUnitBody>;

export const UnitTypeParams = z.object({ key: z.string().regex(/^[a-z0-9_]{1,60}$/, 'Not a unit type key') });

export interface UnitRow {
  id: string;
  roadNumber: string;
  unitTypeKey: string;
  unitTypeName: string;
  frontEnd: (typeof FRONT_ENDS)[number];
  yardId: string | null;
  yardName: string | null;
  serviceState: (typeof UNIT_SERVICE_STATES)[number];
  nonComplying: boolean;
  nonComplyingSince: string | null;
  conditionMonitoring: boolean;
  humpStencilled: boolean;
  lastPeriodicOn: string | null;
  lastAnnualOn: string | null;
  lastHandBrakeOn: string | null;
  lastMainReservoirOn: string | null;
  lastCmCheckOn: string | null;
  openFindings: number;
  version: number;
}
