import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import * as XLSX from 'xlsx';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { Plate } from '@/models';
import { layout, type FileFacts } from '../fixtures/export-layouts';
import { MAPPINGS, SINGLE_PLATE_LAYOUTS, type SinglePlateLayout } from '../fixtures/export-layouts/mappings';
import { expectPlateHoldsTruth, layoutScreensSetup, type LayoutScreen } from '../support/layout-imports';
import { fileTargets } from '../support/layout-truth';

/**
 * The invented export layouts (tests/fixtures/export-layouts) through Gatewell's import service, each with
 * its mapping as a user writes it once (tests/fixtures/export-layouts/mappings.ts, shared with the script's
 * test, import-plate-cli-layouts.test.ts). The layouts of several plates per file are not read here yet.
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
});
