import type { FrontEnd } from '../domain/frames';
import { PART_KINDS } from '../domain/parts';
import type { Drawing, ViewPart } from '../drawings/types';
import { unitLayout, type LayoutPart } from '../layout/unit-layout';
import { bodyEndRole, deriveLayout, frontEndSides, pinLabel, pinSide, sideOfY, type DerivedPart, type ViewPoint } from '../orientation';
import type { Answer, Expected, Grade, Prompt } from './types';
import { END_NAME, capitalise, inSentence, frontSentence, numberSentence, planEdgeOf, planTopYSign, sideSentence } from './words';

/** The answer does not fit the prompt (another template, a part not on the drawing shown, a name not offered). */
export class GradeError extends Error {}

/** Every label here comes from the orientation engine; the lab keeps no rule of its own. */
function derive(drawing: Drawing, frontEnd: FrontEnd) {
  const layout = unitLayout(drawing, frontEnd);
  const derived = new Map<string, DerivedPart>(
    deriveLayout(
      drawing.instances.map((i) => ({ instanceId: i.instanceId, kind: i.kind, centre: i.centre })),
      frontEnd,
      drawing.lengthIn,
    ).map((d) => [d.instanceId, d]),
  );
  const viewParts = new Map<string, ViewPart>();
  for (const v of drawing.views) for (const p of v.parts) viewParts.set(p.id, p);
  const byPartId = new Map<string, LayoutPart>(layout.parts.map((p) => [p.partId, p]));
  return { layout, derived, viewParts, byPartId };
}

// Drawings are immutable once parsed, so one derivation per (drawing, F) serves every answer.
const cache = new WeakMap<Drawing, Map<FrontEnd, ReturnType<typeof derive>>>();
function engine(drawing: Drawing, frontEnd: FrontEnd) {
  let byEnd = cache.get(drawing);
  if (!byEnd) cache.set(drawing, (byEnd = new Map()));
  let e = byEnd.get(frontEnd);
  if (!e) byEnd.set(frontEnd, (e = derive(drawing, frontEnd)));
  return e;
}

/** Where the tap lies: the given point when it is on the part (1 in slack), else the part's centre. */
function tapPoint(vp: ViewPart, point?: ViewPoint): ViewPoint {
  const slack = 1;
  if (point && point.u >= vp.bbox.umin - slack && point.u <= vp.bbox.umax + slack && point.v >= vp.bbox.vmin - slack && point.v <= vp.bbox.vmax + slack) {
    return point;
  }
  return vp.centre;
}

/** The right answer of a prompt under its F, derived by the engine from the drawing. */
export function expectedFor(prompt: Prompt, drawing: Drawing): Expected {
  if (prompt.unitTypeKey !== drawing.key) throw new GradeError(`prompt is about ${prompt.unitTypeKey}, not ${drawing.key}`);
  const fe = prompt.frontEnd;
  const { layout, derived, viewParts } = engine(drawing, fe);
  const inViews = layout.parts.filter((p) => prompt.views.includes(p.view));
  switch (prompt.template) {
    case 'tap_part': {
      const hits = inViews.filter(
        (p) => p.label === prompt.targetLabel && (!prompt.side || pinSide(p.view, viewParts.get(p.partId)!.centre, fe) === prompt.side),
      );
      if (hits.length === 0) throw new GradeError(`no part of ${drawing.key} is the ${prompt.targetLabel} under this F`);
      const first = derived.get(hits[0].instanceId)!;
      return {
        label: prompt.side ? pinLabel(first, prompt.side) : prompt.targetLabel,
        partIds: hits.map((p) => p.partId),
        instanceIds: [...new Set(hits.map((p) => p.instanceId))],
      };
    }
    case 'name_part': {
      const part = layout.parts.find((p) => p.partId === prompt.partId);
      if (!part) throw new GradeError(`${drawing.key} has no element ${prompt.partId}`);
      return { label: part.label, partIds: [part.partId], instanceIds: [part.instanceId] };
    }
    case 'which_end': {
      const end = frontEndSides(fe)[prompt.ask];
      const atEnd = inViews.filter((p) => p.end === prompt.ask);
      return { label: `${capitalise(END_NAME[end])} end`, end, partIds: atEnd.map((p) => p.partId), instanceIds: [...new Set(atEnd.map((p) => p.instanceId))] };
    }
    case 'which_side': {
      const { leftYSign, rightYSign } = frontEndSides(fe);
      const ySign = prompt.ask === 'left' ? leftYSign : rightYSign;
      const onSide = inViews.filter((p) => p.side === prompt.ask);
      const edge = planEdgeOf(drawing, fe, prompt.ask);
      const label = edge ? `The ${edge} side of the plan (the ${prompt.ask} side)` : `The ${prompt.ask} side`;
      return { label, ySign, partIds: onSide.map((p) => p.partId), instanceIds: [...new Set(onSide.map((p) => p.instanceId))] };
    }
  }
}

