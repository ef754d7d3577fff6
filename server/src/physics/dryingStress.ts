/**
 * In-plane drying stress through the thickness of a bonded plate from its equivalent pore
 * pressure profile (physics.md section 5). Free shrinkage of a layer is proportional to b pi;
 * the layers share one in-plane strain (flat), or one strain plane (curl), so
 *
 *   flat:        sigma(x) = C (<pi> - pi(x))
 *   curl:        sigma(x) = C (pi_fit(x) - pi(x)),  pi_fit the least-squares line of pi over x
 *   restrained:  sigma(x) = C ((1 - R) <pi> - pi(x)),  R the external restraint degree, 0..1
 *   C = b (1 - 2 nu) / (1 - nu) * psi
 *
 * Tension positive: a surface that dries more than the mean (pi more negative) is in tension.
 * Source: elastic thin-plate poromechanics with Coussy's (2004) equivalent pore pressure.
 *
 * Means and fits are weighted integrals over the thickness. Give either node positions only
 * (trapezoid weights: half the spacing to each neighbour, so the profile spans its first to its
 * last depth) or explicit weights per point (cell widths of a cell-centred grid, whose points are
 * the cell centres). The weights sum to the simulated thickness.
 */

/** Stress mode, named as in physics.md section 5. */
export type DryingStressMode = 'flat' | 'curl' | 'restrained';

/** Options of the drying-stress functions. */
export interface DryingStressOptions {
  /** Stress mode. Default 'flat'. */
  mode?: DryingStressMode;
  /** External restraint degree R, 0..1, used by 'restrained'. Default 1 (full restraint; our assumption, upper bound). */
  restraintDegree?: number;
  /**
   * Biot coefficient b, 0..1. Default 1: the early-age skeleton is far softer than the solid
   * grains, b = 1 - K_dr / K_s -> 1 (our assumption, upper bound; hardened paste is nearer 0.6-0.8).
   */
  biotCoefficient?: number;
  /** Poisson's ratio nu, 0..0.5. Default 0.2 (uncracked concrete, EN 1992-1-1 clause 3.1.3(4)). */
  poissonRatio?: number;
  /** Relaxation factor psi for early-age creep, (0, 1]. Default 1: elastic upper bound (physics.md section 5). */
  relaxationFactor?: number;
}

/** A depth profile: positions from the exposed surface, m, increasing. */
export interface DepthProfile {
  /** Depths below the exposed surface, m, strictly increasing. */
  depthsM: readonly number[];
  /** Optional weight of each point, m (cell widths); default: trapezoid weights from `depthsM`. */
  weightsM?: readonly number[];
}

/** Result of a drying-stress computation. */
export interface DryingStressResult {
  /** Stress at each depth, Pa, tension positive. */
  stressesPa: number[];
  /** Stress at the first point (the exposed surface, or the first cell centre), Pa. */
  surfaceStressPa: number;
  /** Weighted mean of pi over the thickness, Pa. */
  meanEquivalentPressurePa: number;
  /** The factor C = b (1 - 2 nu) / (1 - nu) psi. */
  stressFactor: number;
}

/** Trapezoid weights (m) of node positions: half the spacing to each neighbour. */
export function trapezoidWeightsM(depthsM: readonly number[]): number[] {
  const count = depthsM.length;
  if (count === 1) return [1];
  return depthsM.map((depth, i) => {
    const previous = i > 0 ? (depthsM[i - 1] as number) : depth;
    const next = i < count - 1 ? (depthsM[i + 1] as number) : depth;
    return (next - previous) / 2;
  });
}

/**
 * Drying stress from a profile of equivalent pore pressure pi (Pa) at the given depths.
 *
 * @param profile depths (m) and optional weights (m); the pi values pair with the depths.
 * @param equivalentPressuresPa pi at each depth, Pa (<= 0).
 * @param options mode, restraint degree, b, nu, psi (defaults above).
 * @returns the stress profile, the surface stress and the mean pi. A uniform pi gives zero stress
 *   in 'flat' and 'curl'; an empty profile gives NaN surface stress; NaN inputs propagate.
 */
