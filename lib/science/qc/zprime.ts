// Plate quality: the Z′ factor of Zhang, Chung & Oldenburg 1999 (J Biomol Screen 4:67–73).
import { mean, sampleStandardDeviation } from 'simple-statistics';

/** Zhang et al. 1999: 0.5 ≤ Z′ ≤ 1 excellent, 0 < Z′ < 0.5 marginal, Z′ ≤ 0 unusable for screening. */
export type ZPrimeBand = 'excellent' | 'marginal' | 'unusable';

export interface ControlStatistics {
  /** Wells used. */
  n: number;
  /** Mean (same unit as the values, here fractional block); null without wells. */
  mean: number | null;
  /** Sample standard deviation (n − 1); null with fewer than 2 wells. */
  sd: number | null;
}

export interface ZPrimeResult {
  zPrime: number | null;
  band: ZPrimeBand | null;
  /** Z′ at or above the screen's limit. */
  passes: boolean;
  limit: number;
  reference: ControlStatistics;
  vehicle: ControlStatistics;
  message: string;
}

/** Z′ = 1 − 3(σp + σn)/|μp − μn| from control means and standard deviations (Zhang et al. 1999). */
export function zPrimeFromStatistics(
  positive: { mean: number; sd: number },
  negative: { mean: number; sd: number },
): number {
  return 1 - (3 * (positive.sd + negative.sd)) / Math.abs(positive.mean - negative.mean);
}

/** The band of a Z′ value (Zhang et al. 1999). */
export function zPrimeBand(zPrime: number): ZPrimeBand {
  return zPrime >= 0.5 ? 'excellent' : zPrime > 0 ? 'marginal' : 'unusable';
}

/**
 * Z′ of one plate and target from its reference-blocker (positive) and vehicle (negative) wells.
 * @param limit the screen's lowest acceptable Z′. @default 0.5 (Gatewell design; Zhang et al. 1999 "excellent" bound)
 */
export function plateZPrime(
  reference: ArrayLike<number>,
  vehicle: ArrayLike<number>,
  limit = 0.5,
): ZPrimeResult {
  if (!Number.isFinite(limit)) throw new RangeError(`Z′ limit must be a finite number, got ${limit}`);
  const ref = describe(reference, 'reference');
  const veh = describe(vehicle, 'vehicle');
  const base = { limit, reference: ref, vehicle: veh };
  if (ref.sd === null || veh.sd === null) {
    return {
      ...base,
      zPrime: null,
      band: null,
      passes: false,
      message: `Z′ needs at least 2 reference and 2 vehicle wells; ${ref.n} and ${veh.n} in use.`,
    };
  }
  if (ref.mean === veh.mean) {
    return {
      ...base,
      zPrime: null,
      band: 'unusable',
      passes: false,
      message: 'Reference and vehicle wells have the same mean: no assay window.',
    };
  }
  const zPrime = zPrimeFromStatistics({ mean: ref.mean!, sd: ref.sd }, { mean: veh.mean!, sd: veh.sd });
  const band = zPrimeBand(zPrime);
  const passes = zPrime >= limit;
  const shown = zPrime.toFixed(2);
  return {
    ...base,
    zPrime,
    band,
    passes,
    message: passes
      ? `Z′ ${shown} (${band}).`
      : `Z′ ${shown} (${band}) is below the screen's limit of ${limit}.`,
  };
}

function describe(values: ArrayLike<number>, name: string): ControlStatistics {
  const list = Array.from(values);
  if (!list.every(Number.isFinite)) throw new RangeError(`${name} values must be finite numbers`);
  return {
    n: list.length,
    mean: list.length > 0 ? mean(list) : null,
    sd: list.length > 1 ? sampleStandardDeviation(list) : null,
  };
}
