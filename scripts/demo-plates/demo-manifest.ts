// The truth behind a demo export, written beside it as JSON so fits and QC can be checked against it.
import { DEMO_COMPOUNDS, DEMO_TARGETS, trueBlock, type DemoTarget } from './demo-compounds';
import type { DemoExport } from './export-layouts';
import type { FailureKind, NoiseModel, PlatePlan } from './plate-plans';
import type { DemoWell } from './simulate-plate';

/** The manifest of one demo file. */
export interface DemoManifest {
  file: string;
  generator: 'scripts/make-demo-plates.ts';
  note: string;
  seed: number;
  plate: string;
  screen: string;
  target: DemoTarget;
  format: 96 | 384;
  dataSheet: string;
  headerRow: number;
  wellCount: number;
  concentrations_uM: number[];
  replicates: number;
  noise: NoiseModel;
  /** Z′ the noise model implies: 1 − 3 (σ_ref + σ_veh) / |μ_ref − μ_veh| on the ratio I_compound / I_control. */
  zPrimeFromNoiseModel: number;
  truth: {
    compound: string;
    target: DemoTarget;
    ic50_uM: number;
    hillSlope: number;
    blockAtHighest: number;
    ic50WithinTestedRange: boolean;
  }[];
  failingWells: { well: string; target: DemoTarget; kind: FailureKind; missing: string | null }[];
}

/** Builds the manifest of one plan's export. */
export function makeManifest(plan: PlatePlan, wells: DemoWell[], exported: DemoExport): DemoManifest {
  const highest = Math.max(...plan.concentrations_uM);
  const lowest = Math.min(...plan.concentrations_uM);
  const { noise } = plan;
  const sdVehicle = Math.hypot(noise.rundownSd, noise.ratioSd);
  const zPrime =
    1 - (3 * (noise.referenceSd + sdVehicle)) / Math.abs(noise.referenceRatio - noise.rundownMean);
  return {
    file: plan.file,
    generator: 'scripts/make-demo-plates.ts',
    note: 'Invented demo data for Gatewell; not measurements.',
    seed: plan.seed,
    plate: plan.plateName,
    screen: DEMO_TARGETS[plan.target].screen,
    target: plan.target,
    format: plan.format,
    dataSheet: exported.dataSheet,
    headerRow: exported.headerRow,
    wellCount: wells.length,
    concentrations_uM: plan.concentrations_uM,
    replicates: plan.replicates,
    noise,
    zPrimeFromNoiseModel: Number(zPrime.toFixed(3)),
    truth: plan.compounds.map((identifier) => {
      const potency = DEMO_COMPOUNDS.find((c) => c.identifier === identifier)?.truth[plan.target];
      if (!potency) throw new RangeError(`demo compound ${identifier} is not defined`);
      return {
        compound: identifier,
        target: plan.target,
        ...potency,
        blockAtHighest: Number(trueBlock(highest, potency).toFixed(4)),
        ic50WithinTestedRange: potency.ic50_uM >= lowest && potency.ic50_uM <= highest,
      };
    }),
    failingWells: plan.failures.map((f) => ({
      well: f.well,
      target: plan.target,
      kind: f.kind,
      missing: f.missing ?? null,
    })),
  };
}
