/**
 * The calibrated parameters with their spread, as the state endpoint reports them
 * (issue 6, item 7): per parameter, statistics over the members in physical units and the mean
 * and spread of the analysis variable the filter works on.
 */
import type { EnsembleMember } from './ensemble.ts';
import type { ParameterSpec } from './parameterPrior.ts';
import { quantileOfSorted, sortedFinite } from './quantile.ts';
import { toAnalysisVariable } from './variableTransform.ts';

/** One parameter's ensemble statistics. */
export interface ParameterSummary {
  name: string;
  /** Mean over members, physical units. */
  mean: number;
  /** 5 %, 50 % and 95 % quantiles over members (Hyndman and Fan 1996, definition 7). */
  p05: number;
  median: number;
  p95: number;
  /** Mean and sample standard deviation (N - 1) of the analysis variable. */
  analysisMean: number;
  analysisSd: number;
  /** Prior mean and sd of the analysis variable, for comparison. */
  priorMean: number;
  priorSd: number;
  /** Members with a finite value. */
  memberCount: number;
}

/**
 * Summarises each parameter over the members. Non-finite values are left out; with no finite
 * value the statistics are NaN, with one the sd is NaN.
 *
 * @param members - the ensemble's members; @param specs - in the members' parameter order.
 */
export function summariseParameters<C>(
  members: readonly EnsembleMember<C>[],
  specs: readonly ParameterSpec[],
): ParameterSummary[] {
  return specs.map((spec, j) => {
    const values = sortedFinite(members.map((member) => member.parameters[j] ?? Number.NaN));
    const z = values
      .map((value) => toAnalysisVariable(spec.transform, value))
      .filter(Number.isFinite);
    const count = values.length;
    const mean = count === 0 ? Number.NaN : values.reduce((sum, v) => sum + v, 0) / count;
    const analysisMean = z.length === 0 ? Number.NaN : z.reduce((sum, v) => sum + v, 0) / z.length;
    const analysisSd =
      z.length < 2
        ? Number.NaN
        : Math.sqrt(z.reduce((sum, v) => sum + (v - analysisMean) ** 2, 0) / (z.length - 1));
    return {
      name: spec.name,
      mean,
      p05: quantileOfSorted(values, 0.05),
      median: quantileOfSorted(values, 0.5),
      p95: quantileOfSorted(values, 0.95),
      analysisMean,
      analysisSd,
      priorMean: spec.priorMean,
      priorSd: spec.priorSd,
      memberCount: count,
    };
  });
}
