/** Plain geometry on drawing shapes: boxes, hit areas, point tests, view ↔ sheet placement. */
import { VIEW_AXES } from '../domain/frames';
import type { ViewKey } from '../domain/frames';
import type { Box, DrawingView, Shape, ViewCoord, ViewPart, ViewSheet } from './types';

/** Sheet (SVG user unit, inch) position: x to the right, y down. */
export interface SheetPoint {
  readonly sx: number;
  readonly sy: number;
}

/** Smallest box holding all the flat u,v pairs. */
export function boxOfPoints(points: readonly number[]): Box {
  let umin = Infinity, vmin = Infinity, umax = -Infinity, vmax = -Infinity;
  for (let i = 0; i + 1 < points.length; i += 2) {
    umin = Math.min(umin, points[i]);
    umax = Math.max(umax, points[i]);
    vmin = Math.min(vmin, points[i + 1]);
    vmax = Math.max(vmax, points[i + 1]);
  }
  return { umin, vmin, umax, vmax };
}

/** Box of a shape; a text's box is its anchor point only (labels are never tapped). */
export function shapeBBox(shape: Shape): Box {
  switch (shape.kind) {
    case 'rect':
      return { umin: shape.x, vmin: shape.y, umax: shape.x + shape.w, vmax: shape.y + shape.h };
    case 'circle':
      return { umin: shape.cx - shape.r, vmin: shape.cy - shape.r, umax: shape.cx + shape.r, vmax: shape.cy + shape.r };
    case 'ellipse':
      return { umin: shape.cx - shape.ru, vmin: shape.cy - shape.rv, umax: shape.cx + shape.ru, vmax: shape.cy + shape.rv };
    case 'line':
      return boxOfPoints([shape.x1, shape.y1, shape.x2, shape.y2]);
    case 'poly':
      return boxOfPoints(shape.points);
    case 'text':
      return { umin: shape.x, vmin: shape.y, umax: shape.x, vmax: shape.y };
  }
}

export const boxCentre = (b: Box): ViewCoord => ({ u: (b.umin + b.umax) / 2, v: (b.vmin + b.vmax) / 2 });

/** Whether `inner` lies inside `outer`, allowing `tolerance` inches of overhang. */
export function boxInside(inner: Box, outer: Box, tolerance = 0): boolean {
  return (
    inner.umin >= outer.umin - tolerance &&
    inner.vmin >= outer.vmin - tolerance &&
    inner.umax <= outer.umax + tolerance &&
    inner.vmax <= outer.vmax + tolerance
  );
}

export const boxContains = (b: Box, p: ViewCoord): boolean =>
  p.u >= b.umin && p.u <= b.umax && p.v >= b.vmin && p.v <= b.vmax;

/**
 * The box grown about its centre so each side is at least `minSide` inches; sides already
 * longer stay as they are. The canvas passes its minimum finger target converted to inches
 * at the current zoom (e.g. 9 mm on screen ÷ screen mm per drawing inch).
 */
export function expandedHitBox(bbox: Box, minSide: number): Box {
  const c = boxCentre(bbox);
  const hu = Math.max(bbox.umax - bbox.umin, minSide) / 2;
  const hv = Math.max(bbox.vmax - bbox.vmin, minSide) / 2;
  return { umin: c.u - hu, vmin: c.v - hv, umax: c.u + hu, vmax: c.v + hv };
}

/** The invisible hit rectangle of a part: its bbox grown to at least `minSizeIn` each way. */
export const hitArea = (part: ViewPart, minSizeIn: number): Box => expandedHitBox(part.bbox, minSizeIn);

function distanceToSegment(p: ViewCoord, u1: number, v1: number, u2: number, v2: number): number {
  const du = u2 - u1, dv = v2 - v1;
  const len2 = du * du + dv * dv;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p.u - u1) * du + (p.v - v1) * dv) / len2));
  return Math.hypot(p.u - (u1 + t * du), p.v - (v1 + t * dv));
}

