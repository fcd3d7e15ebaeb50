/**
 * What a parsed unit drawing is: views of the carbody with tappable parts and
 * decoration, every coordinate in VIEW coordinates — body-frame inches of the two
 * axes VIEW_AXES gives for the view (plan: u = x, v = y; side elevations: u = x,
 * v = z; end elevations: u = y, v = z). Signs are already undone, so +v in a side
 * elevation is up and +u in an end elevation is +y, whatever way the sheet draws it.
 * `sheet` on each view says how the file laid that view out, for a canvas that wants
 * to draw it the same way round.
 */
import type { BodyPoint, ViewKey } from '../domain/frames';
import type { PartKind } from '../domain/parts';

/** A point in one view, body inches of that view's two axes (same convention as shared/orientation's ViewPoint). */
export interface ViewCoord {
  readonly u: number;
  readonly v: number;
}

/** Axis-aligned box in view coordinates. */
export interface Box {
  readonly umin: number;
  readonly vmin: number;
  readonly umax: number;
  readonly vmax: number;
}

/**
 * Fill hint: `none` outline only, `body` carbody panel tint, `glass` windows and lenses, `rubber`
 * hoses and dark fittings, `ink` solid graphite (stencils), `ground` opaque in the app's ground
 * colour so it hides what is drawn behind it (wheels over the hatched truck frame).
 */
export const FILL_CLASSES = ['none', 'body', 'glass', 'rubber', 'ink', 'ground'] as const;
export type FillClass = (typeof FILL_CLASSES)[number];

/** Line hint: `normal` outline, `heavy` silhouette, `hair` hatching and fine detail, `hidden` dashed (behind something). */
export const LINE_CLASSES = ['normal', 'heavy', 'hair', 'hidden'] as const;
export type LineClass = (typeof LINE_CLASSES)[number];

export interface ShapeStyle {
  readonly fill: FillClass;
  readonly line: LineClass;
}

interface ShapeBase {
  readonly style: ShapeStyle;
  /** Document order within the view (decoration and parts share one count); higher is drawn later, on top. */
  readonly order: number;
}

/** x = umin, y = vmin of the box; w, h along u and v. */
export interface RectShape extends ShapeBase {
  readonly kind: 'rect';
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}
export interface CircleShape extends ShapeBase {
  readonly kind: 'circle';
  readonly cx: number;
  readonly cy: number;
  readonly r: number;
}
/** Radii along u (ru) and v (rv). */
export interface EllipseShape extends ShapeBase {
  readonly kind: 'ellipse';
  readonly cx: number;
  readonly cy: number;
  readonly ru: number;
  readonly rv: number;
}
export interface LineShape extends ShapeBase {
  readonly kind: 'line';
  readonly x1: number;
  readonly y1: number;
  readonly x2: number;
  readonly y2: number;
}
/** Flat list u0, v0, u1, v1, ...; closed for polygons and paths ending in Z. */
export interface PolyShape extends ShapeBase {
  readonly kind: 'poly';
  readonly points: readonly number[];
  readonly closed: boolean;
}
/** A label; (x, y) is the anchor on the baseline; size is the font size in inches. Always drawn upright. */
export interface TextShape extends ShapeBase {
  readonly kind: 'text';
  readonly x: number;
  readonly y: number;
  readonly text: string;
  readonly size: number;
  readonly anchor: 'start' | 'middle' | 'end';
}
export type Shape = RectShape | CircleShape | EllipseShape | LineShape | PolyShape | TextShape;
/** Shapes a tappable part may have (no text). */
export type PartShape = Exclude<Shape, TextShape>;

/** One tappable element in one view. */
export interface ViewPart {
  /** The element's id, unique in the file. */
  readonly id: string;
  readonly kind: PartKind;
  /** The physical part; the same instance drawn in several views shares this id. */
  readonly instanceId: string;
  readonly shape: PartShape;
  readonly bbox: Box;
  /** Centre of bbox. */
  readonly centre: ViewCoord;
}

/** One sheet axis: which body axis runs along it and with which sign. */
export interface SheetAxis {
  readonly axis: 'x' | 'y' | 'z';
  readonly sign: 1 | -1;
}

/**
 * How the file lays the view out: sheet = (tx, ty) + (u.sign * body[u.axis], v.sign * body[v.axis]),
 * sheet x to the right and y down (SVG user units = inches).
 */
export interface ViewSheet {
  readonly tx: number;
  readonly ty: number;
  readonly u: SheetAxis;
  readonly v: SheetAxis;
}

export interface DrawingView {
  readonly key: ViewKey;
  readonly bounds: Box;
  /** In document order; later parts are drawn over earlier ones and should win a tap. */
  readonly parts: readonly ViewPart[];
  /** Everything without data-part (outlines, hatching, labels), in document order. */
  readonly decor: readonly Shape[];
  readonly sheet: ViewSheet;
}

export interface DrawingInstance {
  readonly instanceId: string;
  readonly kind: PartKind;
  /** Assembled from the views; see parse-drawing.ts for which view gives which axis and the defaults. */
  readonly centre: BodyPoint;
  /** Views the instance is drawn in, in VIEW_KEYS order. */
  readonly views: readonly ViewKey[];
  /** Element ids of its drawings. */
  readonly partIds: readonly string[];
}

export interface Drawing {
  /** Unit type key, e.g. `six_axle_road`. */
  readonly key: string;
  readonly name: string;
  readonly lengthIn: number;
  readonly widthIn: number;
  readonly axleCount: number;
  /** The root viewBox: sheet area in inches. */
  readonly viewBox: { readonly x: number; readonly y: number; readonly w: number; readonly h: number };
  /** In the order data-views declares them. */
  readonly views: readonly DrawingView[];
  /** In order of first appearance, views taken in data-views order. */
  readonly instances: readonly DrawingInstance[];
}
