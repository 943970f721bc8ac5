import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { Fit, Plate, Readout, Well } from '@/models';
import { importRowCounts } from '../support/import-counts';
import { demoFile, potassiumImportSetup } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';

// Whole-file errors and warnings through the import service: what the check step is told about a file
// renamed, empty, without its optional QC columns or without a required one, and what is stored.

const SERIES_RULE =
  'The series resistance rule (1 to 25 MΩ) was not applied: no well has a series resistance. The other QC rules, Z′ and the fits still run.';
const CAPACITANCE_RULE =
  'The capacitance rule (1 to 100 pF) was not applied: no well has a capacitance. The other QC rules, Z′ and the fits still run.';

/** The demo potassium plate's CSV (its truth in the manifest) without the named columns. */
function demoCsvWithout(...headers: string[]) {
  const { bytes, manifest } = demoFile('kv-96-plate-01.csv');
  const lines = new TextDecoder()
    .decode(bytes)
    .replace(/^\ufeff/, '')
    .trimEnd()
    .split(/\r?\n/);
  const drop = new Set(lines[0]!.split(',').flatMap((h, i) => (headers.includes(h) ? [i] : [])));
  expect(drop.size).toBe(headers.length);
  const kept = lines.map((line) =>
    line
      .split(',')
      .filter((_, i) => !drop.has(i))
      .join(','),
  );
  return { bytes: new TextEncoder().encode(`${kept.join('\n')}\n`), manifest };
}

