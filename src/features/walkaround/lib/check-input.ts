import { runCheck, type RunCheckOutcome } from '../../../../shared/api/checks';
import type { DefectTypeItem } from '../api/defect-types';
import { checkInputFor as sharedCheckInputFor } from '../../../../shared/walkaround/check-input';

export interface ReadingDraft {
  value?: number;
  unit: 'in' | 'mm';
  nominal?: number;
  adjoining?: number;
  lastDone?: string;
}

/** The same function the server runs when it stores the finding (one copy, in shared/). */
export const checkInputFor = (defect: Pick<DefectTypeItem, 'check' | 'checkPreset'>, r: ReadingDraft, ctx: { humpStencilled: boolean; today: string }) =>
  sharedCheckInputFor(defect, r, ctx);

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
