// The moments at which an instrument reads block (issue 20 point 2). A screen's target reports one readout
// (tonic) unless the screen names a second, use-dependent one: block at the n-th pulse of a train or at a
// depolarised holding potential, where a state-dependent blocker binds inactivated channels. In the
// modulated-receptor model (Bean, Cohen & Tsien 1983, J Gen Physiol 81:613) the tonic IC50 estimates the
// resting-state affinity Kr and the use-dependent IC50 the inactivated-state affinity Ki.

/** Every block readout, the tonic one first; a target with one readout has only the tonic one. */
export const BLOCK_READOUTS = ['tonic', 'use_dependent'] as const;

export type BlockReadout = (typeof BLOCK_READOUTS)[number];

/** The readout of every target, and the only one of a target that reports one. */
export const PRIMARY_READOUT: BlockReadout = 'tonic';

/** Words for each readout where the screen gives it no name of its own. */
export const BLOCK_READOUT_LABEL: Record<BlockReadout, string> = {
  tonic: 'tonic',
  use_dependent: 'use-dependent',
};

/** What the ratio tonic IC50 / use-dependent IC50 means, in words for people. */
export const READOUT_RATIO_MEANING =
  'Tonic IC50 ÷ use-dependent IC50: above 1 the compound blocks more as the channel is used ' +
  '(state- or use-dependent block); about 1, block does not depend on use.';

/**
 * The ratio tonic IC50 / use-dependent IC50 (no unit), or null unless both IC50s are estimates above 0
 * (a lower bound or a missing fit gives no ratio).
 */
export function readoutRatio(tonicIc50_uM: number | null, useDependentIc50_uM: number | null): number | null {
  if (tonicIc50_uM === null || useDependentIc50_uM === null) return null;
  if (!(tonicIc50_uM > 0) || !(useDependentIc50_uM > 0)) return null;
  return tonicIc50_uM / useDependentIc50_uM;
}
