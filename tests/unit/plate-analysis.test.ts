import { describe, expect, test } from 'vitest';
import { analysePlate, fitKey, type AnalysisReadout, type AnalysisWell } from '@/lib/science/plate-analysis';

// Noise-free generated plate: currents follow simple pore block, block = 1/(1+(IC50/C)^h)
// (Mirams et al. 2011, Cardiovasc Res 91:53–61; pore-block-mirams-2011.json in tests/fixtures/check-values),
// so the fit must return the generating IC50.
const TRUE_IC50_UM = 0.3;
const TRUE_HILL = 1.2;
const CONCENTRATIONS_UM = [0.01, 0.03, 0.1, 0.3, 1, 3, 10];

function plate() {
  const wells: AnalysisWell[] = [];
  const readouts: AnalysisReadout[] = [];
  const base = { sealResistance_GOhm: 2, seriesResistance_MOhm: 8, capacitance_pF: 20, excluded: false };
  const add = (
    id: string,
    role: AnalysisWell['role'],
    concentration: number | null,
    ratio: number,
    extra: Partial<AnalysisWell> = {},
  ) => {
    wells.push({
      id,
      role,
      compoundId: role === 'test' ? 'C1' : null,
      concentration_uM: concentration,
      ...base,
      ...extra,
    });
    readouts.push({
      id: `r-${id}`,
      wellId: id,
      target: 'Nav',
      controlCurrent_pA: -1000,
      compoundCurrent_pA: -1000 * ratio,
    });
  };
  for (let i = 0; i < 4; i += 1) add(`veh${i}`, 'vehicle', 0, 1);
  for (let i = 0; i < 4; i += 1) add(`ref${i}`, 'reference', 1, 0);
  CONCENTRATIONS_UM.forEach((c, i) => {
    const block = 1 / (1 + (TRUE_IC50_UM / c) ** TRUE_HILL);
    add(`t${i}a`, 'test', c, 1 - block);
    add(`t${i}b`, 'test', c, 1 - block);
  });
  return { wells, readouts };
}

describe('plate analysis', () => {
  test('a noise-free plate returns the generating IC50 and Hill slope', () => {
    const { wells, readouts } = plate();
    const analysis = analysePlate(wells, readouts);
    const fit = analysis.fits.find((f) => f.compoundId === 'C1')!;
    expect(fit.result.status).toBe('fitted');
    expect(fit.result.ic50_uM).toBeCloseTo(TRUE_IC50_UM, 6);
    expect(fit.result.hillSlope).toBeCloseTo(TRUE_HILL, 6);
    expect(fit.result.n).toBe(14);
  });

  test('a well failing QC and a well excluded by a person are both left out of the fit', () => {
    const { wells, readouts } = plate();
    wells.find((w) => w.id === 't0a')!.sealResistance_GOhm = 0.1;
    wells.find((w) => w.id === 't1a')!.excluded = true;
    const analysis = analysePlate(wells, readouts, { thresholds: { sealResistanceMin_GOhm: 0.5 } });
    const r = (id: string) => analysis.readouts.find((x) => x.id === `r-${id}`)!;
    expect(r('t0a').qcReasons.map((q) => q.code)).toEqual(['seal_resistance_low']);
    expect(r('t0a').used).toBe(false);
    expect(r('t1a').used).toBe(false);
    expect(r('t1a').block).not.toBeNull();
    expect(analysis.fits[0]!.result.n).toBe(12);
  });

  test('the chosen model per compound × target is used', () => {
    const { wells, readouts } = plate();
    const analysis = analysePlate(wells, readouts, { models: { [fitKey('C1', 'Nav')]: 'hill4' } });
    expect(analysis.fits[0]!.model).toBe('hill4');
    expect(analysis.fits[0]!.result.ic50_uM).toBeCloseTo(TRUE_IC50_UM, 4);
  });

  test('Z′ per target comes from vehicle and reference wells', () => {
    const { wells, readouts } = plate();
    const [target] = analysePlate(wells, readouts).targets;
    // Identical controls: σ = 0, so Z′ = 1 − 0/|μp − μn| = 1 (Zhang, Chung & Oldenburg 1999 definition,
    // zprime-zhang-1999.json).
    expect(target!.zPrime.zPrime).toBeCloseTo(1, 12);
  });
});
