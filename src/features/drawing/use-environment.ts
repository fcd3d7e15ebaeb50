import { useEffect, useState, type RefObject } from 'react';

/** Follows the app's dark theme (the `dark` class on <html>, set by the shell's theme switch). */
export function useDarkTheme(): boolean {
  const [dark, setDark] = useState(() => document.documentElement.classList.contains('dark'));
  useEffect(() => {
    const html = document.documentElement;
    const mo = new MutationObserver(() => setDark(html.classList.contains('dark')));
    mo.observe(html, { attributes: true, attributeFilter: ['class'] });
    setDark(html.classList.contains('dark'));
    return () => mo.disconnect();
  }, []);
  return dark;
}

const REDUCED = '(prefers-reduced-motion: reduce)';

export function usePrefersReducedMotion(): boolean {
  const [reduced, setReduced] = useState(() => typeof window.matchMedia === 'function' && window.matchMedia(REDUCED).matches);
  useEffect(() => {
    if (typeof window.matchMedia !== 'function') return;
    const mq = window.matchMedia(REDUCED);
    const on = (): void => setReduced(mq.matches);
    mq.addEventListener?.('change', on);
    return () => mq.removeEventListener?.('change', on);
  }, []);
  return reduced;
}

/** The element's content width in CSS px, following resizes; `fallback` until it can be measured (or where nothing lays out). */
export function useElementWidth(ref: RefObject<HTMLElement | null>, fixed: number | undefined, fallback = 640): number {
  const [width, setWidth] = useState(fixed ?? fallback);
  useEffect(() => {
    if (fixed !== undefined) {
      setWidth(fixed);
      return;
    }
    const el = ref.current;
    if (!el) return;
    const measure = (): void => {
      const w = Math.floor(el.clientWidth);
      if (w > 0) setWidth(w);
    };
    measure();
    if (typeof ResizeObserver === 'function') {
      const ro = new ResizeObserver(measure);
      ro.observe(el);
      return () => ro.disconnect();
    }
    window.addEventListener('resize', measure);
    return () => window.removeEventListener('resize', measure);
  }, [ref, fixed]);
  return width;
}

/** `value`, but only after it has stopped changing for `ms` (re-caching the drawing after a zoom settles). */
export function useSettled<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    if (Object.is(value, settled)) return;
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, settled, ms]);
  return settled;
}
