import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import * as XLSX from 'xlsx';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { Plate } from '@/models';
import { layout, type FileFacts } from '../fixtures/export-layouts';
import type { ColumnMappingInput } from '@/lib/imports/mapping-schema';
import { Well } from '@/models';
import type { TableReadBack } from '../fixtures/export-layouts/layout-kit';
import { expectedIc50s, PLATES, type PlateName, type Target } from '../fixtures/export-layouts/truth';
import { fitsCurrent } from '../support/jobs';
import { MAPPINGS, SINGLE_PLATE_LAYOUTS, type SinglePlateLayout } from '../fixtures/export-layouts/mappings';
import { expectPlateHoldsTruth, layoutScreensSetup, type LayoutScreen } from '../support/layout-imports';
import { fileTargets } from '../support/layout-truth';

/**
 * The invented export layouts (tests/fixtures/export-layouts) through Gatewell's import service, each with
 * its mapping as a user writes it once (tests/fixtures/export-layouts/mappings.ts, shared with the script's
 * test, import-plate-cli-layouts.test.ts). The two layouts of several plates per file are mapped below, as a user maps them once.
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

interface Importable {
  name: string;
  /** Header of each field's column in the file. */
  columns: ColumnMappingInput['columns'];
  /**
   * Whether the file's target words are the screen's (up to case and punctuation), or one target is named,
   * or the target column holds the file's own words, mapped to the screen's targets.
   */
  targets: 'column' | 'fixed' | 'mapped';
  /** How a wide or grid sheet is laid out, and its header row (a grid's: the first grid's title). */
  layout?: ColumnMappingInput['layout'];
  headerRow?: number;
}

