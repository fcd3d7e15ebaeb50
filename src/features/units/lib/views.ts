import type { FrontEnd, ViewKey } from '../../../../shared/domain/frames';
import { frontEndSides } from '../../../../shared/orientation';
import type { LayoutPart, UnitLayout } from '../../../../shared/layout/unit-layout';

/** A view named the way a person on the ground names it, which depends on the end with the F. */
export function viewName(view: ViewKey, frontEnd: FrontEnd): string {
  const s = frontEndSides(frontEnd);
  switch (view) {
    case 'plan':
      return 'Plan';
    case 'side_plus_y':
      return s.rightYSign === 1 ? 'Right side' : 'Left side';
    case 'side_minus_y':
      return s.rightYSign === -1 ? 'Right side' : 'Left side';
    case 'end_short_hood':
      return s.front === 'short_hood' ? 'Front end' : 'Rear end';
    case 'end_long_hood':
      return s.front === 'long_hood' ? 'Front end' : 'Rear end';
  }
}

/**
 * An example of what a flip changes, for the confirmation: the first numbered running-gear part
 * (a traction motor if the unit has them) and its label under each front end.
 */
export function flipExample(now: UnitLayout, flipped: UnitLayout): { before: string; after: string } | null {
  const byId = new Map(flipped.parts.map((p) => [p.partId, p]));
  const order = ['traction_motor', 'truck', 'axle', 'sand_box'];
  const pick = (p: LayoutPart) => p.number === 1 && (p.count ?? 0) > 1;
  for (const kind of order) {
    const a = now.parts.find((p) => p.kind === kind && pick(p));
    const b = a && byId.get(a.partId);
    if (a && b) return { before: a.label, after: b.label };
  }
  return null;
}
