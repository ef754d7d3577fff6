/**
 * The water properties the pore hydraulics need at a cell temperature (surface tension, viscosity,
 * density, Kelvin coefficient, saturation vapour pressure), from one lazily filled table shared by
 * every model in the process. The physics library's IAPWS formulations cost about 5 us for the
 * set, and a live element fed by probes has a new temperature in every cell at every interval:
 * about 60 sets per interval, more than the transport steps of the interval cost. The table
 * holds nodes every 0.01 K from 0 to 100 degC, each computed the first time a look-up needs it,
 * and interpolates linearly.
 */
import { kelvinCoefficientPa } from '../physics/kelvin.ts';
import { saturationVapourPressurePa } from '../physics/saturationVapourPressure.ts';
import { waterDensityKgPerM3 } from '../physics/waterDensity.ts';
import { waterSurfaceTensionNPerM } from '../physics/waterSurfaceTension.ts';
import { waterViscosityPaS } from '../physics/waterViscosity.ts';

/** Water properties at one temperature, SI units. */
export interface WaterProperties {
  surfaceTensionNPerM: number;
  viscosityPaS: number;
  densityKgPerM3: number;
  /** A = rho R T / M_w of the Kelvin equation, Pa. */
  kelvinCoefficientPa: number;
  saturationVapourPressurePa: number;
}

const FIRST_K = 273.15;
const STEP_K = 0.01;
const LAST_NODE = 10_000; // 373.15 K
const FIELDS = 5;
const nodes = new Float64Array((LAST_NODE + 1) * FIELDS);
const filled = new Uint8Array(LAST_NODE + 1);

/** The physics library's values (IAPWS releases; see each function's source). */
function exactProperties(temperatureK: number, out: WaterProperties): void {
  const densityKgPerM3 = waterDensityKgPerM3(temperatureK);
  out.surfaceTensionNPerM = waterSurfaceTensionNPerM(temperatureK);
  out.viscosityPaS = waterViscosityPaS(temperatureK, densityKgPerM3);
  out.densityKgPerM3 = densityKgPerM3;
  out.kelvinCoefficientPa = kelvinCoefficientPa(temperatureK, densityKgPerM3);
  out.saturationVapourPressurePa = saturationVapourPressurePa(temperatureK);
}

const scratch: WaterProperties = {
  surfaceTensionNPerM: 0,
  viscosityPaS: 0,
  densityKgPerM3: 0,
  kelvinCoefficientPa: 0,
  saturationVapourPressurePa: 0,
};

function fill(node: number): void {
  exactProperties(FIRST_K + node * STEP_K, scratch);
  const at = node * FIELDS;
  nodes[at] = scratch.surfaceTensionNPerM;
  nodes[at + 1] = scratch.viscosityPaS;
  nodes[at + 2] = scratch.densityKgPerM3;
  nodes[at + 3] = scratch.kelvinCoefficientPa;
  nodes[at + 4] = scratch.saturationVapourPressurePa;
  filled[node] = 1;
}

/**
 * Fills `out` with the water properties at `temperatureK`: linear interpolation between nodes
 * 0.01 K apart on [273.15 K, 373.15 K], the physics functions themselves outside it (and for NaN).
 * Interpolation error below h^2 / 8 max |f''| / f: with h = 0.01 K, about 5e-8 of the value for
 * the saturation vapour pressure (f'' / f about 4e-3 per K^2 near 20 degC), less for the others;
 * test/engine/_waterPropertyTable.test.ts bounds it at 1e-7 over the range. Far below the
 * uncertainty of the formulations themselves.
 */
export function waterPropertiesAt(temperatureK: number, out: WaterProperties): void {
  const position = (temperatureK - FIRST_K) / STEP_K;
  if (!(position >= 0 && position < LAST_NODE)) {
    exactProperties(temperatureK, out);
    return;
  }
  const node = Math.floor(position);
  const weight = position - node;
  if (filled[node] === 0) fill(node);
  if (filled[node + 1] === 0) fill(node + 1);
  const low = node * FIELDS;
  out.surfaceTensionNPerM = between(low, weight);
  out.viscosityPaS = between(low + 1, weight);
  out.densityKgPerM3 = between(low + 2, weight);
  out.kelvinCoefficientPa = between(low + 3, weight);
  out.saturationVapourPressurePa = between(low + 4, weight);
}

/** Linear interpolation between a node's field at `index` and the next node's. */
function between(index: number, weight: number): number {
  const below = nodes[index] as number;
  return below + weight * ((nodes[index + FIELDS] as number) - below);
}
