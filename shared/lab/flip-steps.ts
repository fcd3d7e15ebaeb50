import type { FrontEnd } from '../domain/frames';
import { PART_KINDS, type PartKind } from '../domain/parts';
import type { Drawing } from '../drawings/types';
import { unitLayout, type LayoutPart } from '../layout/unit-layout';
import { flipFrontEnd, frontEndSides, mirrorNumber } from '../orientation';
import { END_NAME, capitalise, inSentence, planEdgeOf } from './words';

export interface FlipStep {
  readonly key: string;
  readonly title: string;
  readonly body: string;
  /** Elements to light while the step is shown. */
  readonly partIds: readonly string[];
}

/** What a part is called under each F position, for the side-by-side pin. */
export interface BothNames {
  readonly instanceId: string;
  readonly kind: PartKind;
  readonly shortHood: string;
  readonly longHood: string;
  readonly changes: boolean;
}

export function bothNames(drawing: Drawing, instanceId: string): BothNames | undefined {
  const a = unitLayout(drawing, 'short_hood').parts.find((p) => p.instanceId === instanceId);
  const b = unitLayout(drawing, 'long_hood').parts.find((p) => p.instanceId === instanceId);
  if (!a || !b) return undefined;
  return { instanceId, kind: a.kind, shortHood: a.label, longHood: b.label, changes: a.label !== b.label };
}

/** Per instance: does its name change when the F moves? (What changes and what stays, for the demonstration.) */
export function labelChanges(drawing: Drawing): Map<string, BothNames> {
  const a = unitLayout(drawing, 'short_hood').parts;
  const b = new Map(unitLayout(drawing, 'long_hood').parts.map((p) => [p.instanceId, p.label]));
  const out = new Map<string, BothNames>();
  for (const p of a) {
    if (out.has(p.instanceId)) continue;
    const longHood = b.get(p.instanceId) ?? p.label;
    out.set(p.instanceId, { instanceId: p.instanceId, kind: p.kind, shortHood: p.label, longHood, changes: p.label !== longHood });
  }
  return out;
}

/** The numbered kind with most members on the centreline (traction motors, axles), to count along. */
function countingExample(parts: readonly LayoutPart[]): LayoutPart[] {
  const groups = new Map<string, LayoutPart[]>();
  for (const p of parts) {
    if (p.number === undefined || p.side !== 'center' || p.view !== 'plan') continue;
    const g = groups.get(p.kind) ?? [];
    g.push(p);
    groups.set(p.kind, g);
  }
  const best = [...groups.values()].sort((x, y) => y.length - x.length || x[0].kind.localeCompare(y[0].kind))[0] ?? [];
  return [...best].sort((x, y) => (x.number ?? 0) - (y.number ?? 0));
}

/**
 * The rule step by step, in our own words, for one drawing and F position; every number and name
 * in the text is the engine's. `pinned` adds the "same part, two names" step for that instance.
 */
export function flipSteps(drawing: Drawing, frontEnd: FrontEnd, pinned?: string): FlipStep[] {
  const { front, rear } = frontEndSides(frontEnd);
  const other = flipFrontEnd(frontEnd);
  const layout = unitLayout(drawing, frontEnd).parts;
  const steps: FlipStep[] = [];
  const marks = layout.filter((p) => p.kind === 'front_marking').map((p) => p.partId);
  steps.push({
    key: 'find-f',
    title: 'Find the F',
    body: `The F is stencilled on the ${END_NAME[front]} end. That end is the front, whichever way the unit stands on the track; the ${END_NAME[rear]} end is the rear.`,
    partIds: marks,
  });
  const leftEdge = planEdgeOf(drawing, frontEnd, 'left');
  steps.push({
    key: 'face-f',
    title: 'Stand in the cab and face the F',
    body: `Left is your left hand, right is your right hand.${leftEdge ? ` On this plan the left side is the ${leftEdge} edge and the right side the ${leftEdge === 'upper' ? 'lower' : 'upper'} edge.` : ''} Parts that come in pairs, one each side, take their side from here.`,
    partIds: layout.filter((p) => p.side === 'left' && p.view === 'plan').map((p) => p.partId),
  });
  const row = countingExample(layout);
  if (row.length > 1) {
    const kind = row[0].kind;
    const plural = PART_KINDS[kind].plural;
    steps.push({
      key: 'count',
      title: 'Count from the front',
      body: `${capitalise(plural)} are numbered 1 to ${row.length} starting at the front: #1 is the one nearest the ${END_NAME[front]} end, #${row.length} the one nearest the ${END_NAME[rear]} end. Parts that come one each side are counted on each side separately.`,
      partIds: [row[0].partId],
    });
  }
  const trucks = layout.filter((p) => p.kind === 'truck' && p.view === 'plan' && p.number === 1);
  if (trucks.length > 0) {
    steps.push({ key: 'trucks', title: 'Trucks follow the same rule', body: `The truck nearer the front is #1: here the one under the ${END_NAME[front]} end.`, partIds: trucks.map((p) => p.partId) });
  }
  const example = row[0];
  steps.push({
    key: 'move-f',
    title: 'Move the F',
    body: `Put the F on the ${END_NAME[frontEndSides(other).front]} end and the front, the rear, left, right and every number change over${example?.count ? `: #1 becomes #${mirrorNumber(1, example.count)}, #2 becomes #${mirrorNumber(Math.min(2, example.count), example.count)}` : ''}. No part moves; only the names do.`,
    partIds: marks,
  });
  const stay = layout.filter((p) => p.view === 'plan' && p.side === 'center' && p.number === undefined && p.end === undefined && p.kind !== 'front_marking');
  if (stay.length > 0) {
    const names = [...new Set(stay.map((p) => p.label))].slice(0, 4).join(', ');
    steps.push({ key: 'stays', title: 'What stays the same', body: `A part that is one of its kind and has no side or end keeps its name wherever the F is: ${names}.`, partIds: stay.map((p) => p.partId) });
  }
  if (pinned) {
    const both = bothNames(drawing, pinned);
    if (both) {
      steps.push({
        key: 'pinned',
        title: 'Same part, two names',
        body: both.changes
          ? `The pinned part is the ${inSentence(both.shortHood)} with the F on the short hood, and the ${inSentence(both.longHood)} with the F on the long hood. Write it down wrong and the repair goes to another part.`
          : `The pinned part is the ${inSentence(both.shortHood)} under either F: it has no side, end or number to change.`,
        partIds: layout.filter((p) => p.instanceId === pinned).map((p) => p.partId),
      });
    }
  }
  return steps;
}
