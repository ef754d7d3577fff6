/**
 * Packing of members into the analysis block and back: row i < n is state entry i through the
 * state transform, row n + j is parameter j through its own transform; column k is member k.
 */
import { createEnsembleMatrix, type EnsembleMatrix } from './_ensembleMatrix.ts';
import type { EnsembleMember } from './ensemble.ts';
import type { ParameterSpec } from './parameterPrior.ts';
import {
  analysisVariableFunction,
  physicalValueFunction,
  type VariableTransform,
} from './variableTransform.ts';

/** Rows: state entries then parameters; columns: members. */
export function toAnalysisMatrix<C>(
  members: readonly EnsembleMember<C>[],
  specs: readonly ParameterSpec[],
  stateTransform: VariableTransform,
): EnsembleMatrix {
  const memberCount = members.length;
  const stateCount = members[0]?.state.length ?? 0;
  const matrix = createEnsembleMatrix(stateCount + specs.length, memberCount);
  const values = matrix.values;
  const forward = analysisVariableFunction(stateTransform);
  const parameterForward = specs.map((spec) => analysisVariableFunction(spec.transform));
  for (let k = 0; k < memberCount; k++) {
    const member = members[k];
    if (member === undefined) continue;
    const state = member.state;
    for (let i = 0; i < stateCount; i++)
      values[i * memberCount + k] = forward(state[i] ?? Number.NaN);
    for (let j = 0; j < specs.length; j++) {
      const toZ = parameterForward[j] ?? forward;
      values[(stateCount + j) * memberCount + k] = toZ(member.parameters[j] ?? Number.NaN);
    }
  }
  return matrix;
}

/** Members back from analysis rows (state then parameters), in physical values. */
export function fromAnalysisMatrix<C>(
  matrix: EnsembleMatrix,
  members: readonly EnsembleMember<C>[],
  specs: readonly ParameterSpec[],
  stateTransform: VariableTransform,
): EnsembleMember<C>[] {
  const memberCount = members.length;
  const stateCount = matrix.rowCount - specs.length;
  const values = matrix.values;
  const inverse = physicalValueFunction(stateTransform);
  const parameterInverse = specs.map((spec) => physicalValueFunction(spec.transform));
  // One buffer for all members, each member's state and parameters a view into it: a single
  // allocation instead of two per member (typed array allocation dominates at this size).
  const width = stateCount + specs.length;
  const storage = new Float64Array(memberCount * width);
  return members.map((member, k) => {
    const state = storage.subarray(k * width, k * width + stateCount);
    for (let i = 0; i < stateCount; i++)
      state[i] = inverse(values[i * memberCount + k] ?? Number.NaN);
    const parameters = storage.subarray(k * width + stateCount, (k + 1) * width);
    for (let j = 0; j < specs.length; j++) {
      const toX = parameterInverse[j] ?? inverse;
      parameters[j] = toX(values[(stateCount + j) * memberCount + k] ?? Number.NaN);
    }
    return { state, parameters, carried: member.carried };
  });
}
