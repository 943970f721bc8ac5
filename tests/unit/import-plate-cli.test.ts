// scripts/import-plate.ts --offline --dry-run --json as a child process, with no database settings at all:
// the facts it prints for files of the invented export layouts (tests/fixtures/export-layouts) and for a
// demo export (seeders/data/demo-plates) against what the generators recorded, a file lacking a readout,
// a file with role words no guess places, and bad arguments.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import XLSX from 'xlsx';
import { afterAll, describe, expect, test } from 'vitest';
import { layout, type LayoutFile } from '../fixtures/export-layouts';
import { MAPPINGS } from '../fixtures/export-layouts/mappings';
import { TWO_READOUT_MAPPING, twoReadoutExport } from '../fixtures/two-readouts/two-readout-export';
import { truthRoleCounts } from '../support/layout-truth';
import { ROOT as root, runScript, SCRIPT_TIMEOUT_MS } from '../support/run-script';

const dir = mkdtempSync(join(tmpdir(), 'gatewell-import-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Runs the script with no database settings in its environment. */
const run = (args: string[]) => runScript(args, { offline: true });

const json = (value: unknown) => new TextEncoder().encode(JSON.stringify(value));

function write(name: string, bytes: Uint8Array): string {
  const file = join(dir, name);
  writeFileSync(file, bytes);
  return file;
}

function dryRun(file: string) {
  const out = run([file, '--offline', '--dry-run', '--json']);
  return { code: out.code, facts: JSON.parse(out.stdout) as Record<string, unknown>, stderr: out.stderr };
}

/** The truth's role counts of the plate a layout file records (by its barcode). */
const truthRoles = (written: LayoutFile) => truthRoleCounts(written.facts.plates[0]!.label);

describe('import-plate --offline --dry-run --json on the invented layouts', () => {
  test.each(['xls-workbook', 'xlsx-run-1536'])(
    '%s: label from the barcode, wells, roles, unit and targets as the generator recorded them',
    (name) => {
      const written = layout(name).write();
      const { code, facts } = dryRun(write(written.filename, written.bytes));
      const truth = written.facts;
      expect(code).toBe(0);
      expect(facts).toMatchObject({
        plateLabel: truth.plates[0]!.label,
        labelSource: 'barcode',
        sheet: truth.plates[0]!.sheet,
        plateFormat: truth.plates[0]!.format,
        wellCount: truth.plates[0]!.wellCount,
        roleCounts: truthRoles(written),
        concentrationUnit: truth.units.concentration,
        qcRulesNotApplied: [],
        unregisteredCompounds: null,
        errors: [],
        warnings: [],
      });
      expect([...(facts.targets as string[])].sort()).toEqual(Object.values(truth.targetWords).sort());
    },
  );

  test('a file lacking the series resistance: that rule is reported not applied, nothing else changes', () => {
    const written = layout('xlsx-run-1536').write();
    const book = XLSX.read(written.bytes, { type: 'array' });
    const sheetName = written.facts.plates[0]!.sheet;
    const rows = XLSX.utils.sheet_to_json<unknown[]>(book.Sheets[sheetName]!, { header: 1, defval: null });
    const header = rows[3] as unknown[]; // the header is row 4 (three title rows above it)
    const drop = header.indexOf('Series R / MOhm');
    expect(drop).toBeGreaterThan(0);
    book.Sheets[sheetName] = XLSX.utils.aoa_to_sheet(rows.map((r) => r.filter((_, i) => i !== drop)));
    const bytes = XLSX.write(book, { type: 'array', bookType: 'xlsx' }) as ArrayBuffer;
    const { code, facts } = dryRun(write('no-series-resistance.xlsx', new Uint8Array(bytes)));
    expect(code).toBe(0);
    expect(facts).toMatchObject({
      plateLabel: 'GWX-1536-0051',
      wellCount: 512,
      roleCounts: truthRoles(written),
      qcRulesNotApplied: ['series_resistance'],
      errors: [],
      warnings: [
        'The series resistance rule (1 to 25 MΩ) was not applied: no well has a series resistance. The other QC rules, Z′ and the fits still run.',
      ],
    });
  });

  test('role words no guess places: exit 1, the error names them, no wells', () => {
    const written = layout('semicolon-decimal-comma').write();
    const { code, facts } = dryRun(write(written.filename, written.bytes));
    expect(code).toBe(1);
    expect(facts).toMatchObject({
      plateLabel: 'GWX-096-0417',
      labelSource: 'file',
      wellCount: 0,
      concentrationUnit: 'uM',
      targets: ['hNav1.7'],
      unregisteredCompounds: null,
    });
    expect(facts.errors).toEqual([
      'Sheet "GWX-096-0417", row 1, column E "Sample type": the well-role column holds words Gatewell cannot place: "solvent", "library", "blocker"; on the mapping step assign each to negative control, positive control, test or empty.',
      'The sheet holds no wells.',
    ]);
  });
});

describe('import-plate --offline on a demo export', () => {
  test('kv-96-plate-01.csv: wells and roles as the file lists them, label from the file name', () => {
    const file = join(root, 'seeders/data/demo-plates/kv-96-plate-01.csv');
    const manifest = JSON.parse(readFileSync(`${file}.manifest.json`, 'utf8')) as {
      wellCount: number;
      target: string;
      format: number;
    };
    // The roles as the file writes them, read here line by line (column 2, "Well type").
    const types = readFileSync(file, 'utf8')
      .trim()
      .split('\n')
      .slice(1)
      .map((line) => line.split(',')[1]);
    const count = (word: string) => types.filter((t) => t === word).length;
    const { code, facts } = dryRun(file);
    expect(code).toBe(0);
    const plateFacts = {
      sheet: 'kv-96-plate-01',
      plateLabel: 'kv-96-plate-01',
      labelSource: 'file',
      plateFormat: manifest.format,
      wellCount: manifest.wellCount,
      roleCounts: {
        negativeControl: count('VEH'),
        positiveControl: count('REF'),
        test: count('TEST'),
        empty: 0,
      },
      concentrationUnit: 'uM',
      targets: [manifest.target],
      // One block readout per well and target: the tonic one.
      readouts: { [manifest.target]: ['tonic'] },
      qcRulesNotApplied: [],
      unregisteredCompounds: null,
      errors: [],
      warnings: [],
    };
    // One plate: the top-level keys are its facts, and `plates` lists it once.
    expect(facts).toEqual({
      file: 'kv-96-plate-01.csv',
      template: null,
      ...plateFacts,
      plateCount: 1,
      plates: [{ key: 'kv-96-plate-01', ...plateFacts }],
    });
  });

  // Two plates in one file (issue 18): the guess splits them, a plate each labelled by its barcode. Their
  // role words are the layout's own, which no guess places (a template maps them, see the integration
  // tests), so each plate's error names the plate.
  test.each(['plate-column-tsv', 'plates-per-sheet'])(
    "%s: a plate each in `plates`, labelled by its barcode; top-level keys are the first plate's",
    (name) => {
      const written = layout(name).write();
      const { code, facts } = dryRun(write(written.filename, written.bytes));
      expect(code).toBe(1);
      const labels = written.facts.plates.map((p) => p.label);
      const plates = facts.plates as { plateLabel: string; errors: string[] }[];
      expect(facts.plateCount).toBe(2);
      expect(plates.map((p) => p.plateLabel)).toEqual(labels);
      expect(facts.plateLabel).toBe(labels[0]);
      for (const [i, plate] of plates.entries()) {
        expect(plate.errors[0]).toContain('cannot place');
        expect((facts.errors as string[]).filter((e) => e.startsWith(`Plate "${labels[i]}": `))).toHaveLength(
          plate.errors.length,
        );
      }
    },
  );

  test('a file read at two moments: `readouts` lists tonic and use-dependent per target, guessed or mapped', () => {
    const written = twoReadoutExport();
    const file = write(written.filename, written.bytes);
    const mapping = join(dir, 'two-readout-mapping.json');
    writeFileSync(mapping, JSON.stringify(TWO_READOUT_MAPPING));
    const both = ['tonic', 'use_dependent'];
    // The fixture's wide columns (SCN9A P1 block, SCN9A P10 block, …): the guess reads the file's target words.
    const guessed = dryRun(file);
    expect(guessed.code, guessed.stderr).toBe(0);
    expect(guessed.facts.readouts).toEqual({ SCN9A: both, KCNQ2: both });
    expect((guessed.facts.plates as { readouts: unknown }[])[0]!.readouts).toEqual(guessed.facts.readouts);
    const mapped = run([file, '--offline', '--mapping', mapping, '--json']);
    expect(mapped.code, mapped.stderr).toBe(0);
    expect(Object.values(JSON.parse(mapped.stdout).readouts as Record<string, string[]>)).toEqual([
      both,
      both,
    ]);
  });

  test('--label wins over the file name', () => {
    const file = join(root, 'seeders/data/demo-plates/kv-96-plate-01.csv');
    const out = run([file, '--offline', '--json', '--label', 'KV-P01']);
    expect(out.code).toBe(0);
    expect(JSON.parse(out.stdout)).toMatchObject({ plateLabel: 'KV-P01', labelSource: 'given' });
  });
});

describe('import-plate arguments', () => {
  test('no --screen or --as without --offline: exit 2, naming both', () => {
    const out = run([join(root, 'seeders/data/demo-plates/kv-96-plate-01.csv'), '--dry-run']);
    expect(out.code).toBe(2);
    expect(out.stdout).toBe('');
    expect(out.stderr).toBe(
      'import-plate: bad arguments:\n  --screen: is required (or --offline)\n  --as: is required (or --offline)\n',
    );
  });

  test('--template with --offline, and a file that is not there: exit 2', () => {
    const demo = join(root, 'seeders/data/demo-plates/kv-96-plate-01.csv');
    const withTemplate = run([demo, '--offline', '--template', 'Rig A']);
    expect(withTemplate.code).toBe(2);
    expect(withTemplate.stderr).toBe(
      'import-plate: bad arguments:\n  --template: templates are kept in the database: not with --offline\n',
    );
    const missing = run([join(dir, 'absent.csv'), '--offline']);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toBe(`import-plate: cannot read ${join(dir, 'absent.csv')}: ENOENT\n`);
  });

  // Three script runs in each of these: a fresh Node process each, several seconds on a busy machine.
  test(
    '--mapping: a mapping that is not complete, or not JSON, is refused naming each bad field; exit 2',
    () => {
      const demo = join(root, 'seeders/data/demo-plates/kv-96-plate-01.csv');
      // Two fields from one column, four required fields left out, a unit Gatewell does not know.
      const incomplete = write('incomplete.json', json({ columns: { well: 'Well', compound: 'Well' } }));
      const out = run([demo, '--offline', '--mapping', incomplete]);
      expect(out.code).toBe(2);
      expect(out.stdout).toBe('');
      const lines = out.stderr.trimEnd().split('\n');
      expect(lines[0]).toBe(`import-plate: --mapping: invalid mapping in ${incomplete}:`);
      expect(lines.slice(1).map((line) => line.split(':')[0]!.trim())).toEqual([
        'columns.concentration',
        'columns.target',
        'columns.controlCurrent',
        'columns.compoundCurrent',
        'columns.compound',
      ]);
      const badUnit = write('bad-unit.json', json({ units: { concentration: 'micromolar' } }));
      const unit = run([demo, '--offline', '--mapping', badUnit]);
      expect(unit.code).toBe(2);
      expect(unit.stderr).toMatch(
        /^import-plate: --mapping: invalid mapping in .*\n {2}units\.concentration: /,
      );
      const notJson = write('not-json.json', new TextEncoder().encode('{ "columns": '));
      const broken = run([demo, '--offline', '--mapping', notJson]);
      expect(broken.code).toBe(2);
      expect(broken.stderr).toMatch(/^import-plate: --mapping: .*not-json\.json is not valid JSON: /);
    },
    SCRIPT_TIMEOUT_MS,
  );

  test(
    '--mapping with --template: exit 2, naming the clash; a sheet the file lacks: refused, exit 1',
    () => {
      // A text file's one sheet is named by the file: "GWX-096-0417".
      const written = layout('semicolon-decimal-comma').write();
      const file = write(written.filename, written.bytes);
      const mapping = write(
        'other-sheet.json',
        json({ ...MAPPINGS['semicolon-decimal-comma'], wellSheet: 'Data' }),
      );
      const both = run([
        file,
        '--screen',
        'S',
        '--as',
        'a@gatewell.test',
        '--template',
        'T',
        '--mapping',
        mapping,
      ]);
      expect(both.code).toBe(2);
      expect(both.stderr).toBe(
        'import-plate: bad arguments:\n  --mapping: a mapping file or a template, not both\n',
      );
      const out = run([file, '--offline', '--json', '--mapping', mapping]);
      expect(out.code).toBe(1);
      expect(JSON.parse(out.stdout)).toMatchObject({
        wellCount: 0,
        errors: [
          'The mapping reads the sheet "Data", which the file does not hold; its sheets: "GWX-096-0417".',
        ],
      });
    },
    SCRIPT_TIMEOUT_MS,
  );
});