/** The mapping of a layout: the test's columns, the QC columns and units from the file's facts. */
function mappingFor(importable: Importable, facts: FileFacts): ColumnMappingInput {
  const targets = Object.keys(facts.targetWords) as Target[];
  const { units } = facts;
  // A table's QC columns come from the file's facts; a grid's are the test's own (its blocks' titles).
  const table = facts.readBack.shape === 'table' ? (facts.readBack as TableReadBack) : null;
  return {
    ...(importable.layout ? { layout: importable.layout } : {}),
    headerRow: importable.headerRow ?? table!.headerRow,
    columns: {
      ...(table
        ? {
            sealResistance: table.sealResistance,
            seriesResistance: table.seriesResistance,
            capacitance: table.capacitance,
          }
        : {}),
      ...importable.columns,
    },
    units: {
      concentration: units.concentration,
      controlCurrent: units.current,
      compoundCurrent: units.current,
      sealResistance: units.sealResistance,
      seriesResistance: units.seriesResistance,
      capacitance: units.capacitance,
      ...(units.block ? { block: units.block } : {}),
    },
    fixedTarget: importable.targets === 'fixed' ? targets[0]! : null,
    // The file's own target words, mapped to the screen's targets.
    targetValues:
      importable.targets === 'mapped'
        ? Object.fromEntries(targets.map((target) => [facts.targetWords[target]!, target]))
        : {},
    // The file's way of writing a missing value, where Gatewell does not read it so by default.
    missing: { notANumber: facts.missingMarker === 'NaN' },
    // The file's own words for the roles, in the role column or as the compound identifier.
    roleValues: {
      [facts.roleWords.vehicle]: 'vehicle',
      [facts.roleWords.reference]: 'reference',
      [facts.roleWords.test]: 'test',
    },
    controls: {
      negative: [facts.roleWords.vehicle],
      positive: [facts.roleWords.reference],
      zeroConcentration: false,
    },
  };
}

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
   * once (the file's columns, units and words, and how its plates are told apart), each file is stored as a
   * plate per plate of the truth in one transaction; QC flags exactly each plate's bad wells, every
   * measurable IC50 of each plate is within ±15 % of the truth and its CI holds it, and the template saved
   * with the first file reads a second file of the layout by its fingerprint with no edit.
   */
  const SEVERAL: (Importable & { plates: ColumnMappingInput['plates'] })[] = [
    {
      name: 'plates-per-sheet',
      targets: 'mapped',
      plates: { by: 'sheet' },
      columns: {
        well: 'Well',
        role: 'Well type',
        compound: 'Compound',
        concentration: 'Conc (uM)',
        target: 'Target',
        controlCurrent: 'I pre (pA)',
        compoundCurrent: 'I post (pA)',
      },
    },
    {
      name: 'plate-column-tsv',
      targets: 'mapped',
      plates: { by: 'column', column: 'Plate barcode' },
      columns: {
        well: 'Well',
        role: 'Role',
        compound: 'Compound',
        concentration: 'Conc (nM)',
        target: 'Target',
        controlCurrent: 'I control (nA)',
        compoundCurrent: 'I compound (nA)',
      },
    },
  ];

  /** QC flags exactly the plate's bad wells; each measurable IC50 of its plan within ±15 % and inside its CI. */
  async function expectPlateMatchesTruth(
    plateId: string,
    truth: FileFacts['plates'][number],
    targets: Target[],
  ) {
    await fitsCurrent(plateId);
    const stored = await Plate.findByPk(plateId, { rejectOnEmpty: true });
    expect(stored.label).toBe(truth.label);
    expect(stored.format).toBe(truth.format);
    expect(await Well.count({ where: { plateId } })).toBe(truth.wellCount);
    const flagged = await db().query<{ position: string }>(
      `select distinct w.position from readouts r join wells w on w.id = r.well_id
         where w.plate_id = :plateId and jsonb_array_length(r.qc_reasons) > 0 order by w.position`,
      { replacements: { plateId }, type: 'SELECT' as never },
    );
    expect(flagged.map((f) => f.position)).toEqual(truth.badWells.map((b) => b.well).sort());
    const fits = await db().query<{
      identifier: string;
      target: string;
      status: string;
      ic50: number;
      low: number;
      high: number;
    }>(
      `select c.identifier, t.name as target, f.status, f.ic50_um as ic50, f.ic50_ci_low_um as low,
              f.ic50_ci_high_um as high
         from fits f join compounds c on c.id = f.compound_id join targets t on t.id = f.target_id
         where f.plate_id = :plateId`,
      { replacements: { plateId }, type: 'SELECT' as never },
    );
    const name = (Object.keys(PLATES) as PlateName[]).find((n) => PLATES[n].barcode === truth.label)!;
    const expected = expectedIc50s(PLATES[name], targets);
    expect(expected.length).toBeGreaterThan(0);
    for (const ic50 of expected) {
      const label = `${truth.label}: ${ic50.compound} on ${ic50.target}`;
      const fit = fits.find((f) => f.identifier === ic50.compound && f.target === ic50.target);
      expect(fit?.status, label).toBe('fitted');
      expect(fit!.ic50 / ic50.ic50_uM, label).toBeGreaterThanOrEqual(0.85);
      expect(fit!.ic50 / ic50.ic50_uM, label).toBeLessThanOrEqual(1.15);
      expect(fit!.low, label).toBeLessThanOrEqual(ic50.ic50_uM);
      expect(fit!.high, label).toBeGreaterThanOrEqual(ic50.ic50_uM);
    }
  }

  const tableCount = async (table: string) =>
    (
      await db().query<{ n: number }>(`select count(*)::int as n from ${table}`, { type: 'SELECT' as never })
    )[0]!.n;

  test.each(SEVERAL)(
    '$name: mapped once, stored as a plate each (QC, IC50s, CIs), and its template reads a second file',
    async (importable) => {
      const file = layout(importable.name).write();
      const { facts } = file;
      const targets = Object.keys(facts.targetWords) as Target[];
      const screenId = screenFor(facts).id;
      const mapping = { ...mappingFor(importable, facts), plates: importable.plates };
      const upload = { screenId, bytes: file.bytes, filename: file.filename, mediaType: file.mediaType };
      const inspection = await inspectUpload(biologist, upload);
      // The guess proposes how the plates are told apart.
      const guessed = inspection.sheets.find((s) => s.name === facts.plates[0]!.sheet)!.guess.mapping.plates;
      expect(guessed).toEqual({ by: importable.plates!.by, column: importable.plates!.column ?? null });
      const draftId = inspection.draftId!;
      const sheet = facts.plates[0]!.sheet;
      const preview = await previewImport(biologist, { draftId, sheet, mapping });
      expect(preview.fileProblems).toEqual([]);
      expect(preview.plates.map((p) => [p.label, p.wellCount, p.ok])).toEqual(
        facts.plates.map((p) => [p.label, p.wellCount, true]),
      );
      const files = await tableCount('uploaded_files');
      const audits = await tableCount(`audit_events where action = 'import'`);
      const mails = await tableCount(`mail_outbox where kind = 'plate_imported'`);
      const name = `${importable.name} layout`;
      const committed = await commitImport(biologist, {
        draftId,
        sheet,
        mapping,
        label: 'unused',
        templateName: name,
      });
      expect(committed.plates.map((p) => p.label)).toEqual(facts.plates.map((p) => p.label));
      for (const [i, truth] of facts.plates.entries())
        await expectPlateMatchesTruth(committed.plates[i]!.plateId, truth, targets);
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

      // The same file again is a duplicate, named by its first plate.
      const again = await inspectUpload(biologist, upload);
      expect(again.duplicateOf?.plateId).toBe(committed.plates[0]!.plateId);

      // A second file of the layout: recognised by the template, previewed and stored with no edit.
      const second = secondFile(layout(importable.name).write());
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
    const mapping = {
      ...mappingFor(SEVERAL[1]!, facts),
      plates: SEVERAL[1]!.plates,
    };
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
