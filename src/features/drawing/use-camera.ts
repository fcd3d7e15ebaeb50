import { useCallback, useMemo, useRef, useState } from 'react';
import type { ViewKey } from '../../../shared/domain/frames';
import { clampCamera, fitCamera, reorientCamera, zoomLimits, type Camera, type Viewport, type ViewOrientation, type ZoomLimits } from '../../../shared/drawings/screen';
import type { Box } from '../../../shared/drawings/types';

interface CameraState {
  readonly camera: Camera;
  readonly viewKey: ViewKey;
  readonly orient: ViewOrientation;
  readonly viewport: Viewport;
  /** Still as fitted: a resize refits instead of keeping the old scale. */
  readonly fitted: boolean;
}

export interface CameraControls {
  camera: Camera;
  limits: ZoomLimits;
  /** The camera now, for event handlers between renders. */
  current(): Camera;
  /** Applies a pure camera command (pan, zoom, pinch…); the result is kept on screen. */
  update(command: (c: Camera) => Camera): void;
  fit(): void;
}

/**
 * Pan and zoom state for one view: fitted when the view or (while untouched) the viewport changes,
 * turned round with the drawing when its orientation flips, clamped so the drawing stays in sight.
 */
export function useCamera(viewKey: ViewKey, bounds: Box, orient: ViewOrientation, viewport: Viewport): CameraControls {
  const [state, setState] = useState<CameraState | null>(null);
  const fresh = (): CameraState => ({ camera: fitCamera(bounds, orient, viewport), viewKey, orient, viewport, fitted: true });

  // Derived-state adjustment during render (React's documented pattern), so no frame shows a stale camera.
  let s = state;
  const vpChanged = !!s && (s.viewport.width !== viewport.width || s.viewport.height !== viewport.height);
  if (!s || s.viewKey !== viewKey || (s.fitted && vpChanged)) s = fresh();
  else {
    if (s.orient.su !== orient.su || s.orient.sv !== orient.sv) s = { ...s, camera: reorientCamera(s.camera, s.orient, orient, bounds), orient };
    if (vpChanged) s = { ...s, viewport };
  }
  if (s !== state) setState(s);

  const ref = useRef(s);
  ref.current = s;
  const fitScale = useMemo(() => fitCamera(bounds, orient, viewport).scale, [bounds, orient, viewport]);
  const limits = useMemo(() => zoomLimits(fitScale), [fitScale]);

  const update = useCallback(
    (command: (c: Camera) => Camera) => {
      setState((prev) => {
        const base = prev ?? ref.current;
        const next = clampCamera(command(base.camera), bounds, base.orient, base.viewport);
        return { ...base, camera: next, fitted: false };
      });
    },
    [bounds],
  );
  const fit = useCallback(() => {
    setState((prev) => {
      const base = prev ?? ref.current;
      return { ...base, camera: fitCamera(bounds, base.orient, base.viewport), fitted: true };
    });
  }, [bounds]);
  const current = useCallback(() => ref.current.camera, []);

  return { camera: s.camera, limits, current, update, fit };
}
