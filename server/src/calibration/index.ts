/**
 * Calibration of a model ensemble to probe readings, and the ensemble statistics of the outlook.
 * Pure and model-agnostic: the engine supplies the forecast step and the observation operator.
 * See README.md in this folder for the interfaces and defaults.
 */
export { assimilate } from './assimilate.ts';
export type {
  AnalysisMethod,
  AssimilationDiagnostics,
  AssimilationOptions,
  Observation,
  ObservationOperator,
  StateLayout,
} from './assimilate.ts';
export { createEnsemble, forecastEnsemble, restoreEnsemble, snapshotEnsemble } from './ensemble.ts';
export type {
  Ensemble,
  EnsembleMember,
  EnsembleSnapshot,
  ForecastModel,
  InitialMemberFactory,
} from './ensemble.ts';
export { createEnsembleRandom, restoreEnsembleRandom } from './ensembleRandom.ts';
export type { EnsembleRandom, EnsembleRandomSnapshot } from './ensembleRandom.ts';
export { esmdaWindow } from './esmdaWindow.ts';
export type { EsmdaOptions, WindowReadings } from './esmdaWindow.ts';
export { gaspariCohn } from './gaspariCohn.ts';
export { DEFAULT_INFLATION } from './inflation.ts';
export type { InflationOption } from './inflation.ts';
export {
  LOG_SUCTION,
  transformObservation,
  transformObservationErrorSd,
} from './observationTransform.ts';
export type { ObservationTransform } from './observationTransform.ts';
export { firstCrossingTimeS } from './firstCrossingTime.ts';
export {
  DEFAULT_BAND_PROBABILITIES,
  DEFAULT_UTILIZATION_THRESHOLDS,
  outlookStatistics,
  quantileBands,
  thresholdCrossing,
} from './outlookStatistics.ts';
export type { OutlookStatistics, QuantileBand, ThresholdCrossing } from './outlookStatistics.ts';
export {
  biasPrior,
  defaultParameterSpecs,
  drawInitialParameters,
  logitNormalPrior,
  logNormalPrior,
} from './parameterPrior.ts';
export type { ParameterSpec } from './parameterPrior.ts';
export { summariseParameters } from './parameterSummary.ts';
export type { ParameterSummary } from './parameterSummary.ts';
export { quantileOfSorted } from './quantile.ts';
export {
  RH_CLASS_2_PERCENT,
  RH_CLASS_3_PERCENT,
  relativeHumidityErrorSd,
} from './relativeHumidityErrorSd.ts';
export type { RelativeHumiditySensorClass } from './relativeHumidityErrorSd.ts';
export {
  analysisVariableSlope,
  fromAnalysisVariable,
  toAnalysisVariable,
} from './variableTransform.ts';
export type { VariableTransform } from './variableTransform.ts';
