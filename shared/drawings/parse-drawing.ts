/**
 * Loader for Hoodline unit drawings: one SVG file per unit type, drawn in carbody inches.
 *
 * File format (ours; diagrams/README.md says the same for people drawing them):
 *
 *   <svg xmlns="http://www.w3.org/2000/svg" viewBox="minx miny w h"
 *        data-unit-type="six_axle_road" data-name="Six-axle road unit, cab on short hood"
 *        data-length="850" data-width="123" data-axles="6"
 *        data-views="plan side_plus_y side_minus_y end_short_hood end_long_hood">
 *     <g data-view="plan" transform="translate(TX,TY)" data-axes="x,-y" data-bounds="umin vmin umax vmax">
 *       <rect id="pl-axle_1" data-part="axle" data-instance="axle_1" x=".." y=".." width=".." height=".."/>
 *       <path class="hair" d="M .. L .."/>   (decoration: no data-part)
 *     </g>
 *     ...
 *   </svg>
 *
 * - Sheet units are inches. data-length (over coupler faces), data-width and data-axles are required.
 *   data-views lists the views in the file; plan is required; each listed view must be present.
 * - A view is a direct child <g> of the root with data-view (a ViewKey), an optional
 *   transform="translate(TX,TY)" (the only transform anywhere), data-axes and data-bounds.
 * - data-axes says which signed body axis runs along the sheet's u (right) and v (down), e.g.
 *   plan "x,-y" (short hood end at the left, +y up: a true view from above), side_plus_y "-x,-z"
 *   (seen from outside on the +y side), side_minus_y "x,-z", end_short_hood "-y,-z" (seen from
 *   outside, looking at the short hood end), end_long_hood "y,-z". They must name exactly the two
 *   axes VIEW_AXES gives for the view. A point (a, b) written inside the group is at
 *   body[axis_u] = sign_u * a, body[axis_v] = sign_v * b (SVG semantics: it shows on the sheet
 *   at (TX + a, TY + b)).
 * - The loader hands every shape back in VIEW coordinates: (u, v) = the body inches of
 *   VIEW_AXES[view] (plan x,y; sides x,z; ends y,z) with the signs undone.
 * - data-bounds "umin vmin umax vmax" is the view's extent in those view coordinates; every part
 *   must lie inside it.
 * - Tappable parts: an element with data-part (a PART_KINDS key), an id unique in the file and
 *   data-instance (lowercase, digits, underscores) naming the physical part; the same physical part
 *   drawn in several views shares its data-instance and is drawn at most once per view. Allowed
 *   shapes: rect, circle, ellipse, line, polyline, polygon and path with absolute M/L/H/V/Z only
 *   (a part's path is one subpath). Later elements are drawn over earlier ones and win a tap.
 * - Everything else inside a view is decoration and is kept (shapes as above, plus plain <text>).
 *   Nested <g> without a transform may group elements; <title>, <desc> inside views and
 *   <title>, <desc>, <metadata>, <defs>, <style> at the root are ignored.
 * - class tokens are style hints: fill `body` | `glass` | `rubber` | `ink` | `ground` | `none`, line `heavy` |
 *   `hair` | `hidden` | `normal`; a group's classes pass to its children, the child's own win.
 * - data-axles must equal the number of axle instances drawn.
 *
 * Instance centres: x and y come from the plan, z from a side elevation (plus-y first), else from an
 * end elevation. A part not in the plan takes x from a side elevation and y from an end elevation.
 * What no view shows is defaulted: x = 0 (only in end_short_hood) or the length (only in
 * end_long_hood); y = +width/2 (only in side_plus_y), −width/2 (only in side_minus_y), 0 (both);
 * z = 0 (top of rail) when the part is only in the plan. Where several views show the same axis they
 * must agree within INSTANCE_TOLERANCE_IN.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { VIEW_AXES, VIEW_KEYS, bodyPoint } from '../domain/frames';
import type { ViewKey } from '../domain/frames';
import { isPartKind } from '../domain/parts';
import type { PartKind } from '../domain/parts';
import { boxCentre, boxInside, shapeBBox } from './geometry';
import { PathDataError, parsePathData } from './path-data';
import { FILL_CLASSES, LINE_CLASSES } from './types';
import type {
  Box,
  Drawing,
  DrawingInstance,
  DrawingView,
  FillClass,
  LineClass,
  PartShape,
  SheetAxis,
  Shape,
  ShapeStyle,
  ViewPart,
  ViewSheet,
} from './types';

/** Views showing the same axis of one instance may differ by this much (inches) at their centres. */
export const INSTANCE_TOLERANCE_IN = 2;
/** Parts may overhang their view bounds by this much (rounding in hand-edited files). */
const BOUNDS_TOLERANCE_IN = 0.01;
const MAX_FILE_CHARS = 2_000_000;

