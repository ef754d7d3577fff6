/**
 * A SIMPLE STAND-IN for the hidden truth, NOT a drying model: it lets the simulators' plumbing
 * (sampling, noise, packs, MQTT) be tested without the engine. The demo never uses it, nor does
 * the demo's acceptance test.
 *
 * Its rule (our assumption, chosen only to move plausibly with the weather): a dryness index D,
 * in % RH, grows with the potential evaporation of a wet surface and relaxes back when the
 * surface is covered or fogged,
 *   dD/dt = k_e E - D / tau,   RH(d) = 100 - D exp(-d / delta)
 * with k_e = 6 %RH per kg/m2 of water evaporated (our assumption), tau = 6 h, delta = 8 mm, D at
 * most 60. E is Uno's (1998) estimate from the physics library. Temperatures follow the
 * scripted thermal field.
 */
import { curingBoundaryInputs, type CuringMeasure } from '../../server/src/physics/index.ts';
import { evaporationFluxKgM2s } from '../../server/src/physics/index.ts';
import { windSpeedAtUnoHeight } from '../../server/src/physics/index.ts';
import type { HiddenTruth, TruthWeather } from './hiddenTruth.ts';
import type { Scenario } from './scenarioSchema.ts';
import { ThermalField } from './thermalField.ts';

const DRYNESS_PER_KG_M2 = 6;
const RELAX_S = 6 * 3600;
const DECAY_DEPTH_MM = 8;
const MAX_DRYNESS = 60;
const KELVIN_OFFSET = 273.15;

/** The stand-in truth; see the file comment. Tests of the simulators only. */
export function createStandInTruth(
  truth: Scenario['truth'],
  probeDepthsMm: readonly number[],
): HiddenTruth {
  const thermal = new ThermalField({
    depthsMm: [...probeDepthsMm, truth.thicknessMm],
    initialTemperatureC: truth.placementTemperatureC,
    solarGainKPerKWm2: truth.solarGainKPerKWm2,
    surfaceLagS: truth.surfaceLagMin * 60,
  });
  let timeMs = Date.parse(truth.placedAt);
  let dryness = 0;
  let evaporationKgM2s = 0;
  return {
    kind: 'stand-in',
    get timeMs() {
      return timeMs;
    },
    advanceTo(targetMs: number, weather: TruthWeather, activeMeasures: readonly CuringMeasure[]) {
      while (timeMs < targetMs) {
        const nextMs = Math.min(targetMs, timeMs + truth.stepS * 1000);
        const stepS = (nextMs - timeMs) / 1000;
        thermal.step(stepS, weather.airTemperatureC, weather.solarWm2);
        const surface = curingBoundaryInputs(activeMeasures, {
          windKmH: 3.6 * windSpeedAtUnoHeight(weather.windAtMastMS, weather.mastHeightM),
          relativeHumidity: weather.relativeHumidityPercent / 100,
        });
        const held = surface.heldSaturated || weather.rainMmH > 0.5;
        evaporationKgM2s = held
          ? 0
          : Math.max(
              0,
              surface.fluxMultiplier *
                evaporationFluxKgM2s({
                  airTemperatureK: weather.airTemperatureC + KELVIN_OFFSET,
                  concreteTemperatureK: thermal.temperatureCAt(0) + KELVIN_OFFSET,
                  relativeHumidity: surface.relativeHumidity,
                  windMS: surface.windKmH / 3.6,
                }),
            );
        dryness += stepS * (DRYNESS_PER_KG_M2 * evaporationKgM2s - dryness / RELAX_S);
        dryness = Math.min(MAX_DRYNESS, Math.max(0, dryness));
        timeMs = nextMs;
      }
    },
    relativeHumidityPercentAt(depthMm: number) {
      return 100 - dryness * Math.exp(-Math.max(0, depthMm) / DECAY_DEPTH_MM);
    },
    temperatureCAt(depthMm: number) {
      return thermal.temperatureCAt(depthMm);
    },
    evaporationKgM2h() {
      return evaporationKgM2s * 3600;
    },
    surfaceSuctionPa() {
      return Number.NaN;
    },
    riskFigures() {
      return null;
    },
  };
}
