// Seeds the invented demo scenario through Gatewell's own services, so every row is validated and
// audited like a user's: two screens with their targets, the demo compounds with a batch each, the
// generated plate exports of seeders/data/demo-plates imported as the demo biologist, and two of those
// plates taken on through sign-off with the demo users' signatures (one approved, one submitted), so that
// every role finds a plate at its own step.
// Run by seeders/20261201000200-demo-scenario.js as
//   node --conditions=react-server --import tsx scripts/seed-demo.ts
// (the react-server condition makes the 'server-only' marker an empty module outside Next).
import { loadActor } from '@/lib/auth/load-actor';
import type { Actor } from '@/lib/auth/roles';
import { createCompound, insertBatch } from '@/lib/compounds/service';
import { db } from '@/lib/db';
import { addTarget, createScreen } from '@/lib/screens/service';
import { screenSchema } from '@/lib/validation/screens';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { commitImport, inspectUpload } from '@/lib/plates/import-service';
import { signPlateStep } from '@/lib/signoff/service';
import type { SignoffAction } from '@/lib/domain/plate-states';
import { startJobWorkers, stopJobWorkers } from '@/lib/jobs/worker';
import { setTimeout as sleep } from 'node:timers/promises';
import { Compound, Plate, Screen } from '@/models';
import type { DemoManifest } from './demo-plates/demo-manifest';
import { DEMO_COMPOUNDS, DEMO_TARGETS } from './demo-plates/demo-compounds';

async function demoActor(email: string): Promise<Actor> {
  db();
  const { User } = await import('@/models');
  const user = await User.findOne({ where: { email } });
  const actor = user && (await loadActor(user.id, '127.0.0.1'));
  if (!actor) throw new Error(`demo user ${email} is missing: run the user seeder first`);
  const { sessionVersion: _v, ...rest } = actor;
  return rest;
}

/** Invented screens of the demo: a sodium pain screen and a potassium counter-screen. */
const DEMO_SCREENS = [
  {
    name: 'Pain sodium screen',
    description: 'Invented demo: state-dependent blockers of a neuronal sodium current, primary potency.',
    conductance: 'gNa',
    targets: Object.entries(DEMO_TARGETS)
      .filter(([, t]) => t.screen === 'Pain sodium screen')
      .map(([name]) => name),
  },
  {
    name: 'Potassium counter-screen',
    description: 'Invented demo: the same series on a slow M-type potassium current, for selectivity.',
    conductance: 'gM',
    targets: Object.entries(DEMO_TARGETS)
      .filter(([, t]) => t.screen === 'Potassium counter-screen')
      .map(([name]) => name),
  },
];

async function seedScreens(admin: Actor): Promise<void> {
  for (const demo of DEMO_SCREENS) {
    if (await Screen.findOne({ where: { name: demo.name } })) continue;
    const input = screenSchema.parse({
      name: demo.name,
      description: demo.description,
      neuronPreset: 'pospischil-rs-2008',
      zPrimeMin: 0.5,
      sealResistanceMin_GOhm: 0.5,
      controlCurrentMin_pA: 200,
      seriesResistanceMax_MOhm: 25,
      capacitanceMin_pF: 1,
      capacitanceMax_pF: 100,
      vehicleRundownMax_percent: 20,
      exposures_uM: '0.03, 0.1, 0.3, 1',
    });
    const { id } = await createScreen(admin, input);
    for (const name of demo.targets)
      await addTarget(admin, id, { name, conductance: demo.conductance, description: '' });
  }
}

async function seedCompounds(chemist: Actor): Promise<void> {
  for (const demo of DEMO_COMPOUNDS) {
    if (await Compound.findOne({ where: { identifier: demo.identifier } })) continue;
    const compound = await createCompound(chemist, {
      identifier: demo.identifier,
      name: demo.name,
      smiles: '',
      molecularWeight: demo.molecularWeight,
    });
    await db().transaction((transaction) =>
      insertBatch(
        chemist,
        compound.id,
        { lot: `${demo.identifier}-B01`, purity_percent: 98.5, stockConcentration_mM: 10, solvent: 'DMSO' },
        transaction,
      ),
    );
  }
}

