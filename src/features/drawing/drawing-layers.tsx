/**
 * The canvas's three Konva layers, split by how often they change (Konva's performance guide):
 * the drawing (cached bitmap: panning only re-composites it), the pins (one Shape, one path per
 * batch), and the overlay (selection, label box, numbers, orientation words, the F). None listens
 * to events: taps are resolved geometrically by the canvas (shared/drawings/geometry partAtPoint).
 * Each takes precomputed geometry; the math is in shared/drawings/screen*.ts.
 */
import Konva from 'konva';
import type { Context } from 'konva/lib/Context';
import type { Group as KonvaGroup } from 'konva/lib/Group';
import type { Shape as KonvaShape } from 'konva/lib/Shape';
import { memo, useCallback, useLayoutEffect, useRef, type ReactNode, type RefObject } from 'react';
import { Group, Layer, Rect, Shape, Text } from 'react-konva';
import type { Camera, OrientationMarker, Viewport, ViewOrientation } from '../../../shared/drawings/screen';
import type { PlacedNumeral } from '../../../shared/drawings/screen-labels';
import type { Box, PartShape, Shape as DrawingShape } from '../../../shared/drawings/types';
import { FONT_STACK, paintDrawing, paintNumerals, paintPins, tracePartShape, type PinBatches } from './paint';
import { withAlpha, type Palette } from './palette';
import type { DrawingHeat } from './types';

/** The flip of the F: markers glide and a turned view turns over in this time (respecting reduced motion). */
const FLIP_SECONDS = 0.3;

/** Larger caches cost too much memory on a tablet; past these the drawing is painted live (still fast, and sharp). */
const MAX_CACHE_SIDE_PX = 8192;
const MAX_CACHE_AREA_PX = 8_000_000;

export interface PaperLayerProps {
  shapes: readonly DrawingShape[];
  extent: Box;
  palette: Palette;
  orient: ViewOrientation;
  camera: Camera;
  /** The scale the linework is drawn (and cached) for: the camera's, once a zoom has settled. */
  lineScale: number;
  heat?: DrawingHeat;
  reduceMotion: boolean;
}

export const PaperLayer = memo(function PaperLayer({ shapes, extent, palette, orient, camera, lineScale, heat, reduceMotion }: PaperLayerProps) {
  const shape = useRef<KonvaShape>(null);
  const group = useRef<KonvaGroup>(null);
  const place = { x: camera.ox, y: camera.oy, scaleX: orient.su * camera.scale, scaleY: orient.sv * camera.scale };
  useTurnOver(group, orient, place, reduceMotion, (extent.umin + extent.umax) / 2);
  const sceneFunc = useCallback(
    (ctx: Context) => paintDrawing(ctx._context, shapes, palette, lineScale, orient, heat),
    [shapes, palette, lineScale, orient, heat],
  );
  useLayoutEffect(() => {
    const node = shape.current;
    if (!node) return;
    const pr = lineScale * (Konva.pixelRatio || 1);
    const w = extent.umax - extent.umin, h = extent.vmax - extent.vmin;
    if (w * pr > MAX_CACHE_SIDE_PX || h * pr > MAX_CACHE_SIDE_PX || w * h * pr * pr > MAX_CACHE_AREA_PX) node.clearCache();
    else node.cache({ x: extent.umin, y: extent.vmin, width: w, height: h, pixelRatio: pr });
    node.getLayer()?.batchDraw();
  }, [sceneFunc, extent, lineScale]);
  return (
    <Layer listening={false} name="drawing-layer">
      <Group ref={group} name="camera" x={camera.ox} y={camera.oy} scaleX={orient.su * camera.scale} scaleY={orient.sv * camera.scale}>
        <Shape ref={shape} name="drawing" sceneFunc={sceneFunc} listening={false} perfectDrawEnabled={false} />
      </Group>
    </Layer>
  );
});

