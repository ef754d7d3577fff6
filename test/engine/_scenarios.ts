/** Shared scenarios of the engine tests (an invented site: a slab poured on a summer morning). */
import type { CuringMeasure } from '../../server/src/physics/curingMeasures.ts';
import type { PoreReferenceParameters } from '../../server/src/engine/_poreReferenceCurves.ts';
import {
  createElementModel,
  type ElementModelConfig,
  type ElementModelOptions,
} from '../../server/src/engine/elementModel.ts';
import type { ElementModel } from '../../server/src/engine/elementModel.ts';
import { loadMaterialPreset } from '../../server/src/engine/materialPreset.ts';
import {
  simulateElement,
  type SimulationResult,
  type WeatherSample,
} from '../../server/src/engine/simulateElement.ts';
import type { DryingCase } from '../../server/src/engine/grid.ts';

export const HOUR_S = 3600;
const kelvin = (celsius: number): number => celsius + 273.15;

/** Constant weather: air and concrete at `temperatureC`, humidity fraction, wind m/s at 0.5 m. */
export function steadyWeather(
  temperatureC: number,
  relativeHumidity: number,
  windMS: number,
): WeatherSample[] {
  return [
    {
      timeS: 0,
      airTemperatureK: kelvin(temperatureC),
      relativeHumidity,
      windMS,
      surfaceTemperatureK: kelvin(temperatureC),
    },
  ];
}

/** Harsh drying: 35 degC, 30 % RH, 30 km/h (Uno: about 2.3 kg/m2/h on a wet surface). */
export const HARSH = steadyWeather(35, 0.3, 30 / 3.6);

/** Hourly weather of a day with a cycle in temperature, humidity and wind, from placement at 08:00. */
export function dailyWeather(days: number): WeatherSample[] {
  const samples: WeatherSample[] = [];
  for (let hour = 0; hour <= days * 24; hour += 1) {
    const phase = (2 * Math.PI * (hour - 6)) / 24; // warmest at 14:00 (hour 6 after placement)
    const airC = 22 + 8 * Math.cos(phase);
    samples.push({
      timeS: hour * HOUR_S,
      airTemperatureK: kelvin(airC),
      relativeHumidity: 0.55 - 0.2 * Math.cos(phase),
      windMS: 2 + 3 * Math.max(0, Math.cos(phase)) + (hour % 5 === 0 ? 2 : 0),
      surfaceTemperatureK: kelvin(airC + 2),
    });
  }
  return samples;
}

/** A model of a preset with test-sized options (and, in `config`, the stress reference or the setting depth). */
export function modelOf(
  presetId: string,
  thicknessM: number,
  dryingCase: DryingCase = 'one-face',
  options: ElementModelOptions = {},
  config: Pick<ElementModelConfig, 'stressReference' | 'settingDepthM'> = {},
): ElementModel {
  return createElementModel({
    material: loadMaterialPreset(presetId),
    thicknessM,
    dryingCase,
    options,
    ...config,
  });
}

/** Runs a model through weather and measures for `hours`, output every 10 min. */
export function run(
  model: ElementModel,
  weather: readonly WeatherSample[],
  hours: number,
  measures: readonly CuringMeasure[] = [],
  profileHours: readonly number[] = [],
): SimulationResult {
  return simulateElement({
    model,
    weather,
    measures,
    durationS: hours * HOUR_S,
    outputIntervalS: 600,
    profileTimesS: profileHours.map((hour) => hour * HOUR_S),
  });
}

/** Water held by the element per m2 of surface (m of liquid), from the pressures alone. */
export function waterHeldM(
  model: ElementModel,
  result: { state: SimulationResult['state'] },
): number {
  model.applyState(result.state);
  let held = 0;
  for (let i = 0; i < model.grid.cellCount; i += 1) {
    held +=
      (model.grid.widthsM[i] ?? Number.NaN) *
      model.hydraulics.waterContentAt(i, result.state.transport.pressurePa[i] ?? Number.NaN);
  }
  return held;
}

/** A measure from `startH` to `endH` hours after placement. */
export function measure(
  kind: CuringMeasure['kind'],
  startH: number,
  endH: number,
  extra: Partial<CuringMeasure> = {},
): CuringMeasure {
  return { kind, startMs: startH * HOUR_S * 1000, endMs: endH * HOUR_S * 1000, ...extra };
}

/**
 * Reference-curve parameters of a fine hardened paste (one log-normal mode of 0.05 um median,
 * porosity 0.15, tortuosity 3; invented for the table tests).
 */
export const FINE_PASTE_CURVES: PoreReferenceParameters = {
  poreSizes: {
    kind: 'lognormal',
    modes: [{ medianDiameterM: 0.05e-6, geometricSd: 3, volumeFraction: 1 }],
  },
  porosity: 0.15,
  tortuosity: 3,
  saturatedPermeabilityM2: undefined,
  referenceTemperatureK: 293.15,
};
