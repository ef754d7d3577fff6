/**
 * One analysis of the live ensemble: the calibration core's ETKF (or serial EnSRF with
 * localisation) with the engine's inflation, then the analysed members written back into their
 * element states. Before the element's final set only what the probes can inform is kept (see
 * `plasticPhaseUpdates` in types.ts).
 */
import { assimilate } from '../calibration/index.ts';
import type {
  Ensemble,
  Observation,
  ObservationOperator,
  ParameterSpec,
  StateLayout,
} from '../calibration/index.ts';
import type { ElementState } from '../engine/index.ts';
import type { ResolvedOptions } from './engineOptions.ts';
import { PARAMETER_INDEX, applyAnalysis } from './memberModel.ts';
import type { LiveMember } from './memberModel.ts';

/** What an analysis needs besides the ensemble and the observations. */
export interface AnalysisContext {
  operator: ObservationOperator<ElementState>;
  specs: readonly ParameterSpec[];
  layout: StateLayout;
  options: ResolvedOptions;
  /** Whether the element has not reached final set yet (ElementModel.hasSet, member 0). */
  plastic: boolean;
}

/**
 * Assimilates `observations` and returns the analysed ensemble with every member's element state
 * consistent with it. Deterministic (no draws). After set, or with `plasticPhaseUpdates: 'all'`:
 * state and parameters as analysed (`analysisUpdates` may keep the state). Before set:
 * 'state-and-biases' keeps the forecast's element parameters and takes the analysed suctions,
 * bleed film and biases; 'biases' keeps the forecast member and takes only the biases.
 */
export function analysisStep(
  ensemble: Ensemble<ElementState>,
  observations: readonly Observation[],
  context: AnalysisContext,
): Ensemble<ElementState> {
  const { options } = context;
  const analysed = assimilate(
    ensemble,
    observations,
    context.operator,
    context.specs,
    context.layout,
    {
      inflation:
        options.rtpsAlpha === null
          ? { kind: 'multiplicative', factor: options.inflationFactor }
          : {
              kind: 'relaxation-to-prior-spread',
              alpha: options.rtpsAlpha,
              exceptParameters: options.rtpsOnBiases
                ? []
                : context.specs.slice(PARAMETER_INDEX.firstBias).map((spec) => spec.name),
            },
      method:
        options.localisationHalfWidthM === null
          ? { kind: 'etkf' }
          : { kind: 'serial-ensrf', localisation: { halfWidthM: options.localisationHalfWidthM } },
    },
  ).ensemble;
  const biasesOnly = options.plasticPhaseUpdates !== 'all' && context.plastic;
  const keepState = options.plasticPhaseUpdates === 'state-and-biases' && context.plastic;
  return {
    ...analysed,
    members: analysed.members.map((member, k): LiveMember => {
      if (!biasesOnly) {
        applyAnalysis(member, options.analysisUpdates === 'state-and-parameters');
        return member;
      }
      const before = ensemble.members[k] as LiveMember;
      const parameters = before.parameters.slice();
      parameters.set(
        member.parameters.subarray(PARAMETER_INDEX.firstBias),
        PARAMETER_INDEX.firstBias,
      );
      if (keepState) {
        const updated = { state: member.state, parameters, carried: before.carried };
        applyAnalysis(updated, true);
        return updated;
      }
      return { state: before.state, parameters, carried: before.carried };
    }),
  };
}
