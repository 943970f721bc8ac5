import 'server-only';
import { poreBlockFraction } from '@/lib/science/forecast/pore-block';
import { conductanceNames, getPreset } from '@/lib/science/neuron/presets';
import { stateDependentConductances } from '@/lib/science/neuron/state-dependent-block';
import type { PotencyUse, StateDependence, TargetPotency } from '@/lib/validation/forecasts';

/** The highest Hill slope the forecast accepts (lib/science/forecast/request-schema.ts). */
const MAX_HILL = 10;

export interface PotencyTarget {
  id: string;
  name: string;
  conductance: string;
}

/** The parts of a fit a forecast needs, and the plate it came from. */
export interface PotencyFit {
  fitId: string;
  status: 'fitted' | 'above_range' | 'inactive' | 'insufficient' | 'not_converged';
  model: 'hill2' | 'hill4';
  ic50_uM: number | null;
  hill: number | null;
  ic50LowerBound_uM: number | null;
  plate: { id: string; label: string; state: string } | null;
}

/** A target's use-dependent fit (the second block readout), as the state-dependent forecast reads it. */
export interface UseDependentFit extends Omit<PotencyFit, 'plate' | 'ic50LowerBound_uM'> {
  /** The name the screen gives the readout (null: none, the generic words are used). */
  readoutName: string | null;
}

const num = (v: number) => Number(v.toPrecision(3)).toString();

function useOf(fit: PotencyFit | undefined): { use: PotencyUse; note: string } {
  if (!fit) return { use: 'not_tested', note: 'Not tested: treated as no block.' };
  const bound = fit.ic50LowerBound_uM === null ? '' : ` ${num(fit.ic50LowerBound_uM)} µM`;
  switch (fit.status) {
    case 'fitted':
      if (fit.hill === null || !(fit.hill > 0) || fit.hill > MAX_HILL) {
        return {
          use: 'slope_out_of_range',
          note: `Hill slope ${fit.hill === null ? 'missing' : num(fit.hill)} is outside the 0–${MAX_HILL} the model accepts: treated as no block.`,
        };
      }
      return {
        use: 'used',
        note: `Fitted IC50 and Hill slope, applied as simple pore block${fit.model === 'hill4' ? ' (from the four-parameter fit, whose bottom and top the model does not use)' : ''}.`,
      };
    case 'above_range':
      return {
        use: 'above_range',
        note: `IC50 above${bound}, the highest concentration tested: treated as no block.`,
      };
    case 'inactive':
      return { use: 'inactive', note: `No meaningful block up to${bound}: treated as no block.` };
    case 'insufficient':
      return {
        use: 'insufficient',
        note: 'Too few concentrations for a fit, so no IC50: treated as no block.',
      };
    case 'not_converged':
      return { use: 'not_converged', note: 'The fit did not converge, so no IC50: treated as no block.' };
  }
}

/**
 * How a used potency's use-dependent fit enters the state-dependent forecast (modulated receptor, Bean,
 * Cohen & Tsien 1983): its IC50 as Ki, the inactivated-state affinity, beside the tonic IC50 as Kr, on a
 * conductance with an inactivation gate; otherwise in words why the state-dependent case takes it as
 * tonic block. Null when the target has no use-dependent fit.
 */
function stateDependenceOf(
  presetName: string,
  target: PotencyTarget,
  use: PotencyUse,
  fit: UseDependentFit | undefined,
): StateDependence | null {
  if (!fit) return null;
  const name = fit.readoutName ?? 'use-dependent';
  const base = { fitId: fit.fitId, readoutName: fit.readoutName, ic50_uM: fit.ic50_uM, hill: fit.hill };
  const tonicOnly = (why: string): StateDependence => ({ ...base, inactivatedIc50_uM: null, note: why });
  if (use !== 'used')
    return tonicOnly(`No usable tonic IC50 (Kr), so the ${name} readout does not enter the forecast.`);
  if (!stateDependentConductances(getPreset(presetName)).includes(target.conductance))
    return tonicOnly(
      `${target.conductance} has no inactivation gate in preset ${presetName}: the state-dependent case takes its tonic block only.`,
    );
  if (fit.status !== 'fitted' || fit.ic50_uM === null || !(fit.ic50_uM > 0))
    return tonicOnly(
      `The ${name} fit gives no IC50 (${fit.status.replace('_', ' ')}): the state-dependent case takes its tonic block only.`,
    );
  return {
    ...base,
    inactivatedIc50_uM: fit.ic50_uM,
    note: `State-dependent case: tonic IC50 as Kr (resting channels), ${name} IC50 ${num(fit.ic50_uM)} µM as Ki (inactivated channels).`,
  };
}

/**
 * How each target enters a forecast with the given preset: its IC50 and Hill slope with the block at
 * every exposure, or in words why it counts as no block. A conductance takes its potency from the first
 * target (by name) that gives one; later targets on the same conductance are said to be unused.
 * `useDependentFitOf` gives a target's use-dependent fit, whose IC50 the state-dependent case takes as Ki.
 */
export function targetPotencies(
  presetName: string,
  targets: PotencyTarget[],
  fitOf: (targetId: string) => PotencyFit | undefined,
  exposures_uM: number[],
  useDependentFitOf: (targetId: string) => UseDependentFit | undefined = () => undefined,
): TargetPotency[] {
  const { blockable } = conductanceNames(getPreset(presetName));
  const taken = new Map<string, string>();
  return [...targets]
    .sort((a, b) => a.name.localeCompare(b.name))
    .map((target) => {
      const fit = fitOf(target.id);
      let { use, note } = useOf(fit);
      if (!blockable.includes(target.conductance)) {
        use = 'not_modelled';
        note = `${target.name} maps to ${target.conductance}, which preset ${presetName} cannot block: not modelled.`;
      } else if (use === 'used' && taken.has(target.conductance)) {
        use = 'not_modelled';
        note = `${target.conductance} already takes its potency from ${taken.get(target.conductance)}: not used.`;
      } else if (use === 'used') {
        taken.set(target.conductance, target.name);
      }
      const blockAtExposures = exposures_uM.map((c) =>
        use === 'used' ? poreBlockFraction(c, fit!.ic50_uM!, fit!.hill!) : 0,
      );
      return {
        targetId: target.id,
        target: target.name,
        fitId: fit?.fitId ?? null,
        conductance: target.conductance,
        use,
        ic50_uM: fit?.ic50_uM ?? null,
        hill: fit?.hill ?? null,
        ic50LowerBound_uM: fit?.ic50LowerBound_uM ?? null,
        note,
        blockAtExposures,
        plate: fit?.plate ?? null,
        stateDependence: stateDependenceOf(presetName, target, use, useDependentFitOf(target.id)),
      };
    });
}
