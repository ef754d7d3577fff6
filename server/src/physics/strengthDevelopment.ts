/**
 * Strength and modulus development with equivalent age: the code curve of EN 1992-1-1 3.1.2 /
 * fib Model Code 2010 5.1.9, its closed-form inverse, and the setting-shifted forms of
 * physics.md section 6 (code curve shifted by the age at final set, or the hyperbolic
 * strength-maturity relation of ASTM C1074 / Carino 1984).
 *
 * Units: ages are equivalent ages at 20 degC in days (the unit the code formulas are written
 * in), strengths in MPa, moduli in GPa; each name carries its unit.
 */

/** Cement class of EN 197 as grouped by EN 1992-1-1 3.1.2(6): rapid, normal, slow hardening. */
export type CementClass = 'R' | 'N' | 'S';

/** Which rule chooses the coefficient `s`. */
export type CementCoefficientRule = 'en1992' | 'mc2010';

/**
 * Coefficient `s` of the strength development curve.
 *
 * - `en1992` (default of this library): R 0.20 (CEM 42.5 R, 52.5 N, 52.5 R), N 0.25 (CEM 32.5 R,
 *   42.5 N), S 0.38 (CEM 32.5 N), for every strength. Source: EN 1992-1-1:2004 3.1.2(6).
 * - `mc2010`: the same three values for fcm <= 60 MPa, and s = 0.20 for every cement above
 *   (fib Model Code 2010 Table 5.1-9, from memory: high-strength mixes with low w/c gain early
 *   strength fast whatever the cement). Needs `fcmMPa`; NaN fcm falls back to the class value.
 *
 * We default to EN 1992-1-1 because the class table and the tensile rule used with it come from
 * that standard, and its values are the ones a site engineer will find in the project's code.
 *
 * @param cementClass `R`, `N` or `S`
 * @param rule `en1992` (default) or `mc2010`
 * @param fcmMPa mean 28-day compressive strength, MPa (only read by `mc2010`)
 */
export function cementCoefficientS(
  cementClass: CementClass,
  rule: CementCoefficientRule = 'en1992',
  fcmMPa = Number.NaN,
): number {
  if (rule === 'mc2010' && fcmMPa > 60) return 0.2;
  switch (cementClass) {
    case 'R':
      return 0.2;
    case 'N':
      return 0.25;
    case 'S':
      return 0.38;
  }
}

/**
 * Strength development factor `beta_cc(t) = exp{ s [1 - (28 / t)^0.5] }`.
 *
 * @param equivalentAgeDays equivalent age at 20 degC, days; 28 gives exactly 1
 * @param s cement coefficient (> 0), see {@link cementCoefficientS}
 * @returns beta_cc (dimensionless); 0 for ages <= 0 (the limit as t -> 0+); exp(s) for an
 *   infinite age; NaN for NaN inputs or s <= 0. The curve is not calibrated below about one day
 *   (physics.md 6): use the setting-shifted forms for early ages.
 * Source: EN 1992-1-1:2004 eq. (3.2); fib Model Code 2010 eq. (5.1-51).
 */
export function strengthDevelopmentFactor(equivalentAgeDays: number, s: number): number {
  if (Number.isNaN(equivalentAgeDays) || !(s > 0)) return Number.NaN;
  if (equivalentAgeDays <= 0) return 0;
  return Math.exp(s * (1 - Math.sqrt(28 / equivalentAgeDays)));
}

/**
 * Mean compressive strength at an equivalent age: `fcm(t) = beta_cc(t) fcm`.
 *
 * @param equivalentAgeDays equivalent age, days; @param fcmMPa 28-day mean strength, MPa
 * @param s cement coefficient
 * @returns MPa; 0 at ages <= 0; NaN for NaN input.
 * Source: EN 1992-1-1:2004 eq. (3.1); fib Model Code 2010 eq. (5.1-50).
 */
export function compressiveStrengthAtAgeMPa(
  equivalentAgeDays: number,
  fcmMPa: number,
  s: number,
): number {
  return strengthDevelopmentFactor(equivalentAgeDays, s) * fcmMPa;
}

/**
 * Tensile strength from the ratio of compressive strength reached: `fctm(t) = r^alpha fctm`
 * with `r = fcm(t) / fcm` and `alpha = 1` while r < 1 (before 28 days on the code curve),
 * `alpha = 2/3` from r >= 1 on. On the code curve r = beta_cc, so this is EN 1992-1-1 eq. (3.4)
 * exactly; for other compressive laws (hyperbolic fit) it is our generalisation of that rule.
 *
 * @param compressiveRatio fc(t) / fcm (dimensionless, >= 0); negative or NaN gives NaN
 * @param fctmMPa 28-day mean tensile strength, MPa
 * @returns MPa. Source: EN 1992-1-1:2004 3.1.2(9), eq. (3.4).
 */
