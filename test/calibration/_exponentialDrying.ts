/**
 * Toy nonlinear model for twin experiments: the pore humidity at one probe relaxing towards an
 * ambient level at an unknown rate, `dh/dt = -k (h - h_inf)`. The truth uses the exact solution
 * `h(t) = h_inf + (h_0 - h_inf) exp(-k t)`; the members step it with forward Euler in 60 s steps,
 * a different discretisation, so the filter is not fed data made by its own model (physics.md
 * section 8, "inverse crime"). The estimated parameter is k (log transform); the model is
 * nonlinear in (h, k) jointly.
 */
import type { EnsembleMember, ForecastModel } from '../../server/src/calibration/ensemble.ts';
import type { EnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';
import { logNormalPrior, type ParameterSpec } from '../../server/src/calibration/parameterPrior.ts';

/** Level the humidity relaxes to (fraction). */
export const AMBIENT_RH = 0.55;
/** Initial humidity (fraction). */
export const INITIAL_RH = 0.99;
/** Hidden drying rate of the truth, 1/s (time constant about 11 h). */
export const TRUE_RATE_PER_S = 2.5e-5;
/** Depth of the probe, m. */
export const PROBE_DEPTH_M = 0.01;

/** Prior of k: median 1e-5 1/s, a factor 3 per sigma (the truth lies 0.83 sigma above). */
export const RATE_SPEC: ParameterSpec = logNormalPrior('dryingRatePerS', 1e-5, 3, 'test prior');

/** The truth's humidity at time t, s. */
export function trueRelativeHumidity(timeS: number): number {
  return AMBIENT_RH + (INITIAL_RH - AMBIENT_RH) * Math.exp(-TRUE_RATE_PER_S * timeS);
}

/**
 * Forward Euler in 60 s steps; with `noiseSd` > 0 adds N(0, noiseSd^2) to h at the end of each
 * advance (model error drawn from the ensemble's generator, which makes the run depend on it).
 */
export function exponentialDryingModel(noiseSd = 0): ForecastModel {
  return {
    advance(
      member: EnsembleMember,
      fromS: number,
      toS: number,
      random: EnsembleRandom,
    ): EnsembleMember {
      const rate = member.parameters[0] ?? 0;
      let h = member.state[0] ?? 0;
      for (let t = fromS; t < toS; t += 60) {
        const dt = Math.min(60, toS - t);
        h -= rate * (h - AMBIENT_RH) * dt;
      }
      if (noiseSd > 0) h += noiseSd * random.normal();
      return { state: Float64Array.of(h), parameters: member.parameters, carried: null };
    },
  };
}

/** Member i starts at the initial humidity with its drawn rate. */
export function initialMember(_index: number, parameters: Float64Array): EnsembleMember {
  return { state: Float64Array.of(INITIAL_RH), parameters, carried: null };
}
