// Fractional block per well, corrected for vehicle run-down, with plate Z′ per target.
import { mean } from 'simple-statistics';
import type { WellRole } from '../qc/well';
import { plateZPrime, type ZPrimeResult } from '../qc/zprime';

export interface BlockWell {
  wellId: string;
  /** The current measured (the screen's target name). */
  target: string;
  role: WellRole;
  /** Current before compound or vehicle (pA; sign as recorded, inward negative). */
  controlCurrent_pA: number | null;
  /** Current after compound or vehicle (pA). */
  compoundCurrent_pA: number | null;
  /**
   * The fractional block as the file gives it, instead of the currents (null when missing): its ratio is
   * 1 − block, and run-down correction and normalisation apply to it as to a ratio of currents.
   */
  givenBlock?: number | null;
  /** Left out of the control means and fits (QC flag or exclusion); its block is still computed for display. */
  excluded: boolean;
}

export interface BlockOptions {
  /** Divide each ratio I_compound/I_control by the mean vehicle ratio. @default true (Gatewell design, section 4) */
  rundownCorrection?: boolean;
  /** Rescale block so that the vehicle mean is 0 and the reference-blocker mean is 1. @default false */
  normalise?: boolean;
  /** The screen's lowest acceptable Z′. @default 0.5 (Gatewell design, section 4) */
  zPrimeMin?: number;
}

export interface WellBlock {
  wellId: string;
  role: WellRole;
  excluded: boolean;
  /** I_compound/I_control, uncorrected; null when a current is missing or the control is 0. */
  ratio: number | null;
  /** Fractional block after the corrections that were applied; null with the ratio. */
  block: number | null;
}

export type BlockNoteCode = 'no_vehicle_wells' | 'no_reference_wells' | 'no_assay_window';

export interface TargetBlock {
  target: string;
  /** Whether the run-down correction was applied (it needs vehicle wells in use). */
  rundownCorrected: boolean;
  /** Whether normalisation was applied (it needs vehicle and reference wells in use and a window between them). */
  normalised: boolean;
  /** Mean I_compound/I_control of the vehicle wells in use; null without any. */
  vehicleMeanRatio: number | null;
  wells: WellBlock[];
  /** Z′ on the final block values of the reference and vehicle wells in use. */
  zPrime: ZPrimeResult;
  notes: { code: BlockNoteCode; message: string }[];
}

/** block = 1 − I_compound/I_control per well, per target in order of first appearance; inputs not mutated. */
export function computeFractionalBlock(
  wells: readonly BlockWell[],
  options: BlockOptions = {},
): TargetBlock[] {
  const rundownCorrection = options.rundownCorrection ?? true;
  const normalise = options.normalise ?? false;
  const zPrimeMin = options.zPrimeMin ?? 0.5;
  if (!Number.isFinite(zPrimeMin))
    throw new RangeError(`zPrimeMin must be a finite number, got ${zPrimeMin}`);
  const byTarget = new Map<string, BlockWell[]>();
  for (const well of wells) {
    const group = byTarget.get(well.target);
    if (group) group.push(well);
    else byTarget.set(well.target, [well]);
  }
  return [...byTarget].map(([target, group]) =>
    targetBlock(target, group, rundownCorrection, normalise, zPrimeMin),
  );
}

function targetBlock(
  target: string,
  group: readonly BlockWell[],
  rundownCorrection: boolean,
  normalise: boolean,
  zPrimeMin: number,
): TargetBlock {
  const notes: TargetBlock['notes'] = [];
  const ratios = group.map((w) => ratioOf(w));
  const inUse = (role: WellRole, values: readonly (number | null)[]) =>
    values.filter((v, i): v is number => v !== null && group[i]!.role === role && !group[i]!.excluded);
  const vehicleRatios = inUse('vehicle', ratios);
  const vehicleMeanRatio = vehicleRatios.length > 0 ? mean(vehicleRatios) : null;
  if (vehicleMeanRatio === null)
    notes.push({
      code: 'no_vehicle_wells',
      message: 'No vehicle wells in use: no run-down correction, and no Z′.',
    });
  const rundownCorrected = rundownCorrection && vehicleMeanRatio !== null && vehicleMeanRatio > 0;
  let blocks = ratios.map((r) => (r === null ? null : 1 - (rundownCorrected ? r / vehicleMeanRatio! : r)));

  let normalised = false;
  if (normalise) {
    const vehicleBlocks = inUse('vehicle', blocks);
    const referenceBlocks = inUse('reference', blocks);
    if (referenceBlocks.length === 0)
      notes.push({
        code: 'no_reference_wells',
        message: 'No reference-blocker wells in use: block is not normalised.',
      });
    if (vehicleBlocks.length > 0 && referenceBlocks.length > 0) {
      const low = mean(vehicleBlocks);
      const high = mean(referenceBlocks);
      if (high === low)
        notes.push({
          code: 'no_assay_window',
          message: 'Vehicle and reference-blocker means are equal: block is not normalised.',
        });
      else {
        blocks = blocks.map((b) => (b === null ? null : (b - low) / (high - low)));
        normalised = true;
      }
    }
  }
  return {
    target,
    rundownCorrected,
    normalised,
    vehicleMeanRatio,
    wells: group.map((w, i) => ({
      wellId: w.wellId,
      role: w.role,
      excluded: w.excluded,
      ratio: ratios[i] ?? null,
      block: blocks[i] ?? null,
    })),
    zPrime: plateZPrime(inUse('reference', blocks), inUse('vehicle', blocks), zPrimeMin),
    notes,
  };
}

function ratioOf(well: BlockWell): number | null {
  if (well.givenBlock !== undefined)
    return well.givenBlock === null || !Number.isFinite(well.givenBlock) ? null : 1 - well.givenBlock;
  const { controlCurrent_pA: control, compoundCurrent_pA: compound } = well;
  if (
    control === null ||
    compound === null ||
    !Number.isFinite(control) ||
    !Number.isFinite(compound) ||
    control === 0
  )
    return null;
  return compound / control;
}
