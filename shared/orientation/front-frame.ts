import { CENTRE_TOLERANCE_IN } from '../domain/parts';
import { bodyPoint, frontPoint } from '../domain/frames';
import type { BodyEnd, BodyPoint, End, FrontEnd, FrontPoint, Side } from '../domain/frames';

/** Which physical end is front/rear and which sign of y is left/right, for one position of the F. */
export interface FrontEndSides {
  readonly front: BodyEnd;
  readonly rear: BodyEnd;
  /** Sign of body y on the left when facing the front from the cab. */
  readonly leftYSign: -1 | 1;
  readonly rightYSign: -1 | 1;
}

const SIDES: Record<FrontEnd, FrontEndSides> = {
  short_hood: { front: 'short_hood', rear: 'long_hood', leftYSign: -1, rightYSign: 1 },
  long_hood: { front: 'long_hood', rear: 'short_hood', leftYSign: 1, rightYSign: -1 },
};

/** The end/side assignment for an F position; the single table every other conversion follows. */
export function frontEndSides(frontEnd: FrontEnd): FrontEndSides {
  return SIDES[frontEnd];
}

/** The other end: moving the F (or turning the question round in the lab). */
export function flipFrontEnd(frontEnd: FrontEnd): FrontEnd {
  return frontEnd === 'short_hood' ? 'long_hood' : 'short_hood';
}

/** Whether a physical end of the carbody is the front or the rear under this F position. */
export function bodyEndRole(bodyEnd: BodyEnd, frontEnd: FrontEnd): End {
  return bodyEnd === frontEnd ? 'front' : 'rear';
}

/** The physical end whose coupler face is nearer to body x (the exact middle counts as long hood end). */
export function bodyEndOfX(x: number, lengthIn: number): BodyEnd {
  return x < lengthIn / 2 ? 'short_hood' : 'long_hood';
}

/** Left/right/center of a body y; within CENTRE_TOLERANCE_IN of the centreline is 'center'. */
export function sideOfY(y: number, frontEnd: FrontEnd): Side {
  if (Math.abs(y) <= CENTRE_TOLERANCE_IN) return 'center';
  return Math.sign(y) === SIDES[frontEnd].leftYSign ? 'left' : 'right';
}

/** Carbody point to front-relative point: what fleet aggregation and labels measure from. */
export function bodyToFront(p: BodyPoint, frontEnd: FrontEnd, lengthIn: number): FrontPoint {
  const { leftYSign } = SIDES[frontEnd];
  const along = frontEnd === 'short_hood' ? p.x : lengthIn - p.x;
  // + 0 turns -0 into 0 so a centreline part serialises and compares as plain 0.
  return frontPoint(along, leftYSign * p.y + 0, p.z);
}

/** Front-relative point back to the carbody frame; inverse of bodyToFront. */
export function frontToBody(f: FrontPoint, frontEnd: FrontEnd, lengthIn: number): BodyPoint {
  const { leftYSign } = SIDES[frontEnd];
  const x = frontEnd === 'short_hood' ? f.along : lengthIn - f.along;
  return bodyPoint(x, leftYSign * f.left + 0, f.z);
}
