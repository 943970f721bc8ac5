// scripts/import-plate.ts --mapping FILE.json as a child process on every invented export
// layout (of one plate or of several) (tests/fixtures/export-layouts), each with its mapping as a user writes it once
// (tests/fixtures/export-layouts/mappings.ts, the one import-layouts.test.ts gives the import service):
// (a) --offline --dry-run --json with no database settings at all, the printed facts against what the
// layout's writer and the truth recorded; (b) committed into the test database as a biologist, the
// stored plate read back against the truth (QC flags exactly the bad wells, every measurable IC50 within
// ±15 % and inside its 95 % CI).
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { Plate } from '@/models';
import { LAYOUTS, layout, type FileFacts, type LayoutFile } from '../fixtures/export-layouts';
import { stem } from '../fixtures/export-layouts/layout-kit';
import {
  MAPPINGS,
  SEVERAL_PLATE_LAYOUTS,
  SINGLE_PLATE_LAYOUTS,
  type MappedLayout,
} from '../fixtures/export-layouts/mappings';
import { expectPlateHoldsTruth, layoutScreensSetup, type LayoutScreen } from '../support/layout-imports';
import { plateExpectedIc50, truthRoleCounts } from '../support/layout-truth';
import { runScript } from '../support/run-script';

/** Each run is a fresh Node process (several seconds on a busy machine), and a commit waits for its fits. */
const SCRIPT_TEST_MS = 180_000;

