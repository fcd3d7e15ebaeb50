/**
 * A small seeded random source (mulberry32) so a quiz's prompts are reproducible from its seed:
 * the same seed gives the same prompts on the server, in tests and in a browser.
 */
export interface Rng {
  /** Uniform in [0, 1). */
  next(): number;
  /** Integer in [0, n). */
  int(n: number): number;
  /** One element of a non-empty list. */
  pick<T>(items: readonly T[]): T;
  /** A shuffled copy (Fisher–Yates). */
  shuffle<T>(items: readonly T[]): T[];
  bool(): boolean;
}

/** Seeds are 32-bit unsigned integers. */
export const SEED_MAX = 0xffffffff;

export function seededRng(seed: number): Rng {
  if (!Number.isInteger(seed) || seed < 0 || seed > SEED_MAX) throw new RangeError(`seed ${seed} is not a 32-bit unsigned integer`);
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const int = (n: number) => {
    if (!Number.isInteger(n) || n < 1) throw new RangeError(`cannot pick from ${n} items`);
    return Math.floor(next() * n);
  };
  return {
    next,
    int,
    pick: (items) => {
      if (items.length === 0) throw new RangeError('cannot pick from an empty list');
      return items[int(items.length)];
    },
    shuffle: (items) => {
      const out = [...items];
      for (let i = out.length - 1; i > 0; i--) {
        const j = int(i + 1);
        [out[i], out[j]] = [out[j], out[i]];
      }
      return out;
    },
    bool: () => next() < 0.5,
  };
}