export interface PinsLayerProps {
  pins: PinBatches;
  palette: Palette;
  orient: ViewOrientation;
  camera: Camera;
  viewport: Viewport;
  /** The scale the pins are laid out (and cached) for; while a zoom is under way the cached picture is stretched. */
  lineScale: number;
  reduceMotion: boolean;
}

/** Pins stand out this far (CSS px) from their point, halo included. */
const PIN_REACH_PX = 12;

export const PinsLayer = memo(function PinsLayer({ pins, palette, orient, camera, viewport, lineScale, reduceMotion }: PinsLayerProps) {
  const shape = useRef<KonvaShape>(null);
  const group = useRef<KonvaGroup>(null);
  const k = camera.scale / lineScale;
  useTurnOver(group, orient, { x: camera.ox, y: camera.oy, scaleX: k, scaleY: k }, reduceMotion);
  const cached = useRef(false);
  const cam = useRef(camera);
  cam.current = camera;
  const sceneFunc = useCallback(
    (ctx: Context) => {
      const c = cam.current;
      const k = c.scale / lineScale;
      // Cached: paint every pin once. Live (too large to cache): only those in sight.
      const visible = cached.current
        ? { x0: -Infinity, y0: -Infinity, x1: Infinity, y1: Infinity }
        : { x0: -c.ox / k, y0: -c.oy / k, x1: (viewport.width - c.ox) / k, y1: (viewport.height - c.oy) / k };
      paintPins(ctx._context, pins, palette, lineScale, orient, visible);
    },
    [pins, palette, lineScale, orient, viewport],
  );
  useLayoutEffect(() => {
    const node = shape.current;
    if (!node) return;
    const b = pins.box;
    const pr = Konva.pixelRatio || 1;
    const x0 = b ? Math.min(orient.su * lineScale * b.umin, orient.su * lineScale * b.umax) - PIN_REACH_PX : 0;
    const x1 = b ? Math.max(orient.su * lineScale * b.umin, orient.su * lineScale * b.umax) + PIN_REACH_PX : 0;
    const y0 = b ? Math.min(orient.sv * lineScale * b.vmin, orient.sv * lineScale * b.vmax) - PIN_REACH_PX : 0;
    const y1 = b ? Math.max(orient.sv * lineScale * b.vmin, orient.sv * lineScale * b.vmax) + PIN_REACH_PX : 0;
    const w = x1 - x0, h = y1 - y0;
    // Few pins draw faster than a cache composites; many pins are drawn once into a bitmap so a pan only moves it.
    const worth = pins.count >= 200 && w * pr <= MAX_CACHE_SIDE_PX && h * pr <= MAX_CACHE_SIDE_PX && w * h * pr * pr <= MAX_CACHE_AREA_PX;
    cached.current = worth;
    if (worth) node.cache({ x: x0, y: y0, width: w, height: h, pixelRatio: pr });
    else node.clearCache();
    node.getLayer()?.batchDraw();
  }, [sceneFunc, pins, orient, lineScale]);
  return (
    <Layer listening={false} name="pins-layer" visible={pins.count > 0}>
      <Group ref={group} x={camera.ox} y={camera.oy} scaleX={k} scaleY={k}>
        <Shape ref={shape} name="pins" sceneFunc={sceneFunc} listening={false} perfectDrawEnabled={false} />
      </Group>
    </Layer>
  );
});

/**
 * A node that glides from where it was on screen to where it is when `flipKey` changes (the F
 * moved). Positions are relative to the camera origin (`ox`, `oy`), which may itself jump when the
 * view turns round, so the glide starts from the old place on screen, not the old relative numbers.
 */
