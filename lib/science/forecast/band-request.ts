import type { PotencyUncertaintyInput } from './uncertainty';

/** Bands asked for in a forecast request (validated by request-schema.ts). */
export interface BandRequest {
  draws: number;
  seed: number;
  /** Per conductance of `potencies`: the fit's covariance and/or wells; absent means none known. */
  potencies: Record<string, PotencyUncertaintyInput>;
  /** Concentrations to band (same unit as the request's); null: every one. */
  concentrations: number[] | null;
}

export const DEFAULT_BAND_DRAWS = 200;
