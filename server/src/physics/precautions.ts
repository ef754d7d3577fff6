/**
 * Precaution checks of the trade that sit beside the utilization gauge (physics.md section 7):
 * the ACI 305R evaporation-rate threshold, evaporation against bleeding before setting, and the
 * ACI 301 core-to-surface temperature difference for mass concrete.
 *
 * Units: evaporation and bleed rates in kg/m2/h (the unit of the ACI 305R threshold), films in
 * kg/m2, durations in h, temperatures and differences in K.
 */

/** ACI 305R evaporation threshold for precautions against plastic shrinkage cracking, metric text: 1.0 kg/m2/h. */
export const ACI305R_EVAPORATION_THRESHOLD_KG_M2H = 1.0;

/**
 * The same threshold as the inch-pound text gives it, 0.2 lb/ft2/h, converted exactly
 * (1 lb = 0.45359237 kg, 1 ft2 = 0.09290304 m2): 0.9765 kg/m2/h.
 */
export const ACI305R_EVAPORATION_THRESHOLD_INCH_POUND_KG_M2H = (0.2 * 0.45359237) / 0.09290304;

/** Options of {@link evaporationPrecautionVerdict}. */
export interface EvaporationPrecautionOptions {
  /** Threshold for ordinary mixes, kg/m2/h. Default 1.0 (ACI 305R, metric text). */
  readonly thresholdKgM2h: number;
  /**
   * The mix bleeds little (silica fume, low w/c). Default false. When true the threshold is
   * multiplied by {@link EvaporationPrecautionOptions.sensitiveMixFactor}.
   */
  readonly sensitiveMix: boolean;
  /**
   * Factor on the threshold for sensitive mixes. Default 0.5: "about half" for mixes with
   * silica fume or low w/c (ACI 305R discussion of such mixes, value from memory).
   */
  readonly sensitiveMixFactor: number;
}

/** Defaults of {@link EvaporationPrecautionOptions}. */
export const DEFAULT_EVAPORATION_PRECAUTION_OPTIONS: EvaporationPrecautionOptions = {
  thresholdKgM2h: ACI305R_EVAPORATION_THRESHOLD_KG_M2H,
  sensitiveMix: false,
  sensitiveMixFactor: 0.5,
};

/** Verdict on an evaporation rate. */
export interface EvaporationPrecautionVerdict {
  /** Threshold applied, kg/m2/h. */
  readonly thresholdKgM2h: number;
  readonly verdict: 'precautions-needed' | 'below-precaution-threshold' | 'unknown';
}

/**
 * Evaporation rate against the ACI 305R precaution threshold: precautions against plastic
 * shrinkage cracking are needed when the rate reaches the threshold.
 *
 * @param evaporationKgM2h evaporation rate, kg/m2/h; NaN gives `unknown`
 * @param options see {@link EvaporationPrecautionOptions}
 * Source: ACI 305R, Guide to Hot Weather Concreting (1.0 kg/m2/h; 0.2 lb/ft2/h).
 */
export function evaporationPrecautionVerdict(
  evaporationKgM2h: number,
  options: EvaporationPrecautionOptions = DEFAULT_EVAPORATION_PRECAUTION_OPTIONS,
): EvaporationPrecautionVerdict {
  const thresholdKgM2h =
    options.thresholdKgM2h * (options.sensitiveMix ? options.sensitiveMixFactor : 1);
  if (Number.isNaN(evaporationKgM2h) || Number.isNaN(thresholdKgM2h)) {
    return { thresholdKgM2h, verdict: 'unknown' };
  }
  return {
    thresholdKgM2h,
    verdict:
      evaporationKgM2h >= thresholdKgM2h ? 'precautions-needed' : 'below-precaution-threshold',
  };
}

/** Evaporation compared with bleeding before setting. */
export interface EvaporationAgainstBleeding {
  /** Evaporation rate over bleed rate (Infinity when the mix no longer bleeds). */
  readonly ratio: number;
  readonly verdict: 'evaporation-exceeds-bleeding' | 'bleeding-keeps-up' | 'unknown';
}