function Glide(props: { x: number; y: number; ox: number; oy: number; flipKey: string; still: boolean; children: ReactNode; name?: string }) {
  const { x, y, ox, oy, flipKey, still, children, name } = props;
  const node = useRef<KonvaGroup>(null);
  const last = useRef<{ sx: number; sy: number; flipKey: string } | null>(null);
  useLayoutEffect(() => {
    const g = node.current;
    const prev = last.current;
    last.current = { sx: x + ox, sy: y + oy, flipKey };
    if (!g) return;
    g.position({ x, y });
    g.opacity(1);
    if (!prev || prev.flipKey === flipKey || still) return;
    g.position({ x: prev.sx - ox, y: prev.sy - oy });
    g.opacity(0.25);
    const tween = new Konva.Tween({ node: g, duration: FLIP_SECONDS, x, y, opacity: 1, easing: Konva.Easings.EaseInOut });
    tween.play();
    return () => {
      tween.destroy();
      g.position({ x, y });
      g.opacity(1);
    };
  }, [x, y, ox, oy, flipKey, still]);
  return (
    <Group ref={node} x={x} y={y} name={name}>
      {children}
    </Group>
  );
}

interface GroupPlace {
  readonly x: number;
  readonly y: number;
  readonly scaleX: number;
  readonly scaleY: number;
}

/**
 * When the view turns round (front first, and the F moved to the other end) the drawing turns over
 * like a card about its middle instead of jumping (give `turnAboutU`, the middle's u), and the
 * layers drawn over it fade back in (leave it out). `place` is where React puts the group now.
 */
function useTurnOver(node: RefObject<KonvaGroup | null>, orient: ViewOrientation, place: GroupPlace, still: boolean, turnAboutU?: number): void {
  const latest = useRef(place);
  latest.current = place;
  const before = useRef<{ orient: ViewOrientation; place: GroupPlace } | null>(null);
  useLayoutEffect(() => {
    const g = node.current;
    const prev = before.current;
    if (!g || !prev || (prev.orient.su === orient.su && prev.orient.sv === orient.sv) || still) return;
    let tween: Konva.Tween;
    const settle = (): void => {
      g.setAttrs({ ...(turnAboutU === undefined ? {} : latest.current), opacity: 1 });
    };
    if (turnAboutU === undefined) {
      g.opacity(0);
      tween = new Konva.Tween({ node: g, duration: FLIP_SECONDS, opacity: 1 });
    } else {
      // Squeeze the old picture to its middle, swap the vertical sense while it has no width, open the new one.
      const from = prev.place;
      g.setAttrs(from);
      tween = new Konva.Tween({
        node: g,
        duration: FLIP_SECONDS / 2,
        x: from.x + from.scaleX * turnAboutU,
        scaleX: 0,
        easing: Konva.Easings.EaseIn,
        onFinish: () => {
          const to = latest.current;
          g.setAttrs({ y: to.y, scaleY: to.scaleY });
          tween = new Konva.Tween({ node: g, duration: FLIP_SECONDS / 2, x: to.x, scaleX: to.scaleX, easing: Konva.Easings.EaseOut, onFinish: settle });
          tween.play();
        },
      });
    }
    tween.play();
    return () => {
      tween.destroy();
      settle();
    };
  }, [node, orient, still, turnAboutU]);
  // Runs after the effect above on every commit: the place and orientation the next turn starts from.
  useLayoutEffect(() => {
    before.current = { orient, place: latest.current };
  });
}

