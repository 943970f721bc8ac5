// The bands' rate runs stop early (firingRate's stopEarly: at a stable fixed point of the drive, or on a
// periodic spike train): the rate must agree with the whole 1 s step's. The reference is Gatewell's own
// model run over the whole step, which is right here: the test is about the shortcut, not the model.
import { describe, expect, test } from 'vitest';
import { seededRandom } from '@/lib/science/forecast/prng';
import { firingRate, PERIODIC_WITHIN_ms } from '@/lib/science/neuron/firing-rate';
import { simulate } from '@/lib/science/neuron/integrate';
import { compileModel } from '@/lib/science/neuron/model';
import { getPreset, PRESET_NAMES } from '@/lib/science/neuron/presets';
import { findRest } from '@/lib/science/neuron/rest';
import { findRheobase } from '@/lib/science/neuron/rheobase';

/** How far the early rate may sit from the whole step's: 0.01 Hz (our choice, no source; the bands' slack is 0.5 Hz). */
const TOLERANCE_HZ = 0.01;
const CASES = 30;

describe.each(PRESET_NAMES)('%s: the rate of a step stopped early', (name) => {
  test(`equals the whole step's within ${TOLERANCE_HZ} Hz at ${CASES} seeded blocks and drives`, () => {
    const preset = getPreset(name);
    const control = compileModel(preset);
    const rheobase = findRheobase(control, findRest(control).start).rheobase_uA_cm2!;
    const blockable = preset.conductances.filter((c) => c.name !== 'gL').map((c) => c.name);
    const random = seededRandom(20);
    let firing = 0;
    for (let i = 0; i < CASES; i++) {
      // Blocks of 0–95 %, most of them small; drives 0.5–4 × the control rheobase.
      const scale = Object.fromEntries(blockable.map((c) => [c, 1 - 0.95 * random.next() ** 2]));
      const drive = rheobase * (0.5 + 3.5 * random.next());
      const model = compileModel(preset, scale);
      const start = findRest(model).start;
      const whole = firingRate(model, start, drive).rate_Hz;
      const early = firingRate(model, start, drive, { stopEarly: true }).rate_Hz;
      expect(Math.abs(early - whole)).toBeLessThanOrEqual(TOLERANCE_HZ);
      expect(early > 0).toBe(whole > 0);
      if (whole > 0) firing++;
    }
    // Both kinds of run are among the cases.
    expect(firing).toBeGreaterThanOrEqual(5);
    expect(firing).toBeLessThanOrEqual(CASES - 5);
  }, 120_000);
});

describe('a periodic stop', () => {
  test('takes the Wang–Buzsáki cell’s steady train after a few spikes, at the whole step’s rate', () => {
    // The fast-spiking cell has no slow current: its train is periodic after a few spikes.
    const model = compileModel(getPreset('wang-buzsaki-1996'));
    const start = findRest(model).start;
    const run = simulate(model, start, {
      current_uA_cm2: 2,
      duration_ms: 1000,
      meanFrom_ms: 500,
      periodicWithin_ms: PERIODIC_WITHIN_ms,
    });
    expect(run.periodic).toBe(true);
    expect(run.simulated_ms).toBeLessThan(500);
    expect(firingRate(model, start, 2, { stopEarly: true }).rate_Hz).toBeCloseTo(
      firingRate(model, start, 2).rate_Hz,
      3,
    );
  });

  test('a step that settles at a stable fixed point stops there', () => {
    // Below the Hodgkin–Huxley cell's repetitive firing: one spike, then rest at the drive's fixed point.
    const model = compileModel(getPreset('hh-squid-1952'));
    const start = findRest(model).start;
    const whole = simulate(model, start, { current_uA_cm2: 3, duration_ms: 1000 });
    expect(whole.spikeTimes_ms.length).toBeLessThanOrEqual(1);
    expect(firingRate(model, start, 3, { stopEarly: true }).rate_Hz).toBe(0);
  });
});
