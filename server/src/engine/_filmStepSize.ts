/**
 * The length of the next trial of a step under a bleed film, when a trial drew more than the film
 * holds (elementModel.ts). A step that holds the surface saturated uses film water
 * `need(t) = inflow(t) + (E - b) t` (kg/m2: what the body draws in, plus evaporation at the
 * potential rate E, less the bleeding b) and may not use more than the film. The body's draw
 * grows like t^alpha with alpha between about 1/2 (sorption into a dry body, the square-root law
 * of capillary absorption) and about 1 (steps shorter than the surface cell's own response), so
 * the next trial interpolates a power law through the two trials that tell most about it, in
 * log-log coordinates, and keeps inside the bracket the trials have found.
 */

/** One trial of a film step: its length, s, and the film water it used, kg/m2. */
export interface FilmTrial {
  stepS: number;
  needKgM2: number;
}

/**
 * Exponent assumed when only one trial is known: between the square-root law of sorption and
 * the linear start (our assumption; the search corrects it from the second trial on).
 */
const DEFAULT_EXPONENT = 0.75;

/**
 * Length of the next trial, s, so that the film water used comes to about `targetKgM2`.
 * `short` is the longest trial known to use too little (stepS 0 when none: the step's start),
 * `long` the shortest known to use too much, `longBefore` the one before it (null: none).
 * Interpolates `need = c t^alpha` through `short` and `long` when `short` used water, else
 * through `long` and `longBefore`, else through `long` with alpha 0.75; alpha is kept within
 * [0.25, 2]. A result outside (short.stepS, long.stepS) is replaced by their geometric mean, or
 * a tenth of `long` when no shorter trial is known. Positive and finite for positive inputs.
 */
export function nextFilmTrialS(
  short: FilmTrial,
  long: FilmTrial,
  longBefore: FilmTrial | null,
  targetKgM2: number,
): number {
  let exponent = DEFAULT_EXPONENT;
  if (short.stepS > 0 && short.needKgM2 > 0 && long.needKgM2 > short.needKgM2) {
    exponent = Math.log(long.needKgM2 / short.needKgM2) / Math.log(long.stepS / short.stepS);
  } else if (
    longBefore !== null &&
    longBefore.stepS > long.stepS &&
    longBefore.needKgM2 > long.needKgM2
  ) {
    exponent =
      Math.log(longBefore.needKgM2 / long.needKgM2) / Math.log(longBefore.stepS / long.stepS);
  }
  exponent = Math.min(2, Math.max(0.25, exponent));
  const stepS = long.stepS * (targetKgM2 / long.needKgM2) ** (1 / exponent);
  if (stepS > short.stepS && stepS < long.stepS) return stepS;
  return short.stepS > 0 ? Math.sqrt(short.stepS * long.stepS) : 0.1 * long.stepS;
}
