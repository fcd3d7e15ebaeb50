import { CENTRE_TOLERANCE_IN } from '../../../../shared/domain/parts';
import { bodyPoint, type FrontEnd, type ViewKey } from '../../../../shared/domain/frames';
import type { Drawing, ViewPart } from '../../../../shared/drawings/types';
import type { UnitLayout } from '../../../../shared/layout/unit-layout';
import { bodyToViewPoint, frontEndSides } from '../../../../shared/orientation';
import type { ClientFinding, ClientInspection } from '../api/inspections';

/** A view's name for the person walking: sides and ends are named by the F in use. */
export function viewLabel(view: ViewKey, frontEnd: FrontEnd): string {
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

/** The view that shows an area best: its own side or end when the drawing has it, otherwise the one holding most of its parts. */
export function preferredView(drawing: Drawing, area: { key: string; instanceIds: readonly string[] }): ViewKey {
  const has = (k: ViewKey) => drawing.views.some((v) => v.key === k);
  const named: Partial<Record<string, ViewKey>> = {
    end_short_hood: 'end_short_hood',
    end_long_hood: 'end_long_hood',
    side_minus_y: 'side_minus_y',
    side_plus_y: 'side_plus_y',
    running_gear: 'side_minus_y',
    cab: 'plan',
  };
  const want = named[area.key];
  if (want && has(want)) return want;
  const ids = new Set(area.instanceIds);
  let best: ViewKey = drawing.views[0]?.key ?? 'plan';
  let bestN = -1;
  for (const v of drawing.views) {
    const n = v.parts.filter((p) => ids.has(p.instanceId)).length;
    if (n > bestN) (best = v.key), (bestN = n);
  }
  return best;
}

/** Where to pin an instance when it is chosen from a list: in the view shown if it is drawn there, else the first view that draws it. */
export function partInView(drawing: Drawing, instanceId: string, view: ViewKey): { view: ViewKey; part: ViewPart } | null {
  const here = drawing.views.find((v) => v.key === view)?.parts.find((p) => p.instanceId === instanceId);
  if (here) return { view, part: here };
  for (const v of drawing.views) {
    const p = v.parts.find((x) => x.instanceId === instanceId);
    if (p) return { view: v.key, part: p };
  }
  return null;
}

export function instanceLabels(layout: UnitLayout): Map<string, { label: string; kind: string }> {
  const m = new Map<string, { label: string; kind: string }>();
  for (const p of layout.parts) if (!m.has(p.instanceId)) m.set(p.instanceId, { label: p.label, kind: p.kind });
  return m;
}

/**
 * Findings projected onto one view. Side elevations show only the pins on their own side (or the
 * centreline), end elevations only those in the half of the unit nearest that end.
 */
export function pinsForView(findings: readonly ClientFinding[], view: ViewKey, lengthIn: number) {
  return findings
    .filter((f) => {
      if (f.view === view) return true;
      const { x, y } = f.body;
      switch (view) {
        case 'plan':
          return true;
        case 'side_plus_y':
          return y >= -CENTRE_TOLERANCE_IN;
        case 'side_minus_y':
          return y <= CENTRE_TOLERANCE_IN;
        case 'end_short_hood':
          return x < lengthIn / 2;
        case 'end_long_hood':
          return x >= lengthIn / 2;
      }
    })
    .map((f) => {
      const p = bodyToViewPoint(view, bodyPoint(f.body.x, f.body.y, f.body.z));
      return { id: f.id, u: p.u, v: p.v, weight: f.weight, state: f.state, pending: f.pending };
    });
}

export type PartState = 'passed' | 'finding' | 'not_applicable' | 'todo';

/** Each part's state; `pending` while the change that made it waits on this device to be sent. */
export function itemStates(insp: Pick<ClientInspection, 'items'>): Map<string, { state: PartState; reason: string | null; pending?: boolean }> {
  const m = new Map<string, { state: PartState; reason: string | null; pending?: boolean }>();
  for (const i of insp.items) {
    const s = i.state === 'passed' || i.state === 'finding' || i.state === 'not_applicable' ? i.state : 'todo';
    m.set(i.instanceId, i.pending ? { state: s, reason: i.reason, pending: true } : { state: s, reason: i.reason });
  }
  return m;
}

export function areaProgress(area: { instanceIds: readonly string[] }, states: Map<string, { state: PartState }>) {
  const done = area.instanceIds.filter((id) => (states.get(id)?.state ?? 'todo') !== 'todo').length;
  return { done, total: area.instanceIds.length };
}
