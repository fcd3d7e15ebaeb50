import { useEffect, useRef, type RefObject } from 'react';
import { screenPoint, type ScreenPoint } from '../../../shared/domain/frames';
import { wheelZoomFactor } from '../../../shared/drawings/screen';

export interface GestureHandlers {
  /** One finger or a mouse drag moved the drawing by (dx, dy) px. */
  onPan(dx: number, dy: number): void;
  /** Two fingers moved from `before` to `after`. */
  onPinch(before: readonly [ScreenPoint, ScreenPoint], after: readonly [ScreenPoint, ScreenPoint]): void;
  /** A press and release without moving (past the slop). */
  onTap(at: ScreenPoint): void;
  /** A mouse moved over the canvas with no button down. */
  onHover?(at: ScreenPoint): void;
  onWheelZoom(factor: number, at: ScreenPoint): void;
}

/** How far a press may wander and still be a tap, CSS px (a finger wobbles more than a mouse). */
const TAP_SLOP = { mouse: 4, touch: 10, pen: 6 } as const;

interface Tracked {
  start: ScreenPoint;
  last: ScreenPoint;
  type: keyof typeof TAP_SLOP;
}

/**
 * Pointer Events on the canvas container: pan, pinch, tap, hover, wheel. Points are CSS px from the
 * container's top left. Elements marked `data-canvas-controls` (the zoom buttons) are left alone.
 */
export function usePointerGestures(ref: RefObject<HTMLElement | null>, handlers: GestureHandlers): void {
  const h = useRef(handlers);
  h.current = handlers;

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const pointers = new Map<number, Tracked>();
    // A press becomes a drag (or pinch) once it moves past the slop; then its release is not a tap.
    let moved = false;

    const local = (e: { clientX: number; clientY: number }): ScreenPoint => {
      const r = el.getBoundingClientRect();
      return screenPoint(e.clientX - r.left, e.clientY - r.top);
    };
    const ours = (e: Event): boolean => !(e.target instanceof Element && e.target.closest('[data-canvas-controls]'));
    const kind = (e: PointerEvent): Tracked['type'] => (e.pointerType === 'touch' || e.pointerType === 'pen' ? e.pointerType : 'mouse');

    const down = (e: PointerEvent): void => {
      if (!ours(e) || (e.pointerType === 'mouse' && e.button !== 0)) return;
      const p = local(e);
      pointers.set(e.pointerId, { start: p, last: p, type: kind(e) });
      if (pointers.size === 1) moved = false;
      else moved = true; // a second finger: this gesture is a pinch, not a tap
      el.setPointerCapture?.(e.pointerId);
    };
    const move = (e: PointerEvent): void => {
      const t = pointers.get(e.pointerId);
      const p = local(e);
      if (!t) {
        if (e.pointerType === 'mouse' && e.buttons === 0 && ours(e)) h.current.onHover?.(p);
        return;
      }
      if (pointers.size === 1) {
        if (!moved && Math.hypot(p.sx - t.start.sx, p.sy - t.start.sy) <= TAP_SLOP[t.type]) return;
        if (!moved) {
          moved = true;
          // Pan from where the press started so the slop is not lost.
          h.current.onPan(p.sx - t.start.sx, p.sy - t.start.sy);
        } else h.current.onPan(p.sx - t.last.sx, p.sy - t.last.sy);
        t.last = p;
        return;
      }
      const [a, b] = [...pointers.entries()].slice(0, 2);
      if (a[0] !== e.pointerId && b[0] !== e.pointerId) return;
      const before: [ScreenPoint, ScreenPoint] = [a[1].last, b[1].last];
      t.last = p;
      h.current.onPinch(before, [a[1].last, b[1].last]);
    };
    const up = (e: PointerEvent): void => {
      const t = pointers.get(e.pointerId);
      if (!t) return;
      pointers.delete(e.pointerId);
      el.releasePointerCapture?.(e.pointerId);
      if (e.type === 'pointerup' && pointers.size === 0 && !moved) h.current.onTap(local(e));
      // The remaining finger of a pinch continues as a pan from where it is now.
      for (const rest of pointers.values()) rest.start = rest.last;
    };
    const wheel = (e: WheelEvent): void => {
      if (!ours(e)) return;
      e.preventDefault();
      h.current.onWheelZoom(wheelZoomFactor(e.deltaY, e.deltaMode as 0 | 1 | 2, el.clientHeight || 800), local(e));
    };

    el.addEventListener('pointerdown', down);
    el.addEventListener('pointermove', move);
    el.addEventListener('pointerup', up);
    el.addEventListener('pointercancel', up);
    el.addEventListener('wheel', wheel, { passive: false });
    return () => {
      el.removeEventListener('pointerdown', down);
      el.removeEventListener('pointermove', move);
      el.removeEventListener('pointerup', up);
      el.removeEventListener('pointercancel', up);
      el.removeEventListener('wheel', wheel);
    };
  }, [ref]);
}
