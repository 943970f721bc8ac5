// Fractional block per well: run-down correction, normalisation, Z′ per target, excluded wells.
import { describe, expect, test } from 'vitest';
import { computeFractionalBlock, type BlockWell } from '@/lib/science/fit/block';
import type { WellRole } from '@/lib/science/qc/well';

const well = (
  wellId: string,
  role: WellRole,
  control: number | null,
  compound: number | null,
  excluded = false,
  target = 'NaV',
): BlockWell => ({
  wellId,
  target,
  role,
  controlCurrent_pA: control,
  compoundCurrent_pA: compound,
  excluded,
});

// Values chosen so the design's formulas can be worked by hand (Gatewell design, section 4):
// vehicle ratios 0.9 and 0.8 (mean 0.85); reference ratios 0.1 and 0.05; one compound well at ratio 0.425.
const plate: BlockWell[] = [
  well('A01', 'vehicle', -1000, -900),
  well('A02', 'vehicle', -1000, -800),
  well('A03', 'reference', -1000, -100),
  well('A04', 'reference', -2000, -100),
  well('B01', 'test', -2000, -850),
];

describe('fractional block', () => {
  test('block = 1 − I_compound/I_control without corrections', () => {
    const [target] = computeFractionalBlock(plate, { rundownCorrection: false });
    // 1 − 850/2000 = 0.575, by hand.
    expect(target!.wells.find((w) => w.wellId === 'B01')!.block).toBeCloseTo(0.575, 12);
    expect(target!.rundownCorrected).toBe(false);
  });

  test('run-down correction divides the ratio by the mean vehicle ratio', () => {
    const [target] = computeFractionalBlock(plate);
    // 1 − 0.425/0.85 = 0.5; vehicle wells become 1 − 0.9/0.85 and 1 − 0.8/0.85, mean 0 (by hand).
    expect(target!.vehicleMeanRatio).toBeCloseTo(0.85, 12);
    expect(target!.wells.find((w) => w.wellId === 'B01')!.block).toBeCloseTo(0.5, 12);
    expect(target!.wells[0]!.block! + target!.wells[1]!.block!).toBeCloseTo(0, 12);
  });

  test('normalisation maps the vehicle mean to 0 and the reference-blocker mean to 1', () => {
    const [target] = computeFractionalBlock(plate, { normalise: true });
    // Corrected reference blocks 1 − 0.1/0.85 and 1 − 0.05/0.85, mean 1 − 0.075/0.85 = 0.911765;
    // compound 0.5/0.911765 = 0.548387 (by hand).
    expect(target!.normalised).toBe(true);
    expect(target!.wells.find((w) => w.wellId === 'B01')!.block).toBeCloseTo(0.548387, 6);
  });

  test('Z′ per target from the reference and vehicle wells in use', () => {
    const [target] = computeFractionalBlock(plate);
    // Uncorrected ratios, Z′ unchanged by scaling: reference block 0.9, 0.95 (SD 0.035355), vehicle 0.1, 0.2
    // (SD 0.070711), |Δμ| = 0.775: Z′ = 1 − 3(0.106066)/0.775 = 0.589422 (by hand).
    expect(target!.zPrime.zPrime).toBeCloseTo(0.589422, 6);
    expect(target!.zPrime.band).toBe('excellent');
  });

  test('excluded wells keep their block but leave the means; targets stay apart', () => {
    const wells = [
      ...plate,
      well('A05', 'vehicle', -1000, -300, true),
      well('C01', 'vehicle', -500, -500, false, 'KV'),
    ];
    const [nav, kv] = computeFractionalBlock(wells);
    expect(nav!.vehicleMeanRatio).toBeCloseTo(0.85, 12);
    expect(nav!.wells.find((w) => w.wellId === 'A05')!.block).toBeCloseTo(1 - 0.3 / 0.85, 12);
    expect(kv).toMatchObject({ target: 'KV', vehicleMeanRatio: 1 });
    expect(kv!.zPrime.zPrime).toBeNull();
  });

  test('a well without both currents, or with a zero control, has no block', () => {
    const [target] = computeFractionalBlock([
      ...plate,
      well('B02', 'test', null, -100),
      well('B03', 'test', 0, -100),
    ]);
    expect(target!.wells.slice(-2).map((w) => [w.ratio, w.block])).toEqual([
      [null, null],
      [null, null],
    ]);
  });

  test('without vehicle wells: no correction, and a note says why', () => {
    const [target] = computeFractionalBlock([well('B01', 'test', -2000, -850)], { normalise: true });
    expect(target!.rundownCorrected).toBe(false);
    expect(target!.normalised).toBe(false);
    expect(target!.notes.map((n) => n.code)).toEqual(['no_vehicle_wells', 'no_reference_wells']);
    expect(target!.wells[0]!.block).toBeCloseTo(0.575, 12);
  });

  test('inputs are not mutated', () => {
    const copy = structuredClone(plate);
    computeFractionalBlock(plate, { normalise: true });
    expect(plate).toEqual(copy);
  });
});
