/**
 * The subset of SVG path data a drawing may use: absolute M, L, H, V and Z only, so
 * every path is a set of straight polylines (no curves to flatten, no relative maths
 * to get wrong by hand). Coordinates stay in sheet units; the loader maps them.
 */
export interface SubPath {
  /** Flat x0, y0, x1, y1, ... in sheet units. */
  readonly points: number[];
  readonly closed: boolean;
}

export class PathDataError extends Error {}

const TOKEN = /([A-Za-z])|([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)|([\s,]+)|(.)/g;

export function parsePathData(d: string): SubPath[] {
  const tokens: (string | number)[] = [];
  for (const m of d.matchAll(TOKEN)) {
    if (m[1] !== undefined) tokens.push(m[1]);
    else if (m[2] !== undefined) tokens.push(Number(m[2]));
    else if (m[4] !== undefined) throw new PathDataError(`unexpected character "${m[4]}" in path data`);
  }
  const out: SubPath[] = [];
  let current: SubPath | undefined;
  let cx = 0, cy = 0, sx = 0, sy = 0;
  let cmd: string | undefined;
  let i = 0;
  const num = (): number => {
    const t = tokens[i];
    if (typeof t !== 'number') throw new PathDataError(`command ${cmd} is missing a number`);
    i++;
    return t;
  };
  const lineTo = (x: number, y: number): void => {
    if (!current) {
      // A drawing command straight after Z starts a new subpath at the closed one's start.
      current = { points: [sx, sy], closed: false };
      out.push(current);
    }
    current.points.push(x, y);
    cx = x;
    cy = y;
  };
  while (i < tokens.length) {
    const t = tokens[i];
    if (typeof t === 'string') {
      if (!'MLHVZ'.includes(t)) {
        throw new PathDataError(`path command "${t}" is not allowed (only absolute M, L, H, V, Z)`);
      }
      if (cmd === undefined && t !== 'M') throw new PathDataError('path data must start with M');
      cmd = t;
      i++;
      if (t === 'Z') {
        if (!current) throw new PathDataError('Z without an open subpath');
        current = { ...current, closed: true };
        out[out.length - 1] = current;
        current = undefined;
        cx = sx;
        cy = sy;
        continue;
      }
    } else if (cmd === undefined) {
      throw new PathDataError('path data must start with M');
    } else if (cmd === 'Z') {
      throw new PathDataError('numbers after Z need a command');
    }
    switch (cmd) {
      case 'M': {
        const x = num(), y = num();
        current = { points: [x, y], closed: false };
        out.push(current);
        cx = sx = x;
        cy = sy = y;
        cmd = 'L'; // further pairs after M are implicit line-tos
        break;
      }
      case 'L': {
        const x = num(), y = num();
        lineTo(x, y);
        break;
      }
      case 'H':
        lineTo(num(), cy);
        break;
      case 'V':
        lineTo(cx, num());
        break;
    }
  }
  if (out.length === 0) throw new PathDataError('empty path data');
  for (const s of out) {
    if (s.points.length < 4) throw new PathDataError('a subpath needs at least two points');
  }
  return out;
}
