/**
 * The canvas bench page: the six-axle plan in a DrawingCanvas, driven by bench/canvas.ts through
 * window.hoodlineBench (set the pins, pan for a while, report frame times).
 */
import '@fontsource/roboto-condensed/400.css';
import '@fontsource/roboto-condensed/700.css';
import './canvas-page.css';
import { useEffect, useMemo, useRef, useState } from 'react';
import { createRoot } from 'react-dom/client';
import { flushSync } from 'react-dom';
import type { FrontEnd, ViewKey } from '../shared/domain/frames';
import type { DrawingMode } from '../shared/drawings/screen';
import type { Drawing } from '../shared/drawings/types';
import { unitLayout } from '../shared/layout/unit-layout';
import { flipFrontEnd } from '../shared/orientation';
import { DrawingCanvas, OrientationLegend } from '../src/features/drawing';
import type { DrawingCanvasHandle, DrawingPin } from '../src/features/drawing/types';

export interface PanResult {
  /** Every time between animation frames while panning, ms. */
  intervals: number[];
  frames: number;
  /** Median time between animation frames while panning, ms. */
  medianFrameMs: number;
  p95FrameMs: number;
}

declare global {
  interface Window {
    hoodlineBench?: {
      setPins(n: number): Promise<void>;
      pan(ms: number): Promise<PanResult>;
      info(): { drawing: string; parts: number; pins: number };
      /** Mean ms of a synchronous draw of each Konva layer, and of one React pan update, over `n` tries. */
      layerDrawMs(n: number): Record<string, number>;
    };
  }
}

/** Deterministic pins spread over the view (mulberry32), so runs compare. */
function makePins(n: number, d: Drawing): DrawingPin[] {
  let a = 0x5eed;
  const rnd = (): number => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const b = (d.views.find((v) => v.key === VIEW) ?? d.views[0]).bounds;
  const weights = ['federal', 'shop', 'note'] as const;
  const states = ['open', 'open', 'in_repair', 'repaired', 'verified'] as const;
  return Array.from({ length: n }, (_, i) => ({
    id: `bench-${i}`,
    u: b.umin + rnd() * (b.umax - b.umin),
    v: b.vmin + rnd() * (b.vmax - b.vmin),
    weight: weights[Math.floor(rnd() * 3)],
    state: states[Math.floor(rnd() * states.length)],
    pending: rnd() < 0.05,
  }));
}

const nextFrame = (): Promise<number> => new Promise((r) => requestAnimationFrame(r));
const median = (xs: number[]): number => {
  const s = [...xs].sort((p, q) => p - q);
  return s.length ? (s[(s.length - 1) >> 1] + s[s.length >> 1]) / 2 : NaN;
};

// For looking at the canvas by hand: canvas.html?view=side_plus_y&front=long_hood&mode=front_first&pins=40&dark=1
const params = new URLSearchParams(location.search);
const VIEW = (params.get('view') ?? 'plan') as ViewKey;
const FRONT = (params.get('front') ?? 'short_hood') as FrontEnd;
const MODE = (params.get('mode') ?? 'as_built') as DrawingMode;
if (params.get('dark') === '1') document.documentElement.classList.add('dark');

function Bench({ drawing }: { drawing: Drawing }) {
  const handle = useRef<DrawingCanvasHandle>(null);
  const [pins, setPins] = useState<DrawingPin[]>(() => makePins(Number(params.get('pins') ?? 0), drawing));
  const [frontEnd, setFrontEnd] = useState<FrontEnd>(FRONT);
  const layout = useMemo(() => unitLayout(drawing, frontEnd), [drawing, frontEnd]);
  const [selected, setSelected] = useState<string | null>(params.get('select'));

  useEffect(() => {
    window.hoodlineBench = {
      async setPins(n) {
        flushSync(() => setPins(makePins(n, drawing)));
        for (let i = 0; i < 5; i++) await nextFrame();
      },
      async pan(ms) {
        const h = handle.current!;
        const intervals: number[] = [];
        let last = await nextFrame();
        const start = last;
        let phase = 0;
        while (last - start < ms) {
          const now = await nextFrame();
          intervals.push(now - last);
          last = now;
          // A slow sway, ±180 px, so the drawing stays in view the whole time.
          phase += 0.05;
          const dx = 180 * (Math.sin(phase) - Math.sin(phase - 0.05));
          flushSync(() => h.panBy(dx, 0));
        }
        const sorted = [...intervals].sort((p, q) => p - q);
        return { intervals, frames: intervals.length, medianFrameMs: median(intervals), p95FrameMs: sorted[Math.floor(sorted.length * 0.95)] };
      },
      layerDrawMs(n) {
        const out: Record<string, number> = {};
        for (const layer of handle.current!.stage()!.getLayers()) {
          const t0 = performance.now();
          for (let i = 0; i < n; i++) layer.draw();
          out[layer.name() || 'layer'] = (performance.now() - t0) / n;
        }
        const t0 = performance.now();
        for (let i = 0; i < n; i++) flushSync(() => handle.current!.panBy(i % 2 ? 2 : -2, 0));
        out['react pan update'] = (performance.now() - t0) / n;
        return out;
      },
      info: () => ({ drawing: drawing.key, parts: drawing.views.find((v) => v.key === 'plan')!.parts.length, pins: pins.length }),
    };
  }, [drawing, pins.length]);

  return (
    <main className="p-4">
      <div className="mb-2 flex items-center gap-4">
        <h1 className="text-2xl font-bold">
          {drawing.name}: {VIEW}, {pins.length} pins
        </h1>
        <button type="button" className="btn" onClick={() => setFrontEnd((f) => flipFrontEnd(f))}>
          Move the F (now on the {frontEnd === 'short_hood' ? 'short' : 'long'} hood)
        </button>
      </div>
      <DrawingCanvas
        ref={handle}
        drawing={drawing}
        layout={layout}
        view={VIEW}
        mode={MODE}
        pins={pins}
        selectedPartId={selected}
        onSelectPart={(p) => setSelected(p.partId)}
        height={560}
      />
      <div className="mt-3 max-w-3xl">
        <OrientationLegend frontEnd={frontEnd} />
      </div>
    </main>
  );
}

void fetch('./drawing.json')
  .then((r) => r.json() as Promise<Drawing>)
  .then((drawing) => createRoot(document.getElementById('root')!).render(<Bench drawing={drawing} />));
