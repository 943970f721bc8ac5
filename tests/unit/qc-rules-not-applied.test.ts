// QC rules whose readout a file does not carry: not applied and said so, while every other rule, Z′ and
// the fits still run.
import { describe, expect, test } from 'vitest';
import { analysePlate, type AnalysisReadout, type AnalysisWell } from '@/lib/science/plate-analysis';
import { checkWells, type QcWell } from '@/lib/science/qc/qc';
import { qcRulesNotApplied, readoutsAbsentFromEveryWell } from '@/lib/science/qc/qc-rules';
import { DEFAULT_QC_THRESHOLDS } from '@/lib/science/qc/qc-thresholds';

// A generated plate of known truth: currents follow simple pore block, block = 1/(1+(IC50/C)^h)
// (Mirams et al. 2011, Cardiovasc Res 91:53–61; pore-block-mirams-2011.json in tests/fixtures/check-values),
// vehicle wells keep their current and reference wells lose all of it. Three wells are bad by construction.
const TRUE_IC50_UM = 0.3;
const TRUE_HILL = 1.2;
const CONCENTRATIONS_UM = [0.01, 0.03, 0.1, 0.3, 1, 3, 10];
/** The truth's bad wells, and why: a leaky seal, a cell too large, a control current too small. */
const BAD = { t2a: { sealResistance_GOhm: 0.2 }, t4b: { capacitance_pF: 140 }, veh3: {} } as const;
const SMALL_CONTROL_WELL = 'veh3';

/** The plate; `series` gives each well's series resistance (null: the file has no such column). */
function plate(series: (id: string) => number | null) {
  const wells: AnalysisWell[] = [];
  const readouts: AnalysisReadout[] = [];
  const add = (id: string, role: AnalysisWell['role'], concentration: number | null, ratio: number) => {
    const bad: Partial<AnalysisWell> = id in BAD ? BAD[id as keyof typeof BAD] : {};
    wells.push({
      id,
      role,
      compoundId: role === 'test' ? 'C1' : null,
      concentration_uM: concentration,
      sealResistance_GOhm: 2,
      seriesResistance_MOhm: series(id),
      capacitance_pF: 20,
      excluded: false,
      ...bad,
    });
    const control = id === SMALL_CONTROL_WELL ? -150 : -1000;
    readouts.push({
      id: `r-${id}`,
      wellId: id,
      target: 'Kv7.2',
      controlCurrent_pA: control,
      compoundCurrent_pA: control * ratio,
    });
  };
  // Vehicle and reference wells a little apart, so Z′ has a spread to work with (values invented).
  [1, 0.98, 1.02, 1].forEach((ratio, i) => add(`veh${i}`, 'vehicle', 0, ratio));
  [0, 0.01, 0.02, 0.01].forEach((ratio, i) => add(`ref${i}`, 'reference', 1, ratio));
  CONCENTRATIONS_UM.forEach((c, i) => {
    const block = 1 / (1 + (TRUE_IC50_UM / c) ** TRUE_HILL);
    add(`t${i}a`, 'test', c, 1 - block);
    add(`t${i}b`, 'test', c, 1 - block);
  });
  return { wells, readouts };
}

const flagged = (analysis: ReturnType<typeof analysePlate>) =>
  analysis.readouts.filter((r) => r.qcReasons.length > 0).map((r) => r.id.replace(/^r-/, ''));

