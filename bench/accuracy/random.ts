// A small seeded random source for the scenario generator, so every run sees the same scenarios.

export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  uniform(lo: number, hi: number): number;
  normal(): number;
  chance(p: number): boolean;
  pick<T>(items: readonly T[]): T;
}

/** mulberry32: a 32-bit generator, plenty for simulation (not for secrets). */
export function seededRandom(seed: number): Random {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    uniform: (lo, hi) => lo + (hi - lo) * next(),
    normal: () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next()),
    chance: (p) => next() < p,
    pick: (items) => items[Math.floor(next() * items.length)]!,
  };
}
