// Hill fit models and the status each fit ends in (table fits). The models are the science's
// (lib/science/fit/hill-model.ts); a fit's status is what the fit of one compound on one target came to.
import type { HillModelName } from '@/lib/science/fit/hill-model';

export const FIT_MODELS = ['hill2', 'hill4'] as const satisfies readonly HillModelName[];
export type FitModel = (typeof FIT_MODELS)[number];
export const FIT_STATUSES = ['fitted', 'above_range', 'inactive', 'insufficient', 'not_converged'] as const;
export type FitStatus = (typeof FIT_STATUSES)[number];