export type DrawingFault =
  | 'not_xml'
  | 'wrong_root'
  | 'missing_dimension'
  | 'missing_view'
  | 'outside_view'
  | 'unknown_kind'
  | 'duplicate_id'
  | 'outside_bounds'
  | 'unsupported_shape'
  | 'bad_attribute'
  | 'inconsistent_instance'
  | 'count_mismatch';

/** A drawing file that cannot be used; the message names the file, the element (id or tag#n) and the fault. */
export class DrawingError extends Error {
  constructor(
    readonly fileName: string,
    readonly element: string,
    readonly fault: DrawingFault,
    readonly detail: string,
  ) {
    super(`${fileName}, element ${element}: ${detail}`);
    this.name = 'DrawingError';
  }
}

type Attrs = Record<string, string>;
interface XmlNode {
  [tag: string]: unknown;
}

const SHAPE_TAGS = new Set(['rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon', 'path']);
const IGNORED_ROOT_TAGS = new Set(['title', 'desc', 'metadata', 'defs', 'style']);
const IGNORED_VIEW_TAGS = new Set(['title', 'desc']);
const NUMBER = /^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$/;
const INSTANCE_ID = /^[a-z0-9_]+$/;
const UNIT_KEY = /^[a-z][a-z0-9_]*$/;

const parser = new XMLParser({
  preserveOrder: true,
  ignoreAttributes: false,
  attributeNamePrefix: '',
  parseTagValue: false,
  parseAttributeValue: false,
  ignoreDeclaration: true,
  ignorePiTags: true,
  trimValues: false,
});

const tagOf = (node: XmlNode): string => Object.keys(node).find((k) => k !== ':@') ?? '';
const attrsOf = (node: XmlNode): Attrs => (node[':@'] as Attrs | undefined) ?? {};
const childrenOf = (node: XmlNode): XmlNode[] => {
  const c = node[tagOf(node)];
  return Array.isArray(c) ? (c as XmlNode[]) : [];
};
const isElement = (node: XmlNode): boolean => {
  const t = tagOf(node);
  return t !== '' && !t.startsWith('#') && !t.startsWith('?') && !t.startsWith('!');
};

/** Parses one drawing file; throws DrawingError on the first fault found. */
export function parseDrawing(svgText: string, fileName: string): Drawing {
  return new DrawingReader(svgText, fileName).read();
}

interface ViewContext {
  key: ViewKey;
  sheet: ViewSheet;
  bounds: Box;
  parts: ViewPart[];
  decor: Shape[];
  order: number;
}

class DrawingReader {
  private readonly tagCounts = new Map<string, number>();
  private readonly ids = new Set<string>();

  constructor(
    private readonly text: string,
    private readonly fileName: string,
  ) {}

  private fail(element: string, fault: DrawingFault, detail: string): never {
    throw new DrawingError(this.fileName, element, fault, detail);
  }

  /** Counts the element in document order and returns how errors name it: "id" or tag#n. */
  private label(node: XmlNode): string {
    const tag = tagOf(node);
    const n = (this.tagCounts.get(tag) ?? 0) + 1;
    this.tagCounts.set(tag, n);
    const id = attrsOf(node).id;
    return id ? `"${id}"` : `${tag}#${n}`;
  }

  private claimId(node: XmlNode, label: string): void {
    const id = attrsOf(node).id;
    if (id === undefined) return;
    if (id.trim() === '') this.fail(label, 'bad_attribute', 'empty id');
    if (this.ids.has(id)) this.fail(label, 'duplicate_id', `duplicate id "${id}" (ids must be unique in the file)`);
    this.ids.add(id);
  }

