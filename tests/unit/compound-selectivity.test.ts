// Selectivity ratios, the choice of potency per target, and the forecast's concentration sweep.
// The values are worked by hand from the inputs of each case (plain arithmetic, no outside source).
import { describe, expect, test } from 'vitest';
import { choosePotencies, type ProfileFit } from '@/lib/compounds/profile-fits';
import { selectivityRatios } from '@/lib/compounds/selectivity';
import { sweepConcentrations } from '@/lib/forecasts/sweep';

let next = 0;
function fit(
  target: string,
  status: ProfileFit['status'],
  value: number | null,
  extra: Partial<ProfileFit> = {},
): ProfileFit {
  next++;
  return {
    fitId: `f${next}`,
    plateId: `p${next}`,
    plateLabel: `P${next}`,
    plateState: 'imported',
    approved: false,
    importedAt: '2026-11-01T00:00:00Z',
    screenId: 's',
    screenName: 'S',
    targetId: target,
    target,
    conductance: 'gNa',
    readout: 'tonic',
    readoutName: null,
    model: 'hill2',
    status,
    message: '',
    ic50_uM: status === 'fitted' ? value : null,
    ic50CiLow_uM: null,
    ic50CiHigh_uM: null,
    ic50LowerBound_uM: status === 'above_range' || status === 'inactive' ? value : null,
    hill: 1,
    r2: null,
    n: 16,
    ...extra,
  };
}

describe('selectivityRatios', () => {
  test.each([
    // [case, A, B, expected text, meaning]
    [
      'both fitted, Nav1.7 stronger',
      fit('Nav1.7', 'fitted', 0.1),
      fit('Kv7.2', 'fitted', 5),
      'Kv7.2 ÷ Nav1.7 = 50',
      '50-fold more potent on Nav1.7',
    ],
    [
      'both fitted, Kv7.2 stronger',
      fit('Nav1.7', 'fitted', 4),
      fit('Kv7.2', 'fitted', 0.5),
      'Nav1.7 ÷ Kv7.2 = 8',
      '8-fold more potent on Kv7.2',
    ],
    [
      'Kv7.2 above range',
      fit('Nav1.7', 'fitted', 0.045),
      fit('Kv7.2', 'above_range', 30),
      'Kv7.2 ÷ Nav1.7 > 667',
      'at least 667-fold more potent on Nav1.7',
    ],
    [
      'Nav1.7 inactive',
      fit('Nav1.7', 'inactive', 30),
      fit('Kv7.2', 'fitted', 0.9),
      'Nav1.7 ÷ Kv7.2 > 33.3',
      'at least 33.3-fold more potent on Kv7.2',
    ],
    [
      'bound below the fitted IC50',
      fit('Nav1.7', 'fitted', 10),
      fit('Kv7.2', 'above_range', 3),
      'Kv7.2 ÷ Nav1.7 > 0.3',
      'the tested range does not show which target is more potent (Kv7.2 IC50 above 3 µM)',
    ],
    [
      'both above range',
      fit('Nav1.7', 'above_range', 30),
      fit('Kv7.2', 'inactive', 30),
      'Nav1.7 ÷ Kv7.2: not determined',
      'Both IC50s lie above the tested range; no ratio can be given.',
    ],
  ])('%s', (_case, a, b, text, meaning) => {
    const [ratio] = selectivityRatios([a, b]);
    expect(ratio!.text).toBe(text);
    expect(ratio!.meaning).toBe(meaning);
  });

  test('three targets give three pairs; a target without potency gives none', () => {
    const ratios = selectivityRatios([
      fit('A', 'fitted', 1),
      fit('B', 'fitted', 2),
      fit('C', 'fitted', 4),
      fit('D', 'not_converged', null),
    ]);
    expect(ratios.map((r) => r.text)).toEqual(['B ÷ A = 2', 'C ÷ A = 4', 'C ÷ B = 2']);
  });

  test('a ratio counts as approved only when both potencies come from approved plates', () => {
    expect(
      selectivityRatios([fit('A', 'fitted', 1, { approved: true }), fit('B', 'fitted', 2)])[0]!.approved,
    ).toBe(false);
    expect(
      selectivityRatios([
        fit('A', 'fitted', 1, { approved: true }),
        fit('B', 'fitted', 2, { approved: true }),
      ])[0]!.approved,
    ).toBe(true);
  });
});

describe('choosePotencies', () => {
  test('an approved plate wins over a newer one that is not approved; unusable fits are skipped', () => {
    const old = fit('Nav1.7', 'fitted', 0.2, {
      approved: true,
      plateState: 'approved',
      importedAt: '2026-10-01T00:00:00Z',
    });
    const newer = fit('Nav1.7', 'fitted', 0.3, { importedAt: '2026-11-20T00:00:00Z' });
    const failed = fit('Kv7.2', 'not_converged', null, { importedAt: '2026-11-21T00:00:00Z' });
    const bound = fit('Kv7.2', 'above_range', 30, { importedAt: '2026-11-02T00:00:00Z' });
    const chosen = choosePotencies([newer, failed, old, bound]);
    expect(chosen.get('Nav1.7')).toBe(old);
    expect(chosen.get('Kv7.2')).toBe(bound);
  });

  test('without approved plates the newest usable fit stands', () => {
    const a = fit('Nav1.7', 'fitted', 0.2, { importedAt: '2026-10-01T00:00:00Z' });
    const b = fit('Nav1.7', 'fitted', 0.3, { importedAt: '2026-11-20T00:00:00Z' });
    expect(choosePotencies([a, b]).get('Nav1.7')).toBe(b);
  });
});

describe('sweepConcentrations', () => {
  test.each([
    [[0.03, 0.1, 0.3, 1], [0.21], [0.03, 0.1, 0.3, 1, 3, 10]],
    [[0.03, 0.1, 0.3, 1], [1.3], [0.03, 0.1, 0.3, 1, 3, 10, 30, 100]],
    [[0.1, 1], [], [0.1, 0.3, 1, 3, 10]],
    [[0.5], [0.05], [0.5, 1, 3, 10]],
    [[], [1], []],
  ])('exposures %j, IC50s %j', (exposures, ic50s, expected) => {
    expect(sweepConcentrations(exposures, ic50s)).toEqual(expected);
  });
});
