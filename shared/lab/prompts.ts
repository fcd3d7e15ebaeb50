import type { End, FrontEnd, Side, ViewKey } from '../domain/frames';
import type { PartKind } from '../domain/parts';
import type { Drawing } from '../drawings/types';
import { unitLayout, type LayoutPart } from '../layout/unit-layout';
import { composePartLabel, flipFrontEnd, mirrorNumber, partPhrase, pinSide } from '../orientation';
import { seededRng, type Rng } from './rng';
import { ORIENTATION_KINDS, MAX_PROMPTS } from './templates';
import type { NamePartPrompt, Prompt, TapPartPrompt, TemplateSpec, WhichEndPrompt, WhichSidePrompt } from './types';

const SIDE_VIEWS: readonly ViewKey[] = ['side_plus_y', 'side_minus_y'];
/** The whole unit as the learner sees it: plan first, then the side elevations the drawing has. */
const OVERVIEW: readonly ViewKey[] = ['plan', ...SIDE_VIEWS];

export class PromptError extends Error {}

const overviewOf = (d: Drawing): ViewKey[] => OVERVIEW.filter((v) => d.views.some((dv) => dv.key === v));

/** One instance of the layout: its label under this F and the views it is drawn in. */
interface InstanceInfo {
  readonly instanceId: string;
  readonly kind: PartKind;
  readonly label: string;
  readonly parts: readonly LayoutPart[];
}

function instancesOf(drawing: Drawing, frontEnd: FrontEnd, kinds: readonly PartKind[]): InstanceInfo[] {
  const allowed = new Set(kinds);
  const byId = new Map<string, LayoutPart[]>();
  for (const p of unitLayout(drawing, frontEnd).parts) {
    if (!allowed.has(p.kind)) continue;
    const list = byId.get(p.instanceId) ?? [];
    list.push(p);
    byId.set(p.instanceId, list);
  }
  return [...byId.values()].map((parts) => ({ instanceId: parts[0].instanceId, kind: parts[0].kind, label: parts[0].label, parts }));
}

function tapPart(rng: Rng, drawing: Drawing, frontEnd: FrontEnd, kinds: readonly PartKind[], index: number): TapPartPrompt {
  const candidates = instancesOf(drawing, frontEnd, kinds);
  if (candidates.length === 0) throw new PromptError(`${drawing.name} has no parts of the chosen kinds`);
  const target = rng.pick(candidates);
  const first = target.parts[0];
  const phrase = partPhrase({ kind: first.kind, side: first.side, end: first.end, number: first.number });
  const views = overviewOf(drawing);
  for (const p of target.parts) if (!views.includes(p.view)) views.push(p.view);
  // A part on the centreline has no side in its name; asking for it on one side makes the learner find that side.
  if (first.side === 'center') {
    const sides = target.parts
      .filter((p) => SIDE_VIEWS.includes(p.view))
      .map((p) => pinSide(p.view, { u: p.x, v: p.z }, frontEnd))
      .filter((s): s is 'left' | 'right' => s !== 'center');
    if (sides.length > 0) {
      const side = rng.pick(sides);
      return { index, template: 'tap_part', unitTypeKey: drawing.key, frontEnd, kind: target.kind, targetLabel: target.label, side, views, text: `Tap the ${phrase} on the ${side} side.` };
    }
  }
  return { index, template: 'tap_part', unitTypeKey: drawing.key, frontEnd, kind: target.kind, targetLabel: target.label, views, text: `Tap the ${phrase}.` };
}

/** Wrong names a learner might give, the other-F name first: the same part read with the F on the other end, the mirror side, end or number. */
function distractors(drawing: Drawing, frontEnd: FrontEnd, target: InstanceInfo, rng: Rng): string[] {
  const p = target.parts[0];
  const out = new Set<string>();
  const flipped = unitLayout(drawing, flipFrontEnd(frontEnd)).parts.find((q) => q.instanceId === target.instanceId)?.label;
  const otherSide: Side = p.side === 'left' ? 'right' : p.side === 'right' ? 'left' : p.side;
  const otherEnd: End | undefined = p.end === 'front' ? 'rear' : p.end === 'rear' ? 'front' : undefined;
  const mirrored = p.number !== undefined && p.count !== undefined && p.count > 1 ? mirrorNumber(p.number, p.count) : undefined;
  const variants = [
    { side: otherSide, end: p.end, number: p.number },
    { side: p.side, end: otherEnd, number: p.number },
    { side: p.side, end: p.end, number: mirrored },
    { side: otherSide, end: otherEnd, number: mirrored },
  ];
  for (const v of variants) out.add(composePartLabel({ kind: p.kind, side: v.side, end: v.end, number: v.number }));
  // Real neighbours of the same kind make good wrong answers too.
  for (const other of instancesOf(drawing, frontEnd, [p.kind])) out.add(other.label);
  out.delete(target.label);
  if (flipped === undefined || flipped === target.label) return rng.shuffle([...out]);
  // The name it has with the F on the other end is the mistake the lab is about: always offer it.
  out.delete(flipped);
  return [flipped, ...rng.shuffle([...out])];
}

