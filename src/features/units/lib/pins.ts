import { bodyPoint, type ViewKey } from '../../../../shared/domain/frames';
import { CENTRE_TOLERANCE_IN } from '../../../../shared/domain/parts';
import type { FindingState, FindingWeight } from '../../../../shared/domain/states';
import { bodyToViewPoint } from '../../../../shared/orientation';

export interface PinSource {
  id: string;
  view: ViewKey;
  body: { x: number; y: number; z: number };
  weight: FindingWeight;
  state: FindingState;
}

/**
 * Whether a finding shows on a view: always on the view it was pinned in and on the plan; on a side
 * elevation only from its own side of the centreline (or on it); on an end elevation only from the
 * half of the unit nearest that end. Otherwise a pin on the left would be drawn through the unit on
 * the right side too.
 */
export function showsOnView(f: Pick<PinSource, 'view' | 'body'>, view: ViewKey, lengthIn: number): boolean {
  if (f.view === view || view === 'plan') return true;
  switch (view) {
    case 'side_plus_y':
      return f.body.y >= -CENTRE_TOLERANCE_IN;
    case 'side_minus_y':
      return f.body.y <= CENTRE_TOLERANCE_IN;
    case 'end_short_hood':
      return f.body.x < lengthIn / 2;
    case 'end_long_hood':
      return f.body.x >= lengthIn / 2;
  }
}

/** Findings as canvas pins of one view: the body point projected on the view's axes (plan x,y; sides x,z; ends y,z). */
export function pinsForView(findings: readonly PinSource[], view: ViewKey, lengthIn: number) {
  return findings
    .filter((f) => showsOnView(f, view, lengthIn))
    .map((f) => {
      const p = bodyToViewPoint(view, bodyPoint(f.body.x, f.body.y, f.body.z));
      return { id: f.id, u: p.u, v: p.v, weight: f.weight, state: f.state };
    });
}