export function dryingStressFromEquivalentPressure(
  profile: DepthProfile,
  equivalentPressuresPa: readonly number[],
  options: DryingStressOptions = {},
): DryingStressResult {
  const mode = options.mode ?? 'flat';
  const restraint = options.restraintDegree ?? 1;
  const biot = options.biotCoefficient ?? 1;
  const poisson = options.poissonRatio ?? 0.2;
  const relaxation = options.relaxationFactor ?? 1;
  const stressFactor = (biot * (1 - 2 * poisson) * relaxation) / (1 - poisson);
  const depths = profile.depthsM;
  const weights = profile.weightsM ?? trapezoidWeightsM(depths);
  let totalWeight = 0;
  let meanPi = 0;
  let meanDepth = 0;
  for (let i = 0; i < depths.length; i++) {
    const weight = weights[i] as number;
    totalWeight += weight;
    meanPi += weight * (equivalentPressuresPa[i] as number);
    meanDepth += weight * (depths[i] as number);
  }
  meanPi /= totalWeight;
  meanDepth /= totalWeight;
  let slope = 0;
  if (mode === 'curl') {
    let covariance = 0;
    let variance = 0;
    for (let i = 0; i < depths.length; i++) {
      const offset = (depths[i] as number) - meanDepth;
      covariance +=
        (weights[i] as number) * offset * ((equivalentPressuresPa[i] as number) - meanPi);
      variance += (weights[i] as number) * offset * offset;
    }
    slope = variance > 0 ? covariance / variance : 0;
  }
  const stressesPa = depths.map((depth, i) => {
    const pi = equivalentPressuresPa[i] as number;
    switch (mode) {
      case 'flat':
        return stressFactor * (meanPi - pi);
      case 'curl':
        return stressFactor * (meanPi + slope * (depth - meanDepth) - pi);
      case 'restrained':
        return stressFactor * ((1 - restraint) * meanPi - pi);
    }
  });
  return {
    stressesPa,
    surfaceStressPa: stressesPa.length > 0 ? (stressesPa[0] as number) : Number.NaN,
    meanEquivalentPressurePa: meanPi,
    stressFactor,
  };
}

/**
 * Drying stress counted from a stress-free reference state: the stress of the increment
 * pi(x) - pi_ref(x) since the reference (for example the profile at final set, before which a
 * fresh mix flows and carries no stress; counting strains from a stress-free state at final set
 * is common practice in early-age stress analysis).
 *
 *   sigma(x) = S[pi - pi_ref](x),  S the stress operator of `dryingStressFromEquivalentPressure`
 *
 * S is linear in pi, so this is exactly the stress of the increment:
 * S[pi] - S[pi_ref]. Source: as `dryingStressFromEquivalentPressure` (physics.md section 5).
 *
 * @param profile depths (m, from the exposed surface) and optional weights (m).
 * @param equivalentPressuresPa pi at each depth now, Pa (<= 0).
 * @param referencePressuresPa pi at each depth in the stress-free reference state, Pa (<= 0),
 *   paired with the depths; an all-zero reference gives the stress counted from a saturated
 *   placement, identical to `dryingStressFromEquivalentPressure`.
 * @param options see `DryingStressOptions`.
 * @returns as `dryingStressFromEquivalentPressure`, with `meanEquivalentPressurePa` the weighted
 *   mean of the increment. Equal profiles give zero stress everywhere in every mode; a missing
 *   or NaN reference value gives NaN where it enters (the means spread it to every depth).
 */
export function dryingStressFromEquivalentPressureIncrement(
  profile: DepthProfile,
  equivalentPressuresPa: readonly number[],
  referencePressuresPa: ArrayLike<number>,
  options: DryingStressOptions = {},
): DryingStressResult {
  const increments = equivalentPressuresPa.map(
    (pi, i) => pi - (referencePressuresPa[i] ?? Number.NaN),
  );
  return dryingStressFromEquivalentPressure(profile, increments, options);
}

/**
 * Drying stress on a saturation profile: pi(S) at each depth through `equivalentPressure`
 * (e.g. `equivalentPorePressureCurve(retention).fromSaturation`), then
 * `dryingStressFromEquivalentPressure`.
 *
 * @param profile depths (m, from the exposed surface) and optional weights (m).
 * @param saturations S at each depth, 0..1.
 * @param equivalentPressure pi(S) in Pa.
 * @param options see `DryingStressOptions`.
 */
export function dryingStressOnSaturationProfile(
  profile: DepthProfile,
  saturations: readonly number[],
  equivalentPressure: (saturation: number) => number,
  options: DryingStressOptions = {},
): DryingStressResult & { equivalentPressuresPa: number[] } {
  const equivalentPressuresPa = saturations.map((saturation) => equivalentPressure(saturation));
  return {
    ...dryingStressFromEquivalentPressure(profile, equivalentPressuresPa, options),
    equivalentPressuresPa,
  };
}
