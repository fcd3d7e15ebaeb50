import { useMemo } from 'react';
import type { HotSpotsResponse } from '../../../../shared/api/hot-spots';
import { frontPoint } from '../../../../shared/domain/frames';
import type { LayoutPart, UnitLayout } from '../../../../shared/layout/unit-layout';
import { frontToBody } from '../../../../shared/orientation';
import { DrawingCanvas, type DrawingHeat } from '../../drawing';
import { useDrawing } from '../../drawing/api/get-drawing';
import { useUnitTypeLayout } from '../../drawing/api/get-unit-layout';

/**
 * The unit type drawn front first (as a unit with its F on the short hood: front at the left), with
 * every pin's density laid on the plan in the front-relative frame, so units with the F on either
 * end add up on the same spot.
 */
export function HeatPlan({ data, selectedInstance, onPickPart, height }: {
  data: HotSpotsResponse;
  selectedInstance: string | null;
  onPickPart(part: LayoutPart): void;
  height: number;
}) {
  const drawing = useDrawing(data.unitType.key);
  const layout = useUnitTypeLayout(data.unitType.key, 'short_hood');
  const heat = useMemo<DrawingHeat>(() => toPlanHeat(data), [data]);
  const selectedPartId = useMemo(() => (layout.data && selectedInstance ? partIdOf(layout.data, selectedInstance) : null), [layout.data, selectedInstance]);
  if (drawing.isError || layout.isError) return <p role="alert" className="card p-4">The drawing of this unit type could not be loaded.</p>;
  if (!drawing.data || !layout.data) return <div className="w-full rounded-md border-2 border-rule bg-paper-2" style={{ height }} aria-busy="true" />;
  return (
    <DrawingCanvas
      drawing={drawing.data}
      layout={layout.data}
      view="plan"
      mode="front_first"
      heat={heat}
      selectedPartId={selectedPartId}
      onSelectPart={(part) => onPickPart(part)}
      height={height}
    />
  );
}

/** Front-relative heat cells to plan-view cells (u = body x, v = body y) of a unit with its F on the short hood. */
export function toPlanHeat(data: HotSpotsResponse): DrawingHeat {
  const { lengthIn } = data.grid;
  const cells = data.grid.heat.map((c) => {
    // Two opposite corners of the cell, converted through the orientation engine.
    const a = frontToBody(frontPoint(c.along, c.left), 'short_hood', lengthIn);
    const b = frontToBody(frontPoint(c.along + c.w, c.left + c.h), 'short_hood', lengthIn);
    return { u: Math.min(a.x, b.x), v: Math.min(a.y, b.y), w: Math.abs(b.x - a.x), h: Math.abs(b.y - a.y), value: c.value };
  });
  return { cells, max: 1 };
}

/** The plan-view element of an instance, or any view's when the plan does not show it. */
function partIdOf(layout: UnitLayout, instanceId: string): string | null {
  const mine = layout.parts.filter((p) => p.instanceId === instanceId);
  return (mine.find((p) => p.view === 'plan') ?? mine[0])?.partId ?? null;
}
