// The orientation engine: carbody frame ↔ front-relative frame, and the labels a person reads.
export {
  bodyEndOfX,
  bodyEndRole,
  bodyToFront,
  flipFrontEnd,
  frontEndSides,
  frontToBody,
  sideOfY,
} from './front-frame';
export type { FrontEndSides } from './front-frame';
export { composePartLabel, deriveLayout, mirrorNumber, partPhrase } from './part-layout';
export type { DerivedPart, PartInstance, PartLabelParts } from './part-layout';
export { bodyToViewPoint, pinLabel, pinSide, viewPointToBody } from './view-points';
export type { ViewPoint } from './view-points';