  private number(attrs: Attrs, name: string, label: string, fallback?: number): number {
    const raw = attrs[name];
    if (raw === undefined) {
      if (fallback !== undefined) return fallback;
      this.fail(label, 'bad_attribute', `missing ${name}`);
    }
    if (!NUMBER.test(raw)) this.fail(label, 'bad_attribute', `${name}="${raw}" is not a plain number (inches, no units)`);
    return Number(raw);
  }

  private numberList(raw: string, name: string, label: string): number[] {
    const parts = raw.trim().split(/[\s,]+/).filter((s) => s !== '');
    for (const p of parts) {
      if (!NUMBER.test(p)) this.fail(label, 'bad_attribute', `${name}="${raw}" holds "${p}", not a number`);
    }
    return parts.map(Number);
  }

  read(): Drawing {
    if (this.text.length > MAX_FILE_CHARS) this.fail('document', 'not_xml', `file is larger than ${MAX_FILE_CHARS} characters`);
    if (/<!(DOCTYPE|ENTITY)/i.test(this.text)) this.fail('document', 'not_xml', 'DOCTYPE and entity declarations are not allowed');
    const valid = XMLValidator.validate(this.text);
    if (valid !== true) {
      this.fail('document', 'not_xml', `not well-formed XML: ${valid.err.msg} (line ${valid.err.line})`);
    }
    const top = (parser.parse(this.text) as XmlNode[]).filter(isElement);
    if (top.length !== 1 || tagOf(top[0]) !== 'svg') {
      this.fail(top[0] ? this.label(top[0]) : 'document', 'wrong_root', `root element must be <svg>, found <${top[0] ? tagOf(top[0]) : 'nothing'}>`);
    }
    const root = top[0];
    const label = this.label(root);
    this.claimId(root, label);
    const a = attrsOf(root);

    const key = a['data-unit-type'];
    if (key === undefined || !UNIT_KEY.test(key)) {
      this.fail(label, 'bad_attribute', `data-unit-type must be a snake_case key, found ${key === undefined ? 'nothing' : `"${key}"`}`);
    }
    const name = (a['data-name'] ?? '').trim();
    if (name === '') this.fail(label, 'bad_attribute', 'missing data-name');
    for (const dim of ['data-length', 'data-width', 'data-axles']) {
      if (a[dim] === undefined) this.fail(label, 'missing_dimension', `missing ${dim} (length, width and axle count are required)`);
    }
    const lengthIn = this.number(a, 'data-length', label);
    const widthIn = this.number(a, 'data-width', label);
    const axleCount = this.number(a, 'data-axles', label);
    if (!(lengthIn > 0)) this.fail(label, 'bad_attribute', `data-length must be positive, found ${lengthIn}`);
    if (!(widthIn > 0)) this.fail(label, 'bad_attribute', `data-width must be positive, found ${widthIn}`);
    if (!(Number.isInteger(axleCount) && axleCount > 0)) this.fail(label, 'bad_attribute', `data-axles must be a positive whole number, found ${axleCount}`);

    if (a.viewBox === undefined) this.fail(label, 'bad_attribute', 'missing viewBox');
    const vb = this.numberList(a.viewBox, 'viewBox', label);
    if (vb.length !== 4 || !(vb[2] > 0 && vb[3] > 0)) this.fail(label, 'bad_attribute', `viewBox="${a.viewBox}" must be four numbers with positive width and height`);

    const declared = (a['data-views'] ?? '').trim().split(/\s+/).filter((s) => s !== '');
    for (const v of declared) {
      if (!(VIEW_KEYS as readonly string[]).includes(v)) this.fail(label, 'bad_attribute', `data-views names unknown view "${v}"`);
    }
    if (new Set(declared).size !== declared.length) this.fail(label, 'bad_attribute', 'data-views lists a view twice');
    if (!declared.includes('plan')) this.fail(label, 'missing_view', 'the plan view is required (data-views must list plan)');

    const views = new Map<ViewKey, ViewContext>();
    for (const child of childrenOf(root)) {
      if (!isElement(child)) continue;
      const tag = tagOf(child);
      if (IGNORED_ROOT_TAGS.has(tag)) {
        this.skip(child);
        continue;
      }
      const childLabel = this.label(child);
      this.claimId(child, childLabel);
      const ca = attrsOf(child);
      if (tag !== 'g' || ca['data-view'] === undefined) {
        this.fail(childLabel, 'outside_view', `<${tag}> outside any view; every shape belongs in a <g data-view>`);
      }
      const view = this.readViewHeader(child, childLabel, declared);
      if (views.has(view.key)) this.fail(childLabel, 'bad_attribute', `view ${view.key} appears twice`);
      views.set(view.key, view);
      this.readChildren(child, view, { fill: 'none', line: 'normal' });
    }
    for (const v of declared) {
      if (!views.has(v as ViewKey)) this.fail(label, 'missing_view', `view ${v} is declared in data-views but not drawn`);
    }

    const orderedViews: DrawingView[] = declared.map((v) => {
      const c = views.get(v as ViewKey)!;
      return { key: c.key, bounds: c.bounds, parts: c.parts, decor: c.decor, sheet: c.sheet };
    });
    const instances = this.assembleInstances(orderedViews, lengthIn, widthIn);
    const axles = instances.filter((i) => i.kind === 'axle').length;
    if (axles !== axleCount) this.fail(label, 'count_mismatch', `data-axles="${axleCount}" but ${axles} axle instances are drawn`);

    return {
      key,
      name,
      lengthIn,
      widthIn,
      axleCount,
      viewBox: { x: vb[0], y: vb[1], w: vb[2], h: vb[3] },
      views: orderedViews,
      instances,
    };
  }

