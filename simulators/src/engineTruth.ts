/**
 * The hidden truth on the server's own element drying model (server/src/engine), built from the
 * scenario's material preset on a finer grid and with its own hidden parameters (permeability
 * and exposure multipliers), advanced in event time under the scripted weather and the measure
 * log. No drying physics lives here: this file only feeds the engine and reads its profile.
 */
import {
  createElementModel,
  evaluateElement,
  loadMaterialPreset,
} from '../../server/src/engine/index.ts';
import type { ElementModel, ElementState } from '../../server/src/engine/index.ts';
import type { CuringMeasure } from '../../server/src/physics/index.ts';
import { windSpeedAtUnoHeight } from '../../server/src/physics/index.ts';
import type { HiddenTruth, TruthWeather } from './hiddenTruth.ts';
import type { Scenario } from './scenarioSchema.ts';
import { ThermalField, interpolate } from './thermalField.ts';

/** Rain rate above which a shower keeps the surface wet like a covering, mm/h (our assumption). */
export const RAIN_WETS_SURFACE_MMH = 0.5;
const KELVIN_OFFSET = 273.15;

/**
 * A hidden truth on the engine.
 *
 * @param truth - the scenario's `truth` block
 * @param probeDepthsMm - depths the probes sample; the thermal field tracks them
 */
export function createEngineTruth(
  truth: Scenario['truth'],
  probeDepthsMm: readonly number[],
): HiddenTruth {
  const model: ElementModel = createElementModel({
    material: loadMaterialPreset(truth.material),
    thicknessM: truth.thicknessMm / 1000,
    dryingCase: truth.drying,
    stressMode: truth.restraint.mode,
    restraintDegree: truth.restraint.degree,
    options: {
      cellCount: truth.cellCount,
      permeabilityMultiplier: truth.permeabilityMultiplier,
      surface: { exposureMultiplier: truth.exposureMultiplier },
      initialBleedFilmKgM2: truth.initialBleedFilmKgM2,
    },
  });
  const placedAtMs = Date.parse(truth.placedAt);
  const state: ElementState = model.initialState(truth.placementTemperatureC + KELVIN_OFFSET);
  const thermal = new ThermalField({
    depthsMm: [...probeDepthsMm, 10, 25, 50, truth.thicknessMm],
    initialTemperatureC: truth.placementTemperatureC,
    solarGainKPerKWm2: truth.solarGainKPerKWm2,
    surfaceLagS: truth.surfaceLagMin * 60,
  });
  const centresMm = Array.from(model.grid.centresM, (depthM) => depthM * 1000);
  let timeMs = placedAtMs;
  let lastEvaporationKgM2h = 0;

  /** Depth in the modelled domain: two-face elements are symmetric about the middle. */
  const domainDepthMm = (depthMm: number): number =>
    truth.drying === 'two-face' ? Math.min(depthMm, truth.thicknessMm - depthMm) : depthMm;

  return {
    kind: 'engine',
    get timeMs() {
      return timeMs;
    },
    advanceTo(targetMs: number, weather: TruthWeather, activeMeasures: readonly CuringMeasure[]) {
      const stepMs = truth.stepS * 1000;
      const measures: CuringMeasure[] = [...activeMeasures];
      if (weather.rainMmH > RAIN_WETS_SURFACE_MMH) {
        measures.push({ kind: 'wet-covering', startMs: timeMs });
      }
      while (timeMs < targetMs) {
        const nextMs = Math.min(targetMs, timeMs + stepMs);
        thermal.step((nextMs - timeMs) / 1000, weather.airTemperatureC, weather.solarWm2);
        model.advanceTo(state, (nextMs - placedAtMs) / 1000, {
          airTemperatureK: weather.airTemperatureC + KELVIN_OFFSET,
          relativeHumidity: weather.relativeHumidityPercent / 100,
          windMS: Math.max(0, windSpeedAtUnoHeight(weather.windAtMastMS, weather.mastHeightM)),
          surfaceTemperatureK: thermal.temperatureCAt(0) + KELVIN_OFFSET,
          probeTemperatures: thermal.profile().map((point) => ({
            depthM: point.depthMm / 1000,
            temperatureK: point.temperatureC + KELVIN_OFFSET,
          })),
          activeMeasures: measures,
        });
        lastEvaporationKgM2h = state.lastEvaporationKgM2s * 3600;
        timeMs = nextMs;
      }
    },
    relativeHumidityPercentAt(depthMm: number) {
      const pressures = state.transport.pressurePa;
      const humidities = centresMm.map(
        (_, cell) =>
          100 * model.hydraulics.relativeHumidity(cell, Math.min(0, pressures[cell] as number)),
      );
      return interpolate(centresMm, humidities, domainDepthMm(depthMm));
    },
    temperatureCAt(depthMm: number) {
      return thermal.temperatureCAt(depthMm);
    },
    evaporationKgM2h() {
      return lastEvaporationKgM2h;
    },
    surfaceSuctionPa() {
      return Math.max(0, -(state.transport.pressurePa[0] as number));
    },
    riskFigures() {
      if (timeMs <= placedAtMs) return null;
      const figures = evaluateElement(model, state);
      return {
        phase: figures.phase,
        utilization: figures.utilization,
        marginPa: figures.marginPa,
      };
    },
  };
}
