/**
 * Density of liquid water from the IAPWS-IF97 region 1 Gibbs free energy:
 * v = (R T / p) pi gamma_pi(pi, tau), pi = p / 16.53 MPa, tau = 1386 K / T,
 * gamma_pi = sum_i -n_i I_i (7.1 - pi)^(I_i - 1) (tau - 1.222)^J_i, rho = 1 / v.
 * Source: IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the
 * Thermodynamic Properties of Water and Steam, eq. 7 and Tables 2 and 4.
 */
import { STANDARD_ATMOSPHERE_PA } from './units.ts';

/** Specific gas constant of water in IF97, J/(kg K) (IAPWS R7-97(2012), eq. 1). */
const SPECIFIC_GAS_CONSTANT_J_PER_KG_K = 461.526;
/** Reducing pressure p* of region 1, Pa. */
const REDUCING_PRESSURE_PA = 16.53e6;
/** Reducing temperature T* of region 1, K. */
const REDUCING_TEMPERATURE_K = 1386;

/** Exponents I_i, J_i and coefficients n_i of region 1 (IAPWS R7-97(2012), Table 2). */
const REGION1_TERMS: readonly (readonly [number, number, number])[] = [
  [0, -2, 0.14632971213167],
  [0, -1, -0.84548187169114],
  [0, 0, -0.3756360367204e1],
  [0, 1, 0.33855169168385e1],
  [0, 2, -0.95791963387872],
  [0, 3, 0.15772038513228],
  [0, 4, -0.16616417199501e-1],
  [0, 5, 0.81214629983568e-3],
  [1, -9, 0.28319080123804e-3],
  [1, -7, -0.60706301565874e-3],
  [1, -1, -0.18990068218419e-1],
  [1, 0, -0.32529748770505e-1],
  [1, 1, -0.21841717175414e-1],
  [1, 3, -0.5283835796993e-4],
  [2, -3, -0.47184321073267e-3],
  [2, 0, -0.30001780793026e-3],
  [2, 1, 0.47661393906987e-4],
  [2, 3, -0.44141845330846e-5],
  [2, 17, -0.72694996297594e-15],
  [3, -4, -0.31679644845054e-4],
  [3, 0, -0.28270797985312e-5],
  [3, 6, -0.85205128120103e-9],
  [4, -5, -0.22425281908e-5],
  [4, -2, -0.65171222895601e-6],
  [4, 10, -0.14341729937924e-12],
  [5, -8, -0.40516996860117e-6],
  [8, -11, -0.12734301741641e-8],
  [8, -6, -0.17424871230634e-9],
  [21, -29, -0.68762131295531e-18],
  [23, -31, 0.14478307828521e-19],
  [29, -38, 0.26335781662795e-22],
  [30, -39, -0.11947622640071e-22],
  [31, -40, 0.18228094581404e-23],
  [32, -41, -0.93537087292458e-25],
];

/** Lowest temperature (K, -20 degC) waterDensityKgPerM3() answers; see its doc comment. */
export const WATER_DENSITY_MIN_TEMPERATURE_K = 253.15;
/** Highest temperature (K) of IF97 region 1. */
export const WATER_DENSITY_MAX_TEMPERATURE_K = 623.15;
/** Highest pressure (Pa) of IF97 region 1. */
export const WATER_DENSITY_MAX_PRESSURE_PA = 100e6;

/**
 * Density of liquid water, rho = 1 / v with v from IF97 region 1 (see the file header).
 *
 * Range: IF97 region 1 is stated for 273.15 K to 623.15 K and ps(T) to 100 MPa. We also answer
 * for supercooled water down to 253.15 K, where the extrapolation agrees with the IAPWS
 * supplementary release on liquid water at 0.1 MPa within 0.005 %, and for pressures from 0 up
 * to ps(T) (metastable liquid, e.g. hot water at atmospheric pressure), where the equation
 * continues smoothly. Accuracy in the stated range: within about 0.01 % of IAPWS-95 near
 * ambient conditions (checked against the fixture in the tests).
 *
 * @param temperatureK T in K, 253.15 to 623.15.
 * @param pressurePa p in Pa, 0 to 100 MPa, default 101325 Pa (standard atmosphere, ISO 2533).
 * @returns rho in kg/m3 (998.21 at 20 degC and 101325 Pa). NaN outside the range or for NaN.
 * Source: IAPWS R7-97(2012), eq. 7, Tables 2 and 4.
 */
export function waterDensityKgPerM3(
  temperatureK: number,
  pressurePa: number = STANDARD_ATMOSPHERE_PA,
): number {
  if (
    !(temperatureK >= WATER_DENSITY_MIN_TEMPERATURE_K) ||
    !(temperatureK <= WATER_DENSITY_MAX_TEMPERATURE_K) ||
    !(pressurePa >= 0) ||
    !(pressurePa <= WATER_DENSITY_MAX_PRESSURE_PA)
  ) {
    return Number.NaN;
  }
  const reducedPressure = pressurePa / REDUCING_PRESSURE_PA;
  const inverseTemperature = REDUCING_TEMPERATURE_K / temperatureK;
  const pressureTerm = 7.1 - reducedPressure;
  const temperatureTerm = inverseTemperature - 1.222;
  let gibbsPressureDerivative = 0;
  for (const [i, j, n] of REGION1_TERMS) {
    if (i === 0) continue;
    gibbsPressureDerivative -= n * i * pressureTerm ** (i - 1) * temperatureTerm ** j;
  }
  const specificVolumeM3PerKg =
    ((SPECIFIC_GAS_CONSTANT_J_PER_KG_K * temperatureK) / REDUCING_PRESSURE_PA) *
    gibbsPressureDerivative;
  return 1 / specificVolumeM3PerKg;
}
