import type { BodyEnd, FrontEnd } from '../domain/frames';
import { PART_KINDS, type PartKind } from '../domain/parts';
import type { Drawing } from '../drawings/types';
import { flipFrontEnd, frontEndSides } from '../orientation';

/** Sentences the lab builds its explanations from; every fact in them comes from the engine's tables. */
export const END_NAME: Record<BodyEnd, string> = { short_hood: 'short hood', long_hood: 'long hood' };

export const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
/** A reading label inside a sentence: "Rear right ditch light" → "rear right ditch light"; "MU …" keeps its capitals. */
export const inSentence = (label: string) => (/^[A-Z][a-z]/.test(label) ? label.charAt(0).toLowerCase() + label.slice(1) : label);

export function frontSentence(frontEnd: FrontEnd): string {
  const { front, rear } = frontEndSides(frontEnd);
  return `The F is on the ${END_NAME[front]} end, so that end is the front and the ${END_NAME[rear]} end is the rear.`;
}

/** Body y sign at the top edge of the plan as the file draws it (sheet y runs down). */
export function planTopYSign(drawing: Drawing): 1 | -1 | undefined {
  const plan = drawing.views.find((v) => v.key === 'plan');
  if (!plan || plan.sheet.v.axis !== 'y') return undefined;
  return plan.sheet.v.sign === 1 ? -1 : 1;
}

/** Where left or right is on this drawing's plan, under one F position. */
export function planEdgeOf(drawing: Drawing, frontEnd: FrontEnd, side: 'left' | 'right'): 'upper' | 'lower' | undefined {
  const top = planTopYSign(drawing);
  if (top === undefined) return undefined;
  const { leftYSign, rightYSign } = frontEndSides(frontEnd);
  return (side === 'left' ? leftYSign : rightYSign) === top ? 'upper' : 'lower';
}

export function sideSentence(drawing: Drawing, frontEnd: FrontEnd, side: 'left' | 'right'): string {
  const edge = planEdgeOf(drawing, frontEnd, side);
  const where = edge ? ` In the plan as drawn here that is the ${edge} edge;` : '';
  return `Stand in the cab facing the F: your ${side} hand points to the ${side} side.${where} seen from outside, the ${side} side is the one with the front at your ${side === 'right' ? 'right' : 'left'} hand.`;
}

export function numberSentence(kind: PartKind, number: number, count: number, frontEnd: FrontEnd, sided: boolean): string {
  const { front } = frontEndSides(frontEnd);
  const other = END_NAME[frontEndSides(flipFrontEnd(frontEnd)).front];
  const plural = capitalise(PART_KINDS[kind].plural);
  const per = sided ? ' on each side' : '';
  return `${plural} are counted from the front${per}: this one is #${number} of ${count} from the ${END_NAME[front]} end. With the F on the ${other} end the same one would be #${count + 1 - number}.`;
}
