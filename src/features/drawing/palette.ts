/**
 * The canvas's colours. They repeat src/styles/app.css (canvas drawing cannot read CSS variables
 * cheaply on every frame); keep the two in step. One accent (violet) for selection; blue is kept for
 * the blue-signal caution and never used here.
 */
export interface Palette {
  readonly dark: boolean;
  readonly paper: string;
  readonly paper2: string;
  readonly graphite: string;
  readonly graphite2: string;
  readonly rule: string;
  readonly accent: string;
  readonly accentSoft: string;
  readonly federal: string;
  readonly shop: string;
  readonly note: string;
}

export const LIGHT_PALETTE: Palette = {
  dark: false,
  paper: '#f4f1e8',
  paper2: '#ebe6d8',
  graphite: '#262522',
  graphite2: '#55524a',
  rule: '#b9b2a0',
  accent: '#6b2fb3',
  accentSoft: '#ece2f7',
  federal: '#9f1d1d',
  shop: '#a85f00',
  note: '#51606e',
};

export const DARK_PALETTE: Palette = {
  dark: true,
  paper: '#15181c',
  paper2: '#1f242a',
  graphite: '#ece8dc',
  graphite2: '#b3ad9e',
  rule: '#4a4f55',
  accent: '#c79bff',
  accentSoft: '#34285a',
  federal: '#ff7b7b',
  shop: '#ffb547',
  note: '#a9b7c4',
};

export const paletteFor = (dark: boolean): Palette => (dark ? DARK_PALETTE : LIGHT_PALETTE);

function rgb(hex: string): [number, number, number] {
  const n = parseInt(hex.slice(1), 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

/** `hex` at opacity `a` as an rgba() string. */
export function withAlpha(hex: string, a: number): string {
  const [r, g, b] = rgb(hex);
  return `rgba(${r},${g},${b},${a})`;
}

/** Heat cell colour: graphite for the coolest, the federal red for the hottest, more opaque as it gets hotter. */
export function heatFill(value: number, max: number, p: Palette): string {
  const t = max > 0 ? Math.min(1, Math.max(0, value / max)) : 0;
  const [r0, g0, b0] = rgb(p.graphite);
  const [r1, g1, b1] = rgb(p.federal);
  const mix = (a: number, b: number): number => Math.round(a + (b - a) * t);
  return `rgba(${mix(r0, r1)},${mix(g0, g1)},${mix(b0, b1)},${(0.1 + 0.45 * t).toFixed(3)})`;
}
