/**
 * From cell counts to a density overlay: a light 3×3 binomial blur (weights 1-2-1
 * each way) spreads each cell's count to its neighbours so a cluster reads as one
 * warm patch, then values are scaled to 0..1 against the hottest cell. The blur keeps
 * the total: every cell's count is shared out in full among the cells that exist.
 */
import { cellBounds, type CellCount, type GridSpec } from './grid';

export interface HeatCell {
  /** Front-relative rectangle, inches (see cellBounds). */
  readonly along: number;
  readonly left: number;
  readonly w: number;
  readonly h: number;
  /** 0..1, 1 at the hottest cell. */
  readonly value: number;
  /** Smoothed count in the cell (findings per cell after the blur). */
  readonly density: number;
  /** Raw findings pinned in the cell. */
  readonly count: number;
}

const KERNEL = [1, 2, 1];

/** Smoothed counts on the full grid, row-major by col (index col * rows + row). */
export function smoothCounts(spec: GridSpec, cells: readonly CellCount[], blur = true): Float64Array {
  const out = new Float64Array(spec.cols * spec.rows);
  for (const c of cells) {
    if (c.col < 0 || c.col >= spec.cols || c.row < 0 || c.row >= spec.rows) throw new RangeError(`cell ${c.col},${c.row} is outside the grid`);
    if (!blur) {
      out[c.col * spec.rows + c.row] += c.count;
      continue;
    }
    // Share the count among the neighbours that exist, so edge cells lose nothing.
    let weight = 0;
    for (let dc = -1; dc <= 1; dc++)
      for (let dr = -1; dr <= 1; dr++) {
        const col = c.col + dc;
        const row = c.row + dr;
        if (col >= 0 && col < spec.cols && row >= 0 && row < spec.rows) weight += KERNEL[dc + 1] * KERNEL[dr + 1];
      }
    for (let dc = -1; dc <= 1; dc++)
      for (let dr = -1; dr <= 1; dr++) {
        const col = c.col + dc;
        const row = c.row + dr;
        if (col >= 0 && col < spec.cols && row >= 0 && row < spec.rows) {
          out[col * spec.rows + row] += (c.count * KERNEL[dc + 1] * KERNEL[dr + 1]) / weight;
        }
      }
  }
  return out;
}

/** Heat rectangles for the overlay: only cells with some density, hottest = 1. */
export function heatCells(spec: GridSpec, cells: readonly CellCount[], opts: { blur?: boolean; floor?: number } = {}): HeatCell[] {
  const smooth = smoothCounts(spec, cells, opts.blur ?? true);
  const raw = new Map(cells.map((c) => [c.col * spec.rows + c.row, c.count]));
  let max = 0;
  for (const v of smooth) max = Math.max(max, v);
  if (max === 0) return [];
  const floor = opts.floor ?? 0.02;
  const out: HeatCell[] = [];
  for (let col = 0; col < spec.cols; col++) {
    for (let row = 0; row < spec.rows; row++) {
      const i = col * spec.rows + row;
      const value = smooth[i] / max;
      if (value < floor && !raw.has(i)) continue;
      out.push({ ...cellBounds(spec, { col, row }), value, density: smooth[i], count: raw.get(i) ?? 0 });
    }
  }
  return out;
}