export function tensileStrengthFromRatioMPa(compressiveRatio: number, fctmMPa: number): number {
  if (!(compressiveRatio >= 0)) return Number.NaN;
  const alpha = compressiveRatio < 1 ? 1 : 2 / 3;
  return Math.pow(compressiveRatio, alpha) * fctmMPa;
}

/**
 * Mean axial tensile strength at an equivalent age: `fctm(t) = beta_cc(t)^alpha fctm`, alpha = 1
 * for t < 28 days and 2/3 for t >= 28 days.
 *
 * @param equivalentAgeDays days; @param fctmMPa 28-day mean tensile strength, MPa
 * @param s cement coefficient
 * @returns MPa; 0 at ages <= 0; NaN for NaN input.
 * Source: EN 1992-1-1:2004 3.1.2(9), eq. (3.4).
 */
export function tensileStrengthAtAgeMPa(
  equivalentAgeDays: number,
  fctmMPa: number,
  s: number,
): number {
  return tensileStrengthFromRatioMPa(strengthDevelopmentFactor(equivalentAgeDays, s), fctmMPa);
}

/** Which code gives the modulus development exponent. */
export type ModulusDevelopmentRule = 'en1992' | 'mc2010';

/**
 * Modulus at an equivalent age: `E(t) = beta_cc(t)^m E28`.
 *
 * - `en1992` (default): m = 0.3, from `Ecm(t) = (fcm(t) / fcm)^0.3 Ecm`, EN 1992-1-1:2004
 *   eq. (3.5). Consistent with `Ecm = 22 (fcm/10)^0.3` of Table 3.1.
 * - `mc2010`: m = 0.5, `Eci(t) = beta_E(t) Eci` with `beta_E = beta_cc^0.5`, fib Model Code 2010
 *   eq. (5.1-56/57) (from memory). Note it applies to the tangent modulus Eci; we apply the same
 *   factor to whatever 28-day modulus is passed.
 *
 * @param equivalentAgeDays days; @param modulus28GPa 28-day modulus, GPa
 * @param s cement coefficient; @param rule `en1992` (default) or `mc2010`
 * @returns GPa; 0 at ages <= 0; NaN for NaN input.
 */
export function modulusAtAgeGPa(
  equivalentAgeDays: number,
  modulus28GPa: number,
  s: number,
  rule: ModulusDevelopmentRule = 'en1992',
): number {
  const exponent = rule === 'en1992' ? 0.3 : 0.5;
  return Math.pow(strengthDevelopmentFactor(equivalentAgeDays, s), exponent) * modulus28GPa;
}

/**
 * Equivalent age at which the code curve reaches a development factor: the closed-form inverse
 * `t = 28 / (1 - ln(beta) / s)^2`.
 *
 * @param factor target beta_cc (dimensionless)
 * @param s cement coefficient (> 0)
 * @returns days; 0 for factor <= 0; Infinity when factor >= exp(s) (the curve's asymptote is
 *   never reached); NaN for NaN input or s <= 0.
 * Source: inverse of EN 1992-1-1:2004 eq. (3.2).
 */
export function ageForDevelopmentFactorDays(factor: number, s: number): number {
  if (Number.isNaN(factor) || !(s > 0)) return Number.NaN;
  if (factor <= 0) return 0;
  const root = 1 - Math.log(factor) / s;
  if (root <= 0) return Number.POSITIVE_INFINITY;
  return 28 / (root * root);
}

/**
 * Equivalent age at which the code curve reaches a target mean compressive strength
 * (formwork stripping, loading, prestressing).
 *
 * @param targetMPa target strength, MPa; @param fcmMPa 28-day mean strength, MPa (> 0)
 * @param s cement coefficient
 * @returns days; 0 for targets <= 0; Infinity above `exp(s) fcm`; NaN for NaN or fcm <= 0.
 * Source: inverse of EN 1992-1-1:2004 eqs. (3.1)-(3.2).
 */
export function ageForCompressiveStrengthDays(
  targetMPa: number,
  fcmMPa: number,
  s: number,
): number {
  if (!(fcmMPa > 0)) return Number.NaN;
  return ageForDevelopmentFactorDays(targetMPa / fcmMPa, s);
}

