// Writes Gatewell's invented demo plate exports and their truth manifests.
// Usage: npx tsx scripts/make-demo-plates.ts [output folder, default seeders/data/demo-plates]
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { DEMO_COMPOUNDS, DEMO_TARGETS } from './demo-plates/demo-compounds';
import { makeDemoPlate } from './demo-plates/make-demo-plate';
import { PLATE_PLANS } from './demo-plates/plate-plans';

function main(): void {
  const folder = path.resolve(process.argv[2] ?? path.join('seeders', 'data', 'demo-plates'));
  mkdirSync(folder, { recursive: true });
  for (const plan of PLATE_PLANS) {
    const plate = makeDemoPlate(plan);
    writeFileSync(path.join(folder, plan.file), plate.bytes);
    writeFileSync(
      path.join(folder, `${plan.file}.manifest.json`),
      `${JSON.stringify(plate.manifest, null, 2)}\n`,
    );
    console.log(
      `${plan.file}: ${plate.wells.length} wells, ${plate.bytes.length} bytes, Z′ from noise model ${plate.manifest.zPrimeFromNoiseModel}`,
    );
  }
  const scenario = {
    note: 'Invented demo data for Gatewell; not measurements.',
    targets: DEMO_TARGETS,
    compounds: DEMO_COMPOUNDS,
  };
  writeFileSync(path.join(folder, 'demo-compounds.json'), `${JSON.stringify(scenario, null, 2)}\n`);
  console.log(`demo-compounds.json: ${DEMO_COMPOUNDS.length} compounds; files in ${folder}`);
}

main();
