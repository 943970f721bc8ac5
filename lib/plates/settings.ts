import type { ScreenQcLimits } from '@/lib/domain/readouts';
import type { AnalysisSettings } from '@/lib/science/plate-analysis';
import type { HillModelName } from '@/lib/science/fit/hill-model';

/** The analysis settings of a plate: its screen's QC limits and Z′ limit, and the model chosen per fit. */
export function analysisSettings(
  screen: ScreenQcLimits,
  models: Record<string, HillModelName> = {},
): AnalysisSettings {
  return {
    thresholds: {
      sealResistanceMin_GOhm: screen.sealResistanceMin_GOhm,
      controlCurrentMin_pA: screen.controlCurrentMin_pA,
      seriesResistanceMax_MOhm: screen.seriesResistanceMax_MOhm,
      capacitanceMin_pF: screen.capacitanceMin_pF,
      capacitanceMax_pF: screen.capacitanceMax_pF,
      vehicleRundownMax_fraction: screen.vehicleRundownMax_fraction,
    },
    normalise: screen.normaliseToReference,
    zPrimeMin: screen.zPrimeMin,
    models,
  };
}