describe('whole-file errors and warnings through the import service', () => {
  let biologist: Actor;
  let screenId: string;

  beforeAll(async () => {
    ({ biologist, screenId } = await potassiumImportSetup());
  });
  afterAll(() => db().close());

  const upload = (bytes: Uint8Array, filename: string) => ({
    screenId,
    bytes,
    filename,
    mediaType: 'application/octet-stream',
  });

  async function inspectAndPreview(bytes: Uint8Array, filename: string) {
    const inspection = await inspectUpload(biologist, upload(bytes, filename));
    const sheet = inspection.sheets[0]!;
    const choice = { draftId: inspection.draftId!, sheet: sheet.name, mapping: sheet.guess.mapping };
    return { choice, preview: await previewImport(biologist, choice) };
  }

  test('a text file renamed to .xlsx is told it is text, and nothing is written', async () => {
    const before = await importRowCounts();
    const prose = new TextEncoder().encode(
      'Rig 2, Tuesday\nThe seal on row B was lost after the second addition, so please ignore it.\nAnn\n',
    );
    await expect(inspectUpload(biologist, upload(prose, 'run-notes.xlsx'))).rejects.toMatchObject({
      code: 'invalid',
      message:
        'run-notes.xlsx is text, not a spreadsheet: its lines are not split into columns by commas, semicolons or tabs. Upload the export the instrument wrote (xlsx, xls or csv).',
      details: { code: 'not_spreadsheet' },
    });
    expect(await importRowCounts()).toEqual(before);
  });

  test('a CSV saved under an .xlsx name imports as the CSV it is', async () => {
    const { bytes } = demoFile('kv-96-plate-01.csv');
    const { preview } = await inspectAndPreview(bytes, 'kv-96-plate-01.xlsx');
    expect(preview.fileProblems).toEqual([]);
    expect(preview.ok).toBe(true);
    expect(preview.plate?.wells).toHaveLength(96);
  });

  test('a file of 0 bytes is told it is empty, and nothing is written', async () => {
    const before = await importRowCounts();
    const error = await inspectUpload(biologist, upload(new Uint8Array(0), 'plate-07.csv')).catch(
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).message).toBe(
      'plate-07.csv is empty (0 bytes): the file holds nothing to import. Export the plate from the instrument again and upload that file.',
    );
    expect(await importRowCounts()).toEqual(before);
  });

  test('a missing required column is a whole-file problem with what to do; commit refuses it and writes nothing', async () => {
    const { bytes } = demoCsvWithout('I compound (pA)');
    const { choice, preview } = await inspectAndPreview(bytes, 'no-compound-current.csv');
    const problem = {
      code: 'missing_column',
      message:
        'Sheet "no-compound-current", row 1: no column is chosen for the compound current, which every plate needs.',
      whatToDo:
        'On the mapping step, choose the column that holds the compound current. If the export has no such column, set the instrument to write it: Gatewell cannot store a plate without the compound current.',
    };
    expect(preview.fileProblems).toEqual([problem]);
    expect(preview.ok).toBe(false);
    expect(preview.qcRulesNotApplied).toEqual([]);

    const before = await importRowCounts();
    await expect(commitImport(biologist, { ...choice, label: 'KV-NO-I' })).rejects.toMatchObject({
      code: 'invalid',
      message: `The sheet has 1 error(s); first: ${problem.message} ${problem.whatToDo}`,
      details: { fileProblems: [problem] },
    });
    expect(await importRowCounts()).toEqual(before);
  });

  test('without series resistance and capacitance: both rules not applied, the truth’s bad wells flagged, Z′ and fits stored', async () => {
    const { bytes, manifest } = demoCsvWithout('Rs (MΩ)', 'Cm (pF)');
    const { choice, preview } = await inspectAndPreview(bytes, 'kv-no-rs-cm.csv');
    expect(preview.ok).toBe(true);
    expect(preview.fileProblems).toEqual([]);
    expect(preview.qcRulesNotApplied.map((r) => r.message)).toEqual([SERIES_RULE, CAPACITANCE_RULE]);
    // Every QC flag of the check step is one of the truth's bad wells, and every bad well is flagged.
    const wellOfRow = new Map(preview.rows.map((r) => [r.row, r.values.well]));
    const flaggedAtCheck = Object.keys(preview.qc).map((row) => wellOfRow.get(Number(row)));
    expect(flaggedAtCheck.sort()).toEqual(manifest.failingWells.map((w) => w.well).sort());

    const { plateId } = await commitImport(biologist, { ...choice, label: 'KV-NO-RS-CM' });
    await fitsCurrent(plateId);
    const plate = await Plate.findByPk(plateId);
    const [summary] = plate!.qcSummary as {
      zPrime: { zPrime: number | null };
      qcRulesNotApplied?: { rule: string; message: string }[];
    }[];
    expect(summary!.qcRulesNotApplied?.map((r) => [r.rule, r.message])).toEqual([
      ['series_resistance', SERIES_RULE],
      ['capacitance', CAPACITANCE_RULE],
    ]);
    expect(summary!.zPrime.zPrime).not.toBeNull();

    const wells = await Well.findAll({ where: { plateId } });
    const readouts = await Readout.findAll({ where: { wellId: wells.map((w) => w.id) } });
    const position = new Map(wells.map((w) => [w.id, w.position]));
    const flagged = readouts.filter((r) => r.qcReasons.length > 0).map((r) => position.get(r.wellId));
    expect(flagged.sort()).toEqual(manifest.failingWells.map((w) => w.well).sort());

    // The compound whose IC50 lies within the tested range is fitted, its CI holding the generator's IC50.
    const fits = await db().query<{ identifier: string; status: string; low: number; high: number }>(
      'select c.identifier, f.status, f.ic50_ci_low_um as low, f.ic50_ci_high_um as high from fits f join compounds c on c.id = f.compound_id where f.plate_id = :plateId',
      { replacements: { plateId }, type: 'SELECT' as never },
    );
    expect(await Fit.count({ where: { plateId } })).toBe(manifest.truth.length);
    for (const truth of manifest.truth.filter((t) => t.ic50WithinTestedRange)) {
      const fit = fits.find((f) => f.identifier === truth.compound)!;
      expect(fit.status, truth.compound).toBe('fitted');
      expect(fit.low, truth.compound).toBeLessThanOrEqual(truth.ic50_uM);
      expect(fit.high, truth.compound).toBeGreaterThanOrEqual(truth.ic50_uM);
    }
  });

  test('a file that carries every column stores the same QC summary as before: no rules not applied', async () => {
    const { bytes } = demoFile('kv-96-plate-01.csv');
    const renamed = new Uint8Array([...bytes, ...new TextEncoder().encode('\n')]); // another file, same rows
    const { choice, preview } = await inspectAndPreview(renamed, 'kv-full.csv');
    expect(preview.qcRulesNotApplied).toEqual([]);
    const { plateId } = await commitImport(biologist, { ...choice, label: 'KV-FULL' });
    const plate = await Plate.findByPk(plateId);
    for (const target of plate!.qcSummary as object[])
      expect(Object.keys(target).sort()).toEqual([
        'normalised',
        'notes',
        'rundownCorrected',
        'target',
        'vehicleMeanRatio',
        'zPrime',
      ]);
  });
});
