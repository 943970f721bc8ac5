// One demo plate end to end: simulate, lay out, write bytes, describe the truth.
import { makeManifest, type DemoManifest } from './demo-manifest';
import { layOutExport, type DemoExport } from './export-layouts';
import type { PlatePlan } from './plate-plans';
import { simulatePlate, type DemoWell } from './simulate-plate';
import { writeExport } from './write-export';

/** A generated demo plate: the simulated wells, the export's sheets and bytes, and its manifest. */
export interface DemoPlate {
  plan: PlatePlan;
  wells: DemoWell[];
  exported: DemoExport;
  bytes: Uint8Array;
  manifest: DemoManifest;
}

/** Generates one plate of the demo scenario; the same plan always gives the same wells. */
export function makeDemoPlate(plan: PlatePlan): DemoPlate {
  const wells = simulatePlate(plan);
  const exported = layOutExport(plan, wells);
  return {
    plan,
    wells,
    exported,
    bytes: writeExport(plan.file, exported),
    manifest: makeManifest(plan, wells, exported),
  };
}
