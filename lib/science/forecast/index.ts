/** Gatewell's excitability forecast: pore block of model conductances and its effect on firing. */
export { poreBlockFraction } from './pore-block';
export {
  forecastRequestSchema,
  forecastProtocolSchema,
  parseForecastRequest,
  describeIssues,
  ForecastRequestError,
  type ForecastRequest,
  type ParsedForecastRequest,
} from './request-schema';
export {
  DEFAULT_FORECAST_PROTOCOL,
  planForecast,
  type ForecastPlan,
  type ForecastProtocol,
  type PlannedCondition,
} from './plan';
export {
  FORECAST_CAUTION,
  type ConditionForecast,
  type ConditionMeasures,
  type ForecastResult,
  type Shift,
} from './assemble';
export { computeForecast } from './forecast';
export {
  planBands,
  bandOf,
  quantileSorted,
  BAND_METHOD,
  DEFAULT_BAND_DRAWS,
  type Band,
  type BandRequest,
  type BandSample,
  type BandTask,
  type ConditionBand,
  type ForecastBands,
} from './bands';
export { seededRandom, type SeededRandom } from './prng';
export { cholesky2, drawPotency, type DrawSource, type PotencyUncertaintyInput } from './uncertainty';
export { runForecastTask, type ForecastTask, type MeasureTask, type TraceTask } from './tasks';
export { computeBlockModes, tonicOnly, type BlockModesForecast } from './block-modes';
