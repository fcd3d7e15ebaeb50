// The canvas on the committed unit drawings (diagrams/*.svg): every view renders both ways round for
// both front ends, the keyboard reaches every part, and each traction motor, tapped once zoomed in,
// is numbered from the F end (product brief §3: numbered 1..n by distance from the front).
import '../napi-canvas-jsdom';
import { act, fireEvent, render, screen } from '@testing-library/react';
import Konva from 'konva';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { createRef } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { parseDrawing } from '../../shared/drawings/parse-drawing';
import type { FrontEnd } from '../../shared/domain/frames';
import type { DrawingMode } from '../../shared/drawings/screen';
import type { Drawing } from '../../shared/drawings/types';
import { unitLayout } from '../../shared/layout/unit-layout';
import { DrawingCanvas } from '../../src/features/drawing/drawing-canvas';
import type { DrawingCanvasHandle } from '../../src/features/drawing/types';

// Read like server/drawings/load.ts does (that module resolves its folder from import.meta.url, which
// jsdom makes an http URL), from the project root.
const DIR = join(process.cwd(), 'diagrams');
const drawings: Drawing[] = readdirSync(DIR)
  .filter((f) => f.endsWith('.svg'))
  .sort()
  .map((f) => parseDrawing(readFileSync(join(DIR, f), 'utf8'), f));
const FRONTS: FrontEnd[] = ['short_hood', 'long_hood'];
// Many full renders on a real (software) canvas: give a busy 2-core machine time.
vi.setConfig({ testTimeout: 60_000 });
const MODES: DrawingMode[] = ['as_built', 'front_first'];

describe('committed diagrams', () => {
  it('are there to draw', () => {
    expect(drawings.length).toBeGreaterThan(0);
  });
});

describe.each(drawings.map((d) => [d.key, d] as const))('DrawingCanvas on %s', (_key, drawing) => {
  it('renders every view, both modes, both front ends, with FRONT and REAR or the side named', () => {
    for (const view of drawing.views) {
      for (const fe of FRONTS) {
        for (const mode of MODES) {
          const r = render(
            <DrawingCanvas drawing={drawing} layout={unitLayout(drawing, fe)} view={view.key} mode={mode} onSelectPart={vi.fn()} width={800} height={400} />,
          );
          expect(screen.getByRole('application')).toHaveAccessibleName(new RegExp(mode === 'as_built' ? 'as built' : 'front first'));
          const words = Konva.stages.at(-1)!.find('Text').map((t) => (t as Konva.Text).text());
          if (view.key === 'plan') expect(words).toEqual(expect.arrayContaining(['FRONT', 'REAR', 'LEFT', 'RIGHT']));
          else if (view.key.startsWith('side')) expect(words).toEqual(expect.arrayContaining(['FRONT', 'REAR', expect.stringMatching(/^(LEFT|RIGHT) SIDE$/)]));
          else expect(words).toEqual(expect.arrayContaining(['LEFT', 'RIGHT', expect.stringMatching(/^(FRONT|REAR) END$/)]));
          r.unmount();
        }
      }
    }
  });

  it('Tab visits every part of the plan exactly once, then lets focus leave', () => {
    const plan = drawing.views.find((v) => v.key === 'plan')!;
    const onSelectPart = vi.fn();
    render(<DrawingCanvas drawing={drawing} layout={unitLayout(drawing, 'long_hood')} view="plan" mode="as_built" onSelectPart={onSelectPart} width={800} height={400} />);
    const surface = screen.getByRole('application');
    surface.focus();
    const seen: string[] = [];
    for (let i = 0; i < plan.parts.length; i++) {
      // fireEvent returns false when the canvas took the key (preventDefault): focus stays on the canvas, on a part.
      expect(fireEvent.keyDown(surface, { key: 'Tab' })).toBe(false);
      fireEvent.keyDown(surface, { key: 'Enter' });
      seen.push(onSelectPart.mock.lastCall![0].instanceId);
    }
    expect(new Set(seen).size).toBe(plan.parts.length);
    expect(new Set(seen)).toEqual(new Set(plan.parts.map((p) => p.instanceId)));
    // One more Tab is left to the browser, which moves focus on.
    expect(fireEvent.keyDown(surface, { key: 'Tab' })).toBe(true);
  });

  for (const fe of FRONTS) {
    it(`each traction motor tapped when zoomed in is #n counted from the F (on the ${fe === 'short_hood' ? 'short' : 'long'} hood)`, () => {
      const plan = drawing.views.find((v) => v.key === 'plan')!;
      const motors = plan.parts.filter((p) => p.kind === 'traction_motor').sort((a, b) => a.centre.u - b.centre.u);
      expect(motors.length).toBe(drawing.axleCount);
      for (const [i, motor] of motors.entries()) {
        const ref = createRef<DrawingCanvasHandle>();
        const onSelectPart = vi.fn();
        const r = render(
          <DrawingCanvas ref={ref} drawing={drawing} layout={unitLayout(drawing, fe)} view="plan" mode="as_built" onSelectPart={onSelectPart} width={800} height={400} />,
        );
        act(() => ref.current!.zoomBy(8, ref.current!.toScreen(motor.centre)));
        const p = ref.current!.toScreen(motor.centre);
        fireEvent.pointerDown(screen.getByRole('application'), { clientX: p.sx, clientY: p.sy, pointerId: 1, pointerType: 'touch', buttons: 1 });
        fireEvent.pointerUp(screen.getByRole('application'), { clientX: p.sx, clientY: p.sy, pointerId: 1, pointerType: 'touch' });
        // x grows from the short hood end: with the F there the nth from the left is #n, otherwise #(count + 1 − n).
        const n = fe === 'short_hood' ? i + 1 : motors.length - i;
        expect(onSelectPart.mock.calls[0]?.[0].partId).toBe(motor.id);
        expect(screen.getByRole('status')).toHaveTextContent(`Selected: #${n} traction motor`);
        r.unmount();
      }
    });
  }
});