/**
 * Equivalent age at which the code curve reaches a target mean tensile strength. Inverts
 * eq. (3.4) piecewise: beta = q for q = target / fctm < 1 and beta = q^(3/2) for q >= 1.
 *
 * @param targetMPa MPa; @param fctmMPa 28-day mean tensile strength, MPa (> 0)
 * @param s cement coefficient
 * @returns days; 0 for targets <= 0; Infinity above `exp(2 s / 3) fctm`; NaN for NaN input.
 * Source: inverse of EN 1992-1-1:2004 eq. (3.4).
 */
export function ageForTensileStrengthDays(targetMPa: number, fctmMPa: number, s: number): number {
  if (!(fctmMPa > 0)) return Number.NaN;
  const ratio = targetMPa / fctmMPa;
  return ageForDevelopmentFactorDays(ratio < 1 ? ratio : Math.pow(ratio, 1.5), s);
}

/** Parameters of the hyperbolic strength-maturity relation (ASTM C1074, Carino 1984). */
export interface HyperbolicStrengthParameters {
  /** Limiting strength Su, MPa. */
  readonly limitingStrengthMPa: number;
  /** Rate constant k, 1/day of equivalent age. */
  readonly rateConstantPerDay: number;
  /** Equivalent age t0 at which strength development starts (about final set), days. */
  readonly datumAgeDays: number;
}

/**
 * Hyperbolic strength-maturity relation `S = Su k (te - t0) / (1 + k (te - t0))` for te > t0,
 * and 0 before t0.
 *
 * @param equivalentAgeDays te, days; @param parameters Su (MPa), k (1/day), t0 (days)
 * @returns MPa, in [0, Su); tends to Su as te grows; NaN for NaN input.
 * Source: ASTM C1074 (strength-maturity relationship), Carino (1984), "The maturity method:
 *   theory and application", ASTM Cement, Concrete and Aggregates 6(2).
 */
export function hyperbolicStrengthMPa(
  equivalentAgeDays: number,
  parameters: HyperbolicStrengthParameters,
): number {
  const { limitingStrengthMPa, rateConstantPerDay, datumAgeDays } = parameters;
  const activeAge = equivalentAgeDays - datumAgeDays;
  if (Number.isNaN(activeAge)) return Number.NaN;
  if (activeAge <= 0) return 0;
  const x = rateConstantPerDay * activeAge;
  if (x === Number.POSITIVE_INFINITY) return limitingStrengthMPa;
  return (limitingStrengthMPa * x) / (1 + x);
}

/**
 * Equivalent age at which the hyperbolic relation reaches a target strength: with
 * `r = target / Su`, `te = t0 + r / ((1 - r) k)`.
 *
 * @returns days; t0 for targets <= 0; Infinity for targets >= Su; NaN for NaN input.
 * Source: inverse of the ASTM C1074 / Carino (1984) hyperbolic relation.
 */
export function ageForHyperbolicStrengthDays(
  targetMPa: number,
  parameters: HyperbolicStrengthParameters,
): number {
  const { limitingStrengthMPa, rateConstantPerDay, datumAgeDays } = parameters;
  const ratio = targetMPa / limitingStrengthMPa;
  if (Number.isNaN(ratio) || Number.isNaN(datumAgeDays) || !(rateConstantPerDay > 0)) {
    return Number.NaN;
  }
  if (ratio <= 0) return datumAgeDays;
  if (ratio >= 1) return Number.POSITIVE_INFINITY;
  return datumAgeDays + ratio / ((1 - ratio) * rateConstantPerDay);
}

/** Options for strength at early ages (physics.md section 6). */
export interface SettingShiftOptions {
  /**
   * Equivalent age at final set t0, days. Default 0.25 d (6 h at 20 degC). Origin: from memory,
   * final set of ordinary mixes falls about 4 to 8 h at 20 degC; we take the middle. Replace it
   * with the mix's own ASTM C403 penetration time converted to equivalent age.
   */
  readonly finalSetEquivalentAgeDays: number;
  /**
   * Tensile strength floor, MPa, before final set and as a lower bound just after it.
   * Default 0.01 MPa (10 kPa): our assumption for a suspension with almost no tensile strength;
   * it keeps stress over strength finite.
   */
  readonly tensileFloorMPa: number;
}

/** Defaults of {@link SettingShiftOptions}. */
export const DEFAULT_SETTING_SHIFT_OPTIONS: SettingShiftOptions = {
  finalSetEquivalentAgeDays: 0.25,
  tensileFloorMPa: 0.01,
};

