import { boxContains, hitArea, shapeContains } from '../../../../shared/drawings/geometry';
import { MIN_TARGET_PX } from '../../../../shared/drawings/screen';
import type { Box, DrawingView, ViewCoord, ViewPart } from '../../../../shared/drawings/types';

/** Slop on an outline, CSS px: a tap this close to a line counts as on it. */
const OUTLINE_SLOP_PX = 3;

const distanceToBox = (b: Box, p: ViewCoord) => Math.hypot(Math.max(b.umin - p.u, 0, p.u - b.umax), Math.max(b.vmin - p.v, 0, p.v - b.vmax));

/**
 * The part a quiz tap means, at `pxPerIn` CSS px per drawing inch. The quiz sheet is drawn small
 * (the whole unit at once), where finger-sized targets of neighbouring small parts overlap; so: the
 * topmost part under the tap, unless the tap is within a finger of a small part and what lies under
 * it is a large one (a hood, a walkway) — then the nearest small part. Pure; the e2e test uses it to
 * know where a click lands.
 */
export function resolveTap(view: DrawingView, at: ViewCoord, pxPerIn: number): ViewPart | undefined {
  const minSide = MIN_TARGET_PX / pxPerIn;
  const slop = OUTLINE_SLOP_PX / pxPerIn;
  const isSmall = (p: ViewPart) => p.bbox.umax - p.bbox.umin < minSide || p.bbox.vmax - p.bbox.vmin < minSide;
  let under: ViewPart | undefined;
  for (let i = view.parts.length - 1; i >= 0 && !under; i--) if (shapeContains(view.parts[i].shape, at, slop)) under = view.parts[i];
  if (under && isSmall(under)) return under;
  let near: ViewPart | undefined;
  let best = Infinity;
  for (const p of view.parts) {
    if (!isSmall(p) || !boxContains(hitArea(p, minSide), at)) continue;
    const d = distanceToBox(p.bbox, at);
    if (d <= best) [near, best] = [p, d]; // ties go to the part drawn on top
  }
  return near ?? under;
}
