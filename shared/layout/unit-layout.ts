import { bodyPoint, type BodyPoint, type FrontEnd, type ViewKey } from '../domain/frames';
import type { PartKind } from '../domain/parts';
import type { Drawing } from '../drawings/types';
import { deriveLayout, type DerivedPart } from '../orientation';

/** One tappable element of a unit's drawing, with the labels its front end gives it. */
export interface LayoutPart {
  partId: string;
  instanceId: string;
  kind: PartKind;
  view: ViewKey;
  x: number;
  y: number;
  z: number;
  number?: number;
  count?: number;
  side: DerivedPart['side'];
  end?: DerivedPart['end'];
  label: string;
  along: number;
  left: number;
}

export interface UnitLayout {
  frontEnd: FrontEnd;
  parts: LayoutPart[];
}

/**
 * The F stencil is drawn on the short hood; a unit that carries it on the long hood carries it at the
 * same place relative to its front, i.e. turned end for end (x → L − x, y → −y).
 */
export function markingCentre(centre: BodyPoint, frontEnd: FrontEnd, lengthIn: number): BodyPoint {
  return frontEnd === 'short_hood' ? centre : bodyPoint(lengthIn - centre.x, -centre.y, centre.z);
}

const instancesFor = (drawing: Drawing, frontEnd: FrontEnd) =>
  drawing.instances.map((i) => ({ instanceId: i.instanceId, kind: i.kind, centre: i.kind === 'front_marking' ? markingCentre(i.centre, frontEnd, drawing.lengthIn) : i.centre }));

/** Derives every element's label from the unit's front end; one physical instance, one label. */
export function unitLayout(drawing: Drawing, frontEnd: FrontEnd): UnitLayout {
  const derived = deriveLayout(instancesFor(drawing, frontEnd), frontEnd, drawing.lengthIn);
  const placed = instancesFor(drawing, frontEnd);
  const byInstance = new Map(derived.map((d, i) => [d.instanceId, { d, centre: placed[i].centre }]));
  const parts: LayoutPart[] = [];
  for (const view of drawing.views) {
    for (const p of view.parts) {
      const { d, centre } = byInstance.get(p.instanceId)!;
      parts.push({
        partId: p.id,
        instanceId: p.instanceId,
        kind: p.kind,
        view: view.key,
        x: centre.x,
        y: centre.y,
        z: centre.z,
        ...(d.number !== undefined ? { number: d.number, count: d.count } : {}),
        side: d.side,
        ...(d.end ? { end: d.end } : {}),
        label: d.label,
        along: d.front.along,
        left: d.front.left,
      });
    }
  }
  return { frontEnd, parts };
}

/** Instances ordered by distance from the front (the Tab order and the default walk order). */
export function instancesFromFront(drawing: Drawing, frontEnd: FrontEnd): DerivedPart[] {
  const derived = deriveLayout(instancesFor(drawing, frontEnd), frontEnd, drawing.lengthIn);
  return [...derived].sort((a, b) => a.front.along - b.front.along || b.front.left - a.front.left || a.instanceId.localeCompare(b.instanceId));
}
