// The one-request import on the real database: the service behind POST /api/imports/plate (checked, then
// stored by a job worker from an import draft), its refusal of a file with errors and of a file already
// stored, and scripts/import-plate.ts as a child process importing into this test database.
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { startJobWorkers, stopJobWorkers } from '@/lib/jobs/worker';
import { importOnce } from '@/lib/plates/import-once';
import { ImportDraft, Plate, Well } from '@/models';
import { layout } from '../fixtures/export-layouts';
import { importRowCounts } from '../support/import-counts';
import { demoFile, demoScreensSetup } from '../support/demo-scenario';
import { ROOT as root, runScript } from '../support/run-script';

describe('import in one request', () => {
  let biologist: Actor;

  beforeAll(async () => {
    await startJobWorkers({ sweep: false });
    ({ biologist } = await demoScreensSetup());
  });
  afterAll(async () => {
    await stopJobWorkers();
    await db().close();
  });

  test('the route’s service: a clean file is checked, stored by a worker from its draft, and its facts answered', async () => {
    const { bytes, manifest } = demoFile('nav-96-plate-01.xlsx');
    const result = await importOnce(
      biologist,
      { screen: 'pain SODIUM screen', file: { bytes, filename: 'nav-96-plate-01.xlsx', mediaType: '' } },
      { via: 'job' },
    );
    expect(result.state).toBe('stored');
    const plate = await Plate.findOne({ where: { label: 'nav-96-plate-01' }, rejectOnEmpty: true });
    expect(result).toMatchObject({ state: 'stored', plateId: plate.id });
    expect(result.facts).toMatchObject({
      plateLabel: 'nav-96-plate-01',
      labelSource: 'file',
      template: null,
      wellCount: manifest.wellCount,
      targets: [manifest.target],
      unregisteredCompounds: [],
      errors: [],
    });
    expect(await Well.count({ where: { plateId: plate.id } })).toBe(manifest.wellCount);
    // The draft the check kept was used up by the worker's commit.
    const drafts = await ImportDraft.findAll({ where: { ownerId: biologist.id } });
    expect(drafts.map((d) => d.plateId)).toEqual([plate.id]);

    const again = await importOnce(
      biologist,
      { screen: 'Pain sodium screen', file: { bytes, filename: 'again.xlsx', mediaType: '' } },
      { via: 'job' },
    ).catch((error: unknown) => error);
    expect(again).toMatchObject({
      code: 'conflict',
      message: 'This exact file was already imported for this screen as plate nav-96-plate-01.',
      details: { plateId: plate.id },
    });
  });

  test('a file with errors is refused with its facts and problems; nothing is stored', async () => {
    const written = layout('semicolon-decimal-comma').write();
    const before = await importRowCounts();
    const refusal = await importOnce(
      biologist,
      { screen: 'Pain sodium screen', label: 'NOT-STORED', file: { ...written, mediaType: '' } },
      { via: 'job' },
    ).catch((error: unknown) => error);
    expect(refusal).toMatchObject({
      code: 'invalid',
      details: {
        facts: {
          plateLabel: 'NOT-STORED',
          wellCount: 0,
          errors: [
            'Sheet "GWX-096-0417", row 1, column E "Sample type": the well-role column holds words Gatewell cannot place: "solvent", "library", "blocker"; on the mapping step assign each to negative control, positive control, test or empty.',
            'The sheet holds no wells.',
          ],
        },
      },
    });
    expect(await importRowCounts()).toEqual(before);
  });

  test('the script imports into the database as the account named, and refuses the same file again', async () => {
    const file = join(root, 'seeders/data/demo-plates/kv-96-plate-01.csv');
    const { manifest } = demoFile('kv-96-plate-01.csv');
    const dry = runScript([
      file,
      '--screen',
      'Potassium counter-screen',
      '--as',
      biologist.email,
      '--dry-run',
      '--json',
    ]);
    expect(dry.stderr).toBe('');
    expect(dry.code).toBe(0);
    expect(JSON.parse(dry.stdout)).toMatchObject({
      plateLabel: 'kv-96-plate-01',
      unregisteredCompounds: [],
      errors: [],
    });
    expect(await Plate.count({ where: { label: 'KV-P01' } })).toBe(0);

    const out = runScript([
      file,
      '--screen',
      'Potassium counter-screen',
      '--as',
      biologist.email,
      '--label',
      'KV-P01',
      '--json',
    ]);
    expect(out.stderr).toBe('');
    expect(out.code).toBe(0);
    const printed = JSON.parse(out.stdout) as { plateId: string; plateLabel: string; wellCount: number };
    const plate = await Plate.findOne({ where: { label: 'KV-P01' }, rejectOnEmpty: true });
    expect(printed).toMatchObject({ plateId: plate.id, plateLabel: 'KV-P01', wellCount: manifest.wellCount });
    expect(plate.importedBy).toBe(biologist.id);

    const twice = runScript([file, '--screen', 'Potassium counter-screen', '--as', biologist.email]);
    expect(twice.code).toBe(1);
    expect(twice.stdout).toMatch(
      /refused: This exact file was already imported for this screen as plate KV-P01\.\n$/,
    );
    // Three script runs, each a fresh Node process: several seconds each on a busy machine.
  }, 180_000);

  test('the script refuses an account that may not import', async () => {
    const file = join(root, 'seeders/data/demo-plates/kv-96-plate-01.csv');
    const out = runScript([
      file,
      '--screen',
      'Potassium counter-screen',
      '--as',
      'nobody@gatewell.test',
      '--json',
    ]);
    expect(out.code).toBe(1);
    expect(JSON.parse(out.stdout)).toMatchObject({
      refused: 'no enabled account with the e-mail nobody@gatewell.test',
      errors: ['no enabled account with the e-mail nobody@gatewell.test'],
    });
  }, 120_000);
});
