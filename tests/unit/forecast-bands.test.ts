// Uncertainty bands of a forecast: coverage of a known truth, collapse without uncertainty, reproducibility.
import { afterAll, describe, expect, test } from 'vitest';
import { closeForecastPool, runForecast } from '@/lib/compute/forecast-pool';
import { fitHill } from '@/lib/science/fit/hill-fit';
import { bandOf, quantileSorted } from '@/lib/science/forecast/bands';
import { computeForecast } from '@/lib/science/forecast/forecast';
import { parseForecastRequest } from '@/lib/science/forecast/request-schema';
import { cholesky2 } from '@/lib/science/forecast/uncertainty';
import { CONCENTRATIONS_UM, NOISE } from '@/tests/fixtures/export-layouts/truth';
import { DEMO_COMPOUNDS, trueBlock } from '@/scripts/demo-plates/demo-compounds';
import { makeRandom } from '@/scripts/demo-plates/random';

afterAll(closeForecastPool);

/**
 * A short protocol for the tests only (coarser step, shorter steps than the app's defaults) so that the
 * coverage test's 100 replicates × 200 draws of the model stay well under a minute on a shared machine;
 * the truth and the bands use the same protocol, so coverage is judged like for like.
 */
const QUICK = { dt_ms: 0.1, stepMs: 50, rateStepMs: 100 } as const;
const PRESET = 'pospischil-rs-2008' as const;

/** An invented demo compound's true sodium-channel potency (scripts/demo-plates/demo-compounds.ts). */
const TRUTH = DEMO_COMPOUNDS[0]!.truth['Nav1.7'];

/**
 * Scatter of an observed block around the truth: the invented demo noise (tests/fixtures/export-layouts/truth.ts),
 * vehicle run-down spread and ratio scatter combined, σ ≈ 0.032.
 */
const SD = Math.hypot(NOISE.rundownSd, NOISE.ratioSd);

/** One simulated plate's wells of the compound on the target: 3 replicates at each of the 8 concentrations. */
function simulatedWells(seed: number) {
  const random = makeRandom(seed);
  const wells: { concentration_uM: number; block: number }[] = [];
  for (const c of CONCENTRATIONS_UM)
    for (let k = 0; k < 3; k++)
      wells.push({ concentration_uM: c, block: trueBlock(c, TRUTH) + random.normal(0, SD) });
  return wells;
}

function fitOf(wells: { concentration_uM: number; block: number }[]) {
  const fit = fitHill({
    concentration_uM: wells.map((w) => w.concentration_uM),
    block: wells.map((w) => w.block),
  });
  expect(fit.status).toBe('fitted');
  const cov = fit.estimate!.covariance!;
  return {
    ic50: fit.ic50_uM!,
    hill: fit.hillSlope!,
    degreesOfFreedom: fit.estimate!.degreesOfFreedom,
    covariance: [
      [cov[0]![0]!, cov[0]![1]!],
      [cov[1]![0]!, cov[1]![1]!],
    ],
  };
}

const bandRequest = (
  { ic50, hill }: { ic50: number; hill: number },
  covariance: number[][] | null,
  degreesOfFreedom: number | null,
  concentrations: number[],
  seed: number,
  draws = 200,
) => ({
  preset: PRESET,
  potencies: { gNa: { ic50, hill } },
  concentrations,
  protocol: QUICK,
  trace: false as const,
  uncertainty: { seed, draws, potencies: { gNa: { covariance, degreesOfFreedom } } },
});

describe('quantiles', () => {
  test('type 7 quantiles match R’s quantile() default on 1…10 (R documentation, type 7; values from memory)', () => {
    const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    // quantile(1:10, c(0.025, 0.5, 0.975)) in R gives 1.225, 5.5, 9.775.
    expect(quantileSorted(x, 0.025)).toBeCloseTo(1.225, 12);
    expect(quantileSorted(x, 0.5)).toBeCloseTo(5.5, 12);
    expect(quantileSorted(x, 0.975)).toBeCloseTo(9.775, 12);
  });

  test('a rheobase that never comes counts above every value', () => {
    const b = bandOf([1, 2, 3, null], 'infinity');
    expect(b.missing).toBe(1);
    expect(b.high).toBeNull();
    expect(b.low).toBeCloseTo(1.075, 12);
  });

  test('an indefinite or asymmetric covariance is not used', () => {
    expect(
      cholesky2([
        [1, 2],
        [2, 1],
      ]),
    ).toBeNull();
    expect(
      cholesky2([
        [1, 0.1],
        [0.3, 1],
      ]),
    ).toBeNull();
    expect(
      cholesky2([
        [4, 2],
        [2, 5],
      ]),
    ).toEqual([2, 1, 2]);
  });
});

