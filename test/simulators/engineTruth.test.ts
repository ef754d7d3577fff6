/**
 * The engine as hidden truth under the demo scenario: the story the scenario tells holds in the
 * truth, judged by the engine's own risk figures (evaluateElement, physics.md section 7).
 * Without measures the utilization U reaches 1 (the margin closes) soon after the dry wind rises,
 * while still in the plastic phase, where U = -p_surface / p_crit; with the crew's fogging and
 * windbreak it stays well below 1 through the afternoon.
 */
import { describe, expect, it } from 'vitest';
import { curingMeasuresActiveAt } from '../../server/src/physics/curingMeasures.ts';
import { loadMaterialPreset } from '../../server/src/engine/index.ts';
import { createEngineTruth } from '../../simulators/src/engineTruth.ts';
import type { HiddenTruth } from '../../simulators/src/hiddenTruth.ts';
import {
  probeDepthsMm,
  toCuringMeasure,
  truthWeatherAt,
} from '../../simulators/src/playScenario.ts';
import { DEMO_SCENARIO, loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { utcOffsetMin } from '../../simulators/src/scenarioSchema.ts';

const { scenario } = loadScenarioFolder(DEMO_SCENARIO);
const criticalSuctionPa =
  (loadMaterialPreset(scenario.truth.material).mix?.criticalSuctionKPa?.value ?? Number.NaN) * 1000;
const at = (localTime: string) => Date.parse(`2026-07-16T${localTime}:00+02:00`);

/** Plays the truth alone to `untilMs` under a measure log; returns the suction (Pa) every 5 min. */
function playTruth(
  logName: string,
  untilMs: number,
): { truth: HiddenTruth; suctionPa: Map<number, number>; utilization: Map<number, number> } {
  const truth = createEngineTruth(scenario.truth, probeDepthsMm(scenario));
  const measures = (scenario.measureLogs[logName] ?? []).map(toCuringMeasure);
  const suctionPa = new Map<number, number>();
  const utilization = new Map<number, number>();
  for (let timeMs = Date.parse(scenario.truth.placedAt); timeMs < untilMs; timeMs += 60_000) {
    truth.advanceTo(
      timeMs + 60_000,
      truthWeatherAt(scenario.weather, timeMs, utcOffsetMin(scenario.startAt)),
      curingMeasuresActiveAt(measures, timeMs),
    );
    if ((timeMs + 60_000) % 300_000 === 0) {
      suctionPa.set(timeMs + 60_000, truth.surfaceSuctionPa());
      utilization.set(timeMs + 60_000, truth.riskFigures()?.utilization ?? Number.NaN);
    }
  }
  return { truth, suctionPa, utilization };
}

const firstCrossing = (series: Map<number, number>, limit: number) =>
  [...series.entries()].find(([, value]) => value >= limit)?.[0] ?? null;

describe('createEngineTruth() under the level3-topping scenario', () => {
  it('the fresh mix has a critical suction to compare with (preset criticalSuctionKPa)', () => {
    expect(criticalSuctionPa).toBeGreaterThan(0);
  });

  it('without measures the margin closes (U >= 1) after the dry wind rises (12:45) and before 14:00, in the plastic phase', () => {
    const { truth, suctionPa, utilization } = playTruth('no-action', at('14:00'));
    const closedAt = firstCrossing(utilization, 1);
    expect(truth.kind).toBe('engine');
    expect(closedAt).not.toBeNull();
    expect(closedAt as number).toBeGreaterThan(at('12:45'));
    expect(closedAt as number).toBeLessThan(at('14:00'));
    expect(truth.riskFigures()?.phase).toBe('plastic');
    // plastic-phase U is the surface suction over the critical suction: both crossings agree
    expect(firstCrossing(suctionPa, criticalSuctionPa)).toBe(closedAt);
  });

  it("with the crew's fogging and windbreak U stays below 0.5 until 17:00", () => {
    const { utilization } = playTruth('fogging', at('17:00'));
    expect(Math.max(...utilization.values())).toBeLessThan(0.5);
  });

  it('probe depths stay near saturation while the surface dries (a drying front from the top)', () => {
    const { truth } = playTruth('no-action', at('17:30'));
    const surface = truth.relativeHumidityPercentAt(0);
    const deep = truth.relativeHumidityPercentAt(35);
    expect(surface).toBeLessThan(deep);
    expect(deep).toBeGreaterThan(95);
    // the scripted thermal field: concrete warmed by the sun above the morning's 27 degC
    expect(truth.temperatureCAt(5)).toBeGreaterThan(scenario.truth.placementTemperatureC);
  });
});
