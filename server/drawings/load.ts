import { readFileSync, readdirSync } from 'node:fs';
import { basename, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { DrawingError, parseDrawing } from '../../shared/drawings/parse-drawing';
import type { Drawing } from '../../shared/drawings/types';

/** The committed drawings, one SVG per unit type. */
export const DIAGRAMS_DIR = fileURLToPath(new URL('../../diagrams/', import.meta.url));

/**
 * Reads every *.svg in `dir` (sorted by name) into a map keyed by unit type. Throws the
 * first DrawingError; a file's data-unit-type must equal its name without .svg, so a
 * copied file cannot silently shadow another unit type.
 */
export function loadDrawingsFromDir(dir: string = DIAGRAMS_DIR): Map<string, Drawing> {
  const files = readdirSync(dir)
    .filter((f) => f.toLowerCase().endsWith('.svg'))
    .sort();
  const out = new Map<string, Drawing>();
  for (const file of files) {
    const drawing = parseDrawing(readFileSync(join(dir, file), 'utf8'), file);
    const expected = basename(file, '.svg');
    if (drawing.key !== expected) {
      throw new DrawingError(file, 'svg#1', 'bad_attribute', `data-unit-type "${drawing.key}" must match the file name "${expected}"`);
    }
    out.set(drawing.key, drawing);
  }
  return out;
}
