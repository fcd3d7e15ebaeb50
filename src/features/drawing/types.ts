/** The canvas's public types; importing them never loads Konva. */
import type { Ref } from 'react';
import type { Stage } from 'konva/lib/Stage';
import type { ScreenPoint, ViewKey } from '../../../shared/domain/frames';
import type { FindingState, FindingWeight } from '../../../shared/domain/states';
import type { Camera, DrawingMode } from '../../../shared/drawings/screen';
import type { Drawing, ViewCoord } from '../../../shared/drawings/types';
import type { LayoutPart, UnitLayout } from '../../../shared/layout/unit-layout';

export type { DrawingMode };

/** A finding pinned on the view, in view coordinates (body inches of the view's axes). */
export interface DrawingPin {
  readonly id: string;
  readonly u: number;
  readonly v: number;
  readonly weight: FindingWeight;
  readonly state: FindingState;
  /** Placed on this device but not yet stored by the server: drawn with a dashed outline. */
  readonly pending?: boolean;
}

/** One heat cell: lower corner (u, v) and size (w along u, h along v) in view inches. */
export interface HeatCell {
  readonly u: number;
  readonly v: number;
  readonly w: number;
  readonly h: number;
  readonly value: number;
}

export interface DrawingHeat {
  readonly cells: readonly HeatCell[];
  /** The value drawn at full strength (values above it are drawn as it). */
  readonly max: number;
}

/** Imperative hooks for screens and the bench; everyday use needs none of them. */
export interface DrawingCanvasHandle {
  panBy(dx: number, dy: number): void;
  zoomBy(factor: number, at?: ScreenPoint): void;
  fit(): void;
  camera(): Camera;
  /** Where a view point is on the canvas now (CSS px from the canvas's top left). */
  toScreen(p: ViewCoord): ScreenPoint;
  stage(): Stage | null;
}

export interface DrawingCanvasProps {
  drawing: Drawing;
  /** Labels for the unit's front end; `layout.frontEnd` is the unit's front end. */
  layout: UnitLayout;
  view: ViewKey;
  mode: DrawingMode;
  /**
   * The selected element (LayoutPart.partId). A part of the same physical instance in another view
   * is highlighted in this one too. Leave undefined to let the canvas keep its own selection; pass
   * null for "nothing selected" under your control.
   */
  selectedPartId?: string | null;
  pins?: readonly DrawingPin[];
  heat?: DrawingHeat;
  /** A tap, click or Enter on a part; `at` is the tapped view point (the part's centre from the keyboard). */
  onSelectPart(part: LayoutPart, at: ViewCoord): void;
  /** A tap on no part. */
  onTapEmpty?(at: ViewCoord): void;
  /** CSS px; default 420. */
  height?: number;
  /** CSS px; default: the container's width. */
  width?: number;
  ref?: Ref<DrawingCanvasHandle>;
}
