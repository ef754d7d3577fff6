/**
 * One analysis of an ensemble against the observations that arrived: the parameters are
 * augmented into the state (Evensen 2009, *Data Assimilation: The Ensemble Kalman Filter*, 2nd ed.,
 * Springer; Evensen 2003, Ocean Dynamics 53), everything is updated in its transformed space,
 * and the members come back in physical units.
 */
import {
  addRowMeans,
  createEnsembleMatrix,
  type EnsembleMatrix,
  removeRowMeans,
  rowSpreads,
} from './_ensembleMatrix.ts';
import type { Ensemble, EnsembleMember } from './ensemble.ts';
import { etkfAnalysis } from './etkfAnalysis.ts';
import {
  DEFAULT_INFLATION,
  inflateMultiplicatively,
  type InflationOption,
  relaxToPriorSpread,
} from './inflation.ts';
import {
  type ObservationTransform,
  transformObservation,
  transformObservationErrorSd,
} from './observationTransform.ts';
import type { ParameterSpec } from './parameterPrior.ts';
import { serialEnsrfAnalysis } from './serialEnsrfAnalysis.ts';
import type { VariableTransform } from './variableTransform.ts';
import { fromAnalysisMatrix, toAnalysisMatrix } from './_memberPacking.ts';

/** One reading to assimilate. */
export interface Observation {
  /** The probe (or sensor) it came from; observations are assimilated sorted by id. */
  id: string;
  /** Observed relative humidity as a fraction (0..1). NaN = missing: skipped. */
  value: number;
  /** Error standard deviation, same unit, > 0 (see relativeHumidityErrorSd). */
  errorSd: number;
  /** Depth of the probe below the exposed surface, m (used only for localisation). */
  depthM: number;
}

/** Supplied by the model: what a member predicts for each observation. */
export interface ObservationOperator<C = null> {
  /**
   * Predicted values, in the observations' order and unit (relative humidity as a fraction,
   * including the member's probe bias). A non-finite prediction in any member drops that
   * observation from this analysis (reported in the diagnostics).
   */
  predict(member: EnsembleMember<C>, observations: readonly Observation[]): Float64Array;
}

/** Where the state entries sit and how they are represented in the analysis. */
export interface StateLayout {
  /** Depth of each state entry below the exposed surface, m; NaN for entries without one. */
  depthM: Float64Array;
  /** Transform applied to every state entry (default identity). */
  transform?: VariableTransform;
}

/** The analysis scheme; see README for why the ETKF is the default. */
export type AnalysisMethod =
  { kind: 'etkf' } | { kind: 'serial-ensrf'; localisation: { halfWidthM: number } | null };

/** Options of {@link assimilate}; every field optional. */
export interface AssimilationOptions {
  /** Default `{ kind: 'etkf' }` (our choice: deterministic, no localisation). */
  method?: AnalysisMethod;
  /** Default {@link DEFAULT_INFLATION} (multiplicative 1.02, our assumption). */
  inflation?: InflationOption;
  /** Default `{ kind: 'relative-humidity' }`; LOG_SUCTION is the option of physics.md 8. */
  observationTransform?: ObservationTransform;
}

/** What an analysis did, for logs and the state endpoint. */
export interface AssimilationDiagnostics {
  /** Observations used, in the order assimilated. */
  usedIds: string[];
  /** Observations not used, with the reason. */
  skipped: { id: string; reason: 'missing value' | 'invalid error' | 'non-finite prediction' }[];
  /** Innovation (observed - mean prediction) of each used observation, transformed space. */
  innovations: number[];
  /** Ensemble spread of each used prediction before the analysis, transformed space. */
  predictedSd: number[];
  /** Analysis rows (state entries, then parameters) left unchanged: not finite in some member. */
  frozenRows: number[];
}

/**
 * Assimilates `observations` into the ensemble and returns the analysis ensemble. Members are
 * new objects whose `state` and `parameters` are views into one new buffer (never shared with
 * another member or with the forecast); `carried` is passed through; `random` and `timeS` are
 * unchanged; `analysisCount` counts up. Steps:
 * 1. drop missing or invalid observations and those any member cannot predict; none left ->
 *    the ensemble is returned unchanged (no inflation either);
 * 2. analysis vector of member k: `[T_s(state_k); T_j(parameter_kj)]` (state transform,
 *    per-parameter transforms), predicted and observed values through the observation
 *    transform, error sd by the delta method;
 * 3. inflation of forecast perturbations (multiplicative: state and predictions alike, as Hunt
 *    et al. 2007 do through their factor rho);
 * 4. ETKF or serial EnSRF; 5. RTPS when chosen; 6. back-transform.
 * An entry (state or parameter) that is not finite in its analysis space in some member (NaN,
 * or a value at a log or logit bound) is left as it was in every member and listed in
 * `frozenRows`, so one bad value cannot spread into the other entries.
 * Deterministic: no random draws, so it does not touch the generator.
 *
 * @param specs - the estimated parameters, in the members' parameter order.
 * @param layout - depths (and transform) of the state entries.
 */
