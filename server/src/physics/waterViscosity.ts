/**
 * Dynamic viscosity of water, IAPWS 2008 formulation without the critical enhancement:
 * mu = mu* mu0(T) mu1(T, rho), mu2 = 1.
 * Source: IAPWS R12-08, Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary Water
 * Substance, eqs. 10-12 and Tables 1-2; Huber et al. (2009), J. Phys. Chem. Ref. Data 38(2).
 */
import { WATER_CRITICAL_TEMPERATURE_K } from './saturationVapourPressure.ts';
import { waterDensityKgPerM3 } from './waterDensity.ts';

/** Critical density rho_c of water, kg/m3 (IAPWS-95). */
const CRITICAL_DENSITY_KG_PER_M3 = 322;
/** Reference viscosity mu*, Pa s. */
const REFERENCE_VISCOSITY_PA_S = 1e-6;
/** H_i of the dilute-gas term mu0 (IAPWS R12-08, Table 1). */
const DILUTE_GAS_H = [1.67752, 2.20462, 0.6366564, -0.241605] as const;
/** Non-zero H_ij of the residual term mu1, as [i, j, H_ij] (IAPWS R12-08, Table 2). */
const RESIDUAL_H: readonly (readonly [number, number, number])[] = [
  [0, 0, 0.520094],
  [1, 0, 0.850895e-1],
  [2, 0, -0.108374e1],
  [3, 0, -0.289555],
  [0, 1, 0.222531],
  [1, 1, 0.999115],
  [2, 1, 0.188797e1],
  [3, 1, 0.126613e1],
  [5, 1, 0.120573],
  [0, 2, -0.281378],
  [1, 2, -0.906851],
  [2, 2, -0.772479],
  [3, 2, -0.489837],
  [4, 2, -0.25704],
  [0, 3, 0.161913],
  [1, 3, 0.257399],
  [0, 4, -0.325372e-1],
  [3, 4, 0.698452e-1],
  [4, 5, 0.872102e-2],
  [3, 6, -0.435673e-2],
  [5, 6, -0.593264e-3],
];

/** Lowest temperature (K, -20 degC) waterViscosityPaS() answers. */
export const WATER_VISCOSITY_MIN_TEMPERATURE_K = 253.15;
/** Highest temperature (K) of the IAPWS 2008 formulation. */
export const WATER_VISCOSITY_MAX_TEMPERATURE_K = 1173.15;

/**
 * Dynamic viscosity of water at temperature T and density rho:
 * mu0 = 100 sqrt(Tr) / sum_{i=0..3} H_i / Tr^i; mu1 = exp[rhor sum_i sum_j H_ij (1/Tr - 1)^i
 * (rhor - 1)^j]; mu = 1e-6 Pa s * mu0 * mu1, with Tr = T / 647.096 K and rhor = rho / 322 kg/m3.
 * The critical enhancement mu2 is taken as 1: the release shows it matters only very close to
 * the critical point (far from concrete pore water).
 *
 * @param temperatureK T in K. IAPWS 2008 is stated from the melting line to 1173.15 K; we also
 *   answer for supercooled liquid down to 253.15 K (extrapolation; the tests compare it with the
 *   IAPWS supplementary release on liquid water at 0.1 MPa).
 * @param densityKgPerM3 rho in kg/m3, > 0. Default: liquid density at T and 101325 Pa from
 *   waterDensityKgPerM3() (IAPWS-IF97 region 1), which is NaN above 623.15 K.
 * @returns mu in Pa s (1.0016e-3 at 20 degC and 101325 Pa). NaN outside [253.15 K, 1173.15 K],
 *   for rho <= 0, or for NaN.
 * Source: IAPWS R12-08, eqs. 10-12.
 */
export function waterViscosityPaS(
  temperatureK: number,
  densityKgPerM3: number = waterDensityKgPerM3(temperatureK),
): number {
  if (
    !(temperatureK >= WATER_VISCOSITY_MIN_TEMPERATURE_K) ||
    !(temperatureK <= WATER_VISCOSITY_MAX_TEMPERATURE_K) ||
    !(densityKgPerM3 > 0)
  ) {
    return Number.NaN;
  }
  const reducedTemperature = temperatureK / WATER_CRITICAL_TEMPERATURE_K;
  const reducedDensity = densityKgPerM3 / CRITICAL_DENSITY_KG_PER_M3;

  let diluteDenominator = 0;
  DILUTE_GAS_H.forEach((h, i) => {
    diluteDenominator += h / reducedTemperature ** i;
  });
  const diluteGas = (100 * Math.sqrt(reducedTemperature)) / diluteDenominator;

  const temperatureTerm = 1 / reducedTemperature - 1;
  const densityTerm = reducedDensity - 1;
  let residualSum = 0;
  for (const [i, j, h] of RESIDUAL_H) {
    residualSum += h * temperatureTerm ** i * densityTerm ** j;
  }
  const residual = Math.exp(reducedDensity * residualSum);

  return REFERENCE_VISCOSITY_PA_S * diluteGas * residual;
}
