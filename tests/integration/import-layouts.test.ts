import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import * as XLSX from 'xlsx';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { columnMappingSchema } from '@/lib/imports/mapping-schema';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { Plate, Well } from '@/models';
import { layout, type FileFacts } from '../fixtures/export-layouts';
import {
  MAPPINGS,
  SEVERAL_PLATE_LAYOUTS,
  SINGLE_PLATE_LAYOUTS,
  type SinglePlateLayout,
} from '../fixtures/export-layouts/mappings';
import { expectPlateHoldsTruth, layoutScreensSetup, type LayoutScreen } from '../support/layout-imports';
import { fileTargets, plateExpectedIc50, truthRoleCounts } from '../support/layout-truth';

/**
 * The invented export layouts (tests/fixtures/export-layouts) through Gatewell's import service, each with
 * its mapping as a user writes it once (tests/fixtures/export-layouts/mappings.ts, shared with the script's
 * test, import-plate-cli-layouts.test.ts), the layouts of several plates per file among them.
 */

/**
 * Layouts read through the reshape step (lib/imports/reshape-table.ts): a column block per target, and
 * plate-shaped grids whose "Target" line above the grids is read as a column of every well.
 */
const RESHAPED: SinglePlateLayout[] = [
  'wide-fraction-block',
  'grid-96-tsv',
  'grid-384-xlsx',
  'grid-1536-csv',
];

/** The other single-plate layouts but the cumulative one: a long table with one concentration per well. */
const IMPORTABLE = SINGLE_PLATE_LAYOUTS.filter(
  (name) => !RESHAPED.includes(name) && name !== 'cumulative-rows',
);

/**
 * Another file of the same layout: one decimal value of the data written one
 * more, under the same name, so that its bytes, not its layout, differ from the file imported before.
 */
function secondFile(file: ReturnType<ReturnType<typeof layout>['write']>) {
  const bump = (value: string) => String(Number(value) + 1);
  let bytes: Uint8Array;
  if (file.facts.kind === 'xlsx') {
    const book = XLSX.read(file.bytes, { type: 'array' });
    const sheet = book.Sheets[file.facts.plates[0]!.sheet]!;
    const address = Object.keys(sheet).find((key) => {
      const cell = sheet[key] as XLSX.CellObject | undefined;
      return !key.startsWith('!') && cell?.t === 'n' && !Number.isInteger(cell.v);
    })!;
    const cell = sheet[address] as XLSX.CellObject;
    sheet[address] = { t: 'n', v: Number(bump(String(cell.v))) };
    bytes = new Uint8Array(XLSX.write(book, { type: 'array', bookType: 'xlsx' }) as ArrayBuffer);
  } else {
    const text = new TextDecoder().decode(file.bytes);
    const changed = text.replace(
      /([\t,])(\d+\.\d+)(?=[\t,\r\n])/,
      (_all, sep: string, n: string) => sep + bump(n),
    );
    expect(changed).not.toBe(text);
    bytes = new TextEncoder().encode(changed);
  }
  return { bytes, filename: file.filename, mediaType: file.mediaType, facts: file.facts };
}