function namePart(rng: Rng, drawing: Drawing, frontEnd: FrontEnd, kinds: readonly PartKind[], index: number): NamePartPrompt {
  const candidates = instancesOf(drawing, frontEnd, kinds);
  if (candidates.length === 0) throw new PromptError(`${drawing.name} has no parts of the chosen kinds`);
  const target = rng.pick(candidates);
  const shown = target.parts.find((p) => p.view === 'plan') ?? target.parts[0];
  const choices = rng.shuffle([target.label, ...distractors(drawing, frontEnd, target, rng).slice(0, 3)]);
  return { index, template: 'name_part', unitTypeKey: drawing.key, frontEnd, kind: target.kind, partId: shown.partId, choices, views: [shown.view], text: 'Name this part.' };
}

function whichEnd(rng: Rng, drawing: Drawing, frontEnd: FrontEnd, index: number): WhichEndPrompt {
  const ask = rng.bool() ? 'front' : 'rear';
  return { index, template: 'which_end', unitTypeKey: drawing.key, frontEnd, ask, views: overviewOf(drawing), text: `Which end is the ${ask}?` };
}

function whichSide(rng: Rng, drawing: Drawing, frontEnd: FrontEnd, index: number): WhichSidePrompt {
  const ask = rng.bool() ? 'left' : 'right';
  return { index, template: 'which_side', unitTypeKey: drawing.key, frontEnd, ask, views: overviewOf(drawing), text: `Which side is the ${ask} side?` };
}

const identity = (p: Prompt) => `${p.unitTypeKey}|${p.frontEnd}|${p.text}|${p.template === 'name_part' ? p.partId : ''}`;

/**
 * The prompts of one attempt: for each template line, `count` prompts on the quiz's unit type (or a
 * random one when the quiz has none), each with the F placed at random. The same seed and drawings
 * give the same prompts. Repeats are avoided where the drawing has enough parts.
 */
export function generatePrompts(
  templates: readonly TemplateSpec[],
  drawings: readonly Drawing[],
  unitTypeKey: string | null,
  seed: number,
): Prompt[] {
  const rng = seededRng(seed);
  const pool = unitTypeKey === null ? [...drawings].sort((a, b) => a.key.localeCompare(b.key)) : drawings.filter((d) => d.key === unitTypeKey);
  if (pool.length === 0) throw new PromptError(unitTypeKey ? `No drawing for unit type ${unitTypeKey}` : 'No drawings to ask about');
  const total = templates.reduce((n, t) => n + t.count, 0);
  if (total < 1 || total > MAX_PROMPTS) throw new PromptError(`A quiz holds 1 to ${MAX_PROMPTS} prompts, not ${total}`);
  const out: Prompt[] = [];
  const seen = new Set<string>();
  for (const spec of templates) {
    const kinds = spec.kinds && spec.kinds.length > 0 ? spec.kinds : ORIENTATION_KINDS;
    for (let i = 0; i < spec.count; i++) {
      let prompt: Prompt | undefined;
      for (let tries = 0; tries < 25; tries++) {
        const drawing = rng.pick(pool);
        const frontEnd: FrontEnd = rng.bool() ? 'short_hood' : 'long_hood';
        const index = out.length;
        const candidate =
          spec.template === 'tap_part'
            ? tapPart(rng, drawing, frontEnd, kinds, index)
            : spec.template === 'name_part'
              ? namePart(rng, drawing, frontEnd, kinds, index)
              : spec.template === 'which_end'
                ? whichEnd(rng, drawing, frontEnd, index)
                : whichSide(rng, drawing, frontEnd, index);
        prompt = candidate;
        if (!seen.has(identity(candidate))) break;
      }
      seen.add(identity(prompt!));
      out.push(prompt!);
    }
  }
  return out;
}

/** Kinds a drawing can ask about under a template's filter (for the quiz builder's checks). */
export function askableKinds(drawing: Drawing, kinds?: readonly PartKind[]): PartKind[] {
  const allowed = kinds && kinds.length > 0 ? kinds : ORIENTATION_KINDS;
  return [...new Set(drawing.instances.map((i) => i.kind))].filter((k) => allowed.includes(k));
}
