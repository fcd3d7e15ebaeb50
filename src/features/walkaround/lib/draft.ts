import type { FindingDraft } from '../components/finding-form';

/** The finding form as typed, per inspection, so a reload or a dropped connection does not lose it. */
const key = (inspectionId: string) => `hoodline.walk.draft.${inspectionId}`;

export function readDraft(inspectionId: string): FindingDraft | null {
  try {
    const raw = sessionStorage.getItem(key(inspectionId));
    if (!raw) return null;
    const d = JSON.parse(raw) as FindingDraft;
    return d && typeof d.idempotencyKey === 'string' && d.target && d.values ? d : null;
  } catch {
    return null;
  }
}

export function writeDraft(inspectionId: string, d: FindingDraft | null) {
  try {
    if (d) sessionStorage.setItem(key(inspectionId), JSON.stringify(d));
    else sessionStorage.removeItem(key(inspectionId));
  } catch {
    // No storage (private mode): the draft lives as long as the page.
  }
}
