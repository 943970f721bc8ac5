// Hill fit models and the status each fit ends in (table fits). The models are the science's
// (lib/science/fit/hill-model.ts); a fit's status is what the fit of one compound on one target came to.
import type { HillModelName } from '@/lib/science/fit/hill-model';

export const FIT_MODELS = ['hill2', 'hill4'] as const satisfies readonly HillModelName[];
export type FitModel = (typeof FIT_MODELS)[number];
export const FIT_STATUSES = ['fitted', 'above_range', 'inactive', 'insufficient', 'not_converged'] as const;
export type FitStatus = (typeof FIT_STATUSES)[number];

import { BLOCK_READOUT_LABEL, type BlockReadout } from '@/lib/science/fit/block-readouts';

export {
  BLOCK_READOUTS,
  BLOCK_READOUT_LABEL,
  PRIMARY_READOUT,
  READOUT_RATIO_MEANING,
  readoutRatio,
  type BlockReadout,
} from '@/lib/science/fit/block-readouts';

/**
 * The names a screen gives its target's readouts (targets.block_readouts): an empty object is one readout,
 * the tonic one; naming the use-dependent readout makes the target report two.
 */
export type TargetReadoutNames = Partial<Record<'tonic' | 'use_dependent', string>>;

/** A readout in words: tonic or use-dependent, with the screen's own name for it when it gives one. */
export function readoutText(readout: BlockReadout, name: string | null = null): string {
  return name ? `${BLOCK_READOUT_LABEL[readout]} (${name})` : BLOCK_READOUT_LABEL[readout];
}