  /** Walks an ignored subtree so tag#n counts stay in document order. */
  private skip(node: XmlNode): void {
    this.label(node);
    for (const c of childrenOf(node)) if (isElement(c)) this.skip(c);
  }

  private readViewHeader(node: XmlNode, label: string, declared: string[]): ViewContext {
    const a = attrsOf(node);
    const key = a['data-view'];
    if (!(VIEW_KEYS as readonly string[]).includes(key)) this.fail(label, 'bad_attribute', `unknown view "${key}"`);
    const viewKey = key as ViewKey;
    if (!declared.includes(viewKey)) this.fail(label, 'bad_attribute', `view ${viewKey} is drawn but not declared in data-views`);

    let tx = 0, ty = 0;
    if (a.transform !== undefined) {
      const m = /^\s*translate\(\s*([^,\s)]+)(?:[\s,]+([^,\s)]+))?\s*\)\s*$/.exec(a.transform);
      if (!m || !NUMBER.test(m[1]) || (m[2] !== undefined && !NUMBER.test(m[2]))) {
        this.fail(label, 'bad_attribute', `transform="${a.transform}": a view may only be moved with translate(TX,TY)`);
      }
      tx = Number(m[1]);
      ty = m[2] === undefined ? 0 : Number(m[2]);
    }

    if (a['data-axes'] === undefined) this.fail(label, 'bad_attribute', 'missing data-axes');
    const axes = a['data-axes'].split(',').map((s) => s.trim());
    const parsed = axes.map((s) => /^([-+]?)([xyz])$/.exec(s));
    if (parsed.length !== 2 || parsed.some((p) => p === null)) {
      this.fail(label, 'bad_attribute', `data-axes="${a['data-axes']}" must be two signed axes such as "-x,-z"`);
    }
    const [pu, pv] = parsed as RegExpExecArray[];
    const u: SheetAxis = { axis: pu[2] as SheetAxis['axis'], sign: pu[1] === '-' ? -1 : 1 };
    const v: SheetAxis = { axis: pv[2] as SheetAxis['axis'], sign: pv[1] === '-' ? -1 : 1 };
    const want = [...VIEW_AXES[viewKey]].sort().join(',');
    if ([u.axis, v.axis].sort().join(',') !== want) {
      this.fail(label, 'bad_attribute', `data-axes="${a['data-axes']}" must use the axes ${VIEW_AXES[viewKey].join(' and ')} for view ${viewKey}`);
    }

    if (a['data-bounds'] === undefined) this.fail(label, 'bad_attribute', 'missing data-bounds');
    const b = this.numberList(a['data-bounds'], 'data-bounds', label);
    if (b.length !== 4 || !(b[0] < b[2] && b[1] < b[3])) {
      this.fail(label, 'bad_attribute', `data-bounds="${a['data-bounds']}" must be "umin vmin umax vmax" with min < max`);
    }
    return {
      key: viewKey,
      sheet: { tx, ty, u, v },
      bounds: { umin: b[0], vmin: b[1], umax: b[2], vmax: b[3] },
      parts: [],
      decor: [],
      order: 0,
    };
  }

  private styleOf(attrs: Attrs, inherited: ShapeStyle, label: string): ShapeStyle {
    let fill: FillClass = inherited.fill;
    let line: LineClass = inherited.line;
    for (const token of (attrs.class ?? '').split(/\s+/).filter((s) => s !== '')) {
      if ((FILL_CLASSES as readonly string[]).includes(token)) fill = token as FillClass;
      else if ((LINE_CLASSES as readonly string[]).includes(token)) line = token as LineClass;
      else this.fail(label, 'bad_attribute', `unknown class "${token}" (fill: ${FILL_CLASSES.join(', ')}; line: ${LINE_CLASSES.join(', ')})`);
    }
    return { fill, line };
  }

  private readChildren(parent: XmlNode, view: ViewContext, inherited: ShapeStyle): void {
    for (const node of childrenOf(parent)) {
      if (!isElement(node)) continue;
      const tag = tagOf(node);
      if (IGNORED_VIEW_TAGS.has(tag)) {
        this.skip(node);
        continue;
      }
      const label = this.label(node);
      this.claimId(node, label);
      const a = attrsOf(node);
      if (a.transform !== undefined) {
        this.fail(label, 'bad_attribute', `transform="${a.transform}" is not allowed here (only translate on the view group)`);
      }
      const style = this.styleOf(a, inherited, label);
      const partKind = a['data-part'];
      if (tag === 'g') {
        if (a['data-view'] !== undefined) this.fail(label, 'bad_attribute', 'views cannot be nested');
        if (partKind !== undefined) this.fail(label, 'unsupported_shape', 'data-part on <g>: a part must be a single shape');
        this.readChildren(node, view, style);
        continue;
      }
      if (tag === 'text') {
        if (partKind !== undefined) this.fail(label, 'unsupported_shape', 'data-part on <text>: labels cannot be parts');
        const text = this.readText(node, view, style, label);
        if (text) view.decor.push(text);
        continue;
      }
      if (!SHAPE_TAGS.has(tag)) {
        this.fail(label, 'unsupported_shape', `<${tag}> is not supported (rect, circle, ellipse, line, polyline, polygon, path, text, g)`);
      }
      const shapes = this.readShape(node, tag, view, style, label);
      if (partKind === undefined) {
        view.decor.push(...shapes);
        continue;
      }
      this.addPart(a, partKind, shapes, view, label);
    }
  }

  private addPart(a: Attrs, partKind: string, shapes: PartShape[], view: ViewContext, label: string): void {
    if (!isPartKind(partKind)) this.fail(label, 'unknown_kind', `unknown part kind "${partKind}" (data-part must be a catalogue key)`);
    if (a.id === undefined) this.fail(label, 'bad_attribute', 'a part needs an id');
    const instanceId = a['data-instance'];
    if (instanceId === undefined) this.fail(label, 'bad_attribute', 'a part needs data-instance naming the physical part');
    if (!INSTANCE_ID.test(instanceId)) this.fail(label, 'bad_attribute', `data-instance="${instanceId}" must be lowercase letters, digits and underscores`);
    if (shapes.length !== 1) this.fail(label, 'unsupported_shape', `a part's path must be one subpath, found ${shapes.length}`);
    const shape = shapes[0];
    const bbox = shapeBBox(shape);
    if (!boxInside(bbox, view.bounds, BOUNDS_TOLERANCE_IN)) {
      const f = (n: number): string => String(Math.round(n * 100) / 100);
      this.fail(
        label,
        'outside_bounds',
        `part lies outside view ${view.key}: spans u ${f(bbox.umin)}..${f(bbox.umax)}, v ${f(bbox.vmin)}..${f(bbox.vmax)}; ` +
          `bounds are u ${f(view.bounds.umin)}..${f(view.bounds.umax)}, v ${f(view.bounds.vmin)}..${f(view.bounds.vmax)}`,
      );
    }
    if (view.parts.some((p) => p.instanceId === instanceId)) {
      this.fail(label, 'inconsistent_instance', `instance ${instanceId} is drawn twice in view ${view.key}`);
    }
    view.parts.push({ id: a.id, kind: partKind as PartKind, instanceId, shape, bbox, centre: boxCentre(bbox) });
  }

  /** A point as written inside the view group → view coordinates (body inches of VIEW_AXES, signs undone). */
  private toView(view: ViewContext, a: number, b: number): [number, number] {
    const { u, v } = view.sheet;
    const body = { x: 0, y: 0, z: 0 };
    body[u.axis] = u.sign * a;
    body[v.axis] = v.sign * b;
    const [ua, va] = VIEW_AXES[view.key];
    return [body[ua] + 0, body[va] + 0];
  }

  private swapped(view: ViewContext): boolean {
    return view.sheet.u.axis !== VIEW_AXES[view.key][0];
  }

  private mapPoints(view: ViewContext, sheetPts: readonly number[]): number[] {
    const out: number[] = [];
    for (let i = 0; i < sheetPts.length; i += 2) out.push(...this.toView(view, sheetPts[i], sheetPts[i + 1]));
    return out;
  }

  private readShape(node: XmlNode, tag: string, view: ViewContext, style: ShapeStyle, label: string): PartShape[] {
    const a = attrsOf(node);
    const order = view.order++;
    const base = { style, order };
    const nonNegative = (name: string, n: number): number => {
      if (!(n >= 0) || !Number.isFinite(n)) this.fail(label, 'bad_attribute', `${name} must be zero or more, found ${n}`);
      return n;
    };
    switch (tag) {
      case 'rect': {
        const x = this.number(a, 'x', label, 0), y = this.number(a, 'y', label, 0);
        const w = nonNegative('width', this.number(a, 'width', label));
        const h = nonNegative('height', this.number(a, 'height', label));
        const [u1, v1] = this.toView(view, x, y);
        const [u2, v2] = this.toView(view, x + w, y + h);
        return [{ kind: 'rect', x: Math.min(u1, u2), y: Math.min(v1, v2), w: Math.abs(u2 - u1), h: Math.abs(v2 - v1), ...base }];
      }
      case 'circle': {
        const [cx, cy] = this.toView(view, this.number(a, 'cx', label, 0), this.number(a, 'cy', label, 0));
        const r = nonNegative('r', this.number(a, 'r', label));
        return [{ kind: 'circle', cx, cy, r, ...base }];
      }
      case 'ellipse': {
        const [cx, cy] = this.toView(view, this.number(a, 'cx', label, 0), this.number(a, 'cy', label, 0));
        const rx = nonNegative('rx', this.number(a, 'rx', label));
        const ry = nonNegative('ry', this.number(a, 'ry', label));
        const [ru, rv] = this.swapped(view) ? [ry, rx] : [rx, ry];
        return [{ kind: 'ellipse', cx, cy, ru, rv, ...base }];
      }
      case 'line': {
        const [x1, y1] = this.toView(view, this.number(a, 'x1', label, 0), this.number(a, 'y1', label, 0));
        const [x2, y2] = this.toView(view, this.number(a, 'x2', label, 0), this.number(a, 'y2', label, 0));
        return [{ kind: 'line', x1, y1, x2, y2, ...base }];
      }
      case 'polyline':
      case 'polygon': {
        if (a.points === undefined) this.fail(label, 'bad_attribute', 'missing points');
        const pts = this.numberList(a.points, 'points', label);
        if (pts.length < 4 || pts.length % 2 !== 0) this.fail(label, 'bad_attribute', `points must be two or more x,y pairs, found ${pts.length} numbers`);
        return [{ kind: 'poly', points: this.mapPoints(view, pts), closed: tag === 'polygon', ...base }];
      }
      default: {
        if (a.d === undefined) this.fail(label, 'bad_attribute', 'missing d');
        let subpaths;
        try {
          subpaths = parsePathData(a.d);
        } catch (e) {
          if (e instanceof PathDataError) this.fail(label, 'unsupported_shape', e.message);
          throw e;
        }
        return subpaths.map((s) => ({ kind: 'poly' as const, points: this.mapPoints(view, s.points), closed: s.closed, ...base }));
      }
    }
  }

  private readText(node: XmlNode, view: ViewContext, style: ShapeStyle, label: string): Shape | undefined {
    const a = attrsOf(node);
    let text = '';
    for (const c of childrenOf(node)) {
      if (isElement(c)) this.fail(label, 'unsupported_shape', `<text> may hold plain text only, found <${tagOf(c)}>`);
      const t = c['#text'];
      if (t !== undefined) text += String(t);
    }
    text = text.replace(/\s+/g, ' ').trim();
    const order = view.order++;
    if (text === '') return undefined;
    const [x, y] = this.toView(view, this.number(a, 'x', label, 0), this.number(a, 'y', label, 0));
    const size = this.number(a, 'font-size', label, 10);
    if (!(size > 0)) this.fail(label, 'bad_attribute', `font-size must be positive, found ${size}`);
    const anchorRaw = a['text-anchor'] ?? 'start';
    if (anchorRaw !== 'start' && anchorRaw !== 'middle' && anchorRaw !== 'end') {
      this.fail(label, 'bad_attribute', `text-anchor="${anchorRaw}" must be start, middle or end`);
    }
    return { kind: 'text', x, y, text, size, anchor: anchorRaw, style, order };
  }

  private assembleInstances(views: DrawingView[], lengthIn: number, widthIn: number): DrawingInstance[] {
    interface Seen {
      kind: PartKind;
      firstLabel: string;
      views: Map<ViewKey, ViewPart>;
    }
    const seen = new Map<string, Seen>();
    for (const view of views) {
      for (const part of view.parts) {
        const s = seen.get(part.instanceId);
        if (!s) {
          seen.set(part.instanceId, { kind: part.kind, firstLabel: part.id, views: new Map([[view.key, part]]) });
          continue;
        }
        if (s.kind !== part.kind) {
          this.fail(`"${part.id}"`, 'inconsistent_instance', `instance ${part.instanceId} has kind ${part.kind} here but ${s.kind} in "${s.firstLabel}"`);
        }
        s.views.set(view.key, part);
      }
    }
    // Document order of first appearance (views are read in file order, parts within each).
    const firstOrder = new Map<string, number>();
    let n = 0;
    for (const view of views) for (const p of view.parts) if (!firstOrder.has(p.instanceId)) firstOrder.set(p.instanceId, n++);

    const out: DrawingInstance[] = [];
    for (const [instanceId, s] of seen) {
      const values: Record<'x' | 'y' | 'z', { view: ViewKey; id: string; value: number }[]> = { x: [], y: [], z: [] };
      for (const [vk, part] of s.views) {
        const [ua, va] = VIEW_AXES[vk];
        values[ua].push({ view: vk, id: part.id, value: part.centre.u });
        values[va].push({ view: vk, id: part.id, value: part.centre.v });
      }
      for (const axis of ['x', 'y', 'z'] as const) {
        const list = values[axis];
        for (const other of list.slice(1)) {
          if (Math.abs(other.value - list[0].value) > INSTANCE_TOLERANCE_IN) {
            const f = (v: number): string => String(Math.round(v * 100) / 100);
            this.fail(
              `"${other.id}"`,
              'inconsistent_instance',
              `instance ${instanceId} is at ${axis} = ${f(other.value)} in ${other.view} but ${axis} = ${f(list[0].value)} in ${list[0].view} ("${list[0].id}")`,
            );
          }
        }
      }
      const pick = (axis: 'x' | 'y' | 'z', order: ViewKey[]): number | undefined => {
        for (const vk of order) {
          const hit = values[axis].find((e) => e.view === vk);
          if (hit) return hit.value;
        }
        return undefined;
      };
      const has = (vk: ViewKey): boolean => s.views.has(vk);
      const x =
        pick('x', ['plan', 'side_plus_y', 'side_minus_y']) ??
        (has('end_short_hood') && has('end_long_hood') ? lengthIn / 2 : has('end_long_hood') ? lengthIn : 0);
      const y =
        pick('y', ['plan', 'end_short_hood', 'end_long_hood']) ??
        (has('side_plus_y') && has('side_minus_y') ? 0 : has('side_plus_y') ? widthIn / 2 : -widthIn / 2);
      const z = pick('z', ['side_plus_y', 'side_minus_y', 'end_short_hood', 'end_long_hood']) ?? 0;
      out.push({
        instanceId,
        kind: s.kind,
        centre: bodyPoint(x, y, z),
        views: VIEW_KEYS.filter((vk) => s.views.has(vk)),
        partIds: VIEW_KEYS.filter((vk) => s.views.has(vk)).map((vk) => s.views.get(vk)!.id),
      });
    }
    out.sort((p, q) => firstOrder.get(p.instanceId)! - firstOrder.get(q.instanceId)!);
    return out;
  }
}
