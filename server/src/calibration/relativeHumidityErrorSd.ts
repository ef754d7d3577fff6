/**
 * Observation error of an embedded relative humidity probe, from its sensor class: a constant
 * accuracy over the calibrated range, widened towards saturation, plus the reading's
 * quantisation.
 */

/** A probe's accuracy class. All humidities are fractions (0.02 = 2 %RH). */
export interface RelativeHumiditySensorClass {
  /** Accuracy over the calibrated range, read as one standard deviation (fraction). */
  accuracy: number;
  /** Humidity above which the error widens (fraction). */
  wideningFrom: number;
  /** Extra standard deviation reached at saturation, h = 1 (fraction), added linearly. */
  extraAtSaturation: number;
  /** Resolution of the reported value (fraction); adds resolution^2 / 12 to the variance. */
  resolution: number;
}

/**
 * The +-2 %RH class. Capacitive humidity sensors are commonly specified at +-2 or +-3 %RH over
 * about 10-90 %RH with a wider tolerance above (manufacturer classes, common practice); near
 * saturation they also drift and recover slowly after condensation. Reading the class as one
 * sigma, the widening from 90 %RH to an extra 2 %RH at 100 %RH and the 0.1 %RH resolution are
 * our assumptions.
 */
export const RH_CLASS_2_PERCENT: RelativeHumiditySensorClass = {
  accuracy: 0.02,
  wideningFrom: 0.9,
  extraAtSaturation: 0.02,
  resolution: 0.001,
};

/** The +-3 %RH class; same widening and resolution as {@link RH_CLASS_2_PERCENT}. */
export const RH_CLASS_3_PERCENT: RelativeHumiditySensorClass = {
  accuracy: 0.03,
  wideningFrom: 0.9,
  extraAtSaturation: 0.02,
  resolution: 0.001,
};

/**
 * Standard deviation of a relative humidity reading's error:
 * `sd(h) = sqrt( (a + e * clamp((h - h_w) / (1 - h_w), 0, 1))^2 + q^2 / 12 )`
 * with a the accuracy, e the extra at saturation, h_w where widening starts, q the resolution.
 *
 * @param relativeHumidity - the reading as a fraction; readings above 1 (condensation) use h = 1,
 *   below 0 use 0; NaN gives NaN (a missing reading is not assimilated).
 * @param sensorClass - the probe's class (default {@link RH_CLASS_2_PERCENT}).
 * @returns the standard deviation as a fraction, > 0 for any class with accuracy > 0.
 */
export function relativeHumidityErrorSd(
  relativeHumidity: number,
  sensorClass: RelativeHumiditySensorClass = RH_CLASS_2_PERCENT,
): number {
  if (Number.isNaN(relativeHumidity)) return Number.NaN;
  const h = Math.min(1, Math.max(0, relativeHumidity));
  const span = 1 - sensorClass.wideningFrom;
  const position =
    span > 0 ? Math.min(1, Math.max(0, (h - sensorClass.wideningFrom) / span)) : h >= 1 ? 1 : 0;
  const sd = sensorClass.accuracy + sensorClass.extraAtSaturation * position;
  return Math.sqrt(sd * sd + (sensorClass.resolution * sensorClass.resolution) / 12);
}
