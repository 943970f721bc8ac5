// Seeded pseudo-random numbers for the demo data, so every run writes the same plates.

/** A reproducible source of random numbers. */
export interface Random {
  /** Uniform on [0, 1). */
  next(): number;
  /** Uniform on [low, high). */
  uniform(low: number, high: number): number;
  /** Normal with the given mean and standard deviation. */
  normal(mean: number, sd: number): number;
  /** Log-normal: `median · exp(N(0, sdLog))`. */
  logNormal(median: number, sdLog: number): number;
}

/** A generator seeded with a 32-bit integer (the mulberry32 recurrence), normals by the Box–Muller transform. */
export function makeRandom(seed: number): Random {
  let state = seed >>> 0;
  const next = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (mean: number, sd: number) => {
    const u = 1 - next();
    const v = next();
    return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
  return {
    next,
    uniform: (low, high) => low + (high - low) * next(),
    normal,
    logNormal: (median, sdLog) => median * Math.exp(normal(0, sdLog)),
  };
}

/** Rounds to a number of decimals, the precision an export writes. */
export function roundTo(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor;
}

/** Limits a value to [low, high]. */
export function clamp(value: number, low: number, high: number): number {
  return Math.min(high, Math.max(low, value));
}
