import { PART_KINDS, PART_KIND_KEYS, type PartKind } from '../domain/parts';

/** The kinds of prompt a trainer builds a quiz from. */
export const TEMPLATE_KEYS = ['tap_part', 'name_part', 'which_end', 'which_side'] as const;
export type TemplateKey = (typeof TEMPLATE_KEYS)[number];

export interface TemplateDef {
  readonly key: TemplateKey;
  readonly title: string;
  /** What the learner is asked, in the trainer's list. */
  readonly description: string;
  readonly example: string;
  /** Whether the trainer may narrow the template to some part kinds. */
  readonly usesKinds: boolean;
}

export const TEMPLATES: Record<TemplateKey, TemplateDef> = {
  tap_part: {
    key: 'tap_part',
    title: 'Tap the part',
    description: 'A part is named by its side, end and number under the F shown; the learner taps it on the drawing.',
    example: 'Tap the #2 traction motor on the right side.',
    usesKinds: true,
  },
  name_part: {
    key: 'name_part',
    title: 'Name this part',
    description: 'One part lights up; the learner picks its name, side and number from four.',
    example: 'Name this part.',
    usesKinds: true,
  },
  which_end: {
    key: 'which_end',
    title: 'Which end?',
    description: 'The learner picks the front or the rear end from where the F is.',
    example: 'Which end is the rear?',
    usesKinds: false,
  },
  which_side: {
    key: 'which_side',
    title: 'Which side?',
    description: 'The learner picks the left or the right side of the unit from where the F is.',
    example: 'Which side is the left side?',
    usesKinds: false,
  },
};

/**
 * Part kinds whose name changes when the F moves (numbered, sided or ended), which is what the lab
 * teaches. The F marking itself is left out: it is what the question is read from.
 */
export const ORIENTATION_KINDS: readonly PartKind[] = PART_KIND_KEYS.filter((k) => {
  const s = PART_KINDS[k];
  return k !== 'front_marking' && (s.numbered || s.sided || s.ended);
});

/** Most prompts one quiz may hold (a class sitting, not an exam marathon). */
export const MAX_PROMPTS = 40;
export const MAX_PER_TEMPLATE = 20;