const dir = mkdtempSync(join(tmpdir(), 'gatewell-import-cli-layouts-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A layout's file and its mapping written to a folder of their own; their paths. */
function writeLayout(name: MappedLayout): { written: LayoutFile; file: string; mapping: string } {
  const written = layout(name).write();
  const folder = join(dir, name);
  mkdirSync(folder, { recursive: true });
  const file = join(folder, written.filename);
  const mapping = join(folder, 'mapping.json');
  writeFileSync(file, written.bytes);
  writeFileSync(mapping, JSON.stringify(MAPPINGS[name], null, 2));
  return { written, file, mapping };
}

/**
 * The label the plate must get with no --label: its barcode where the file writes it beside a key (the
 * mapping locates it there), else the file's name without its extension (the barcode itself for the
 * layouts named by it).
 */
function expectedLabel(written: LayoutFile) {
  return written.facts.barcodeKey === undefined
    ? { plateLabel: stem(written.filename), labelSource: 'file' }
    : { plateLabel: written.facts.plates[0]!.label, labelSource: 'barcode' };
}

/** The file's target values as it writes them, sorted. */
const targetWords = (facts: FileFacts) => Object.values(facts.targetWords).sort();

test('every layout is run through the script here, of one plate or of several', () => {
  expect([...SINGLE_PLATE_LAYOUTS, ...SEVERAL_PLATE_LAYOUTS].sort()).toEqual(
    LAYOUTS.map((l) => l.name).sort(),
  );
  for (const name of SINGLE_PLATE_LAYOUTS) expect(layout(name).write().facts.plates, name).toHaveLength(1);
  for (const name of SEVERAL_PLATE_LAYOUTS) expect(layout(name).write().facts.plates, name).toHaveLength(2);
});

/**
 * Where each plate of a several-plate layout takes its label with no --label: the sheet's name (a sheet
 * per plate, each named by its barcode) or its value in the plate column (the barcode).
 */
const severalLabelSource = (name: MappedLayout) =>
  MAPPINGS[name].plates?.by === 'column' ? 'column' : 'sheet';

describe('import-plate --offline --dry-run --json --mapping on the layouts of several plates', () => {
  test.each(SEVERAL_PLATE_LAYOUTS)(
    '%s: the file and each plate (label, wells, roles, unit, targets, QC rules) as the writer recorded them',
    (name) => {
      const { written, file, mapping } = writeLayout(name);
      const { facts } = written;
      const out = runScript([file, '--offline', '--dry-run', '--json', '--mapping', mapping], {
        offline: true,
      });
      expect(out.stderr).toBe('');
      expect(out.code).toBe(0);
      const printed = JSON.parse(out.stdout) as Record<string, unknown> & {
        plates: (Record<string, unknown> & { targets: string[] })[];
      };
      // The top-level keys are the first plate's, but errors, warnings and unregistered compounds: the file's.
      expect(printed).toMatchObject({
        file: written.filename,
        template: null,
        plateCount: facts.plates.length,
        plateLabel: facts.plates[0]!.label,
        unregisteredCompounds: null,
        errors: [],
        warnings: [],
      });
      expect(printed.plates).toHaveLength(facts.plates.length);
      for (const [i, plate] of facts.plates.entries()) {
        expect(printed.plates[i], plate.label).toMatchObject({
          key: plate.label,
          sheet: plate.sheet,
          plateLabel: plate.label,
          labelSource: severalLabelSource(name),
          plateFormat: plate.format,
          wellCount: plate.wellCount,
          roleCounts: truthRoleCounts(plate.label),
          concentrationUnit: facts.units.concentration,
          qcRulesNotApplied: [],
          unregisteredCompounds: null,
          errors: [],
          warnings: [],
        });
        expect([...printed.plates[i]!.targets].sort(), plate.label).toEqual(targetWords(facts));
      }
    },
    SCRIPT_TEST_MS,
  );
});

describe('import-plate --offline --dry-run --json --mapping on every single-plate layout', () => {
  test.each(SINGLE_PLATE_LAYOUTS)(
    '%s: label, wells, roles, unit, targets and QC rules as the writer recorded them; no errors, no warnings',
    (name) => {
      const { written, file, mapping } = writeLayout(name);
      const { facts } = written;
      const plate = facts.plates[0]!;
      // Every layout writes all three QC readouts (seal, series resistance, capacitance), so every QC
      // rule applies; its bad wells are QC's to flag, not the check's to warn of.
      if (facts.readBack.shape === 'table')
        for (const column of ['sealResistance', 'seriesResistance', 'capacitance'] as const)
          expect(facts.readBack[column], column).not.toBe('');
      const out = runScript([file, '--offline', '--dry-run', '--json', '--mapping', mapping], {
        offline: true,
      });
      expect(out.stderr).toBe('');
      expect(out.code).toBe(0);
      const printed = JSON.parse(out.stdout) as Record<string, unknown>;
      expect(printed).toMatchObject({
        file: written.filename,
        sheet: plate.sheet,
        template: null,
        ...expectedLabel(written),
        plateFormat: plate.format,
        wellCount: plate.wellCount,
        roleCounts: truthRoleCounts(plate.label),
        concentrationUnit: facts.units.concentration,
        qcRulesNotApplied: [],
        unregisteredCompounds: null,
        errors: [],
        warnings: [],
      });
      expect([...(printed.targets as string[])].sort()).toEqual(targetWords(facts));
    },
    SCRIPT_TEST_MS,
  );
});

describe('import-plate --mapping committed into the database, read back against the truth', () => {
  let biologist: Actor;
  let screenFor: (facts: FileFacts) => LayoutScreen;

  beforeAll(async () => {
    ({ biologist, screenFor } = await layoutScreensSetup());
  });
  afterAll(() => db().close());

  /** The script run for real as the biologist, on the screen, with the layout's mapping: its printed JSON. */
  function commit<Printed>(file: string, screenName: string, mapping: string): Printed {
    const out = runScript([
      file,
      '--screen',
      screenName,
      '--as',
      biologist.email,
      '--mapping',
      mapping,
      '--json',
    ]);
    expect(out.stderr).toBe('');
    expect(out.code).toBe(0);
    return JSON.parse(out.stdout) as Printed;
  }

  test.each(SINGLE_PLATE_LAYOUTS)(
    '%s: stored as the account named on the screen named; QC flags exactly the bad wells, every IC50 within ±15 % and inside its CI',
    async (name) => {
      const { written, file, mapping } = writeLayout(name);
      const { facts } = written;
      const plate = facts.plates[0]!;
      const screen = screenFor(facts);
      const printed = commit<{ plateId: string } & Record<string, unknown>>(file, screen.name, mapping);
      // The truth's compounds are the demo scenario's, all registered on this database.
      expect(printed).toMatchObject({
        ...expectedLabel(written),
        wellCount: plate.wellCount,
        unregisteredCompounds: [],
        errors: [],
      });
      const stored = await Plate.findByPk(printed.plateId, { rejectOnEmpty: true });
      expect(stored.label).toBe(expectedLabel(written).plateLabel);
      expect(stored.screenId).toBe(screen.id);
      expect(stored.importedBy).toBe(biologist.id);
      await expectPlateHoldsTruth(stored.id, plate, facts.expectedIc50);
    },
    SCRIPT_TEST_MS,
  );

  test.each(SEVERAL_PLATE_LAYOUTS)(
    '%s: stored as a plate each; each plate read back against its own truth',
    async (name) => {
      const { written, file, mapping } = writeLayout(name);
      const { facts } = written;
      const screen = screenFor(facts);
      const printed = commit<
        Record<string, unknown> & {
          plateId: string;
          plates: { plateId: string; plateLabel: string; wellCount: number }[];
        }
      >(file, screen.name, mapping);
      expect(printed).toMatchObject({
        plateCount: facts.plates.length,
        unregisteredCompounds: [],
        errors: [],
      });
      expect(printed.plates.map((p) => [p.plateLabel, p.wellCount])).toEqual(
        facts.plates.map((p) => [p.label, p.wellCount]),
      );
      expect(printed.plateId).toBe(printed.plates[0]!.plateId);
      for (const [i, plate] of facts.plates.entries()) {
        const stored = await Plate.findByPk(printed.plates[i]!.plateId, { rejectOnEmpty: true });
        expect(stored.label).toBe(plate.label);
        expect(stored.screenId).toBe(screen.id);
        expect(stored.importedBy).toBe(biologist.id);
        await expectPlateHoldsTruth(stored.id, plate, plateExpectedIc50(plate.label, facts));
      }
    },
    SCRIPT_TEST_MS,
  );
});