/** A placed orientation word with its box size, relative to the camera origin. */
export interface MarkerBox {
  readonly marker: OrientationMarker;
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

export const MARKER_FONT_PX = 14;
const MARKER_PAD_X = 6;

/** Box a marker word takes, anchored as the marker says. */
export function markerBox(m: OrientationMarker): MarkerBox {
  const w = Math.ceil(m.text.length * MARKER_FONT_PX * 0.62 + m.text.length * 1.2 + 2 * MARKER_PAD_X);
  const h = MARKER_FONT_PX + 8;
  const x = m.at.sx - (m.align === 'right' ? w : m.align === 'center' ? w / 2 : 0);
  const y = m.at.sy - (m.valign === 'bottom' ? h : m.valign === 'middle' ? h / 2 : 0);
  return { marker: m, x, y, w, h };
}

/** An F as shown: its glyph outline in screen px about its centre, already the right way up. */
export interface FMarkView {
  readonly key: string;
  readonly x: number;
  readonly y: number;
  /** Flat dx, dy pairs per subpath. */
  readonly outline: readonly number[];
  readonly closed: boolean;
}

export interface SelectionView {
  readonly shape: PartShape;
  /** The touch target when it is larger than the part on screen (view inches), drawn as a faint box. */
  readonly target?: Box;
  readonly label: { readonly x: number; readonly y: number; readonly w: number; readonly h: number; readonly text: string };
}

export interface OverlayLayerProps {
  palette: Palette;
  orient: ViewOrientation;
  camera: Camera;
  numerals: readonly PlacedNumeral[];
  markers: readonly MarkerBox[];
  fMarks: readonly FMarkView[];
  selection?: SelectionView;
  /** The part under the keyboard focus (view box), drawn as a dashed outline. */
  focus?: Box;
  flipKey: string;
  reduceMotion: boolean;
}

export const NUMERAL_FONT_PX = 11;
export const LABEL_FONT_PX = 16;

export const OverlayLayer = memo(function OverlayLayer(props: OverlayLayerProps) {
  const { palette: p, orient, camera, numerals, markers, fMarks, selection, focus, flipKey, reduceMotion } = props;
  const { scale } = camera;
  const group = useRef<KonvaGroup>(null);
  useTurnOver(group, orient, { x: camera.ox, y: camera.oy, scaleX: 1, scaleY: 1 }, reduceMotion);
  const numeralFunc = useCallback((ctx: Context) => paintNumerals(ctx._context, numerals, p, NUMERAL_FONT_PX), [numerals, p]);
  const numeralShape = useRef<KonvaShape>(null);
  useLayoutEffect(() => {
    // A hundred small texts cost more to paint than one bitmap costs to composite on every pan.
    const node = numeralShape.current;
    if (!node) return;
    let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
    for (const n of numerals) {
      x0 = Math.min(x0, n.x - n.w / 2 - 3);
      x1 = Math.max(x1, n.x + n.w / 2 + 3);
      y0 = Math.min(y0, n.y - n.h / 2 - 3);
      y1 = Math.max(y1, n.y + n.h / 2 + 3);
    }
    const pr = Konva.pixelRatio || 1;
    const w = x1 - x0, h = y1 - y0;
    if (numerals.length > 0 && w * pr <= MAX_CACHE_SIDE_PX && h * pr <= MAX_CACHE_SIDE_PX && w * h * pr * pr <= MAX_CACHE_AREA_PX) {
      node.cache({ x: x0, y: y0, width: w, height: h, pixelRatio: pr });
    } else node.clearCache();
    node.getLayer()?.batchDraw();
  }, [numeralFunc, numerals]);
  const fFunc = useCallback(
    (ctx: Context, shape: KonvaShape) => {
      const m = shape.getAttr('mark') as FMarkView;
      const c = ctx._context;
      c.beginPath();
      const o = m.outline;
      c.moveTo(o[0], o[1]);
      for (let i = 2; i + 1 < o.length; i += 2) c.lineTo(o[i], o[i + 1]);
      if (m.closed) {
        c.closePath();
        c.fillStyle = p.graphite;
        c.fill();
      } else {
        c.strokeStyle = p.graphite;
        c.lineWidth = 2;
        c.stroke();
      }
    },
    [p],
  );
  const selectionFunc = useCallback(
    (ctx: Context) => {
      if (!selection) return;
      const c = ctx._context;
      c.save();
      c.scale(orient.su * scale, orient.sv * scale);
      c.beginPath();
      tracePartShape(c, selection.shape);
      c.restore();
      const s = selection.shape;
      if (s.kind !== 'line' && (s.kind !== 'poly' || s.closed)) {
        c.fillStyle = withAlpha(p.accent, 0.22);
        c.fill();
      }
      c.strokeStyle = p.accent;
      c.lineWidth = 3;
      c.lineJoin = 'round';
      c.stroke();
      if (selection.target) {
        const t = selection.target;
        const x0 = orient.su * scale * t.umin, x1 = orient.su * scale * t.umax;
        const y0 = orient.sv * scale * t.vmin, y1 = orient.sv * scale * t.vmax;
        c.beginPath();
        c.rect(Math.min(x0, x1), Math.min(y0, y1), Math.abs(x1 - x0), Math.abs(y1 - y0));
        c.strokeStyle = withAlpha(p.accent, 0.55);
        c.lineWidth = 1.5;
        c.stroke();
      }
    },
    [selection, orient, scale, p],
  );
  const focusFunc = useCallback(
    (ctx: Context) => {
      if (!focus) return;
      const c = ctx._context;
      const x0 = orient.su * scale * focus.umin, x1 = orient.su * scale * focus.umax;
      const y0 = orient.sv * scale * focus.vmin, y1 = orient.sv * scale * focus.vmax;
      const pad = 5;
      c.beginPath();
      c.rect(Math.min(x0, x1) - pad, Math.min(y0, y1) - pad, Math.abs(x1 - x0) + 2 * pad, Math.abs(y1 - y0) + 2 * pad);
      c.setLineDash([5, 3]);
      c.strokeStyle = p.accent;
      c.lineWidth = 2;
      c.stroke();
      c.setLineDash([]);
    },
    [focus, orient, scale, p],
  );

  return (
    <Layer listening={false} name="overlay-layer">
      <Group ref={group} x={camera.ox} y={camera.oy}>
        <Shape ref={numeralShape} name="numerals" numerals={numerals} sceneFunc={numeralFunc} listening={false} perfectDrawEnabled={false} />
        {fMarks.map((m) => (
          <Glide key={m.key} x={m.x} y={m.y} ox={camera.ox} oy={camera.oy} flipKey={flipKey} still={reduceMotion} name="f-marking">
            <Shape sceneFunc={fFunc} mark={m} listening={false} perfectDrawEnabled={false} />
          </Glide>
        ))}
        {markers.map((b) => {
          const front = b.marker.role === 'front';
          const plain = b.marker.role === 'left' || b.marker.role === 'right' || b.marker.role === 'caption';
          return (
            <Glide key={b.marker.role} x={b.x} y={b.y} ox={camera.ox} oy={camera.oy} flipKey={flipKey} still={reduceMotion} name={`marker-${b.marker.role}`}>
              {!plain && (
                <Rect
                  width={b.w}
                  height={b.h}
                  cornerRadius={3}
                  fill={front ? p.graphite : undefined}
                  stroke={front ? undefined : p.rule}
                  strokeWidth={front ? 0 : 1.5}
                  listening={false}
                  perfectDrawEnabled={false}
                />
              )}
              <Text
                text={b.marker.text}
                width={b.w}
                height={b.h}
                align="center"
                verticalAlign="middle"
                wrap="none"
                fontFamily={FONT_STACK}
                fontStyle="bold"
                fontSize={MARKER_FONT_PX}
                letterSpacing={1.2}
                fill={front ? p.paper : plain ? p.graphite2 : p.graphite}
                listening={false}
                perfectDrawEnabled={false}
              />
            </Glide>
          );
        })}
        {selection && <Shape name="selection" sceneFunc={selectionFunc} listening={false} perfectDrawEnabled={false} />}
        {focus && <Shape name="focus" sceneFunc={focusFunc} listening={false} perfectDrawEnabled={false} />}
        {selection && (
          <Group name="label-box" x={selection.label.x} y={selection.label.y}>
            <Rect width={selection.label.w} height={selection.label.h} cornerRadius={4} fill={p.paper} stroke={p.accent} strokeWidth={2} listening={false} perfectDrawEnabled={false} />
            <Text
              text={selection.label.text}
              width={selection.label.w}
              height={selection.label.h}
              align="center"
              verticalAlign="middle"
              wrap="none"
              fontFamily={FONT_STACK}
              fontStyle="bold"
              fontSize={LABEL_FONT_PX}
              fill={p.graphite}
              listening={false}
              perfectDrawEnabled={false}
            />
          </Group>
        )}
      </Group>
    </Layer>
  );
});