describe('bands', () => {
  test('zero covariance collapses every band to the point forecast', () => {
    const r = computeForecast(
      bandRequest(
        { ic50: TRUTH.ic50_uM, hill: TRUTH.hillSlope },
        [
          [0, 0],
          [0, 0],
        ],
        20,
        [TRUTH.ic50_uM, 3 * TRUTH.ic50_uM],
        1,
        20,
      ),
    );
    expect(r.bands!.conditions).toHaveLength(2);
    r.bands!.conditions.forEach((b, i) => {
      const band = b!;
      const m = r.conditions[i]!.measures;
      expect(m.rheobase_uA_cm2).not.toBeNull();
      for (const q of [band.rheobase_uA_cm2.low, band.rheobase_uA_cm2.median, band.rheobase_uA_cm2.high])
        expect(q).toBe(m.rheobase_uA_cm2);
      for (const q of [band.threshold_mV.low, band.threshold_mV.high]) expect(q).toBe(m.threshold_mV);
      for (const q of [band.referenceRate_Hz.low, band.referenceRate_Hz.high])
        expect(q).toBe(m.referenceRate_Hz);
    });
  });

  test('the same seed gives the same band, another seed another one, on threads as in this thread', async () => {
    const fit = fitOf(simulatedWells(7));
    const request = bandRequest(fit, fit.covariance, fit.degreesOfFreedom, [TRUTH.ic50_uM], 11, 40);
    const once = computeForecast(request);
    const again = computeForecast(request);
    expect(again.bands).toEqual(once.bands);
    const pooled = await runForecast(request);
    expect(pooled.bands).toEqual(once.bands);
    const other = computeForecast({ ...request, uncertainty: { ...request.uncertainty, seed: 12 } });
    expect(other.bands!.conditions[0]!.rheobase_uA_cm2).not.toEqual(
      once.bands!.conditions[0]!.rheobase_uA_cm2,
    );
  });

  test('without a covariance the wells are bootstrapped, reproducibly', () => {
    const wells = simulatedWells(3);
    const fit = fitOf(wells);
    const request = {
      ...bandRequest(fit, null, null, [TRUTH.ic50_uM], 5, 30),
      uncertainty: { seed: 5, draws: 30, potencies: { gNa: { covariance: null, wells } } },
    };
    const r = computeForecast(request);
    expect(r.bands!.sources).toEqual([expect.objectContaining({ conductance: 'gNa', source: 'bootstrap' })]);
    const block = r.bands!.conditions[0]!.block.gNa!;
    expect(block.low!).toBeLessThan(block.high!);
    expect(computeForecast(request).bands).toEqual(r.bands);
  });

  test('only the concentrations asked for get a band', () => {
    const fit = fitOf(simulatedWells(9));
    const request = bandRequest(fit, fit.covariance, fit.degreesOfFreedom, [TRUTH.ic50_uM, 1], 2, 10);
    const r = computeForecast({
      ...request,
      uncertainty: { ...request.uncertainty, concentrations: [1] },
    });
    expect(r.bands!.conditions[0]).toBeNull();
    expect(r.bands!.conditions[1]!.rheobase_uA_cm2.low).not.toBeNull();
  });

  test('bands need potencies, and uncertainty only of conductances with a potency', () => {
    expect(() =>
      parseForecastRequest({ preset: 'hh-squid-1952', block: { gNa: 0.5 }, uncertainty: { seed: 1 } }),
    ).toThrow('uncertainty bands need potencies');
    expect(() =>
      parseForecastRequest({
        preset: 'hh-squid-1952',
        potencies: { gNa: { ic50: 1, hill: 1 } },
        concentrations: [1],
        uncertainty: { seed: 1, potencies: { gK: { covariance: null } } },
      }),
    ).toThrow('uncertainty given for "gK", which has no potency');
  });

  test('the truth’s forecast lies inside the 95 % band in at least 90 % of 200 simulated plates', () => {
    // One concentration (the true IC50) and the short protocol; with the bands' few runs per concentration
    // (band-cell.ts) the 200 replicates took 4.5–15.5 s (load average 6–17) on this 2-core machine. 200 plates
    // rather than 100: with 100 the binomial error (± 2.3 %) is as large as the margin between the nominal
    // 95 % and the 90 % asked for (on the first 100 seeds the fit's own Wald interval of log IC50 covered
    // the truth 91 times).
    const at = [TRUTH.ic50_uM];
    const truth = computeForecast({
      preset: PRESET,
      potencies: { gNa: { ic50: TRUTH.ic50_uM, hill: TRUTH.hillSlope } },
      concentrations: at,
      protocol: QUICK,
      trace: false,
    }).conditions[0]!.measures.rheobase_uA_cm2!;
    let inside = 0;
    const replicates = 200;
    for (let r = 0; r < replicates; r++) {
      const fit = fitOf(simulatedWells(1000 + r));
      const band = computeForecast(bandRequest(fit, fit.covariance, fit.degreesOfFreedom, at, r)).bands!
        .conditions[0]!.rheobase_uA_cm2;
      if (band.low! <= truth && truth <= band.high!) inside++;
    }
    expect(inside / replicates).toBeGreaterThanOrEqual(0.9);
  }, 120_000);
});
