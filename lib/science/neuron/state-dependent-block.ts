import type { NeuronPreset } from './types';

/**
 * State-dependent block in the modulated-receptor steady state (Bean, Cohen & Tsien 1983, "Lidocaine
 * block of cardiac sodium channels", J Gen Physiol 81:613–642; authors and pages from memory).
 * A blocker binds resting channels with dissociation constant Kr and inactivated ones with Ki. With inactivation h∞(V) = 1/(1 + e^((V − V½)/k)) in equilibrium with binding, the fraction of
 * channels free of drug and not inactivated is
 *
 *   1/(1 + D/Kr) · h∞(V − ΔV½),   ΔV½ = k · ln[(1 + D/Kr)/(1 + D/Ki)]
 *
 * so the drug blocks resting channels tonically, D/(D + Kr), and moves inactivation by ΔV½ (negative,
 * towards rest, when Ki < Kr): the more the membrane depolarises and fires, the more it blocks.
 * The model applies exactly that: the conductance scaled by the tonic factor and its inactivation gate
 * shifted by ΔV½ (compileModel's `inactivationShift`). With Kr = Ki the shift is 0.
 * The closed form assumes one drug molecule per channel (Hill slope 1); a fitted Hill slope ≠ 1 still
 * shapes the tonic fraction (pore block, lib/science/forecast/pore-block.ts), not the shift.
 */
export function modulatedReceptorShift_mV(
  concentration: number,
  restingK: number,
  inactivatedK: number,
  slope_mV: number,
): number {
  if (!(restingK > 0) || !Number.isFinite(restingK))
    throw new RangeError(`Kr must be a positive finite number, got ${restingK}`);
  if (!(inactivatedK > 0) || !Number.isFinite(inactivatedK))
    throw new RangeError(`Ki must be a positive finite number, got ${inactivatedK}`);
  if (!(slope_mV > 0) || !Number.isFinite(slope_mV))
    throw new RangeError(`slope factor must be a positive finite number, got ${slope_mV}`);
  if (!(concentration >= 0) || !Number.isFinite(concentration))
    throw new RangeError(`concentration must be a finite number ≥ 0, got ${concentration}`);
  if (restingK === inactivatedK) return 0;
  return slope_mV * (Math.log1p(concentration / restingK) - Math.log1p(concentration / inactivatedK));
}

/** Slope factor k (mV) of the inactivation gate of a conductance, or null when it has none. */
export function inactivationSlope_mV(preset: NeuronPreset, conductance: string): number | null {
  const c = preset.conductances.find((x) => x.name === conductance);
  const gate = c?.gates.find((g) => g.inactivationSlope_mV !== undefined);
  return gate?.inactivationSlope_mV ?? null;
}

/** Conductances of a preset whose inactivation gate state-dependent block can shift (blockable ones). */
export function stateDependentConductances(preset: NeuronPreset): string[] {
  return preset.conductances
    .filter((c) => c.blockable && c.gates.some((g) => g.inactivationSlope_mV !== undefined))
    .map((c) => c.name);
}
