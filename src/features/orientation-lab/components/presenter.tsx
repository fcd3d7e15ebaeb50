import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import type { FrontEnd, ViewKey } from '../../../../shared/domain/frames';
import { bothNames, flipSteps } from '../../../../shared/lab/flip-steps';
import { END_NAME } from '../../../../shared/lab/words';
import { unitLayout } from '../../../../shared/layout/unit-layout';
import { flipFrontEnd } from '../../../../shared/orientation';
import { DrawingCanvas } from '../../drawing';
import { DEMO_VIEWS, useDemoDrawing } from './flip-demo';

function useWindowHeight() {
  const [h, setH] = useState(() => window.innerHeight);
  useEffect(() => {
    const on = () => setH(window.innerHeight);
    window.addEventListener('resize', on);
    return () => window.removeEventListener('resize', on);
  }, []);
  return h;
}

/**
 * Presenter mode: the flip demonstration for a room. Full screen, large type, driven from the
 * keyboard (or a presentation clicker, which sends Page Up / Page Down).
 */
export function Presenter() {
  const { types, key, setKey, drawing } = useDemoDrawing();
  const [frontEnd, setFrontEnd] = useState<FrontEnd>('short_hood');
  const [step, setStep] = useState(0);
  const [view, setView] = useState<ViewKey>('plan');
  const [pinned, setPinned] = useState<string | null>(null);
  const root = useRef<HTMLDivElement>(null);
  const navigate = useNavigate();
  const height = useWindowHeight();
  const d = drawing.data;
  const steps = useMemo(() => (d ? flipSteps(d, frontEnd, pinned ?? undefined) : []), [d, frontEnd, pinned]);
  const layout = useMemo(() => (d ? unitLayout(d, frontEnd) : undefined), [d, frontEnd]);
  const i = Math.min(step, Math.max(0, steps.length - 1));
  const s = steps[i];
  const views = DEMO_VIEWS.filter((v) => d?.views.some((dv) => dv.key === v.key)).slice(0, 3);
  const unitKeys = types.data?.items.map((t) => t.key) ?? [];

  const enterFullScreen = useCallback(() => {
    const el = root.current;
    if (el && !document.fullscreenElement && typeof el.requestFullscreen === 'function') el.requestFullscreen().catch(() => {});
  }, []);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      // The canvas keeps its own keys (pan, zoom, Tab through parts) when it has the focus.
      if (e.defaultPrevented || e.altKey || e.ctrlKey || e.metaKey) return;
      const tag = (e.target as HTMLElement | null)?.tagName;
      if (tag === 'SELECT' || tag === 'INPUT' || tag === 'TEXTAREA') return;
      switch (e.key) {
        case 'ArrowRight':
        case 'PageDown':
        case ' ':
          e.preventDefault();
          setStep((n) => Math.min(n + 1, steps.length - 1));
          return;
        case 'ArrowLeft':
        case 'PageUp':
          e.preventDefault();
          setStep((n) => Math.max(n - 1, 0));
          return;
        case 'Home':
          e.preventDefault();
          setStep(0);
          return;
        case 'End':
          e.preventDefault();
          setStep(steps.length - 1);
          return;
        case 'f':
        case 'F':
          e.preventDefault();
          setFrontEnd((f) => flipFrontEnd(f));
          return;
        case 'v':
        case 'V': {
          e.preventDefault();
          const at = views.findIndex((x) => x.key === view);
          setView(views[(at + 1) % views.length]?.key ?? 'plan');
          return;
        }
        case 'u':
        case 'U': {
          e.preventDefault();
          if (unitKeys.length === 0) return;
          setKey(unitKeys[(unitKeys.indexOf(key ?? '') + 1) % unitKeys.length]);
          setPinned(null);
          return;
        }
        case 'Enter':
          enterFullScreen();
          return;
        case 'Escape':
          if (!document.fullscreenElement) navigate('/lab');
          return;
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [steps.length, views, view, unitKeys, key, setKey, navigate, enterFullScreen]);

  useEffect(() => {
    root.current?.focus();
  }, []);

  const stepPart = s?.partIds.find((id) => d?.views.find((v) => v.key === view)?.parts.some((p) => p.id === id));
  const pinnedNames = d && pinned ? bothNames(d, pinned) : undefined;

  return (
    <div
      ref={root}
      tabIndex={-1}
      className="fixed inset-0 z-50 flex flex-col gap-4 overflow-auto bg-paper p-6 text-graphite outline-none"
      role="region"
      aria-label="Presenter mode"
      data-testid="presenter"
    >
      <div className="flex flex-wrap items-center gap-3">
        <p className="text-xl font-bold">{d?.name ?? 'Loading…'}</p>
        <p className="rounded-md bg-graphite px-4 py-1 text-3xl font-bold text-paper" data-testid="presenter-front-end" aria-live="polite">
          F on the {END_NAME[frontEnd]} end
        </p>
        <p className="ml-auto text-xl text-graphite-2" data-testid="presenter-step">
          Step {i + 1} of {steps.length}
        </p>
        <button type="button" className="btn" onClick={enterFullScreen}>
          Full screen
        </button>
        <button type="button" className="btn" onClick={() => navigate('/lab')}>
          Leave
        </button>
      </div>
      {d && layout && (
        <DrawingCanvas
          drawing={d}
          layout={layout}
          view={view}
          mode="as_built"
          selectedPartId={stepPart ?? (pinned ? d.views.find((v) => v.key === view)?.parts.find((p) => p.instanceId === pinned)?.id : undefined) ?? null}
          onSelectPart={(part) => part.kind !== 'front_marking' && setPinned(part.instanceId)}
          height={Math.max(260, Math.round(height * 0.42))}
        />
      )}
      {s && (
        <section aria-live="polite" className="space-y-3">
          <h1 className="text-5xl leading-tight font-bold" data-testid="presenter-title">
            {s.title}
          </h1>
          <p className="max-w-[60ch] text-3xl leading-snug">{s.body}</p>
          {pinnedNames && s.key !== 'pinned' && (
            <p className="text-2xl text-graphite-2">
              Pinned: {pinnedNames.shortHood} (F on the short hood) · {pinnedNames.longHood} (F on the long hood)
            </p>
          )}
        </section>
      )}
      <p className="mt-auto text-lg text-graphite-2">
        → or Page Down: next · ← or Page Up: back · F: move the F · V: next view · U: next unit type · Enter: full screen · Esc: leave
      </p>
    </div>
  );
}
