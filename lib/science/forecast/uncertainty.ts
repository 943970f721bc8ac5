import { fitHill } from '../fit/hill-fit';
import type { HillModelName } from '../fit/hill-model';
import type { SeededRandom } from './prng';

/** Where the draws of one potency come from. */
export type DrawSource = 'covariance' | 'bootstrap' | 'none';

/** What is known of one fit's uncertainty (the forecast request's `uncertainty.potencies[conductance]`). */
export interface PotencyUncertaintyInput {
  /**
   * Joint covariance of (log10 IC50, Hill slope) from the fit, 2 × 2 (for a four-parameter fit the
   * top-left block of its covariance). Null or absent: none usable.
   */
  covariance?: number[][] | null;
  /**
   * Degrees of freedom behind the covariance (n − p, or cells − 1): draws then follow the multivariate t,
   * as the fit's own confidence interval does (t₀.₉₇₅,ν). Absent: the normal.
   */
  degreesOfFreedom?: number | null;
  /** The fit's wells, for a bootstrap where the covariance is unusable. */
  wells?: { concentration_uM: number; block: number }[];
  /** The model the wells were fitted with. @default 'hill2' */
  model?: HillModelName;
}

export interface PotencyDraws {
  conductance: string;
  source: DrawSource;
  /** log10 IC50 and Hill slope per draw. */
  log10Ic50: Float64Array;
  hill: Float64Array;
  /** One sentence for the user: how the draws were made, or why there are none. */
  note: string;
}

/** The Hill slopes the forecast accepts (request-schema.ts): draws are held inside. */
const HILL_LIMITS = [0.01, 10] as const;

/**
 * Cholesky factor of a 2 × 2 covariance, or null when it is not a finite, symmetric, positive
 * semi-definite matrix. A zero matrix is usable (every draw then equals the estimate).
 */
export function cholesky2(c: number[][] | null | undefined): [number, number, number] | null {
  if (!c || c.length < 2 || !c[0] || !c[1] || c[0].length < 2 || c[1].length < 2) return null;
  const a = c[0][0]!;
  const b = c[0][1]!;
  const b2 = c[1][0]!;
  const d = c[1][1]!;
  if (![a, b, b2, d].every(Number.isFinite)) return null;
  const scale = Math.max(Math.abs(a), Math.abs(d), 1e-300);
  if (Math.abs(b - b2) > 1e-9 * scale) return null;
  if (a < 0 || d < 0) return null;
  const l11 = Math.sqrt(a);
  const l21 = l11 > 0 ? b / l11 : 0;
  if (l11 === 0 && Math.abs(b) > 1e-12 * scale) return null;
  const rest = d - l21 * l21;
  if (rest < -1e-9 * scale) return null;
  return [l11, l21, Math.sqrt(Math.max(rest, 0))];
}

const clampHill = (h: number) => Math.min(HILL_LIMITS[1], Math.max(HILL_LIMITS[0], h));

/**
 * `draws` joint draws of (log10 IC50, Hill slope) for one fit: from the normal (or, given the degrees
 * of freedom, the multivariate t) with the fit's covariance when it is usable; else a case bootstrap of its wells (resampled with replacement and
 * refitted, resamples without a fitted IC50 redrawn, at most 5 × draws tries); else none (every draw the
 * estimate, said in the note). Slopes are held within 0.01–10, the range the forecast accepts.
 */
export function drawPotency(
  conductance: string,
  estimate: { ic50: number; hill: number },
  input: PotencyUncertaintyInput | undefined,
  draws: number,
  random: SeededRandom,
): PotencyDraws {
  const log10Ic50 = new Float64Array(draws).fill(Math.log10(estimate.ic50));
  const hill = new Float64Array(draws).fill(estimate.hill);
  const factor = cholesky2(input?.covariance);
  if (factor) {
    const [l11, l21, l22] = factor;
    const nu = input?.degreesOfFreedom ?? null;
    const t = nu !== null && nu >= 1 && nu <= 1000 ? Math.round(nu) : null;
    let held = 0;
    for (let i = 0; i < draws; i++) {
      // Multivariate t: a normal draw divided by √(χ²ν/ν), χ²ν as a sum of ν squared normals.
      let w = 1;
      if (t !== null) {
        let chi2 = 0;
        for (let k = 0; k < t; k++) chi2 += random.normal() ** 2;
        w = Math.sqrt(t / chi2);
      }
      const z1 = w * random.normal();
      const z2 = w * random.normal();
      log10Ic50[i] = Math.log10(estimate.ic50) + l11 * z1;
      const h = estimate.hill + l21 * z1 + l22 * z2;
      hill[i] = clampHill(h);
      if (hill[i] !== h) held++;
    }
    return {
      conductance,
      source: 'covariance',
      log10Ic50,
      hill,
      note: `Drawn from the fit’s joint covariance of log IC50 and Hill slope (${t === null ? 'normal' : `t, ${t} degrees of freedom`})${held > 0 ? ` (${held} slope draw(s) held within 0.01–10)` : ''}.`,
    };
  }
  const wells = input?.wells ?? [];
  if (wells.length >= 3) {
    const n = wells.length;
    const c = new Float64Array(n);
    const b = new Float64Array(n);
    let got = 0;
    let tries = 0;
    while (got < draws && tries < 5 * draws) {
      tries++;
      for (let k = 0; k < n; k++) {
        const w = wells[random.below(n)]!;
        c[k] = w.concentration_uM;
        b[k] = w.block;
      }
      const fit = fitHill({ concentration_uM: c, block: b }, { model: input?.model ?? 'hill2' });
      if (fit.status !== 'fitted' || fit.ic50_uM === null || fit.hillSlope === null) continue;
      log10Ic50[got] = Math.log10(fit.ic50_uM);
      hill[got] = clampHill(fit.hillSlope);
      got++;
    }
    if (got === draws) {
      return {
        conductance,
        source: 'bootstrap',
        log10Ic50,
        hill,
        note: `No usable covariance: bootstrap of the fit’s ${n} wells (${draws} refits${tries > draws ? `, ${tries - draws} resample(s) without an IC50 redrawn` : ''}).`,
      };
    }
    log10Ic50.fill(Math.log10(estimate.ic50));
    hill.fill(estimate.hill);
    return {
      conductance,
      source: 'none',
      log10Ic50,
      hill,
      note: `No usable covariance, and too few bootstrap resamples of its ${n} wells gave an IC50 (${got} of ${tries}): this fit’s uncertainty is not in the band.`,
    };
  }
  return {
    conductance,
    source: 'none',
    log10Ic50,
    hill,
    note: 'No usable covariance and no wells to resample: this fit’s uncertainty is not in the band.',
  };
}
