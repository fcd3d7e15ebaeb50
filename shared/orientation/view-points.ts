import { VIEW_AXES, bodyPoint } from '../domain/frames';
import type { BodyPoint, FrontEnd, Side, ViewKey } from '../domain/frames';
import { frontEndSides, sideOfY } from './front-frame';
import { partPhrase } from './part-layout';
import type { DerivedPart } from './part-layout';

/** A point on one view's sheet, in the two body axes that view shows (VIEW_AXES), inches. */
export interface ViewPoint {
  readonly u: number;
  readonly v: number;
}

/** A tap on a view back to the carbody frame; the axis the view cannot show comes from `fallback` (the part's centre). */
export function viewPointToBody(view: ViewKey, point: ViewPoint, fallback: BodyPoint): BodyPoint {
  const [uAxis, vAxis] = VIEW_AXES[view];
  const axes = { x: fallback.x, y: fallback.y, z: fallback.z };
  axes[uAxis] = point.u;
  axes[vAxis] = point.v;
  return bodyPoint(axes.x, axes.y, axes.z);
}

/** A carbody point projected onto one view's sheet. */
export function bodyToViewPoint(view: ViewKey, p: BodyPoint): ViewPoint {
  const [uAxis, vAxis] = VIEW_AXES[view];
  return { u: p[uAxis], v: p[vAxis] };
}

/** The side a pin lies on: from y in plan and end views; in a side elevation, the side that elevation shows. */
export function pinSide(view: ViewKey, point: ViewPoint, frontEnd: FrontEnd): Side {
  const { rightYSign } = frontEndSides(frontEnd);
  switch (view) {
    case 'plan':
      return sideOfY(point.v, frontEnd);
    case 'end_short_hood':
    case 'end_long_hood':
      return sideOfY(point.u, frontEnd);
    case 'side_plus_y':
      return rightYSign === 1 ? 'right' : 'left';
    case 'side_minus_y':
      return rightYSign === -1 ? 'right' : 'left';
  }
}

/** Label for a pin: a centred part pinned off-centre gets the side prefix ("Left side, #2 traction motor"). */
export function pinLabel(part: DerivedPart, side: Side): string {
  if (part.side !== 'center' || side === 'center') return part.label;
  const sideWord = side === 'left' ? 'Left side' : 'Right side';
  return `${sideWord}, ${partPhrase({ kind: part.kind, side: 'center', end: part.end, number: part.number })}`;
}