describe('a QC rule whose readout is in no well is not applied', () => {
  test('a file without series resistance: the rule is listed as not applied, the others flag exactly the bad wells', () => {
    const { wells, readouts } = plate(() => null);
    const analysis = analysePlate(wells, readouts);

    expect(analysis.qcRulesNotApplied).toEqual([
      {
        rule: 'series_resistance',
        field: 'seriesResistance_MOhm',
        label: 'series resistance',
        message:
          'The series resistance rule (1 to 25 MΩ) was not applied: no well has a series resistance. The other QC rules, Z′ and the fits still run.',
      },
    ]);
    expect(flagged(analysis).sort()).toEqual(Object.keys(BAD).sort());
    const reasons = (id: string) =>
      analysis.readouts.find((r) => r.id === `r-${id}`)!.qcReasons.map((q) => q.code);
    expect(reasons('t2a')).toEqual(['seal_resistance_low']);
    expect(reasons('t4b')).toEqual(['capacitance_out_of_range']);
    expect(reasons('veh3')).toEqual(['control_current_small']);

    // Z′ from the 3 good vehicle and 4 reference wells, and the fit from the 12 good test wells.
    const [target] = analysis.targets;
    expect(target!.zPrime.zPrime).not.toBeNull();
    expect(target!.zPrime.vehicle.n).toBe(3);
    expect(target!.zPrime.reference.n).toBe(4);
    expect(target!.qcRulesNotApplied).toEqual(analysis.qcRulesNotApplied);
    const [fit] = analysis.fits;
    expect(fit!.result.status).toBe('fitted');
    expect(fit!.result.n).toBe(12);
    expect(fit!.result.ic50_uM).toBeCloseTo(TRUE_IC50_UM, 2);
  });

  test('a file with every readout: every rule applies and the QC summary has no such entry', () => {
    const { wells, readouts } = plate(() => 8);
    const analysis = analysePlate(wells, readouts);
    expect(analysis.qcRulesNotApplied).toEqual([]);
    expect(analysis.targets[0]).not.toHaveProperty('qcRulesNotApplied');
    expect(flagged(analysis).sort()).toEqual(Object.keys(BAD).sort());
  });

  test('series resistance in some wells only: the rule applies and the wells without it fail', () => {
    const { wells, readouts } = plate((id) => (id === 't0a' ? 8 : id === 't6b' ? 40 : null));
    const analysis = analysePlate(wells, readouts);
    expect(analysis.qcRulesNotApplied).toEqual([]);
    const reasons = (id: string) =>
      analysis.readouts.find((r) => r.id === `r-${id}`)!.qcReasons.map((q) => q.code);
    expect(reasons('t0a')).toEqual([]);
    expect(reasons('t6b')).toEqual(['series_resistance_high']);
    expect(reasons('t1a')).toEqual(['missing_value']);
  });

  test('a rule the screen switched off is not reported as not applied', () => {
    const { wells, readouts } = plate(() => null);
    const analysis = analysePlate(wells, readouts, {
      thresholds: { seriesResistanceMin_MOhm: null, seriesResistanceMax_MOhm: null },
    });
    expect(analysis.qcRulesNotApplied).toEqual([]);
    expect(flagged(analysis).sort()).toEqual(Object.keys(BAD).sort());
  });

  test('seal, series resistance and capacitance all absent: three rules not applied, currents still judged', () => {
    const { wells, readouts } = plate(() => null);
    const bare = wells.map((w) => ({ ...w, sealResistance_GOhm: null, capacitance_pF: null }));
    const analysis = analysePlate(bare, readouts);
    expect(analysis.qcRulesNotApplied.map((r) => [r.rule, r.message])).toEqual([
      [
        'seal_resistance',
        'The seal resistance rule (0.5 to 1000 GΩ) was not applied: no well has a seal resistance. The other QC rules, Z′ and the fits still run.',
      ],
      [
        'series_resistance',
        'The series resistance rule (1 to 25 MΩ) was not applied: no well has a series resistance. The other QC rules, Z′ and the fits still run.',
      ],
      [
        'capacitance',
        'The capacitance rule (1 to 100 pF) was not applied: no well has a capacitance. The other QC rules, Z′ and the fits still run.',
      ],
    ]);
    expect(flagged(analysis)).toEqual([SMALL_CONTROL_WELL]);
  });
});

describe('the QC rule building blocks', () => {
  const well: QcWell = {
    wellId: 'A01',
    role: 'test',
    controlCurrent_pA: -1500,
    compoundCurrent_pA: -700,
    sealResistance_GOhm: 1.2,
    seriesResistance_MOhm: null,
    capacitance_pF: '  ',
  };

  test('checkWells skips only the readouts it is told are absent', () => {
    expect(checkWells([well])[0]!.reasons.map((r) => [r.code, r.field])).toEqual([
      ['missing_value', 'seriesResistance_MOhm'],
      ['missing_value', 'capacitance_pF'],
    ]);
    expect(checkWells([well], {}, { absentReadouts: ['seriesResistance_MOhm'] })[0]!.reasons).toEqual([
      { code: 'missing_value', field: 'capacitance_pF', message: 'The capacitance is missing.' },
    ]);
  });

  test('absent means missing or blank in every well; an empty plate has nothing absent', () => {
    expect(readoutsAbsentFromEveryWell([well, { ...well, sealResistance_GOhm: '' }])).toEqual([
      'seriesResistance_MOhm',
      'capacitance_pF',
    ]);
    expect(readoutsAbsentFromEveryWell([well, { ...well, capacitance_pF: 12 }])).toEqual([
      'seriesResistance_MOhm',
    ]);
    expect(readoutsAbsentFromEveryWell([])).toEqual([]);
  });

  test('a one-sided rule names its open side', () => {
    const thresholds = { ...DEFAULT_QC_THRESHOLDS, capacitanceMax_pF: null };
    expect(qcRulesNotApplied(['capacitance_pF'], thresholds)[0]!.message).toBe(
      'The capacitance rule (at least 1 pF) was not applied: no well has a capacitance. The other QC rules, Z′ and the fits still run.',
    );
  });
});