/**
 * Evaporation against the bleed rate before setting: when evaporation outpaces bleeding the
 * surface dries and capillary suction builds, a recognised warning sign (physics.md 4 and 7).
 *
 * @param evaporationKgM2h evaporation rate, kg/m2/h
 * @param bleedRateKgM2h bleed rate, kg/m2/h (>= 0; 0 once bleeding has stopped)
 * @returns `evaporation-exceeds-bleeding` when E > B; `unknown` for NaN or a negative bleed rate.
 * Source: ACI 305R (plastic shrinkage cracking when evaporation exceeds bleeding); common practice.
 */
export function evaporationAgainstBleeding(
  evaporationKgM2h: number,
  bleedRateKgM2h: number,
): EvaporationAgainstBleeding {
  if (Number.isNaN(evaporationKgM2h) || !(bleedRateKgM2h >= 0)) {
    return { ratio: Number.NaN, verdict: 'unknown' };
  }
  const ratio =
    bleedRateKgM2h > 0
      ? evaporationKgM2h / bleedRateKgM2h
      : evaporationKgM2h > 0
        ? Number.POSITIVE_INFINITY
        : 0;
  return {
    ratio,
    verdict:
      evaporationKgM2h > bleedRateKgM2h ? 'evaporation-exceeds-bleeding' : 'bleeding-keeps-up',
  };
}

/**
 * Hours until the bleed film is gone at constant rates: `w_b / (E - B)` when E > B.
 *
 * @param bleedFilmKgM2 water standing on the surface, kg/m2 (1 kg/m2 = 1 mm)
 * @param evaporationKgM2h evaporation rate, kg/m2/h; @param bleedRateKgM2h bleed rate, kg/m2/h
 * @returns h; 0 when there is no film; Infinity when bleeding keeps up; NaN for NaN input.
 *   The drying model tracks a varying film; this is the quick estimate for constant weather.
 * Source: water balance of the film (physics.md 4).
 */
export function bleedFilmRemainingHours(
  bleedFilmKgM2: number,
  evaporationKgM2h: number,
  bleedRateKgM2h: number,
): number {
  const netLossKgM2h = evaporationKgM2h - bleedRateKgM2h;
  if (Number.isNaN(bleedFilmKgM2) || Number.isNaN(netLossKgM2h)) return Number.NaN;
  if (bleedFilmKgM2 <= 0) return 0;
  if (netLossKgM2h <= 0) return Number.POSITIVE_INFINITY;
  return bleedFilmKgM2 / netLossKgM2h;
}

/**
 * ACI 301 limit on the core-to-surface temperature difference of mass concrete, 35 degF,
 * converted exactly: 19.44 K (ACI 301M rounds it to 19 degC, from memory).
 */
export const ACI301_MAX_CORE_SURFACE_DIFFERENCE_K = 35 / 1.8;

/** Core-to-surface temperature check. */
export interface CoreSurfaceTemperatureCheck {
  /** Core minus surface temperature, K (negative when the surface is warmer). */
  readonly differenceK: number;
  /** Limit applied, K. */
  readonly limitK: number;
  readonly verdict: 'within-limit' | 'exceeds-limit' | 'unknown';
}

/**
 * Temperature difference between the core and the surface layer against the mass-concrete
 * limit: the magnitude of the difference must not exceed the limit.
 *
 * @param coreTemperatureK core temperature, K; @param surfaceTemperatureK surface layer, K
 * @param limitK limit, K; default {@link ACI301_MAX_CORE_SURFACE_DIFFERENCE_K} (35 degF)
 * @returns verdict `unknown` for NaN input.
 * Source: ACI 301, Specifications for Structural Concrete, mass concrete section (35 degF).
 */
export function coreSurfaceTemperatureCheck(
  coreTemperatureK: number,
  surfaceTemperatureK: number,
  limitK: number = ACI301_MAX_CORE_SURFACE_DIFFERENCE_K,
): CoreSurfaceTemperatureCheck {
  const differenceK = coreTemperatureK - surfaceTemperatureK;
  if (Number.isNaN(differenceK) || Number.isNaN(limitK)) {
    return { differenceK, limitK, verdict: 'unknown' };
  }
  return {
    differenceK,
    limitK,
    verdict: Math.abs(differenceK) > limitK ? 'exceeds-limit' : 'within-limit',
  };
}
