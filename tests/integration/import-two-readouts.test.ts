import { beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { readoutRatio } from '@/lib/domain/fits';
import type { ColumnMappingInput } from '@/lib/imports/mapping-schema';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { addTarget, createScreen } from '@/lib/screens/service';
import { screenSchema } from '@/lib/validation/screens';
import {
  FILE_TARGETS,
  TRUTH,
  TWO_READOUT_MAPPING,
  twoReadoutExport,
  type FileTarget,
} from '../fixtures/two-readouts/two-readout-export';
import { makeActor } from '../support/actors';
import { DEMO_SCREEN_SETTINGS, demoScreensSetup } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';

/**
 * An export with a tonic (first pulse) and a use-dependent (tenth pulse) block per well and target
 * (tests/fixtures/two-readouts) through the import service: each readout is fitted on its own. Criteria:
 * IC50 within ±15 % of the invented truth with its 95 % CI holding it, as for the export layouts (common
 * practice for a recovered potency, no published source), and the ratio tonic ÷ use-dependent IC50 within
 * ±25 % of the truth's (two such errors compounded).
 */

let biologist: Actor;
let screenId: string;
let twoReadoutScreenId: string;

beforeAll(async () => {
  const setup = await demoScreensSetup();
  biologist = setup.biologist;
  const admin = await makeActor(['admin']);
  const screen = await createScreen(
    admin,
    screenSchema.parse({ ...DEMO_SCREEN_SETTINGS, name: 'Use-dependence screen' }),
  );
  twoReadoutScreenId = screen.id;
  for (const [name, conductance] of [
    ['Nav1.7', 'gNa'],
    ['Kv7.2', 'gM'],
  ] as const)
    await addTarget(admin, screen.id, {
      name,
      conductance,
      description: '',
      tonicReadoutName: 'first pulse',
      useDependentReadoutName: '10th pulse',
    });
  screenId = setup.screens['Nav1.7']!;
});

interface StoredFit {
  identifier: string;
  target: string;
  readout: string;
  status: string;
  ic50: number;
  low: number;
  high: number;
}

describe('two block readouts per well', () => {
  test('the guess finds both readouts of a wide export', async () => {
    const file = twoReadoutExport();
    const inspection = await inspectUpload(biologist, {
      screenId: twoReadoutScreenId,
      bytes: file.bytes,
      filename: file.filename,
      mediaType: 'text/csv',
    });
    const guess = inspection.sheets[0]!.guess.mapping;
    expect(guess.layout).toEqual({ kind: 'wide', targets: ['SCN9A', 'KCNQ2'] });
    expect(guess.columns.block).toBe('P1 block (%)');
    expect(guess.columns.useDependentBlock).toBe('P10 block (%)');
    expect(guess.columns.controlCurrent).toBe('I0 (pA)');
  });

  test('each readout is fitted on its own and recovers its truth', async () => {
    const file = twoReadoutExport();
    const inspection = await inspectUpload(biologist, {
      screenId: twoReadoutScreenId,
      bytes: file.bytes,
      filename: file.filename,
      mediaType: 'text/csv',
    });
    const draftId = inspection.draftId!;
    const sheet = inspection.sheets[0]!.name;
    const preview = await previewImport(biologist, { draftId, sheet, mapping: TWO_READOUT_MAPPING });
    expect(preview.issues.filter((i) => i.severity === 'error').map((i) => i.message)).toEqual([]);
    const { plateId } = await commitImport(biologist, {
      draftId,
      sheet,
      mapping: TWO_READOUT_MAPPING,
      label: 'GWX-0201',
    });
    await fitsCurrent(plateId);
    const fits = await db().query<StoredFit>(
      `select c.identifier, t.name as target, f.readout, f.status, f.ic50_um as ic50,
              f.ic50_ci_low_um as low, f.ic50_ci_high_um as high
         from fits f join compounds c on c.id = f.compound_id join targets t on t.id = f.target_id
        where f.plate_id = :plateId`,
      { replacements: { plateId }, type: 'SELECT' as never },
    );
    // 4 compounds × 2 targets × 2 readouts.
    expect(fits.length).toBe(16);
    const [readouts] = await db().query(
      `select r.readout, count(*)::int as n from readouts r join wells w on w.id = r.well_id
        where w.plate_id = :plateId group by r.readout order by r.readout`,
      { replacements: { plateId } },
    );
    // 80 wells (8 vehicle, 8 reference, 64 test) × 2 targets, once per readout.
    expect(readouts).toEqual([
      { readout: 'tonic', n: 160 },
      { readout: 'use_dependent', n: 160 },
    ]);
    for (const [identifier, byTarget] of Object.entries(TRUTH)) {
      for (const fileTarget of Object.keys(FILE_TARGETS) as FileTarget[]) {
        const target = FILE_TARGETS[fileTarget];
        const truth = byTarget[fileTarget];
        const of = (readout: string) =>
          fits.find((f) => f.identifier === identifier && f.target === target && f.readout === readout)!;
        const tonic = of('tonic');
        const use = of('use_dependent');
        for (const [fit, expected] of [
          [tonic, truth.tonic.ic50_uM],
          [use, truth.useDependent.ic50_uM],
        ] as const) {
          const where = `${identifier} on ${target}, ${fit.readout}`;
          expect(fit.status, where).toBe('fitted');
          expect(fit.ic50 / expected, where).toBeGreaterThan(0.85);
          expect(fit.ic50 / expected, where).toBeLessThan(1.15);
          expect(fit.low, where).toBeLessThanOrEqual(expected);
          expect(fit.high, where).toBeGreaterThanOrEqual(expected);
        }
        const ratio = readoutRatio(tonic.ic50, use.ic50)!;
        const trueRatio = truth.tonic.ic50_uM / truth.useDependent.ic50_uM;
        expect(ratio / trueRatio, `${identifier} on ${target}`).toBeGreaterThan(0.75);
        expect(ratio / trueRatio, `${identifier} on ${target}`).toBeLessThan(1.25);
      }
    }
  });

  test('a screen whose targets report one readout refuses the use-dependent columns and stores nothing', async () => {
    const file = twoReadoutExport(7);
    const inspection = await inspectUpload(biologist, {
      screenId,
      bytes: file.bytes,
      filename: file.filename,
      mediaType: 'text/csv',
    });
    const mapping: ColumnMappingInput = {
      ...TWO_READOUT_MAPPING,
      layout: { kind: 'wide', targets: ['SCN9A'] },
      targetValues: { SCN9A: 'Nav1.7' },
    };
    const before = await db().query(`select count(*)::int as n from plates`, { type: 'SELECT' as never });
    await expect(
      commitImport(biologist, {
        draftId: inspection.draftId!,
        sheet: inspection.sheets[0]!.name,
        mapping,
        label: 'GWX-0202',
      }),
    ).rejects.toThrow(/reports one block readout on this screen/);
    const after = await db().query(`select count(*)::int as n from plates`, { type: 'SELECT' as never });
    expect(after).toEqual(before);
  });
});