const DEMO_DIR = path.join(process.cwd(), 'seeders', 'data', 'demo-plates');
const DEMO_FILES = [
  'nav-96-plate-01.xlsx',
  'nav-384-plate-02.xlsx',
  'kv-96-plate-01.csv',
  'nav-96-plate-03-noisy.xlsx',
];

/** Imports the generated demo exports through the same inspect → map → commit path a biologist uses. */
async function seedPlates(biologist: Actor): Promise<void> {
  for (const file of DEMO_FILES) {
    const manifest = JSON.parse(
      readFileSync(path.join(DEMO_DIR, `${file}.manifest.json`), 'utf8'),
    ) as DemoManifest;
    if (await Plate.findOne({ where: { label: manifest.plate } })) continue;
    const screen = await Screen.findOne({ where: { name: manifest.screen } });
    if (!screen) throw new Error(`demo screen ${manifest.screen} is missing`);
    const upload = {
      screenId: screen.id,
      bytes: new Uint8Array(readFileSync(path.join(DEMO_DIR, file))),
      filename: file,
      mediaType: file.endsWith('.csv')
        ? 'text/csv'
        : 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    };
    const inspection = await inspectUpload(biologist, upload);
    const sheet = inspection.sheets.find((s) => s.name === manifest.dataSheet);
    if (!sheet) throw new Error(`${file} has no sheet ${manifest.dataSheet}`);
    if (!inspection.draftId) throw new Error(`${file} was already imported for ${manifest.screen}`);
    await commitImport(biologist, {
      draftId: inspection.draftId,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
      label: manifest.plate,
      templateName: `Demo rig — ${sheet.name}`,
    });
  }
}

/** Runs the demo plates' queued fit jobs here, so that the demo opens with its fits current. */
async function fitDemoPlates(): Promise<void> {
  await startJobWorkers({ kinds: ['plate-fits'] });
  const deadline = Date.now() + 120_000;
  while ((await Plate.count({ where: { fitsPending: true } })) > 0) {
    if (Date.now() > deadline) throw new Error('the demo plates were not fitted within two minutes');
    await sleep(100);
  }
  await stopJobWorkers();
}

/** Demo sign-off: which plates go how far, signed by whom (the demo passwords of seeders/20261201000100-demo-users.js). */
const DEMO_SIGNOFF: {
  plate: string;
  steps: { action: SignoffAction; role: 'chemist' | 'biologist' | 'approver'; comment: string }[];
}[] = [
  {
    plate: 'NAV-P02',
    steps: [
      { action: 'verify', role: 'chemist', comment: 'Demo: compound map checked against the plate layout.' },
      { action: 'submit', role: 'biologist', comment: 'Demo: QC, exclusions and fits reviewed.' },
      { action: 'approve', role: 'approver', comment: 'Demo: potencies accepted.' },
    ],
  },
  {
    plate: 'NAV-P03',
    steps: [
      { action: 'verify', role: 'chemist', comment: 'Demo: compound map checked against the plate layout.' },
      {
        action: 'submit',
        role: 'biologist',
        comment: 'Demo: Z′ is below the screen limit on this noisy plate; for an approver to decide.',
      },
    ],
  },
];

/** Takes the demo plates still at import through their demo sign-off steps, each a signed step as in the app. */
async function seedSignoff(): Promise<void> {
  for (const demo of DEMO_SIGNOFF) {
    const plate = await Plate.findOne({ where: { label: demo.plate } });
    if (!plate || plate.state !== 'imported') continue;
    for (const step of demo.steps) {
      const actor = await demoActor(`${step.role}@gatewell.test`);
      await signPlateStep(actor, plate.id, {
        action: step.action,
        password: `demo-${step.role}-pass`,
        comment: step.comment,
        // The demo signers read the plate's QC warnings (NAV-P03's low Z′) and acknowledge them, as the panel asks.
        acknowledgeQcWarnings: true,
      });
    }
  }
}

async function main(): Promise<void> {
  const admin = await demoActor('admin@gatewell.test');
  const chemist = await demoActor('chemist@gatewell.test');
  await seedScreens(admin);
  await seedCompounds(chemist);
  await seedPlates(await demoActor('biologist@gatewell.test'));
  await fitDemoPlates();
  await seedSignoff();
  await db().close();
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