export function assimilate<C>(
  ensemble: Ensemble<C>,
  observations: readonly Observation[],
  operator: ObservationOperator<C>,
  specs: readonly ParameterSpec[],
  layout: StateLayout,
  options: AssimilationOptions = {},
): { ensemble: Ensemble<C>; diagnostics: AssimilationDiagnostics } {
  const method = options.method ?? { kind: 'etkf' };
  const inflation = options.inflation ?? DEFAULT_INFLATION;
  const observationTransform = options.observationTransform ?? { kind: 'relative-humidity' };
  const members = ensemble.members;
  const memberCount = members.length;
  const diagnostics: AssimilationDiagnostics = {
    usedIds: [],
    skipped: [],
    innovations: [],
    predictedSd: [],
    frozenRows: [],
  };

  const candidates = [...observations].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const valid = candidates.filter((observation) => {
    if (!Number.isFinite(observation.value)) {
      diagnostics.skipped.push({ id: observation.id, reason: 'missing value' });
      return false;
    }
    if (!(observation.errorSd > 0) || !Number.isFinite(observation.errorSd)) {
      diagnostics.skipped.push({ id: observation.id, reason: 'invalid error' });
      return false;
    }
    return true;
  });
  if (valid.length === 0 || memberCount < 2) return { ensemble, diagnostics };

  const predictions = members.map((member) => operator.predict(member, valid));
  const used = valid.filter((observation, j) => {
    const finite = predictions.every((predicted) => Number.isFinite(predicted[j]));
    if (!finite) diagnostics.skipped.push({ id: observation.id, reason: 'non-finite prediction' });
    return finite;
  });
  if (used.length === 0) return { ensemble, diagnostics };
  const usedColumns = valid
    .map((observation, j) => (used.includes(observation) ? j : -1))
    .filter((j) => j >= 0);

  const predicted = createEnsembleMatrix(used.length, memberCount);
  usedColumns.forEach((column, j) => {
    predictions.forEach((values, k) => {
      predicted.values[j * memberCount + k] = transformObservation(
        observationTransform,
        values[column] ?? Number.NaN,
      );
    });
  });
  const observed = Float64Array.from(used, (o) =>
    transformObservation(observationTransform, o.value),
  );
  const errorSd = Float64Array.from(used, (o) =>
    transformObservationErrorSd(observationTransform, o.value, o.errorSd),
  );

  const stateTransform = layout.transform ?? { kind: 'identity' };
  const analysis = toAnalysisMatrix(members, specs, stateTransform);
  const frozen = freezeNonFiniteRows(analysis);
  diagnostics.frozenRows = frozen;
  const means = removeRowMeans(analysis);
  const predictedMeans = removeRowMeans(predicted);
  const innovations = observed.map((value, j) => value - (predictedMeans[j] ?? 0));
  diagnostics.usedIds = used.map((o) => o.id);
  diagnostics.innovations = Array.from(innovations);
  diagnostics.predictedSd = Array.from(rowSpreads(predicted));

  if (inflation.kind === 'multiplicative') {
    inflateMultiplicatively(analysis, inflation.factor);
    inflateMultiplicatively(predicted, inflation.factor);
  }
  const forecastSpreads =
    inflation.kind === 'relaxation-to-prior-spread' ? rowSpreads(analysis) : null;

  if (method.kind === 'etkf') {
    etkfAnalysis(analysis, means, predicted, innovations, errorSd);
  } else {
    const localisation =
      method.localisation === null
        ? null
        : {
            halfWidthM: method.localisation.halfWidthM,
            stateDepthM: stateDepths(layout, analysis.rowCount, analysis.rowCount - specs.length),
            observationDepthM: Float64Array.from(used, (o) => o.depthM),
          };
    serialEnsrfAnalysis(analysis, means, predicted, innovations, errorSd, localisation);
  }
  if (forecastSpreads !== null && inflation.kind === 'relaxation-to-prior-spread') {
    const except = new Set(inflation.exceptParameters ?? []);
    if (except.size > 0) {
      // Excepted rows relax towards their own analysis spread, i.e. keep it.
      const firstParameterRow = analysis.rowCount - specs.length;
      const analysisSpreads = rowSpreads(analysis);
      specs.forEach((spec, j) => {
        const row = firstParameterRow + j;
        if (except.has(spec.name)) forecastSpreads[row] = analysisSpreads[row] as number;
      });
    }
    relaxToPriorSpread(analysis, forecastSpreads, inflation.alpha);
  }
  addRowMeans(analysis, means);
  const updated = fromAnalysisMatrix(analysis, members, specs, stateTransform);
  restorePhysicalValues(updated, members, frozen);

  return {
    ensemble: { ...ensemble, members: updated, analysisCount: ensemble.analysisCount + 1 },
    diagnostics,
  };
}

/**
 * Finds the rows with a non-finite value and zeroes them for the analysis (a zero row has no
 * spread: it neither moves nor moves anything else); returns their indices.
 */
function freezeNonFiniteRows(matrix: EnsembleMatrix): number[] {
  const { rowCount, memberCount, values } = matrix;
  const frozen: number[] = [];
  for (let i = 0; i < rowCount; i++) {
    const row = values.subarray(i * memberCount, (i + 1) * memberCount);
    if (row.every((value) => Number.isFinite(value))) continue;
    frozen.push(i);
    row.fill(0);
  }
  return frozen;
}

/** Puts the forecast's physical values back into the frozen rows (state rows first). */
function restorePhysicalValues<C>(
  updated: readonly EnsembleMember<C>[],
  forecast: readonly EnsembleMember<C>[],
  frozenRows: readonly number[],
): void {
  updated.forEach((member, k) => {
    const before = forecast[k];
    if (before === undefined) return;
    const stateCount = before.state.length;
    for (const row of frozenRows) {
      if (row < stateCount) member.state[row] = before.state[row] ?? Number.NaN;
      else member.parameters[row - stateCount] = before.parameters[row - stateCount] ?? Number.NaN;
    }
  });
}

/** Depth of every analysis row: the layout's for state rows, NaN (not localised) for parameters. */
function stateDepths(layout: StateLayout, rowCount: number, stateCount: number): Float64Array {
  const depths = new Float64Array(rowCount).fill(Number.NaN);
  depths.set(layout.depthM.subarray(0, Math.min(layout.depthM.length, stateCount)));
  return depths;
}