/**
 * How in-place strength grows with equivalent age.
 * - `code-shifted`: the EN 1992-1-1 / MC2010 curve run on the age since final set,
 *   `fcm(te) = beta_cc(te - t0) fcm` (t0 from {@link SettingShiftOptions}).
 * - `hyperbolic`: a project's own (or fitted) ASTM C1074 hyperbolic relation; its own t0 is the
 *   start of strength; the class's fcm and fctm give the tensile strength through
 *   {@link tensileStrengthFromRatioMPa}.
 */
export type InPlaceStrengthModel =
  | {
      readonly kind: 'code-shifted';
      readonly fcmMPa: number;
      readonly fctmMPa: number;
      readonly ecmGPa?: number;
      readonly s: number;
      readonly modulusRule?: ModulusDevelopmentRule;
    }
  | {
      readonly kind: 'hyperbolic';
      readonly hyperbolic: HyperbolicStrengthParameters;
      readonly fcmMPa: number;
      readonly fctmMPa: number;
      readonly ecmGPa?: number;
      readonly modulusRule?: ModulusDevelopmentRule;
    };

/** In-place strength and modulus at one equivalent age. */
export interface InPlaceStrength {
  /** Whether the equivalent age has passed the start of strength (final set / t0). */
  readonly hasSet: boolean;
  readonly compressiveStrengthMPa: number;
  /** Never below the tensile floor. */
  readonly tensileStrengthMPa: number;
  /** NaN when the model has no `ecmGPa`. */
  readonly modulusGPa: number;
}

/**
 * In-place strength at an equivalent age under a setting-shifted model (physics.md 6): zero
 * compressive strength and the tensile floor before the start of strength, then the chosen
 * development law. Tensile strength = max(floor, fctm r^alpha), r = fc(te) / fcm.
 *
 * @param equivalentAgeDays equivalent age since placement at 20 degC, days
 * @param model see {@link InPlaceStrengthModel}
 * @param options see {@link SettingShiftOptions}; defaults {@link DEFAULT_SETTING_SHIFT_OPTIONS}
 * @returns NaN figures for NaN age. Sources: EN 1992-1-1:2004 3.1.2; ASTM C1074; Carino (1984).
 */
export function inPlaceStrength(
  equivalentAgeDays: number,
  model: InPlaceStrengthModel,
  options: SettingShiftOptions = DEFAULT_SETTING_SHIFT_OPTIONS,
): InPlaceStrength {
  const startDays =
    model.kind === 'code-shifted'
      ? options.finalSetEquivalentAgeDays
      : model.hyperbolic.datumAgeDays;
  const compressiveStrengthMPa =
    model.kind === 'code-shifted'
      ? compressiveStrengthAtAgeMPa(equivalentAgeDays - startDays, model.fcmMPa, model.s)
      : hyperbolicStrengthMPa(equivalentAgeDays, model.hyperbolic);
  const ratio = compressiveStrengthMPa / model.fcmMPa;
  const exponent = (model.modulusRule ?? 'en1992') === 'en1992' ? 0.3 : 0.5;
  return {
    hasSet: equivalentAgeDays > startDays,
    compressiveStrengthMPa,
    tensileStrengthMPa: Number.isNaN(ratio)
      ? Number.NaN
      : Math.max(options.tensileFloorMPa, tensileStrengthFromRatioMPa(ratio, model.fctmMPa)),
    modulusGPa: Math.pow(ratio, exponent) * (model.ecmGPa ?? Number.NaN),
  };
}

/**
 * Equivalent age at which a setting-shifted model reaches a target compressive strength, closed
 * form: t0 + the inverse of the chosen law.
 *
 * @returns days; the start of strength for targets <= 0; Infinity if never reached; NaN for NaN.
 * Sources: inverses of EN 1992-1-1:2004 eq. (3.2) and of the ASTM C1074 hyperbolic relation.
 */
export function ageForInPlaceCompressiveStrengthDays(
  targetMPa: number,
  model: InPlaceStrengthModel,
  options: SettingShiftOptions = DEFAULT_SETTING_SHIFT_OPTIONS,
): number {
  if (model.kind === 'hyperbolic') return ageForHyperbolicStrengthDays(targetMPa, model.hyperbolic);
  return (
    options.finalSetEquivalentAgeDays +
    ageForCompressiveStrengthDays(targetMPa, model.fcmMPa, model.s)
  );
}
