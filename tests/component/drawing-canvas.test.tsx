// The drawing canvas in jsdom with a real 2-D canvas behind it (@napi-rs/canvas), so taps, labels,
// keyboard order and painted pixels are the real ones. Expected labels follow the orientation rule
// of product brief §3: count from the F end; facing the front from the cab, left is left.
import '../napi-canvas-jsdom';
import { act, fireEvent, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import Konva from 'konva';
import { createRef } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { sampleSixAxleDrawing, SAMPLE_LENGTH } from '../../bench/canvas-sample-drawing';
import type { FrontEnd, ViewKey } from '../../shared/domain/frames';
import { fitCamera, viewExtent, viewOrientation, viewToScreen, type DrawingMode } from '../../shared/drawings/screen';
import type { ViewCoord } from '../../shared/drawings/types';
import { instancesFromFront, unitLayout, type LayoutPart } from '../../shared/layout/unit-layout';
import { DrawingCanvas } from '../../src/features/drawing/drawing-canvas';
import type { DrawingCanvasHandle, DrawingPin } from '../../src/features/drawing/types';

const drawing = sampleSixAxleDrawing();
const W = 800, H = 400;
const layouts = { short_hood: unitLayout(drawing, 'short_hood'), long_hood: unitLayout(drawing, 'long_hood') };
// A real software canvas on a busy 2-core machine: allow more than the default 5 s.
vi.setConfig({ testTimeout: 20_000 });

/** Where a view point is drawn at the fitted camera, computed from the pure transforms (not from the component). */
function screenOf(p: ViewCoord, fe: FrontEnd, mode: DrawingMode = 'as_built', view: ViewKey = 'plan') {
  const v = drawing.views.find((x) => x.key === view)!;
  const o = viewOrientation(v, mode, fe);
  return viewToScreen(p, o, fitCamera(viewExtent(v), o, { width: W, height: H }));
}

function setup(opts: { frontEnd?: FrontEnd; mode?: DrawingMode; pins?: DrawingPin[]; view?: ViewKey } = {}) {
  const onSelectPart = vi.fn<(part: LayoutPart, at: ViewCoord) => void>();
  const onTapEmpty = vi.fn();
  const ref = createRef<DrawingCanvasHandle>();
  const props = (fe: FrontEnd, mode: DrawingMode = opts.mode ?? 'as_built') => ({
    drawing,
    layout: layouts[fe],
    view: opts.view ?? ('plan' as ViewKey),
    mode,
    pins: opts.pins,
    onSelectPart,
    onTapEmpty,
    width: W,
    height: H,
    ref,
  });
  const r = render(<DrawingCanvas {...props(opts.frontEnd ?? 'short_hood')} />);
  const surface = screen.getByRole('application');
  return { ...r, surface, onSelectPart, onTapEmpty, ref, rerenderWith: (fe: FrontEnd, mode?: DrawingMode) => r.rerender(<DrawingCanvas {...props(fe, mode)} />) };
}

function tap(el: Element, p: { sx: number; sy: number }) {
  // jsdom lays nothing out, so the container's rect is at 0,0 and client = canvas coordinates.
  fireEvent.pointerDown(el, { clientX: p.sx, clientY: p.sy, pointerId: 1, pointerType: 'mouse', button: 0, buttons: 1 });
  fireEvent.pointerUp(el, { clientX: p.sx, clientY: p.sy, pointerId: 1, pointerType: 'mouse', button: 0 });
}

const stage = () => Konva.stages.at(-1)!;
function pixel(layerName: string, p: { sx: number; sy: number }): number[] {
  stage().draw();
  const layer = stage().findOne(`.${layerName}`) as Konva.Layer;
  const ratio = layer.getCanvas().getPixelRatio();
  return Array.from(layer.getContext()._context.getImageData(Math.round(p.sx * ratio), Math.round(p.sy * ratio), 1, 1).data);
}

/** The overlay group's offset (the camera origin): overlay nodes are placed relative to it. */
const overlayOrigin = (): number => (stage().findOne('.overlay-layer') as Konva.Layer).getChildren()[0].x();

/** Traction motor 1 sits from x = 80 to 104 in (axle 1 at 74). Tap near its far end, clear of the axle's enlarged target. */
const MOTOR_1_TAP: ViewCoord = { u: 101, v: 0 };

describe('DrawingCanvas: tapping parts', () => {
  it('a click on a traction motor selects it and the live region reads its label', () => {
    const { surface, onSelectPart } = setup();
    tap(surface, screenOf(MOTOR_1_TAP, 'short_hood'));
    expect(onSelectPart).toHaveBeenCalledTimes(1);
    const [part, at] = onSelectPart.mock.calls[0];
    expect(part.partId).toBe('pl-tm-1');
    expect(part.label).toBe('#1 traction motor');
    expect(at.u).toBeCloseTo(MOTOR_1_TAP.u, 6);
    expect(screen.getByRole('status')).toHaveTextContent('Selected: #1 traction motor');
  });

  it('highlights the selected part in the accent colour on the canvas', () => {
    const { surface } = setup();
    const p = screenOf(MOTOR_1_TAP, 'short_hood');
    expect(pixel('overlay-layer', p)[3]).toBe(0);
    tap(surface, p);
    const [r, g, b, a] = pixel('overlay-layer', p);
    // Violet (#6b2fb3) wash: blue channel over red over green, and painted.
    expect(a).toBeGreaterThan(0);
    expect(b).toBeGreaterThan(r);
    expect(r).toBeGreaterThan(g);
    expect(stage().findOne('.label-box')).toBeTruthy();
  });

  it('flipping the front end relabels the same motor at once: #1 becomes #6', () => {
    const { surface, rerenderWith } = setup();
    tap(surface, screenOf(MOTOR_1_TAP, 'short_hood'));
    expect(screen.getByRole('status')).toHaveTextContent('Selected: #1 traction motor');
    rerenderWith('long_hood');
    expect(screen.getByRole('status')).toHaveTextContent('Selected: #6 traction motor');
    rerenderWith('short_hood');
    expect(screen.getByRole('status')).toHaveTextContent('Selected: #1 traction motor');
  });

  it('front first with the F on the long hood draws the unit end for end: motor 1 is at the right and is #6', () => {
    const { surface, onSelectPart } = setup({ frontEnd: 'long_hood', mode: 'front_first' });
    const p = screenOf(MOTOR_1_TAP, 'long_hood', 'front_first');
    expect(p.sx).toBeGreaterThan(W / 2);
    tap(surface, p);
    expect(onSelectPart.mock.calls[0][0].partId).toBe('pl-tm-1');
    expect(screen.getByRole('status')).toHaveTextContent('Selected: #6 traction motor');
  });

  it('a wheel is named by side and number: the +y wheel of axle 1 is the right side #1 wheel, or the left side #6 with the F on the long hood', () => {
    const { surface, rerenderWith } = setup();
    tap(surface, screenOf({ u: 74, v: 30 }, 'short_hood'));
    expect(screen.getByRole('status')).toHaveTextContent('Selected: Right side, #1 wheel');
    rerenderWith('long_hood');
    expect(screen.getByRole('status')).toHaveTextContent('Selected: Left side, #6 wheel');
  });

  it('shows the F at the long hood end when the unit carries it there, and a tap there selects it', () => {
    const { surface, onSelectPart } = setup({ frontEnd: 'long_hood' });
    const fx = SAMPLE_LENGTH - 52, fy = -53.5;
    const f = stage().findOne('.f-marking')!;
    const at = screenOf({ u: fx, v: fy }, 'long_hood');
    expect(f.x() + overlayOrigin()).toBeCloseTo(at.sx, 6);
    tap(surface, at);
    expect(onSelectPart.mock.calls[0][0].kind).toBe('front_marking');
    // Facing the long hood from the cab, −y is on the right.
    expect(screen.getByRole('status')).toHaveTextContent('Selected: Right side F marking');
  });

  it('a tap on empty paper reports the view point and selects nothing', () => {
    const { surface, onSelectPart, onTapEmpty } = setup();
    tap(surface, { sx: 5, sy: 5 });
    expect(onSelectPart).not.toHaveBeenCalled();
    expect(onTapEmpty).toHaveBeenCalledTimes(1);
  });

  it('a drag pans instead of selecting', () => {
    const { surface, onSelectPart, ref } = setup();
    const before = ref.current!.camera();
    const p = screenOf(MOTOR_1_TAP, 'short_hood');
    fireEvent.pointerDown(surface, { clientX: p.sx, clientY: p.sy, pointerId: 1, pointerType: 'touch', buttons: 1 });
    fireEvent.pointerMove(surface, { clientX: p.sx + 60, clientY: p.sy + 5, pointerId: 1, pointerType: 'touch', buttons: 1 });
    fireEvent.pointerUp(surface, { clientX: p.sx + 60, clientY: p.sy + 5, pointerId: 1, pointerType: 'touch' });
    expect(onSelectPart).not.toHaveBeenCalled();
    expect(ref.current!.camera().ox - before.ox).toBeCloseTo(60, 6);
    expect(ref.current!.camera().scale).toBe(before.scale);
  });

  it('two fingers spreading zoom in', () => {
    const { surface, ref } = setup();
    const s0 = ref.current!.camera().scale;
    const t = { pointerType: 'touch', buttons: 1 };
    fireEvent.pointerDown(surface, { clientX: 300, clientY: 200, pointerId: 1, ...t });
    fireEvent.pointerDown(surface, { clientX: 500, clientY: 200, pointerId: 2, ...t });
    fireEvent.pointerMove(surface, { clientX: 200, clientY: 200, pointerId: 1, ...t });
    fireEvent.pointerMove(surface, { clientX: 600, clientY: 200, pointerId: 2, ...t });
    fireEvent.pointerUp(surface, { clientX: 200, clientY: 200, pointerId: 1, pointerType: 'touch' });
    fireEvent.pointerUp(surface, { clientX: 600, clientY: 200, pointerId: 2, pointerType: 'touch' });
    expect(ref.current!.camera().scale / s0).toBeCloseTo(2, 6);
  });

  it('the wheel zooms about the pointer', () => {
    const { surface, ref } = setup();
    const p = screenOf(MOTOR_1_TAP, 'short_hood');
    fireEvent.wheel(surface, { clientX: p.sx, clientY: p.sy, deltaY: -240, deltaMode: 0 });
    expect(ref.current!.camera().scale).toBeGreaterThan(1.4 * fitCamera(viewExtent(drawing.views[0]), { su: 1, sv: -1 }, { width: W, height: H }).scale);
    const still = ref.current!.toScreen(MOTOR_1_TAP);
    expect(still.sx).toBeCloseTo(p.sx, 6);
    expect(still.sy).toBeCloseTo(p.sy, 6);
  });
});

describe('DrawingCanvas: keyboard', () => {
  async function tabSequence(fe: FrontEnd, n: number): Promise<string[]> {
    const { surface, onSelectPart } = setup({ frontEnd: fe });
    const user = userEvent.setup();
    surface.focus();
    const picked: string[] = [];
    for (let i = 0; i < n; i++) {
      await user.keyboard('{Tab}');
      expect(document.activeElement).toBe(surface);
      await user.keyboard('{Enter}');
      picked.push(onSelectPart.mock.lastCall![0].instanceId);
    }
    return picked;
  }

  for (const fe of ['short_hood', 'long_hood'] as FrontEnd[]) {
    it(`Tab goes from the front (F on the ${fe === 'short_hood' ? 'short' : 'long'} hood), in instancesFromFront order`, async () => {
      const picked = await tabSequence(fe, 8);
      const inPlan = new Set(drawing.views[0].parts.map((p) => p.instanceId));
      const expected = instancesFromFront(drawing, fe)
        .filter((d) => inPlan.has(d.instanceId) && d.kind !== 'front_marking')
        .map((d) => d.instanceId);
      const withoutF = picked.filter((id) => id !== 'front_marking');
      expect(withoutF).toEqual(expected.slice(0, withoutF.length));
      // The front coupler comes first; it is the short hood's coupler only when the F is there.
      expect(picked[0]).toBe(fe === 'short_hood' ? 'coupler_sh' : 'coupler_lh');
      expect(picked).toContain('front_marking');
    });
  }

  it('announces the focused part, Enter selects it, Shift+Tab goes back', async () => {
    const { surface } = setup();
    const user = userEvent.setup();
    surface.focus();
    await user.keyboard('{Tab}{Tab}');
    expect(screen.getByRole('status')).toHaveTextContent('Front pilot. Enter selects it.');
    await user.keyboard('{Shift>}{Tab}{/Shift}');
    expect(screen.getByRole('status')).toHaveTextContent('Front coupler. Enter selects it.');
    await user.keyboard('{Enter}');
    expect(screen.getByRole('status')).toHaveTextContent('Selected: Front coupler');
  });

  it('+ and − change the scale, 0 fits again, arrows pan', async () => {
    const { surface, ref } = setup();
    const user = userEvent.setup();
    surface.focus();
    const fit = ref.current!.camera();
    await user.keyboard('+');
    expect(ref.current!.camera().scale).toBeCloseTo(fit.scale * 1.25, 9);
    expect(surface).toHaveAttribute('data-scale', (fit.scale * 1.25).toFixed(4));
    await user.keyboard('+');
    expect(ref.current!.camera().scale).toBeCloseTo(fit.scale * 1.5625, 9);
    await user.keyboard('-');
    expect(ref.current!.camera().scale).toBeCloseTo(fit.scale * 1.25, 9);
    const cam = stage().findOne('.camera')!;
    expect(Math.abs(cam.scaleX())).toBeCloseTo(fit.scale * 1.25, 9);
    await user.keyboard('0');
    expect(ref.current!.camera()).toEqual(fit);
    await user.keyboard('{ArrowRight}');
    expect(ref.current!.camera().ox).toBeCloseTo(fit.ox - 48, 9);
  });

  it('the Fit button brings the whole drawing back', async () => {
    const { surface, ref } = setup();
    const user = userEvent.setup();
    const fit = ref.current!.camera();
    fireEvent.wheel(surface, { clientX: 100, clientY: 100, deltaY: -300 });
    expect(ref.current!.camera()).not.toEqual(fit);
    await user.click(screen.getByRole('button', { name: 'Fit' }));
    expect(ref.current!.camera()).toEqual(fit);
  });
});

describe('DrawingCanvas: orientation words and the flip', () => {
  it('FRONT moves to the long hood end when the F does, gliding there (~300 ms)', async () => {
    const { rerenderWith } = setup();
    const front = () => stage().findOne('.marker-front')!;
    const leftOfDrawing = front().x();
    expect(leftOfDrawing).toBeLessThan(0 + screenOf({ u: 0, v: 0 }, 'short_hood').sx);
    rerenderWith('long_hood');
    const target = screenOf({ u: SAMPLE_LENGTH, v: 0 }, 'long_hood').sx;
    // The tween starts from the old place …
    expect(front().x()).toBeLessThan(target);
    await act(() => new Promise((r) => setTimeout(r, 800)));
    // … and ends beyond the long hood end (in the overlay group's coordinates, offset by the camera).
    const groupX = overlayOrigin();
    expect(front().x() + groupX).toBeGreaterThan(target);
  });

  it('front first: when the F moves the drawing turns over about its middle (~300 ms) and FRONT stays at the left', async () => {
    const { rerenderWith, ref } = setup({ mode: 'front_first' });
    const cam = () => stage().findOne('.camera')!;
    const frontAbs = () => stage().findOne('.marker-front')!.x() + overlayOrigin();
    const frontBefore = frontAbs();
    expect(cam().scaleX()).toBeGreaterThan(0);
    rerenderWith('long_hood', 'front_first');
    // The turn starts from the old picture …
    expect(cam().scaleX()).toBeGreaterThan(0);
    await act(() => new Promise((r) => setTimeout(r, 800)));
    // … and ends mirrored end for end (and, in the plan, side for side) exactly where the camera says.
    const c = ref.current!.camera();
    expect(cam().scaleX()).toBeCloseTo(-c.scale, 9);
    expect(cam().scaleY()).toBeCloseTo(c.scale, 9);
    expect(cam().x()).toBeCloseTo(c.ox, 9);
    expect(frontAbs()).toBeCloseTo(frontBefore, 6);
  });

  it('labels the ends FRONT / REAR and the sides LEFT / RIGHT in the plan', () => {
    setup();
    for (const role of ['front', 'rear', 'left', 'right']) expect(stage().findOne(`.marker-${role}`)).toBeTruthy();
    const words = stage().find('Text').map((t) => (t as Konva.Text).text());
    expect(words).toEqual(expect.arrayContaining(['FRONT', 'REAR', 'LEFT', 'RIGHT']));
  });

  it('writes the number beside each axle, counted from the F, and renumbers on the flip', () => {
    const { rerenderWith } = setup();
    const numbers = () => {
      const placed = stage().findOne('.numerals')!.getAttr('numerals') as { key: string; text: string; x: number; y: number }[];
      return Object.fromEntries(placed.filter((n) => n.key.startsWith('pl-axle-')).map((n) => [n.key, n]));
    };
    const short = numbers();
    expect(Object.keys(short)).toHaveLength(6);
    for (let i = 1; i <= 6; i++) expect(short[`pl-axle-${i}`].text).toBe(String(i));
    // Painted where placed (relative to the camera origin).
    const n1 = short['pl-axle-1'];
    expect(pixel('overlay-layer', { sx: n1.x + overlayOrigin(), sy: n1.y + (stage().findOne('.overlay-layer') as Konva.Layer).getChildren()[0].y() })[3]).toBeGreaterThan(0);
    rerenderWith('long_hood');
    const long = numbers();
    for (let i = 1; i <= 6; i++) expect(long[`pl-axle-${i}`].text).toBe(String(7 - i));
  });
});

describe('DrawingCanvas: reduced motion, theme, heat, caching', () => {
  it('with prefers-reduced-motion the markers jump to their new places at once', () => {
    const mm = vi.fn((q: string) => ({ matches: q.includes('reduce'), media: q, addEventListener: vi.fn(), removeEventListener: vi.fn() }));
    vi.stubGlobal('matchMedia', mm);
    try {
      const { rerenderWith } = setup();
      rerenderWith('long_hood');
      const target = screenOf({ u: SAMPLE_LENGTH, v: 0 }, 'long_hood').sx;
      expect(stage().findOne('.marker-front')!.x() + overlayOrigin()).toBeGreaterThan(target);
      expect(stage().findOne('.marker-front')!.opacity()).toBe(1);
    } finally {
      vi.unstubAllGlobals();
    }
  });

  it('draws graphite on paper, and light lines in the dark theme', async () => {
    setup();
    // The top edge of the carbody outline (heavy line at y = +61.5 in).
    const edge = screenOf({ u: 400, v: 61.5 }, 'short_hood');
    const light = pixel('drawing-layer', edge);
    expect(light[3]).toBeGreaterThan(100);
    expect(light[0]).toBeLessThan(90);
    await act(async () => {
      document.documentElement.classList.add('dark');
      await new Promise((r) => setTimeout(r, 0));
    });
    try {
      const dark = pixel('drawing-layer', edge);
      expect(dark[3]).toBeGreaterThan(100);
      expect(dark[0]).toBeGreaterThan(180);
    } finally {
      document.documentElement.classList.remove('dark');
    }
  });

  it('tints heat cells from graphite to red under the linework', () => {
    const onSelectPart = vi.fn();
    const cell = { u: 400, v: -20, w: 40, h: 40 };
    const base = { drawing, layout: layouts.short_hood, view: 'plan' as ViewKey, mode: 'as_built' as DrawingMode, onSelectPart, width: W, height: H };
    const r = render(<DrawingCanvas {...base} />);
    const at = screenOf({ u: 420, v: 0 }, 'short_hood');
    const before = pixel('drawing-layer', at);
    r.rerender(<DrawingCanvas {...base} heat={{ cells: [{ ...cell, value: 10 }], max: 10 }} />);
    const hot = pixel('drawing-layer', at);
    expect(hot[3]).toBeGreaterThan(before[3] + 80);
    expect(hot[0]).toBeGreaterThan(hot[1] + 60); // red
    r.rerender(<DrawingCanvas {...base} heat={{ cells: [{ ...cell, value: 1 }], max: 10 }} />);
    const cool = pixel('drawing-layer', at);
    expect(cool[3]).toBeLessThan(hot[3]);
    expect(Math.abs(cool[0] - cool[1])).toBeLessThan(hot[0] - hot[1]); // greyer
  });

  it('keeps the drawing (and many pins) as cached bitmaps, and nothing listens for Konva events', () => {
    const pins = Array.from({ length: 500 }, (_, i) => ({ id: `p${i}`, u: i * 1.6, v: 0, weight: 'note' as const, state: 'open' as const }));
    setup({ pins });
    expect(stage().findOne('.drawing')!.isCached()).toBe(true);
    expect(stage().findOne('.pins')!.isCached()).toBe(true);
    for (const layer of stage().getLayers()) expect(layer.listening()).toBe(false);
  });
});

describe('DrawingCanvas: pins', () => {
  function manyPins(n: number): DrawingPin[] {
    const weights = ['federal', 'shop', 'note'] as const;
    const states = ['open', 'in_repair', 'repaired', 'verified'] as const;
    return Array.from({ length: n }, (_, i) => ({
      id: `p${i}`,
      u: 10 + ((i * 37) % 830),
      v: -55 + ((i * 53) % 110),
      weight: weights[i % 3],
      state: states[i % 4],
      pending: i % 17 === 0,
    }));
  }

  it('draws 5,000 pins in one shape without throwing, quickly', () => {
    const pins = manyPins(5000);
    const t0 = performance.now();
    setup({ pins });
    stage().draw();
    const ms = performance.now() - t0;
    const pinsLayer = stage().findOne('.pins-layer') as Konva.Layer;
    expect(pinsLayer.find('Shape')).toHaveLength(1);
    expect(pinsLayer.listening()).toBe(false);
    // Generous bound for a software canvas in jsdom on a 2-core machine.
    expect(ms).toBeLessThan(3000);
  });

  it('paints a federal pin as a deep red filled diamond and a shop pin as an amber ring', () => {
    setup({ pins: [
      { id: 'f', u: 400, v: 0, weight: 'federal', state: 'open' },
      { id: 's', u: 600, v: 0, weight: 'shop', state: 'open' },
    ] });
    const f = pixel('pins-layer', screenOf({ u: 400, v: 0 }, 'short_hood'));
    expect(f).toEqual([0x9f, 0x1d, 0x1d, 255]);
    // A ring: its centre is empty, its rim (6.5 px out) is amber.
    const c = screenOf({ u: 600, v: 0 }, 'short_hood');
    expect(pixel('pins-layer', c)[3]).toBe(0);
    const rim = pixel('pins-layer', { sx: c.sx + 6.5, sy: c.sy });
    // Anti-aliasing may blend a little of the paper halo into a pixel on the rim.
    [0xa8, 0x5f, 0x00, 255].forEach((want, i) => expect(Math.abs(rim[i] - want)).toBeLessThanOrEqual(16));
  });

  it('pins are not hit targets: a tap on a pin still selects the part under it', () => {
    const { surface, onSelectPart } = setup({ pins: [{ id: 'f', u: MOTOR_1_TAP.u, v: MOTOR_1_TAP.v, weight: 'federal', state: 'open' }] });
    tap(surface, screenOf(MOTOR_1_TAP, 'short_hood'));
    expect(onSelectPart.mock.calls[0][0].partId).toBe('pl-tm-1');
  });
});