describe('invented export layouts through the import service', () => {
  let biologist: Actor;
  let screenFor: (facts: FileFacts) => LayoutScreen;

  beforeAll(async () => {
    ({ biologist, screenFor } = await layoutScreensSetup());
  });
  afterAll(() => db().close());

  /** Imports a layout's file with its mapping; QC, every IC50 within ±15 % and its CI holding the truth. */
  async function importAndCheck(name: SinglePlateLayout, templateName?: string) {
    const file = layout(name).write();
    const { facts } = file;
    const [plate] = facts.plates;
    const targets = fileTargets(facts);
    const mapping = MAPPINGS[name];
    const screenId = screenFor(facts).id;
    const upload = { screenId, bytes: file.bytes, filename: file.filename, mediaType: file.mediaType };

    const inspection = await inspectUpload(biologist, upload);
    expect(inspection.sheets.map((s) => s.name)).toContain(plate!.sheet);
    const draftId = inspection.draftId!;
    const preview = await previewImport(biologist, { draftId, sheet: plate!.sheet, mapping });
    expect(preview.issues.filter((i) => i.severity === 'error').map((i) => i.message)).toEqual([]);
    expect(preview.plate?.targets.sort()).toEqual([...targets].sort());

    const { plateId } = await commitImport(biologist, {
      draftId,
      sheet: plate!.sheet,
      mapping,
      label: plate!.label,
      templateName,
    });
    await expectPlateHoldsTruth(plateId, plate!, facts.expectedIc50);
    const stored = await Plate.findByPk(plateId, { rejectOnEmpty: true });
    expect(stored.label).toBe(plate!.label);
    return { facts, mapping };
  }

  test.each(IMPORTABLE)(
    '%s imports with no edit: QC flags exactly the bad wells and every measurable IC50 is recovered',
    async (name) => {
      await importAndCheck(name);
    },
  );

  test.each(RESHAPED)(
    '%s imports through the reshape step (QC, IC50s and CIs), and its template reads a second file',
    async (layoutName) => {
      const name = `${layoutName} layout`;
      const { mapping } = await importAndCheck(layoutName, name);
      const second = secondFile(layout(layoutName).write());
      const [plate] = second.facts.plates;
      const targets = fileTargets(second.facts);
      const screenId = screenFor(second.facts).id;
      const { bytes, filename, mediaType } = second;
      const inspection = await inspectUpload(biologist, { screenId, bytes, filename, mediaType });
      expect(inspection.duplicateOf).toBeNull();
      expect(inspection.recognised?.name).toBe(name);
      expect(inspection.recognised?.sheet).toBe(plate!.sheet);
      expect(inspection.recognised?.mapping.layout).toEqual(mapping.layout);
      const preview = await previewImport(biologist, {
        draftId: inspection.draftId!,
        sheet: inspection.recognised!.sheet,
        mapping: inspection.recognised!.mapping,
      });
      expect(preview.fileProblems).toEqual([]);
      expect(preview.issues.filter((i) => i.severity === 'error').map((i) => i.message)).toEqual([]);
      expect(preview.plate?.wells.length).toBe(plate!.wellCount);
      expect(preview.plate?.targets.sort()).toEqual([...targets].sort());
    },
  );

  // The applications of one cell share its run-down, so their points are not independent: the fit takes
  // the cell as the unit for its CI (lib/science/fit/cell-clusters.ts), and each CI must hold the truth.
  test('cumulative-rows imports with no edit: QC flags exactly the bad wells, every IC50 within ±15 % and inside its CI', async () => {
    const checked = await importAndCheck('cumulative-rows');
    // Every fit of this file took the cell as the unit: its message says so.
    const messages = await db().query<{ message: string }>(
      `select f.message from fits f join plates p on p.id = f.plate_id
         where p.label = :label and f.status = 'fitted'`,
      { replacements: { label: checked.facts.plates[0]!.label }, type: 'SELECT' as never },
    );
    expect(messages.length).toBeGreaterThan(0);
    for (const { message } of messages) expect(message).toContain('cells as the unit');
  });

  /**
   * The two invented layouts of several plates (issue 18): a sheet per plate, and a plate column. Mapped
   * once (MAPPINGS: the file's columns, units and words, and how its plates are told apart), each file is
   * stored as a plate per plate of the truth in one transaction; each plate is checked against its own
   * truth (expectPlateHoldsTruth with that plate's IC50s), and the template saved with the first file
   * reads a second file of the layout by its fingerprint with no edit.
   */
  const tableCount = async (table: string) =>
    (
      await db().query<{ n: number }>(`select count(*)::int as n from ${table}`, { type: 'SELECT' as never })
    )[0]!.n;

  test.each(SEVERAL_PLATE_LAYOUTS)(
    '%s: mapped once, stored as a plate each (QC, IC50s, CIs), and its template reads a second file',
    async (layoutName) => {
      const file = layout(layoutName).write();
      const { facts } = file;
      const screenId = screenFor(facts).id;
      const mapping = MAPPINGS[layoutName];
      const split = columnMappingSchema.parse(mapping).plates;
      const upload = { screenId, bytes: file.bytes, filename: file.filename, mediaType: file.mediaType };
      const inspection = await inspectUpload(biologist, upload);
      // The guess proposes how the plates are told apart.
      const guessed = inspection.sheets.find((s) => s.name === facts.plates[0]!.sheet)!.guess.mapping.plates;
      expect(guessed).toEqual(split);
      const draftId = inspection.draftId!;
      const sheet = facts.plates[0]!.sheet;
      const preview = await previewImport(biologist, { draftId, sheet, mapping });
      expect(preview.fileProblems).toEqual([]);
      // Each plate's own facts on the check step, from its truth: QC flags exactly its bad wells.
      expect(
        preview.plates.map((p) => [p.label, p.wellCount, p.format, p.roleCounts, p.qcFlaggedWells, p.ok]),
      ).toEqual(
        facts.plates.map((p) => [
          p.label,
          p.wellCount,
          p.format,
          truthRoleCounts(p.label),
          p.badWells.length,
          true,
        ]),
      );
      expect(preview.plates.map((p) => p.qcRulesNotApplied)).toEqual(facts.plates.map(() => []));
      const files = await tableCount('uploaded_files');
      const audits = await tableCount(`audit_events where action = 'import'`);
      const mails = await tableCount(`mail_outbox where kind = 'plate_imported'`);
      const name = `${layoutName} layout`;
      const committed = await commitImport(biologist, {
        draftId,
        sheet,
        mapping,
        label: 'unused',
        templateName: name,
      });
      expect(committed.plates.map((p) => p.label)).toEqual(facts.plates.map((p) => p.label));
      for (const [i, truth] of facts.plates.entries()) {
        const { plateId } = committed.plates[i]!;
        expect((await Plate.findByPk(plateId, { rejectOnEmpty: true })).label).toBe(truth.label);
        await expectPlateHoldsTruth(plateId, truth, plateExpectedIc50(truth.label, facts));
      }
      // One file record shared by the plates, an audit event per plate, one notice per chemist for the file.
      expect(await tableCount('uploaded_files')).toBe(files + 1);
      const shared = await Plate.findAll({ where: { id: committed.plates.map((p) => p.plateId) } });
      expect(new Set(shared.map((p) => p.uploadedFileId)).size).toBe(1);
      expect(await tableCount(`audit_events where action = 'import'`)).toBe(audits + 2);
      const notices = await db().query<{ plate_id: string; n: number }>(
        `select plate_id, count(*)::int as n from mail_outbox where kind = 'plate_imported' group by plate_id`,
        { type: 'SELECT' as never },
      );
      const chemists = await tableCount(`user_roles where role = 'chemist'`);
      expect(await tableCount(`mail_outbox where kind = 'plate_imported'`)).toBe(mails + chemists);
      expect(notices.find((n) => n.plate_id === committed.plates[1]!.plateId)).toBeUndefined();

      // The same file again is a duplicate, named by the plate whose label sorts first (byte order).
      const again = await inspectUpload(biologist, upload);
      const first = [...committed.plates].sort((a, b) =>
        a.label < b.label ? -1 : a.label > b.label ? 1 : 0,
      )[0]!;
      expect(again.duplicateOf?.plateId).toBe(first.plateId);

      // A second file of the layout: recognised by the template, previewed and stored with no edit.
      const second = secondFile(layout(layoutName).write());
      const next = await inspectUpload(biologist, {
        screenId,
        bytes: second.bytes,
        filename: second.filename,
        mediaType: second.mediaType,
      });
      expect(next.duplicateOf).toBeNull();
      expect(next.recognised?.name).toBe(name);
      const recognised = next.recognised!;
      const stored = await commitImport(biologist, {
        draftId: next.draftId!,
        sheet: recognised.sheet,
        mapping: recognised.mapping,
        label: 'unused',
      });
      expect(stored.plates.map((p) => p.label)).toEqual(facts.plates.map((p) => p.label));
      for (const [i, truth] of facts.plates.entries())
        expect(await Well.count({ where: { plateId: stored.plates[i]!.plateId } })).toBe(truth.wellCount);
    },
  );

  test('a barcode in a fixed cell of each plate sheet labels each plate with its own barcode', async () => {
    // The sheet-per-plate file with its sheets renamed and each plate's barcode written in cell B1 of its
    // own sheet, two rows above the table: the mapping points at cell B1 of the first plate's sheet.
    const file = layout('plates-per-sheet').write();
    const { facts } = file;
    const book = XLSX.read(file.bytes, { type: 'array' });
    const renamed = XLSX.utils.book_new();
    facts.plates.forEach((plate, i) => {
      const rows = XLSX.utils.sheet_to_json<unknown[]>(book.Sheets[plate.sheet]!, { header: 1 });
      const withBarcode = [['Barcode', plate.label], [], ...rows];
      XLSX.utils.book_append_sheet(renamed, XLSX.utils.aoa_to_sheet(withBarcode), `Run ${i + 1}`);
    });
    const bytes = new Uint8Array(XLSX.write(renamed, { type: 'array', bookType: 'xlsx' }) as ArrayBuffer);
    const mapping = {
      ...MAPPINGS['plates-per-sheet'],
      headerRow: 3,
      facts: { barcode: { kind: 'cell' as const, sheet: 'Run 1', address: 'B1' } },
    };
    const inspection = await inspectUpload(biologist, {
      screenId: screenFor(facts).id,
      bytes,
      filename: 'two-runs.xlsx',
      mediaType: file.mediaType,
    });
    const request = { draftId: inspection.draftId!, sheet: 'Run 1', mapping, label: 'unused' };
    const preview = await previewImport(biologist, request);
    expect(preview.fileProblems).toEqual([]);
    expect(preview.plates.map((p) => [p.sheet, p.label, p.labelSource, p.facts.barcode])).toEqual(
      facts.plates.map((p, i) => [`Run ${i + 1}`, p.label, 'barcode', p.label]),
    );
    const committed = await commitImport(biologist, request);
    const stored = await Plate.findAll({ where: { id: committed.plates.map((p) => p.plateId) } });
    expect(stored.map((p) => p.label).sort()).toEqual(facts.plates.map((p) => p.label).sort());
  });

  test('a QC readout absent from one plate only: that plate reports its rule not applied, named on the file', async () => {
    // The plate-column file with the series resistance of every row of its second plate written as missing.
    const file = layout('plate-column-tsv').write();
    const { facts } = file;
    const [first, second] = facts.plates;
    const lines = new TextDecoder().decode(file.bytes).split('\n');
    const rs = lines[0]!.split('\t').indexOf('Rs (MOhm)');
    expect(rs).toBeGreaterThan(0);
    const edited = lines.map((line) => {
      if (!line.startsWith(`${second!.label}\t`)) return line;
      const cells = line.split('\t');
      cells[rs] = facts.missingMarker;
      return cells.join('\t');
    });
    const inspection = await inspectUpload(biologist, {
      screenId: screenFor(facts).id,
      bytes: new TextEncoder().encode(edited.join('\n')),
      filename: file.filename,
      mediaType: file.mediaType,
    });
    const preview = await previewImport(biologist, {
      draftId: inspection.draftId!,
      sheet: first!.sheet,
      mapping: MAPPINGS['plate-column-tsv'],
    });
    expect(preview.plates.map((p) => p.qcRulesNotApplied.map((r) => r.rule))).toEqual([
      [],
      ['series_resistance'],
    ]);
    expect(preview.qcRulesNotApplied.map((r) => r.rule)).toEqual(['series_resistance']);
    expect(preview.qcRulesNotApplied[0]!.message).toMatch(new RegExp(`^Plate "${second!.label}": `));
  });

  test('a fault in one plate of the file stores no plate, naming that plate; row counts unchanged', async () => {
    const file = layout('plate-column-tsv').write();
    const { facts } = file;
    const [, second] = facts.plates;
    // The second plate's first well is written as a well no plate has (Z99): an error of that plate only.
    const text = new TextDecoder().decode(file.bytes);
    const lines = text.split('\n');
    const at = lines.findIndex((line) => line.startsWith(`${second!.label}\t`));
    const cells = lines[at]!.split('\t');
    cells[1] = 'Z99';
    lines[at] = cells.join('\t');
    const bytes = new TextEncoder().encode(lines.join('\n'));
    const screenId = screenFor(facts).id;
    const mapping = MAPPINGS['plate-column-tsv'];
    const inspection = await inspectUpload(biologist, {
      screenId,
      bytes,
      filename: file.filename,
      mediaType: file.mediaType,
    });
    const request = { draftId: inspection.draftId!, sheet: facts.plates[0]!.sheet, mapping, label: 'x' };
    const preview = await previewImport(biologist, request);
    expect(preview.ok).toBe(false);
    expect(preview.plates.map((p) => p.ok)).toEqual([true, false]);
    expect(preview.plates[1]!.issues[0]!.message).toMatch(new RegExp(`^Plate "${second!.label}": Sheet `));
    const tables = [
      'plates',
      'wells',
      'readouts',
      'uploaded_files',
      'audit_events',
      'mail_outbox',
      'compute_jobs',
    ];
    const before = await Promise.all(tables.map(tableCount));
    await expect(commitImport(biologist, request)).rejects.toThrow(
      new RegExp(
        `^Plate "${second!.label}" has 1 error\\(s\\); first: .*Z99.* No plate of the file was stored\\.$`,
      ),
    );
    expect(await Promise.all(tables.map(tableCount))).toEqual(before);
  });
});
