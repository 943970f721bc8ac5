// Gatewell's Hill fits agree with an independent optimiser (ml-levenberg-marquardt) on generated data. Nothing
// of Gatewell's model enters the reference: the data are generated and the reference fits with the Hill
// equation as written out below, and the reference takes its own finite-difference Jacobian. This fails if
// Gatewell's model, its analytic derivatives or its optimiser went wrong in a way that moves the fit.
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { describe, expect, test } from 'vitest';
import { fitHillCurve } from '@/lib/science/fit/hill-curve';
import { resolveHillFitOptions } from '@/lib/science/fit/hill-options';

/**
 * The Hill equation (Hill 1910) as the four-parameter logistic in x = log10 of the concentration in µM:
 * block = bottom + (top − bottom) / (1 + 10^(h · (log10 IC50 − x))); the two-parameter form has bottom 0,
 * top 1. Written here by hand, independent of lib/science.
 */
function hill(x: number, [log10Ic50, slope, bottom = 0, top = 1]: readonly number[]): number {
  return bottom! + (top! - bottom!) / (1 + 10 ** (slope! * (log10Ic50! - x)));
}

/** Deterministic Gaussian noise (mulberry32 + Box–Muller) so the generated data are the same every run. */
function gaussian(seed: number): () => number {
  let state = seed >>> 0;
  const uniform = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

const CONCENTRATIONS_uM = [0.01, 0.03, 0.1, 0.3, 1, 3, 10, 30];

function generate(ic50_uM: number, slope: number, bottom: number, top: number, seed: number) {
  const noise = gaussian(seed);
  const concentration: number[] = [];
  const block: number[] = [];
  for (const c of CONCENTRATIONS_uM) {
    for (let replicate = 0; replicate < 3; replicate++) {
      concentration.push(c);
      block.push(hill(Math.log10(c), [Math.log10(ic50_uM), slope, bottom, top]) + 0.03 * noise());
    }
  }
  return { concentration, block };
}

/**
 * The reference optimiser on the hand-written Hill equation: its own damping scheme and stopping rule, and
 * its own central-difference Jacobian (step 1e-7). The comparison is with where it stopped.
 */
function referenceFit(x: number[], y: number[], start: number[]) {
  return levenbergMarquardt({ x, y }, (p: number[]) => (xi: number) => hill(xi, p), {
    initialValues: start,
    gradientDifference: 1e-7,
    centralDifference: true,
    maxIterations: 5000,
    errorTolerance: 1e-12,
    damping: 1e-2,
  });
}

describe.each([
  ['hill2', 0.2, 0.8, 0, 1, 11],
  ['hill2', 1.5, 1.2, 0, 1, 12],
  ['hill2', 4, 1.7, 0, 1, 13],
  ['hill4', 0.5, 1, 0.05, 0.95, 14],
  ['hill4', 2, 1.4, -0.03, 1.02, 15],
] as const)('%s, IC50 %f µM, slope %f', (model, ic50, slope, bottom, top, seed) => {
  const data = generate(ic50, slope, bottom, top, seed);
  const ours = fitHillCurve(data.concentration, data.block, resolveHillFitOptions({ model }));
  const x = data.concentration.map((c) => Math.log10(c));
  const start = model === 'hill2' ? [0, 1] : [0, 1, 0, 1];
  const reference = referenceFit(x, data.block, start);

  test('parameters agree with the reference optimiser', () => {
    expect(ours.converged).toBe(true);
    const mine = [ours.log10Ic50, ours.hillSlope, ours.bottom, ours.top].slice(0, start.length);
    mine.forEach((value, j) => expect(Math.abs(value - reference.parameterValues[j]!)).toBeLessThan(1e-5));
  });

  test('our residual sum of squares is no larger than the reference optimiser’s', () => {
    expect(ours.rss).toBeLessThanOrEqual(reference.parameterError * (1 + 1e-9));
  });
});
