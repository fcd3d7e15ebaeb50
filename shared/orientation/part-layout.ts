import { PART_KINDS } from '../domain/parts';
import type { PartKind } from '../domain/parts';
import type { BodyPoint, End, FrontEnd, FrontPoint, Side } from '../domain/frames';
import { bodyEndOfX, bodyEndRole, bodyToFront, sideOfY } from './front-frame';

/** One physical part of a unit; a drawing showing it in several views still has one instance. */
export interface PartInstance {
  readonly instanceId: string;
  readonly kind: PartKind;
  readonly centre: BodyPoint;
}

/** A part as a person names it under one F position. */
export interface DerivedPart {
  readonly instanceId: string;
  readonly kind: PartKind;
  readonly side: Side;
  readonly end?: End;
  /** 1..count from the front, for numbered kinds. */
  readonly number?: number;
  /** Members of the numbering group (kind, and side for sided kinds). */
  readonly count?: number;
  readonly label: string;
  readonly front: FrontPoint;
}

/** What a label is made of; lets pin labels reuse the same wording with a side added. */
export interface PartLabelParts {
  readonly kind: PartKind;
  readonly side: Side;
  readonly end?: End;
  readonly number?: number;
}

const capitalise = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);

/** The label as a phrase inside a sentence ("front left uncoupling lever"); kind labels keep their own capitals ("MU"). */
export function partPhrase({ kind, side, end, number }: PartLabelParts): string {
  const spec = PART_KINDS[kind];
  const noun = number === undefined ? spec.label : `#${number} ${spec.label}`;
  const sideWord = side === 'center' ? undefined : side;
  if (end !== undefined) return [end, sideWord, noun].filter(Boolean).join(' ');
  if (sideWord !== undefined) return number === undefined ? `${sideWord} side ${noun}` : `${sideWord} side, ${noun}`;
  return noun;
}

/** The reading label ("Front left uncoupling lever", "Left side, #2 sand box", "#1 truck"); centre drops the side. */
export function composePartLabel(parts: PartLabelParts): string {
  return capitalise(partPhrase(parts));
}

/** The number the same part gets when the F is on the other end. */
export function mirrorNumber(n: number, count: number): number {
  if (!Number.isInteger(n) || !Number.isInteger(count) || n < 1 || n > count) {
    throw new RangeError(`number ${n} is not in 1..${count}`);
  }
  return count + 1 - n;
}

/**
 * Canonical order with the F on the short hood: x up, then y down (left offset up), then z, then id.
 * With the F on the long hood the order is exactly its reverse, so numbers mirror even when
 * coordinates tie and no float subtraction (length − x) can reorder near-equal parts.
 */
function shortHoodOrder(a: PartInstance, b: PartInstance): number {
  if (a.centre.x !== b.centre.x) return a.centre.x - b.centre.x;
  if (a.centre.y !== b.centre.y) return b.centre.y - a.centre.y;
  if (a.centre.z !== b.centre.z) return a.centre.z - b.centre.z;
  return a.instanceId < b.instanceId ? -1 : a.instanceId > b.instanceId ? 1 : 0;
}

/** Side, end, number and label of every part under one F position; output order follows input order. */
export function deriveLayout(parts: readonly PartInstance[], frontEnd: FrontEnd, lengthIn: number): DerivedPart[] {
  if (!(Number.isFinite(lengthIn) && lengthIn > 0)) throw new RangeError(`unit length ${lengthIn} must be positive`);
  const seen = new Set<string>();
  for (const p of parts) {
    if (seen.has(p.instanceId)) throw new Error(`part instance ${p.instanceId} appears twice; one instance per physical part`);
    seen.add(p.instanceId);
    const { x, y, z } = p.centre;
    if (![x, y, z].every(Number.isFinite)) throw new RangeError(`part instance ${p.instanceId} has a non-finite centre`);
  }

  const sideOf = (p: PartInstance): Side => (PART_KINDS[p.kind].sided ? sideOfY(p.centre.y, frontEnd) : 'center');

  // Group numbered parts by kind and side; side is physical (from y), so groups are the same under either F.
  const groups = new Map<string, PartInstance[]>();
  for (const p of parts) {
    if (!PART_KINDS[p.kind].numbered) continue;
    const key = `${p.kind}|${sideOf(p)}`;
    const group = groups.get(key) ?? [];
    group.push(p);
    groups.set(key, group);
  }
  const numbering = new Map<string, { number: number; count: number }>();
  for (const group of groups.values()) {
    const ordered = [...group].sort(shortHoodOrder);
    if (frontEnd === 'long_hood') ordered.reverse();
    ordered.forEach((p, i) => numbering.set(p.instanceId, { number: i + 1, count: ordered.length }));
  }

  return parts.map((p) => {
    const spec = PART_KINDS[p.kind];
    const side = sideOf(p);
    const end = spec.ended ? bodyEndRole(bodyEndOfX(p.centre.x, lengthIn), frontEnd) : undefined;
    const n = numbering.get(p.instanceId);
    const derived: DerivedPart = {
      instanceId: p.instanceId,
      kind: p.kind,
      side,
      ...(end !== undefined && { end }),
      ...(n !== undefined && { number: n.number, count: n.count }),
      label: composePartLabel({ kind: p.kind, side, end, number: n?.number }),
      front: bodyToFront(p.centre, frontEnd, lengthIn),
    };
    return derived;
  });
}
