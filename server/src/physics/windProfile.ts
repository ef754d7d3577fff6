/**
 * Logarithmic wind profile: converts a wind speed measured at the weather station's mast height
 * to the height another formula needs (0.5 m for Uno's evaporation formula).
 *
 * In a neutrally stratified surface layer over uniform terrain, u(z) = (u* / kappa) ln(z / z0),
 * so two heights relate by u(z2) = u(z1) ln(z2 / z0) / ln(z1 / z0); the friction velocity u* and
 * von Karman's constant kappa cancel. No zero-plane displacement is used (open terrain).
 * Source: the logarithmic law of the surface layer (Prandtl; e.g. Stull 1988, An Introduction to
 * Boundary Layer Meteorology, section 9.7); roughness lengths after the Davenport classification
 * as revised by Wieringa (1992, J. Wind Eng. Ind. Aerodyn. 41-44), tabulated in the WMO Guide to Instruments and Methods of
 * Observation (WMO-No. 8), chapter on wind: "open" terrain (flat, grass, isolated obstacles)
 * z0 = 0.03 m. See physics.md section 4.
 */
import { UNO_WIND_HEIGHT_M } from './evaporation.ts';

/**
 * Default aerodynamic roughness length z0, m: 0.03 m, open terrain (Davenport-Wieringa class
 * "open", WMO-No. 8). A construction site with stacked materials and buildings nearby is rougher
 * (0.1 to 0.5 m, "roughly open" to "rough" in the same table): set the option.
 */
export const OPEN_TERRAIN_ROUGHNESS_LENGTH_M = 0.03;

/** Options of the log wind profile. */
export interface WindProfileOptions {
  /** Aerodynamic roughness length z0, m, > 0. Default 0.03 m (open terrain, WMO-No. 8). */
  roughnessLengthM?: number;
}

/**
 * Wind speed at `targetHeightM` from a speed measured at `measuredHeightM`, by the log profile:
 *   u(z2) = u(z1) ln(z2 / z0) / ln(z1 / z0)
 *
 * Units: heights and z0 in m; the speed in any unit (the result has the same unit).
 * Valid range: both heights well above z0 and within the surface layer (tens of metres);
 * neutral stratification (strong sun or calm nights bend the real profile).
 * Edge cases: target height <= z0 returns 0 (the log profile puts zero wind at z0 and is not
 * defined below it); measured height <= z0, z0 <= 0, or any NaN input returns NaN (the speed at
 * the mast cannot be related to the profile). Negative speeds scale like positive ones.
 * Source: logarithmic surface-layer profile; z0 from WMO-No. 8 (Wieringa classes).
 */
export function logProfileWindSpeed(
  windSpeed: number,
  measuredHeightM: number,
  targetHeightM: number,
  options: WindProfileOptions = {},
): number {
  const roughnessLengthM = options.roughnessLengthM ?? OPEN_TERRAIN_ROUGHNESS_LENGTH_M;
  if (
    Number.isNaN(windSpeed) ||
    Number.isNaN(targetHeightM) ||
    !(roughnessLengthM > 0) ||
    !(measuredHeightM > roughnessLengthM)
  ) {
    return Number.NaN;
  }
  if (targetHeightM <= roughnessLengthM) return 0;
  return (
    (windSpeed * Math.log(targetHeightM / roughnessLengthM)) /
    Math.log(measuredHeightM / roughnessLengthM)
  );
}

/**
 * Wind speed about 0.5 m above the surface, the height Uno's (1998) evaporation formula takes,
 * from a speed measured at the mast height: {@link logProfileWindSpeed} with target 0.5 m.
 * With the default z0 = 0.03 m, a 10 m mast reading scales by ln(0.5/0.03)/ln(10/0.03) = 0.484.
 * Same units, range and edge cases as {@link logProfileWindSpeed}.
 */
export function windSpeedAtUnoHeight(
  windSpeed: number,
  mastHeightM: number,
  options: WindProfileOptions = {},
): number {
  return logProfileWindSpeed(windSpeed, mastHeightM, UNO_WIND_HEIGHT_M, options);
}
