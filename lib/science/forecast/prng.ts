/**
 * Seeded pseudo-random numbers for forecast bands: the mulberry32 recurrence (a well-known 32-bit
 * generator, period 2³²) for uniforms, the Box–Muller transform for normals. Same seed, same sequence.
 */
export interface SeededRandom {
  /** Uniform on [0, 1). */
  next(): number;
  /** Standard normal. */
  normal(): number;
  /** Whole number uniform on 0 … n − 1. */
  below(n: number): number;
}

export function seededRandom(seed: number): SeededRandom {
  let state = seed >>> 0;
  const next = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    normal: () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next()),
    below: (n) => Math.min(n - 1, Math.floor(next() * n)),
  };
}
