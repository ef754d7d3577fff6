/**
 * Forecast of the time until the element reaches a target in-place compressive strength
 * (formwork striking, loading: physics.md section 6), at the exposed surface and in the core,
 * from each depth's equivalent age and its current rate of equivalent age.
 */
import { hydrationHumidityFactor } from '../physics/hydration.ts';
import { arrheniusAgeFactor } from '../physics/maturity.ts';
import { ageForInPlaceCompressiveStrengthDays } from '../physics/strengthDevelopment.ts';
import { kelvinToCelsius, SECONDS_PER_DAY, SECONDS_PER_HOUR } from '../physics/units.ts';
import type { ElementModel } from './elementModel.ts';
import type { ElementState } from './elementState.ts';

/**
 * Target compressive strength of the forecast when none is given, MPa: 10 MPa (common practice,
 * from memory: an in-place strength often asked before striking slab soffit formwork; a project
 * sets its own in its specifications).
 */
export const DEFAULT_TARGET_COMPRESSIVE_STRENGTH_MPA = 10;

/** Time to a target strength at one instant. */
export interface StrengthForecast {
  /** The target in-place compressive strength, MPa. */
  targetCompressiveStrengthMPa: number;
  /** Equivalent age (20 degC) at which the mix reaches the target, s; Infinity if never; NaN without a mix. */
  targetEquivalentAgeS: number;
  /** Hours from now until the surface cell reaches it (0: reached; Infinity: rate 0 or never). */
  surfaceHours: number;
  /** The same for the core (the deepest cell: the base for one-face, the symmetry plane for two-face). */
  coreHours: number;
  /** Current rate of equivalent age at the surface and in the core, s of age per s (dimensionless). */
  surfaceAgeRate: number;
  coreAgeRate: number;
}

/**
 * Current rate of equivalent age of one cell, d t_e / d t (dimensionless): the Arrhenius factor
 * of ASTM C1074 at the cell's temperature (the model's maturity options) times, when the model's
 * option `hydrationHumidityFactor` is on (default), the humidity factor at the cell's pore
 * humidity (physics.md section 6), exactly as the model integrates the age.
 * Returns NaN for a cell outside the grid.
 */
export function equivalentAgeRate(model: ElementModel, state: ElementState, cell: number): number {
  const temperatureK = state.temperatureK[cell];
  const pressurePa = state.transport.pressurePa[cell];
  if (temperatureK === undefined || pressurePa === undefined) return Number.NaN;
  const options = model.config.options ?? {};
  const arrhenius = arrheniusAgeFactor(kelvinToCelsius(temperatureK), options.maturity ?? {});
  if (options.hydrationHumidityFactor === false || pressurePa >= 0) return arrhenius;
  model.applyState(state);
  return arrhenius * hydrationHumidityFactor(model.hydraulics.relativeHumidity(cell, pressurePa));
}

/**
 * Hours until the surface and the core reach `targetMPa` of in-place compressive strength,
 * extrapolating each depth's current rate of equivalent age (temperature and pore humidity held
 * as they are now, a persistence forecast):
 *   hours = (t_e,target - t_e) / (d t_e / d t) / 3600,
 * with t_e,target from the inverse of the setting-shifted strength law
 * (ageForInPlaceCompressiveStrengthDays: EN 1992-1-1 3.1.2 on the age since final set, ASTM
 * C1074). 0 once reached; Infinity when the rate is 0 (a dried surface stops hydrating) or the
 * target is above what the law ever reaches; NaN figures for materials without a mix.
 *
 * @param targetMPa target in-place compressive strength, MPa (default
 *   {@link DEFAULT_TARGET_COMPRESSIVE_STRENGTH_MPA}); targets <= 0 are reached at final set.
 */
export function strengthForecast(
  model: ElementModel,
  state: ElementState,
  targetMPa = DEFAULT_TARGET_COMPRESSIVE_STRENGTH_MPA,
): StrengthForecast {
  const mix = model.material.mix;
  const core = model.grid.cellCount - 1;
  const surfaceAgeRate = equivalentAgeRate(model, state, 0);
  const coreAgeRate = equivalentAgeRate(model, state, core);
  if (mix === undefined) {
    return {
      targetCompressiveStrengthMPa: targetMPa,
      targetEquivalentAgeS: Number.NaN,
      surfaceHours: Number.NaN,
      coreHours: Number.NaN,
      surfaceAgeRate,
      coreAgeRate,
    };
  }
  const targetEquivalentAgeS =
    ageForInPlaceCompressiveStrengthDays(targetMPa, mix.strength, mix.setting) * SECONDS_PER_DAY;
  const hoursAt = (cell: number, rate: number): number => {
    const remainingS = targetEquivalentAgeS - (state.equivalentAgeS[cell] ?? Number.NaN);
    if (Number.isNaN(remainingS)) return Number.NaN;
    if (remainingS <= 0) return 0;
    if (!(rate > 0)) return Number.POSITIVE_INFINITY;
    return remainingS / rate / SECONDS_PER_HOUR;
  };
  return {
    targetCompressiveStrengthMPa: targetMPa,
    targetEquivalentAgeS,
    surfaceHours: hoursAt(0, surfaceAgeRate),
    coreHours: hoursAt(core, coreAgeRate),
    surfaceAgeRate,
    coreAgeRate,
  };
}
