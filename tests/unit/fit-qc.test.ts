// Well QC: every reason, the defaults and their sources, and threshold checking.
import commonPractice from '../fixtures/check-values/qc-common-practice.json';
import lei from '../fixtures/check-values/qc-lei-2019.json';
import { describe, expect, test } from 'vitest';
import { checkWells, type QcWell } from '@/lib/science/qc/qc';
import { DEFAULT_QC_THRESHOLDS, resolveQcThresholds } from '@/lib/science/qc/qc-thresholds';

/** A well inside every default limit (values invented for the test). */
const good: QcWell = {
  wellId: 'A01',
  role: 'test',
  controlCurrent_pA: -1500,
  compoundCurrent_pA: -700,
  sealResistance_GOhm: 1.2,
  seriesResistance_MOhm: 8,
  capacitance_pF: 15,
};

describe('well QC', () => {
  test('defaults: Lei et al. 2019 ranges (seal ≤ 1000 GΩ, capacitance 1–100 pF, series 1–25 MΩ); the rest common practice', () => {
    // Lei et al. 2019, Biophys J 117:2438–2454: seal 0.1–1000 GΩ, capacitance 1–100 pF, series resistance 1–25 MΩ
    // (qc-lei-2019.json). Seal ≥ 0.5 GΩ, control current ≥ 200 pA and vehicle run-down ≤ 20 % are common
    // practice, no source (qc-common-practice.json).
    expect(DEFAULT_QC_THRESHOLDS).toEqual({
      sealResistanceMin_GOhm: commonPractice.sealResistanceMin_GOhm,
      sealResistanceMax_GOhm: lei.sealResistance_GOhm.max,
      controlCurrentMin_pA: commonPractice.controlCurrentMin_pA,
      seriesResistanceMin_MOhm: lei.seriesResistance_MOhm.min,
      seriesResistanceMax_MOhm: lei.seriesResistance_MOhm.max,
      capacitanceMin_pF: lei.capacitance_pF.min,
      capacitanceMax_pF: lei.capacitance_pF.max,
      vehicleRundownMax_fraction: commonPractice.vehicleRundownMax_fraction,
    });
  });

  test('a good well passes', () => {
    expect(checkWells([good])).toEqual([{ wellId: 'A01', passed: true, reasons: [] }]);
  });

  test.each<[string, Partial<QcWell>, string, string]>([
    [
      'seal below minimum',
      { sealResistance_GOhm: 0.3 },
      'seal_resistance_low',
      'Seal resistance 0.3 GΩ is below the minimum of 0.5 GΩ.',
    ],
    [
      'seal above plausible maximum',
      { sealResistance_GOhm: 2000 },
      'seal_resistance_high',
      'Seal resistance 2000 GΩ is above the plausible maximum of 1000 GΩ.',
    ],
    [
      'small inward control current',
      { controlCurrent_pA: -150, compoundCurrent_pA: -100 },
      'control_current_small',
      'Control current -150 pA is smaller than the minimum amplitude of 200 pA.',
    ],
    [
      'series resistance too high',
      { seriesResistance_MOhm: 31 },
      'series_resistance_high',
      'Series resistance 31 MΩ is above the maximum of 25 MΩ.',
    ],
    [
      'series resistance implausibly low',
      { seriesResistance_MOhm: 0.4 },
      'series_resistance_low',
      'Series resistance 0.4 MΩ is below the plausible minimum of 1 MΩ.',
    ],
    [
      'capacitance too large',
      { capacitance_pF: 140 },
      'capacitance_out_of_range',
      'Capacitance 140 pF is outside the range 1 to 100 pF.',
    ],
    ['seal missing', { sealResistance_GOhm: null }, 'missing_value', 'The seal resistance is missing.'],
    ['blank capacitance', { capacitance_pF: '  ' }, 'missing_value', 'The capacitance is missing.'],
    [
      'text in a current',
      { compoundCurrent_pA: 'n/a' },
      'non_numeric_value',
      'The compound current ("n/a") is not a number in pA.',
    ],
    [
      'NaN series resistance',
      { seriesResistance_MOhm: NaN },
      'non_numeric_value',
      'The series resistance ("NaN") is not a number in MΩ.',
    ],
    // Vehicle run-down 1 − (−1100)/(−1500) = 26.7 % > 20 %, by hand.
    [
      'vehicle run-down',
      { role: 'vehicle', compoundCurrent_pA: -1100 },
      'vehicle_rundown',
      'Vehicle well ran down by 27 %, more than the limit of 20 %.',
    ],
  ])('%s', (_case, change, code, message) => {
    const [result] = checkWells([{ ...good, ...change }]);
    expect(result!.passed).toBe(false);
    expect(result!.reasons.map((r) => [r.code, r.message])).toEqual([[code, message]]);
  });

  test('every failing reason is listed, with its field', () => {
    const [result] = checkWells([
      { ...good, sealResistance_GOhm: 0.2, seriesResistance_MOhm: 40, controlCurrent_pA: undefined },
    ]);
    expect(result!.reasons.map((r) => [r.code, r.field])).toEqual([
      ['missing_value', 'controlCurrent_pA'],
      ['seal_resistance_low', 'sealResistance_GOhm'],
      ['series_resistance_high', 'seriesResistance_MOhm'],
    ]);
  });

  test('a compound well may lose current (that is block); a vehicle well within 20 % passes', () => {
    const results = checkWells([
      { ...good, compoundCurrent_pA: -50 },
      { ...good, wellId: 'A02', role: 'vehicle', compoundCurrent_pA: -1300 },
    ]);
    expect(results.map((r) => r.passed)).toEqual([true, true]);
  });

  test('per-screen thresholds replace defaults, and null switches a check and its readout off', () => {
    const well = { ...good, sealResistance_GOhm: 0.8, capacitance_pF: null };
    const [result] = checkWells([well], {
      sealResistanceMin_GOhm: 1,
      capacitanceMin_pF: null,
      capacitanceMax_pF: null,
    });
    expect(result!.reasons.map((r) => r.code)).toEqual(['seal_resistance_low']);
  });

  test.each([
    [
      { controlCurrentMin_pA: -5 },
      'QC threshold controlCurrentMin_pA must be a finite number ≥ 0 or null, got -5',
    ],
    [{ capacitanceMin_pF: 200 }, 'QC threshold capacitanceMin_pF (200) is above capacitanceMax_pF (100)'],
  ])('rejects bad thresholds %j', (overrides, message) => {
    expect(() => resolveQcThresholds(overrides)).toThrow(message);
  });
});
