// What the tests of the invented export layouts (tests/fixtures/export-layouts) share, whichever way a
// file is imported (the import service, scripts/import-plate.ts): the screens they import onto, the
// check of a stored plate against the truth (what needs no database: ./layout-truth.ts).
import { expect } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { addTarget, createScreen } from '@/lib/screens/service';
import { screenSchema } from '@/lib/validation/screens';
import { Plate, Well } from '@/models';
import type { FileFacts, PlateFacts } from '../fixtures/export-layouts/layout-kit';
import { makeActor } from './actors';
import { DEMO_SCREEN_SETTINGS, demoScreensSetup } from './demo-scenario';
import { fitsCurrent } from './jobs';
import { fileTargets } from './layout-truth';

/** A screen a layout file is imported onto: its id and name. */
export interface LayoutScreen {
  id: string;
  name: string;
}

/**
 * A fresh database with the demo screens (one target each) and a screen of both targets at Gatewell's
 * default QC limits, and a biologist to import. `screenFor(facts)` is the screen of the targets a file records.
 */
export async function layoutScreensSetup(): Promise<{
  biologist: Actor;
  screenFor: (facts: FileFacts) => LayoutScreen;
}> {
  const setup = await demoScreensSetup();
  const admin = await makeActor(['admin']);
  const both = await createScreen(
    admin,
    screenSchema.parse({ ...DEMO_SCREEN_SETTINGS, name: 'Sodium and potassium screen' }),
  );
  await addTarget(admin, both.id, { name: 'Nav1.7', conductance: 'gNa', description: '' });
  await addTarget(admin, both.id, { name: 'Kv7.2', conductance: 'gM', description: '' });
  const screens: Record<string, LayoutScreen> = {
    'Nav1.7': { id: setup.screens['Nav1.7']!, name: 'Pain sodium screen' },
    'Kv7.2': { id: setup.screens['Kv7.2']!, name: 'Potassium counter-screen' },
    'Nav1.7+Kv7.2': { id: both.id, name: 'Sodium and potassium screen' },
  };
  const screenFor = (facts: FileFacts) => {
    const screen = screens[fileTargets(facts).join('+')];
    if (!screen) throw new RangeError(`no screen of the targets ${fileTargets(facts).join(', ')}`);
    return screen;
  };
  return { biologist: setup.biologist, screenFor };
}

/** A stored plate's fits, by compound identifier and target name (IC50 and its 95 % CI in µM). */
async function storedFits(plateId: string) {
  return db().query<{
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
}

/**
 * A stored plate against the truth of the file it came from, once its fits are current: its format and
 * wells, QC flagging exactly the truth's bad wells (on any target), and every measurable compound ×
 * target fitted with its IC50 within ±15 % of the truth and its 95 % CI holding the truth. The ±15 % and
 * the CI are the fixture's criteria (tests/fixtures/export-layouts/README.md, Seeds): common practice for
 * a recovered potency, no published source.
 */
export async function expectPlateHoldsTruth(
  plateId: string,
  plateFacts: PlateFacts,
  expectedIc50: FileFacts['expectedIc50'],
): Promise<void> {
  await fitsCurrent(plateId);
  const stored = await Plate.findByPk(plateId, { rejectOnEmpty: true });
  expect(stored.format).toBe(plateFacts.format);
  expect(await Well.count({ where: { plateId } })).toBe(plateFacts.wellCount);

  const flagged = await db().query<{ position: string }>(
    `select distinct w.position from readouts r join wells w on w.id = r.well_id
       where w.plate_id = :plateId and jsonb_array_length(r.qc_reasons) > 0 order by w.position`,
    { replacements: { plateId }, type: 'SELECT' as never },
  );
  expect(flagged.map((f) => f.position)).toEqual(plateFacts.badWells.map((b) => b.well).sort());

  const fits = await storedFits(plateId);
  expect(expectedIc50.length).toBeGreaterThan(0);
  for (const truth of expectedIc50) {
    const label = `${truth.compound} on ${truth.target}`;
    const fit = fits.find((f) => f.identifier === truth.compound && f.target === truth.target);
    expect(fit?.status, label).toBe('fitted');
    expect(fit!.ic50 / truth.ic50_uM, label).toBeGreaterThanOrEqual(0.85);
    expect(fit!.ic50 / truth.ic50_uM, label).toBeLessThanOrEqual(1.15);
    expect(fit!.low, label).toBeLessThanOrEqual(truth.ic50_uM);
    expect(fit!.high, label).toBeGreaterThanOrEqual(truth.ic50_uM);
  }
}