function insidePolygon(p: ViewCoord, pts: readonly number[]): boolean {
  let inside = false;
  const n = pts.length / 2;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const ui = pts[2 * i], vi = pts[2 * i + 1], uj = pts[2 * j], vj = pts[2 * j + 1];
    if (vi > p.v !== vj > p.v && p.u < ((uj - ui) * (p.v - vi)) / (vj - vi) + ui) inside = !inside;
  }
  return inside;
}

/** Whether the shape covers the point; lines and open polylines count within `lineTolerance` inches. */
export function shapeContains(shape: Shape, p: ViewCoord, lineTolerance = 0): boolean {
  switch (shape.kind) {
    case 'rect':
      return boxContains(shapeBBox(shape), p);
    case 'circle':
      return Math.hypot(p.u - shape.cx, p.v - shape.cy) <= shape.r;
    case 'ellipse': {
      if (shape.ru === 0 || shape.rv === 0) return false;
      const a = (p.u - shape.cx) / shape.ru, b = (p.v - shape.cy) / shape.rv;
      return a * a + b * b <= 1;
    }
    case 'line':
      return distanceToSegment(p, shape.x1, shape.y1, shape.x2, shape.y2) <= lineTolerance;
    case 'poly': {
      if (shape.closed && insidePolygon(p, shape.points)) return true;
      const pts = shape.points;
      const segs = shape.closed ? pts.length / 2 : pts.length / 2 - 1;
      for (let i = 0; i < segs; i++) {
        const j = (i + 1) % (pts.length / 2);
        if (distanceToSegment(p, pts[2 * i], pts[2 * i + 1], pts[2 * j], pts[2 * j + 1]) <= lineTolerance) return true;
      }
      return false;
    }
    case 'text':
      return false;
  }
}

const boxesOverlap = (a: Box, b: Box): boolean => a.umin <= b.umax && b.umin <= a.umax && a.vmin <= b.vmax && b.vmin <= a.vmax;

/**
 * The part a tap at `p` means: the topmost part that covers the point (lines and outlines within
 * half a finger), unless a part thinner than a finger either way is drawn over it, holds the point
 * in its enlarged hit box and touches it. A near miss beside a stanchion on the walkway picks the
 * stanchion; a tap squarely on a traction motor picks the motor, even where the enlarged box of the
 * axle beside it (not on it) reaches over. With nothing covering the point, the enlarged box decides.
 */
export function partAtPoint(view: DrawingView, p: ViewCoord, minSideIn: number): ViewPart | undefined {
  let near: ViewPart | undefined;
  for (let i = view.parts.length - 1; i >= 0; i--) {
    const part = view.parts[i];
    if (shapeContains(part.shape, p, minSideIn / 2)) return near && boxesOverlap(near.bbox, part.bbox) ? near : part;
    const small = part.bbox.umax - part.bbox.umin < minSideIn || part.bbox.vmax - part.bbox.vmin < minSideIn;
    if (!near && small && boxContains(hitArea(part, minSideIn), p)) near = part;
  }
  return near;
}

function bodyAxes(key: ViewKey, p: ViewCoord): Record<'x' | 'y' | 'z', number> {
  const [ua, va] = VIEW_AXES[key];
  const axes = { x: 0, y: 0, z: 0 };
  axes[ua] = p.u;
  axes[va] = p.v;
  return axes;
}

/** Where a view point sits on the file's sheet. */
export function viewToSheet(key: ViewKey, sheet: ViewSheet, p: ViewCoord): SheetPoint {
  const axes = bodyAxes(key, p);
  return { sx: sheet.tx + sheet.u.sign * axes[sheet.u.axis], sy: sheet.ty + sheet.v.sign * axes[sheet.v.axis] };
}

/** The view point under a sheet position; inverse of viewToSheet. */
export function sheetToView(key: ViewKey, sheet: ViewSheet, s: SheetPoint): ViewCoord {
  const axes = { x: 0, y: 0, z: 0 };
  axes[sheet.u.axis] = sheet.u.sign * (s.sx - sheet.tx);
  axes[sheet.v.axis] = sheet.v.sign * (s.sy - sheet.ty);
  const [ua, va] = VIEW_AXES[key];
  return { u: axes[ua] + 0, v: axes[va] + 0 };
}
