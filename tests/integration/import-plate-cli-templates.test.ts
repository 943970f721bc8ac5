// scripts/import-plate.ts --dry-run --json as a child process on the real test database: a template saved
// with an import of one file of a layout (the import service, as the app saves it) is applied to a second
// file of that layout, by its header fingerprint and by --template NAME, and the printed facts are the
// mapped ones. The layout is the invented semicolon-separated one (tests/fixtures/export-layouts), whose
// role words no guess places and whose target word is not the screen's.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import type { ColumnMappingInput } from '@/lib/imports/mapping-schema';
import { commitImport, inspectUpload } from '@/lib/plates/import-service';
import { ImportTemplate, Plate } from '@/models';
import { layout } from '../fixtures/export-layouts';
import { plate } from '../fixtures/export-layouts/truth';
import { demoScreensSetup } from '../support/demo-scenario';
import { runScript } from '../support/run-script';

const dir = mkdtempSync(join(tmpdir(), 'gatewell-import-cli-templates-'));
const TEMPLATE = 'Rig B semicolon export';

// The first file of the layout, as written, and its lines (header first, `;`-separated, decimal commas).
const first = layout('semicolon-decimal-comma').write();
const firstText = new TextDecoder().decode(first.bytes);
const eol = firstText.includes('\r\n') ? '\r\n' : '\n';
const firstLines = firstText.trimEnd().split(eol);

/**
 * A second file of the same layout: another plate (its own name) with the test wells of row H left out
 * (H2–H11: ten test wells, none of them a bad well of the truth), so its facts are its own.
 */
const secondName = 'GWX-096-0466.csv';
const secondLines = firstLines.filter((line) => !/^H([2-9]|1[01]);/.test(line));
const second = new TextEncoder().encode(`${secondLines.join(eol)}${eol}`);
/** The same second file with one more column at the end: its header no longer shows the template's fingerprint. */
const withNotes = new TextEncoder().encode(
  `${secondLines.map((line, i) => `${line};${i === 0 ? 'Notes' : ''}`).join(eol)}${eol}`,
);

/** Role counts of the second file from the truth of the first file's plate (row H's ten test wells gone). */
function secondRoles() {
  const wells = plate('p96a').wells;
  const count = (role: string) => wells.filter((w) => w.role === role).length;
  return {
    negativeControl: count('vehicle'),
    positiveControl: count('reference'),
    test: count('test') - 10,
    empty: 0,
  };
}

function file(name: string, bytes: Uint8Array): string {
  const path = join(dir, name);
  writeFileSync(path, bytes);
  return path;
}

/** Each script run is a fresh Node process (several seconds on a busy machine); a test may run three. */
const SCRIPT_TEST_MS = 180_000;

describe('import-plate --dry-run --json with a saved template', () => {
  let biologist: Actor;
  let screenId: string;

  beforeAll(async () => {
    const setup = await demoScreensSetup();
    biologist = setup.biologist;
    screenId = setup.screens['Nav1.7']!;
  });
  afterAll(async () => {
    rmSync(dir, { recursive: true, force: true });
    await db().close();
  });

  const dryRun = (path: string, ...more: string[]) => {
    const out = runScript([
      path,
      '--screen',
      'Pain sodium screen',
      '--as',
      biologist.email,
      '--dry-run',
      '--json',
      ...more,
    ]);
    return { ...out, facts: JSON.parse(out.stdout) as Record<string, unknown> };
  };

  test(
    'before any template: the guess cannot place the role words, and the errors name them',
    () => {
      const out = dryRun(file(secondName, second));
      expect(out.stderr).toBe('');
      expect(out.code).toBe(1);
      expect(out.facts).toMatchObject({ template: null, wellCount: 0 });
      expect(out.facts.errors).toContainEqual(
        expect.stringMatching(
          /"Sample type": the well-role column holds words Gatewell cannot place: .*"solvent"/,
        ),
      );
    },
    SCRIPT_TEST_MS,
  );

  test(
    'a template saved with the first file’s import is recognised in the second file by its fingerprint, and by name',
    async () => {
      // The first file, mapped by hand as on the mapping step and imported with "save as template".
      const mapping: ColumnMappingInput = {
        headerRow: 1,
        columns: {
          well: 'Pos',
          compound: 'Substance',
          concentration: 'Conc [uM]',
          target: 'Assay',
          role: 'Sample type',
          controlCurrent: 'I before [nA]',
          compoundCurrent: 'I after [nA]',
          sealResistance: 'Seal [MOhm]',
          seriesResistance: 'Rs [MOhm]',
          capacitance: 'Cslow [pF]',
        },
        units: {
          concentration: 'uM',
          controlCurrent: 'nA',
          compoundCurrent: 'nA',
          sealResistance: 'MOhm',
          seriesResistance: 'MOhm',
          capacitance: 'pF',
        },
        roleValues: { solvent: 'vehicle', blocker: 'reference', library: 'test' },
        targetValues: { 'hNav1.7': 'Nav1.7' },
      };
      const inspection = await inspectUpload(biologist, {
        screenId,
        bytes: first.bytes,
        filename: first.filename,
        mediaType: 'text/csv',
      });
      const sheet = inspection.sheets[0]!.name;
      const { plateId } = await commitImport(biologist, {
        draftId: inspection.draftId!,
        sheet,
        mapping,
        label: 'GWX-096-0417',
        templateName: TEMPLATE,
      });
      expect(await Plate.count({ where: { id: plateId } })).toBe(1);
      const saved = await ImportTemplate.findOne({ where: { name: TEMPLATE }, rejectOnEmpty: true });
      expect(saved.fingerprint).not.toBeNull();

      const expected = {
        template: TEMPLATE,
        sheet: 'GWX-096-0466',
        plateLabel: 'GWX-096-0466',
        labelSource: 'file',
        plateFormat: 96,
        wellCount: 86,
        roleCounts: secondRoles(),
        concentrationUnit: 'uM',
        targets: ['hNav1.7'],
        unregisteredCompounds: [],
        errors: [],
      };
      // By fingerprint: no --template, the second file's header shows the template's.
      const byFingerprint = dryRun(file(secondName, second));
      expect(byFingerprint.stderr).toBe('');
      expect(byFingerprint.code).toBe(0);
      expect(byFingerprint.facts).toMatchObject(expected);

      // A header with one more column shows no template's fingerprint: guessed, and refused for the role words.
      const notesPath = file('GWX-096-0466-notes.csv', withNotes);
      const guessed = dryRun(notesPath);
      expect(guessed.code).toBe(1);
      expect(guessed.facts).toMatchObject({ template: null, wellCount: 0 });

      // By name (case-blind): the same file read with the template named.
      const byName = dryRun(notesPath, '--template', TEMPLATE.toUpperCase());
      expect(byName.stderr).toBe('');
      expect(byName.code).toBe(0);
      expect(byName.facts).toMatchObject({
        ...expected,
        plateLabel: 'GWX-096-0466-notes',
        sheet: 'GWX-096-0466-notes',
      });

      // Nothing was stored by the dry runs: the first file's plate only.
      expect(await Plate.count()).toBe(1);
    },
    SCRIPT_TEST_MS,
  );

  test(
    'a template name that does not exist: exit 1, the refusal names it',
    () => {
      const out = dryRun(file(secondName, second), '--template', 'No such layout');
      expect(out.code).toBe(1);
      expect(out.facts).toMatchObject({
        refused: 'No import template named or numbered "No such layout".',
        errors: ['No import template named or numbered "No such layout".'],
      });
    },
    SCRIPT_TEST_MS,
  );
});
