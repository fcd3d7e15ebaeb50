/**
 * The drawing feature's entry for screens. The canvas (and Konva with it) is loaded on first use:
 * importing this module costs a few hundred bytes. Screens render <DrawingCanvas …/> as usual; it
 * shows a sized placeholder while the canvas chunk loads.
 */
import { createElement, lazy, Suspense } from 'react';
import type { DrawingCanvasProps } from './types';

/** Starts loading the canvas chunk early (e.g. when a unit is chosen, before its drawing is shown). */
export const preloadDrawingCanvas = () => import('./drawing-canvas');

const LazyCanvas = lazy(preloadDrawingCanvas);

export function DrawingCanvas(props: DrawingCanvasProps) {
  const fallback = createElement(
    'div',
    { className: 'w-full rounded-md border-2 border-rule bg-paper-2', style: { height: props.height ?? 420 }, 'aria-busy': true },
    createElement('span', { className: 'sr-only' }, 'Loading the drawing'),
  );
  return createElement(Suspense, { fallback }, createElement(LazyCanvas, props));
}

export { OrientationLegend } from './orientation-legend';
export type { DrawingCanvasHandle, DrawingCanvasProps, DrawingHeat, DrawingMode, DrawingPin, HeatCell } from './types';
