import type { AnalysisSettings } from '@/lib/science/plate-analysis';
import type { HillModelName } from '@/lib/science/fit/hill-model';

export interface ScreenLimits {
  sealMinGohm: number;
  controlCurrentMinPa: number;
  seriesMaxMohm: number;
  capacitanceMinPf: number;
  capacitanceMaxPf: number;
  rundownMaxFraction: number;
  normaliseToReference: boolean;
  zprimeMin: number;
}

/** The analysis settings of a plate: its screen's QC limits and Z′ limit, and the model chosen per fit. */
export function analysisSettings(screen: ScreenLimits, models: Record<string, HillModelName> = {}): AnalysisSettings {
  return {
    thresholds: {
      sealResistanceMin_GOhm: screen.sealMinGohm,
      controlCurrentMin_pA: screen.controlCurrentMinPa,
      seriesResistanceMax_MOhm: screen.seriesMaxMohm,
      capacitanceMin_pF: screen.capacitanceMinPf,
      capacitanceMax_pF: screen.capacitanceMaxPf,
      vehicleRundownMax: screen.rundownMaxFraction,
    },
    normalise: screen.normaliseToReference,
    zPrimeLimit: screen.zprimeMin,
    models,
  };
}
