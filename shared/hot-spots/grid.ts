/**
 * Binning pins in the front-relative frame: `along` from the front coupler face,
 * `left` offset to the left of the centreline, both inches. Units with the F on
 * either end put the same front-relative spot in the same cell. The server's SQL
 * (server/modules/hot-spots/repository.ts) bins with the same formula; the
 * integration tests check the two agree.
 */

/** Default cell edge, inches: about the size of a tapped part on a plan view. */
export const DEFAULT_CELL_IN = 12;

export interface GridSpec {
  readonly cellIn: number;
  readonly lengthIn: number;
  readonly widthIn: number;
  /** Cells along the unit (index 0 at the front). */
  readonly cols: number;
  /** Cells across (index 0 at the right edge, left = −width/2; the last at the left edge). */
  readonly rows: number;
}

export interface Cell {
  readonly col: number;
  readonly row: number;
}

/** The grid covering a unit type's plan, front first. */
export function gridFor(lengthIn: number, widthIn: number, cellIn: number = DEFAULT_CELL_IN): GridSpec {
  if (!(lengthIn > 0 && widthIn > 0 && cellIn > 0)) throw new RangeError('length, width and cell size must be positive');
  return { cellIn, lengthIn, widthIn, cols: Math.max(1, Math.ceil(lengthIn / cellIn)), rows: Math.max(1, Math.ceil(widthIn / cellIn)) };
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/** The cell a front-relative point falls in; points just outside the outline (a pin on a pilot step) go to the edge cell. */
export function cellOf(spec: GridSpec, along: number, left: number): Cell {
  if (!Number.isFinite(along) || !Number.isFinite(left)) throw new RangeError('point must be finite');
  return {
    col: clamp(Math.floor(along / spec.cellIn), 0, spec.cols - 1),
    row: clamp(Math.floor((left + spec.widthIn / 2) / spec.cellIn), 0, spec.rows - 1),
  };
}

/** The front-relative rectangle a cell covers: along from `along` to `along + w`, left from `left` to `left + h`. */
export function cellBounds(spec: GridSpec, c: Cell): { along: number; left: number; w: number; h: number } {
  return { along: c.col * spec.cellIn, left: c.row * spec.cellIn - spec.widthIn / 2, w: spec.cellIn, h: spec.cellIn };
}

export interface CellCount extends Cell {
  readonly count: number;
}

/** Counts of pins per cell; the pure counterpart of the SQL grouping. Sorted by col, then row. */
export function binPins(spec: GridSpec, pins: readonly { along: number; left: number }[]): CellCount[] {
  const counts = new Map<number, number>();
  for (const p of pins) {
    const c = cellOf(spec, p.along, p.left);
    const k = c.col * spec.rows + c.row;
    counts.set(k, (counts.get(k) ?? 0) + 1);
  }
  return [...counts.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([k, count]) => ({ col: Math.floor(k / spec.rows), row: k % spec.rows, count }));
}
