import { runCheck, type RunCheckOutcome } from '../../../../shared/api/checks';
import type { DefectTypeItem } from '../api/defect-types';

export interface ReadingDraft {
  value?: number;
  unit: 'in' | 'mm';
  nominal?: number;
  adjoining?: number;
  lastDone?: string;
}

/**
 * The input of a defect's rule check from what the form holds; it mirrors the server's
 * checkInputFor (server/modules/walkaround/service.ts) so the live answer is the one the server gives.
 */
export function checkInputFor(defect: Pick<DefectTypeItem, 'check' | 'checkPreset'>, r: ReadingDraft, ctx: { humpStencilled: boolean; today: string }): Record<string, unknown> | null {
  const preset = defect.checkPreset ?? {};
  const has = r.value !== undefined;
  switch (defect.check) {
    case 'pilot_height':
      return has ? { value: r.value, unit: r.unit, service: ctx.humpStencilled ? 'hump_yard' : 'road', stencilled: ctx.humpStencilled, ...preset } : null;
    case 'chain_wear':
      return has ? { nominal: r.nominal, measured: r.value, unit: r.unit } : null;
    case 'wheel_flat':
      return has ? { length: r.value, ...(r.adjoining ? { adjoiningLength: r.adjoining } : {}), unit: r.unit, ...preset } : null;
    case 'flange_thickness':
    case 'rim_thickness':
    case 'tread_hollow':
      return has ? { value: r.value, unit: r.unit, ...preset } : null;
    case 'interval':
      return r.lastDone ? { ...preset, lastDone: r.lastDone, on: ctx.today } : null;
    case 'sanders':
      return r.lastDone ? { discovered: r.lastDone, on: ctx.today } : null;
    default:
      return null;
  }
}

/** Which inputs a defect's check reads. */
export function readingKind(defect: Pick<DefectTypeItem, 'check' | 'measurement'> | undefined): 'none' | 'length' | 'chain' | 'spot' | 'date' {
  if (!defect) return 'none';
  switch (defect.check) {
    case 'chain_wear':
      return 'chain';
    case 'wheel_flat':
      return 'spot';
    case 'interval':
    case 'sanders':
      return 'date';
    case undefined:
      return defect.measurement ? 'length' : 'none';
    default:
      return 'length';
  }
}

/** Runs the shared check live; null while there is nothing to check yet. */
export function liveCheck(defect: DefectTypeItem | undefined, r: ReadingDraft, ctx: { humpStencilled: boolean; today: string }): RunCheckOutcome | null {
  if (!defect?.check) return null;
  const input = checkInputFor(defect, r, ctx);
  return input ? runCheck(defect.check, input) : null;
}
