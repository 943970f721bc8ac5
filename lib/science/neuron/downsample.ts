/** A voltage trace for plotting. */
export interface VoltageTrace {
  t_ms: number[];
  v_mV: number[];
}

/**
 * Reduce samples taken every dt from t0 to about `points` points, keeping each bucket's minimum and
 * maximum in time order so that spike peaks and troughs survive.
 */
export function downsampleMinMax(samples: ArrayLike<number>, t0_ms: number, dt_ms: number, points: number): VoltageTrace {
  const n = samples.length;
  const t_ms: number[] = [];
  const v_mV: number[] = [];
  const buckets = Math.max(1, Math.floor(points / 2));
  if (n <= points) {
    for (let i = 0; i < n; i++) {
      t_ms.push(t0_ms + i * dt_ms);
      v_mV.push(samples[i]!);
    }
    return { t_ms, v_mV };
  }
  const size = n / buckets;
  for (let b = 0; b < buckets; b++) {
    const from = Math.floor(b * size);
    const to = Math.min(n, Math.floor((b + 1) * size));
    let iMin = from;
    let iMax = from;
    for (let i = from + 1; i < to; i++) {
      if (samples[i]! < samples[iMin]!) iMin = i;
      if (samples[i]! > samples[iMax]!) iMax = i;
    }
    for (const i of iMin <= iMax ? [iMin, iMax] : [iMax, iMin]) {
      if (t_ms.length > 0 && t_ms[t_ms.length - 1] === t0_ms + i * dt_ms) continue;
      t_ms.push(t0_ms + i * dt_ms);
      v_mV.push(samples[i]!);
    }
  }
  return { t_ms, v_mV };
}
