import 'server-only';

/** Two concentrations whose ratio is within this are the same point of the sweep. */
const SAME = 1e-6;

/**
 * The concentrations a forecast runs at (µM, ascending): the screen's exposures, and a sweep at 1 and 3
 * per decade from the decade of the lowest exposure to a decade above the higher of the top exposure
 * and the strongest used IC50, so that rheobase and rate can be drawn against concentration. At most
 * 40 points (the forecast accepts 50). The 1–3 spacing is common practice for dilution series, no source.
 */
export function sweepConcentrations(exposures_uM: readonly number[], ic50s_uM: readonly number[]): number[] {
  const exposures = exposures_uM.filter((c) => c > 0 && Number.isFinite(c));
  if (exposures.length === 0) return [];
  const lowest = Math.min(...exposures);
  const top = Math.max(...exposures, ...ic50s_uM.filter((c) => c > 0 && Number.isFinite(c)));
  const fromDecade = Math.floor(Math.log10(lowest) + SAME);
  const toDecade = Math.min(fromDecade + 12, Math.ceil(Math.log10(top) - SAME) + 1);
  const sweep: number[] = [];
  for (let d = fromDecade; d <= toDecade; d++) {
    for (const m of [1, 3]) {
      const c = Number((m * 10 ** d).toPrecision(6));
      if (c >= lowest * (1 - SAME) && c <= 10 ** toDecade * (1 + SAME)) sweep.push(c);
    }
  }
  const all = [...exposures, ...sweep].sort((a, b) => a - b);
  return all.filter((c, i) => i === 0 || c / all[i - 1]! > 1 + SAME).slice(0, 40);
}

/** Whether a concentration is one of the exposures (same tolerance as the sweep). */
export function isExposure(concentration_uM: number, exposures_uM: readonly number[]): boolean {
  return exposures_uM.some((e) => Math.abs(concentration_uM / e - 1) <= SAME);
}
