import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { AuditEvent, Fit, Plate, Readout, UploadedFile, Well } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { demoFile, makeDemoScreens } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';

const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

async function countRows() {
  return {
    plates: await Plate.count(),
    wells: await Well.count(),
    readouts: await Readout.count(),
    fits: await Fit.count(),
    files: await UploadedFile.count(),
  };
}

describe('plate import on the real database', () => {
  let biologist: Actor;
  let screens: Record<string, string>;

  beforeEach(async () => {
    await resetDatabase();
    screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    biologist = await makeActor(['biologist']);
  });
  afterAll(() => db().close());

  /** Inspect, then commit the draft inspect kept with the guessed mapping; returns the file's upload too. */
  async function importDemo(name: string, mediaType = XLSX) {
    const { bytes, manifest } = demoFile(name);
    const upload = { screenId: screens[manifest.target]!, bytes, filename: name, mediaType };
    const inspection = await inspectUpload(biologist, upload);
    const sheet = inspection.sheets.find((s) => s.name === manifest.dataSheet)!;
    const choice = { sheet: sheet.name, mapping: sheet.guess.mapping, label: manifest.plate };
    const stored = await commitImport(biologist, { draftId: inspection.draftId!, ...choice });
    await fitsCurrent(stored.plateId);
    return { manifest, request: { ...upload, ...choice }, ...stored };
  }

  test.each(['nav-96-plate-01.xlsx', 'nav-384-plate-02.xlsx', 'kv-96-plate-01.csv'])(
    '%s round-trips: the fits recover the generator’s true IC50s within their 95 percent confidence intervals',
    async (name) => {
      const { manifest, plateId } = await importDemo(name, name.endsWith('.csv') ? 'text/csv' : XLSX);
      const plate = await Plate.findByPk(plateId);
      expect(plate?.format).toBe(manifest.format);
      expect(await Well.count({ where: { plateId } })).toBe(manifest.wellCount);
      // What is stored, not only what was fitted in memory: test wells hold the generator's concentrations.
      const stored = await Well.findAll({ where: { plateId, role: 'test' } });
      const concentrations = [...new Set(stored.map((w) => w.concentration_uM!.toPrecision(6)))]
        .map(Number)
        .sort((a, b) => b - a);
      expect(concentrations).toEqual([...manifest.concentrations_uM].sort((a, b) => b - a));
      const fits = await db().query<{
        identifier: string;
        status: string;
        ic50_ci_low_um: number;
        ic50_ci_high_um: number;
        ic50_lower_bound_um: number | null;
      }>(
        'select c.identifier, f.status, f.ic50_ci_low_um, f.ic50_ci_high_um, f.ic50_lower_bound_um from fits f join compounds c on c.id = f.compound_id where f.plate_id = :plateId',
        { replacements: { plateId }, type: 'SELECT' as never },
      );
      for (const truth of manifest.truth) {
        const fit = fits.find((f) => f.identifier === truth.compound)!;
        if (truth.ic50WithinTestedRange) {
          expect(fit.status, truth.compound).toBe('fitted');
          expect(fit.ic50_ci_low_um, truth.compound).toBeLessThanOrEqual(truth.ic50_uM);
          expect(fit.ic50_ci_high_um, truth.compound).toBeGreaterThanOrEqual(truth.ic50_uM);
        } else if (truth.blockAtHighest < 0.5) {
          expect(['above_range', 'inactive'], truth.compound).toContain(fit.status);
        }
      }
      // Every planned failing well carries a QC reason on its readout.
      for (const failing of manifest.failingWells) {
        const [row] = await db().query<{ reasons: unknown[] }>(
          'select r.qc_reasons as reasons from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId and w.position = :position',
          { replacements: { plateId, position: failing.well }, type: 'SELECT' as never },
        );
        expect(row?.reasons.length, `${failing.well} ${failing.kind}`).toBeGreaterThan(0);
      }
      expect(await AuditEvent.count({ where: { action: 'import', entityId: plateId } })).toBe(1);
    },
  );

  test('the noisy plate is stored with Z′ below the screen limit flagged', async () => {
    const { plateId, manifest } = await importDemo('nav-96-plate-03-noisy.xlsx');
    const plate = await Plate.findByPk(plateId);
    const [summary] = plate!.qcSummary as { zPrime: { zPrime: number; passes: boolean } }[];
    expect(manifest.zPrimeFromNoiseModel).toBeLessThan(0.5);
    expect(summary!.zPrime.passes).toBe(false);
    expect(summary!.zPrime.zPrime).toBeLessThan(0.5);
  });

  test('the same file for the same screen is refused with a link to the existing plate, and nothing is written', async () => {
    const { plateId, request } = await importDemo('nav-96-plate-01.xlsx');
    const before = await countRows();
    const inspection = await inspectUpload(biologist, request);
    expect(inspection.duplicateOf).toEqual({ plateId, label: 'NAV-P01' });
    expect(inspection.draftId).toBeNull(); // a file that cannot be stored again gets no draft
    await expect(commitImport(biologist, { ...request, label: 'again' })).rejects.toMatchObject({
      code: 'conflict',
      message: 'This exact file was already imported for this screen as plate NAV-P01.',
      details: { plateId },
    });
    expect(await countRows()).toEqual(before);
  });

  test('a chemist cannot import; a preview writes nothing', async () => {
    const { bytes, manifest } = demoFile('nav-96-plate-01.xlsx');
    const upload = { screenId: screens[manifest.target]!, bytes, filename: 'x.xlsx', mediaType: XLSX };
    await expect(inspectUpload(await makeActor(['chemist']), upload)).rejects.toMatchObject({
      code: 'forbidden',
    });
    const inspection = await inspectUpload(biologist, upload);
    const preview = await previewImport(biologist, {
      draftId: inspection.draftId!,
      sheet: manifest.dataSheet,
      mapping: inspection.sheets.find((s) => s.name === manifest.dataSheet)!.guess.mapping,
    });
    expect(preview.ok).toBe(true);
    expect(Object.keys(preview.qc).length).toBeGreaterThan(0);
    expect(await countRows()).toEqual({ plates: 0, wells: 0, readouts: 0, fits: 0, files: 0 });
  });
});