function partReason(drawing: Drawing, fe: FrontEnd, d: DerivedPart, side?: 'left' | 'right'): string[] {
  const spec = PART_KINDS[d.kind];
  const out = [frontSentence(fe)];
  const s = side ?? (d.side === 'center' ? undefined : d.side);
  if (s) out.push(sideSentence(drawing, fe, s));
  if (d.end) out.push(`It belongs to the ${d.end} end, the ${END_NAME[d.end === 'front' ? frontEndSides(fe).front : frontEndSides(fe).rear]} end.`);
  if (d.number !== undefined && d.count !== undefined) out.push(numberSentence(d.kind, d.number, d.count, fe, spec.sided));
  return out;
}

/** Why the right answer is right, built from the engine's derivation for this prompt. */
export function reasonFor(prompt: Prompt, drawing: Drawing, expected: Expected = expectedFor(prompt, drawing)): string {
  const fe = prompt.frontEnd;
  const { derived } = engine(drawing, fe);
  switch (prompt.template) {
    case 'tap_part':
    case 'name_part': {
      const d = derived.get(expected.instanceIds[0])!;
      const side = prompt.template === 'tap_part' ? prompt.side : undefined;
      return [`This is the ${inSentence(expected.label)}.`, ...partReason(drawing, fe, d, side)].join(' ');
    }
    case 'which_end':
      return [frontSentence(fe), prompt.ask === 'rear' ? 'The rear is the end away from the F.' : 'The front is always the end carrying the F.'].join(' ');
    case 'which_side':
      return [frontSentence(fe), sideSentence(drawing, fe, prompt.ask)].join(' ');
  }
}

/** Grades one answer through the orientation engine and says why. */
export function gradeAnswer(prompt: Prompt, answer: Answer, drawing: Drawing): Grade {
  if (answer.template !== prompt.template) throw new GradeError(`this prompt takes a ${prompt.template} answer`);
  const fe = prompt.frontEnd;
  const expected = expectedFor(prompt, drawing);
  const { derived, viewParts, byPartId } = engine(drawing, fe);
  let correct: boolean;
  let given: string;
  switch (answer.template) {
    case 'tap_part': {
      const p = prompt as Extract<Prompt, { template: 'tap_part' }>;
      const part = byPartId.get(answer.partId);
      if (!part || !p.views.includes(part.view)) throw new GradeError(`${answer.partId} is not on the drawing shown`);
      const side = pinSide(part.view, tapPoint(viewParts.get(part.partId)!, answer.point), fe);
      given = pinLabel(derived.get(part.instanceId)!, side);
      correct = part.label === p.targetLabel && (!p.side || side === p.side);
      break;
    }
    case 'name_part': {
      const p = prompt as Extract<Prompt, { template: 'name_part' }>;
      if (!p.choices.includes(answer.label)) throw new GradeError('pick one of the names offered');
      given = answer.label;
      correct = answer.label === expected.label;
      break;
    }
    case 'which_end': {
      const p = prompt as Extract<Prompt, { template: 'which_end' }>;
      const role = bodyEndRole(answer.end, fe);
      given = `${capitalise(END_NAME[answer.end])} end (the ${role})`;
      correct = role === p.ask;
      break;
    }
    case 'which_side': {
      const p = prompt as Extract<Prompt, { template: 'which_side' }>;
      const side = sideOfY((answer.ySign * drawing.widthIn) / 2, fe);
      const top = planTopYSign(drawing);
      given = top === undefined ? `The ${side} side` : `The ${answer.ySign === top ? 'upper' : 'lower'} side of the plan (the ${side} side)`;
      correct = side === p.ask;
      break;
    }
  }
  return { correct, expected, given, reason: reasonFor(prompt, drawing, expected) };
}
