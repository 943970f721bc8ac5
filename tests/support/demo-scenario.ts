import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Actor } from '@/lib/auth/roles';
import { createCompound } from '@/lib/compounds/service';
import { addTarget, createScreen } from '@/lib/screens/service';
import { screenSchema } from '@/lib/validation/screens';
import type { DemoManifest } from '@/scripts/demo-plates/demo-manifest';
import { DEMO_COMPOUNDS } from '@/scripts/demo-plates/demo-compounds';
import { makeActor } from './actors';
import { resetDatabase } from './database';

export const DEMO_DIR = path.join(process.cwd(), 'seeders', 'data', 'demo-plates');

export function demoFile(name: string): { bytes: Uint8Array; manifest: DemoManifest } {
  return {
    bytes: new Uint8Array(readFileSync(path.join(DEMO_DIR, name))),
    manifest: JSON.parse(readFileSync(path.join(DEMO_DIR, `${name}.manifest.json`), 'utf8')) as DemoManifest,
  };
}

/** The settings of the demo screens (Gatewell's default QC limits), all but the name. */
export const DEMO_SCREEN_SETTINGS = {
  description: '',
  neuronPreset: 'pospischil-rs-2008',
  zPrimeMin: 0.5,
  sealResistanceMin_GOhm: 0.5,
  controlCurrentMin_pA: 200,
  seriesResistanceMax_MOhm: 25,
  capacitanceMin_pF: 1,
  capacitanceMax_pF: 100,
  vehicleRundownMax_percent: 20,
  exposures_uM: '0.1, 1',
};

/** One screen per demo target (as the demo seeder makes them) and the demo compounds; returns screen ids by target. */
export async function makeDemoScreens(admin: Actor, chemist: Actor): Promise<Record<string, string>> {
  const base = DEMO_SCREEN_SETTINGS;
  const nav = await createScreen(admin, screenSchema.parse({ ...base, name: 'Pain sodium screen' }));
  await addTarget(admin, nav.id, { name: 'Nav1.7', conductance: 'gNa', description: '' });
  const kv = await createScreen(admin, screenSchema.parse({ ...base, name: 'Potassium counter-screen' }));
  await addTarget(admin, kv.id, { name: 'Kv7.2', conductance: 'gM', description: '' });
  for (const c of DEMO_COMPOUNDS)
    await createCompound(chemist, {
      identifier: c.identifier,
      name: c.name,
      smiles: '',
      molecularWeight: c.molecularWeight,
    });
  return { 'Nav1.7': nav.id, 'Kv7.2': kv.id };
}

/** A fresh database with the demo screens and compounds, and a biologist to import onto them. */
export async function demoScreensSetup(): Promise<{ biologist: Actor; screens: Record<string, string> }> {
  await resetDatabase();
  const screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
  return { biologist: await makeActor(['biologist']), screens };
}

/** A fresh database with the demo screens and compounds, and a biologist to import onto the potassium screen. */
export async function potassiumImportSetup(): Promise<{ biologist: Actor; screenId: string }> {
  const { biologist, screens } = await demoScreensSetup();
  return { biologist, screenId: screens['Kv7.2']! };
}
