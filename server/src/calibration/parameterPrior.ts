/**
 * The uncertain parameters a calibration estimates, each with its transform and a normal prior
 * in the transformed (analysis) space, and the catalogue of defaults physics.md section 8 names.
 */
import type { EnsembleRandom } from './ensembleRandom.ts';
import { fromAnalysisVariable, type VariableTransform } from './variableTransform.ts';

/** One estimated parameter. Its prior is Normal(priorMean, priorSd^2) in analysis space. */
export interface ParameterSpec {
  /** Stable name with its unit, e.g. `permeabilityMultiplier`, `initialBleedFilmKgM2`. */
  name: string;
  transform: VariableTransform;
  /** Prior mean of the analysis variable (ln of the median for `log`, logit for `logit`). */
  priorMean: number;
  /** Prior standard deviation of the analysis variable, > 0. */
  priorSd: number;
  /** Where the prior comes from: a published source, "common practice" or "our assumption". */
  origin: string;
}

/**
 * Prior of a positive multiplier, log-normal: `ln x ~ N(ln median, ln(factor)^2)`, so one
 * standard deviation multiplies or divides the median by `factor`.
 *
 * @param median - median of the multiplier, > 0 (dimensionless).
 * @param factor - one-sigma spread factor, > 1.
 */
export function logNormalPrior(
  name: string,
  median: number,
  factor: number,
  origin: string,
): ParameterSpec {
  return {
    name,
    transform: { kind: 'log' },
    priorMean: Math.log(median),
    priorSd: Math.log(factor),
    origin,
  };
}

/**
 * Prior of a bounded quantity, logit-normal on (lower, upper): the logit of its position between
 * the bounds is `N(logit((median - lower) / (upper - lower)), logitSd^2)`.
 *
 * @param lower - lower bound, same unit as the quantity; @param upper - upper bound, > lower.
 * @param median - median, strictly between the bounds; @param logitSd - spread of the logit, > 0.
 */
export function logitNormalPrior(
  name: string,
  bounds: { lower: number; upper: number },
  median: number,
  logitSd: number,
  origin: string,
): ParameterSpec {
  const u = (median - bounds.lower) / (bounds.upper - bounds.lower);
  return {
    name,
    transform: { kind: 'logit', lower: bounds.lower, upper: bounds.upper },
    priorMean: Math.log(u / (1 - u)),
    priorSd: logitSd,
    origin,
  };
}

/** Prior of an additive bias: `N(0, sd^2)` with no transform. */
export function biasPrior(name: string, sd: number, origin: string): ParameterSpec {
  return { name, transform: { kind: 'identity' }, priorMean: 0, priorSd: sd, origin };
}

/**
 * The default parameters of physics.md section 8, in this order: permeability multiplier,
 * exposure multiplier on evaporation, curing efficiency, initial bleed film, then one relative
 * humidity bias per probe (`rhBias:<probeId>`, as a fraction, 0.02 = 2 %RH).
 *
 * Defaults (all our assumption unless stated):
 * - `permeabilityMultiplier`: median 1, factor 4 per sigma (90 % of the prior within about a
 *   factor 10): the capillary-bundle permeability of a pore-size distribution is uncertain to an
 *   order of magnitude.
 * - `evaporationExposureMultiplier`: median 1, factor 1.4 per sigma: the +-40 % scatter of
 *   evaporation estimates against measurement (Hover 2006, ACI Materials Journal, as physics.md
 *   section 4 cites it), read as one standard deviation.
 * - `curingEfficiency`: on (0, 1), median 0.7, logit sd 1: compounds are rated by water retention
 *   (ASTM C309 / C156) but their efficiency in place varies with coverage and timing.
 * - `initialBleedFilmKgM2`: on (0, 2) kg/m2, median 0.2 kg/m2, logit sd 1: the water left on the
 *   surface when the run opens; bleeding of ordinary mixes totals a few tenths of a kg/m2 per
 *   100 mm of depth (from memory).
 * - `rhBias:<probe>`: mean 0, sd 0.02: a probe's accuracy class of about +-2 %RH (capacitive
 *   sensors are sold in +-2 and +-3 %RH classes; reading the class as one sigma is our assumption).
 *
 * @param probeIds - the relative humidity probes of the run, in a fixed order.
 * @param rhBiasSd - prior sd of each probe's bias as a fraction (default 0.02).
 */
export function defaultParameterSpecs(
  probeIds: readonly string[],
  rhBiasSd = 0.02,
): ParameterSpec[] {
  return [
    logNormalPrior(
      'permeabilityMultiplier',
      1,
      4,
      'our assumption (order-of-magnitude uncertainty)',
    ),
    logNormalPrior(
      'evaporationExposureMultiplier',
      1,
      1.4,
      'Hover (2006) +-40 % read as one sigma; our assumption',
    ),
    logitNormalPrior('curingEfficiency', { lower: 0, upper: 1 }, 0.7, 1, 'our assumption'),
    logitNormalPrior('initialBleedFilmKgM2', { lower: 0, upper: 2 }, 0.2, 1, 'our assumption'),
    ...probeIds.map((id) =>
      biasPrior(`rhBias:${id}`, rhBiasSd, 'sensor accuracy class as one sigma; our assumption'),
    ),
  ];
}

/**
 * Draws the parameters of an initial ensemble from the priors: for member i and parameter j
 * (members outer, parameters inner, so the draw order is fixed), `z = priorMean + priorSd * n`
 * with n standard normal from the ensemble's generator, then `x = fromAnalysisVariable(z)`.
 *
 * @param specs - the parameters; @param memberCount - number of members (>= 2 for a spread).
 * @param random - the ensemble's generator (consumed: memberCount * specs.length normal draws).
 * @returns one Float64Array of physical values per member, in `specs` order.
 */
export function drawInitialParameters(
  specs: readonly ParameterSpec[],
  memberCount: number,
  random: EnsembleRandom,
): Float64Array[] {
  const members: Float64Array[] = [];
  for (let i = 0; i < memberCount; i++) {
    const values = new Float64Array(specs.length);
    specs.forEach((spec, j) => {
      values[j] = fromAnalysisVariable(
        spec.transform,
        spec.priorMean + spec.priorSd * random.normal(),
      );
    });
    members.push(values);
  }
  return members;
}
