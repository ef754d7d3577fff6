/**
 * How relative humidity observations enter the analysis: as relative humidity, or as log
 * suction (physics.md section 8). By the Kelvin equation the suction is
 * `s = -(rho_w R T / M_w) ln h`, so `ln s = ln(rho_w R T / M_w) + ln(-ln h)`. The first term is
 * the same for a probe's reading and for the model's prediction at that probe (both at the probe's
 * temperature) and cancels in the innovation, so the analysis uses `y = ln(-ln h)`: log suction up
 * to a constant. It makes the relation between a drying pore field and the observation nearly
 * linear over the range where suction spans decades (Kelvin: 99 %RH is 1.4 MPa, 80 %RH 30 MPa).
 */

/** `relative-humidity`: y = h. `log-suction`: y = ln(-ln h), h capped to [floor, cap]. */
export type ObservationTransform =
  | { kind: 'relative-humidity' }
  | { kind: 'log-suction'; relativeHumidityCap: number; relativeHumidityFloor: number };

/**
 * Log suction with its defaults: cap 0.995 (a reading of 99.5-100 %RH becomes 0.995, whose
 * suction is 0.68 MPa at 20 degC, so saturated readings do not map to -Infinity; our
 * assumption), floor 0.01 (below any humidity a probe in fresh concrete reports; our assumption).
 */
export const LOG_SUCTION: ObservationTransform = {
  kind: 'log-suction',
  relativeHumidityCap: 0.995,
  relativeHumidityFloor: 0.01,
};

/**
 * Transformed value: `h` or `ln(-ln(clamp(h, floor, cap)))`. NaN stays NaN.
 * @param relativeHumidity - fraction (0..1).
 */
export function transformObservation(
  transform: ObservationTransform,
  relativeHumidity: number,
): number {
  if (transform.kind === 'relative-humidity') return relativeHumidity;
  const h = clampHumidity(transform, relativeHumidity);
  return Math.log(-Math.log(h));
}

/**
 * Error standard deviation in transformed space by the delta method (first-order propagation):
 * `sd_y = sd_h * |dy/dh| = sd_h / (h |ln h|)` at the clamped observed humidity; identity for
 * `relative-humidity`. Near the cap the transformed error is large (at 0.995 about 200 sd_h),
 * which is right: a nearly saturated reading says little about the suction.
 *
 * @param relativeHumidity - the observed value (fraction); @param errorSd - its sd (fraction).
 */
export function transformObservationErrorSd(
  transform: ObservationTransform,
  relativeHumidity: number,
  errorSd: number,
): number {
  if (transform.kind === 'relative-humidity') return errorSd;
  const h = clampHumidity(transform, relativeHumidity);
  return errorSd / (h * Math.abs(Math.log(h)));
}

function clampHumidity(
  transform: Extract<ObservationTransform, { kind: 'log-suction' }>,
  relativeHumidity: number,
): number {
  return Math.min(
    transform.relativeHumidityCap,
    Math.max(transform.relativeHumidityFloor, relativeHumidity),
  );
}
