/** A voltage trace for plotting. */
export interface VoltageTrace {
  t_ms: number[];
  v_mV: number[];
}

/**
 * Reduce samples taken every dt from t0 to at most `points` points: the first and last sample, and
 * each bucket's minimum and maximum in time order, so that spike peaks and troughs survive.
 */
export function downsampleMinMax(
  samples: ArrayLike<number>,
  t0_ms: number,
  dt_ms: number,
  points: number,
): VoltageTrace {
  const n = samples.length;
  const t_ms: number[] = [];
  const v_mV: number[] = [];
  const buckets = Math.max(1, Math.floor((points - 2) / 2));
  if (n <= points) {
    for (let i = 0; i < n; i++) {
      t_ms.push(t0_ms + i * dt_ms);
      v_mV.push(samples[i]!);
    }
    return { t_ms, v_mV };
  }
  const push = (i: number) => {
    if (t_ms.length > 0 && t_ms[t_ms.length - 1] === t0_ms + i * dt_ms) return;
    t_ms.push(t0_ms + i * dt_ms);
    v_mV.push(samples[i]!);
  };
  push(0);
  const size = (n - 2) / buckets;
  for (let b = 0; b < buckets; b++) {
    const from = 1 + Math.floor(b * size);
    const to = Math.min(n - 1, 1 + Math.floor((b + 1) * size));
    let iMin = from;
    let iMax = from;
    for (let i = from + 1; i < to; i++) {
      if (samples[i]! < samples[iMin]!) iMin = i;
      if (samples[i]! > samples[iMax]!) iMax = i;
    }
    if (from >= to) continue;
    for (const i of iMin <= iMax ? [iMin, iMax] : [iMax, iMin]) push(i);
  }
  push(n - 1);
  return { t_ms, v_mV };
}
