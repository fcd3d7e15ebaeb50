import type { BodyEnd, End, FrontEnd, ViewKey } from '../domain/frames';
import type { PartKind } from '../domain/parts';
import type { ViewPoint } from '../orientation';
import type { TemplateKey } from './templates';

/** One line of a quiz: a template and how many prompts it gives, optionally narrowed to some part kinds. */
export interface TemplateSpec {
  readonly template: TemplateKey;
  readonly count: number;
  readonly kinds?: readonly PartKind[];
}

interface PromptBase {
  /** 0-based position in the attempt. */
  readonly index: number;
  readonly unitTypeKey: string;
  /** Where the F is for this prompt; drawn on the unit so the learner reads everything from it. */
  readonly frontEnd: FrontEnd;
  readonly text: string;
  /** Views shown with the prompt, in order. */
  readonly views: readonly ViewKey[];
}

/** "Tap the left side, #2 sand box." / "Tap the #2 traction motor on the right side." */
export interface TapPartPrompt extends PromptBase {
  readonly template: 'tap_part';
  readonly kind: PartKind;
  /** The label the engine gives the target under `frontEnd`. */
  readonly targetLabel: string;
  /** For parts on the centreline: the side they must be tapped on (a side elevation showing that side). */
  readonly side?: 'left' | 'right';
}

/** "Name this part." with one element lit. */
export interface NamePartPrompt extends PromptBase {
  readonly template: 'name_part';
  readonly kind: PartKind;
  /** The drawing element lit for the question. */
  readonly partId: string;
  readonly choices: readonly string[];
}

/** "Which end is the rear?" */
export interface WhichEndPrompt extends PromptBase {
  readonly template: 'which_end';
  readonly ask: End;
}

/** "Which side is the left side?" */
export interface WhichSidePrompt extends PromptBase {
  readonly template: 'which_side';
  readonly ask: 'left' | 'right';
}

/** What the learner sees; it never carries the answer. */
export type Prompt = TapPartPrompt | NamePartPrompt | WhichEndPrompt | WhichSidePrompt;

/** The right answer as the engine derives it; kept with the attempt so results read without the drawing. */
export interface Expected {
  readonly label: string;
  /** Elements to light up after the answer (all views of the prompt). */
  readonly partIds: readonly string[];
  readonly instanceIds: readonly string[];
  readonly end?: BodyEnd;
  /** Body y sign of the asked side (+1: the +y side). */
  readonly ySign?: 1 | -1;
}

export type StoredPrompt = Prompt & { readonly expected: Expected };

export type Answer =
  | { readonly template: 'tap_part'; readonly partId: string; readonly point?: ViewPoint }
  | { readonly template: 'name_part'; readonly label: string }
  | { readonly template: 'which_end'; readonly end: BodyEnd }
  | { readonly template: 'which_side'; readonly ySign: 1 | -1 };

export interface Grade {
  readonly correct: boolean;
  readonly expected: Expected;
  /** What the answer means under this F ("Left side, #5 traction motor", "Short hood end"). */
  readonly given: string;
  /** Why the right answer is right, in our own words. */
  readonly reason: string;
}
