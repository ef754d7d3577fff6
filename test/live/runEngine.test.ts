/**
 * createRunEngine(): determinism of a replay, snapshot and resume, the watermark and the
 * data-quality flags, on readings played from the simulators' level3-topping scenario (their
 * hidden truth, station and probe strings, without MQTT: twinReadings.ts). These properties do
 * not depend on ensemble size or grid, so the tests use 8 members and 20 cells over the first
 * 3 h to stay fast (defaults are 32 and 60).
 */
import { describe, expect, it } from 'vitest';
import { createRunEngine } from '../../server/src/live/index.ts';
import type { LiveReading, RunEngine, RunEngineOptions } from '../../server/src/live/index.ts';
import { CAUTION_TEXT } from '../../server/src/live/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { playTwin } from './twinReadings.ts';

const folder = loadScenarioFolder('level3-topping');
const twin = playTwin(folder.scenario, { logName: 'no-action', durationH: 3.5 });
const OPTIONS: RunEngineOptions = {
  memberCount: 8,
  cellCount: 20,
  outlookEveryAnalyses: 3,
  horizonH: 2,
};

/** Feeds readings in batches of `batchS` seconds of event time, advancing after each. */
function feed(engine: RunEngine, readings: readonly LiveReading[], batchS: number): void {
  const batches = new Map<number, LiveReading[]>();
  for (const reading of readings) {
    const key = Math.floor(reading.eventTimeMs / (batchS * 1000));
    const batch = batches.get(key) ?? [];
    batch.push(reading);
    batches.set(key, batch);
  }
  for (const key of [...batches.keys()].sort((a, b) => a - b)) {
    engine.addReadings(batches.get(key) ?? []);
    engine.advance();
  }
}

function fresh(options: RunEngineOptions = OPTIONS): RunEngine {
  const engine = createRunEngine('ferngate-l3-test', folder.runConfig, options);
  engine.setMeasures(twin.measures);
  return engine;
}

describe('createRunEngine()', () => {
  it('gives identical figures on a replay of the same readings, whatever the batching', () => {
    const first = fresh();
    feed(first, twin.readings, 300);
    const second = fresh();
    feed(second, twin.readings, 1800);
    expect(first.state().eventTimeMs).not.toBeNull();
    expect(JSON.stringify(second.state())).toBe(JSON.stringify(first.state()));
  });

  it('resumed from a snapshot and fed the readings after it, ends in the same state', () => {
    const uninterrupted = fresh();
    feed(uninterrupted, twin.readings, 600);
    const interrupted = fresh();
    const cutMs = Date.parse('2026-07-16T12:40:00+02:00');
    feed(
      interrupted,
      twin.readings.filter((r) => r.eventTimeMs <= cutMs),
      600,
    );
    const snapshot = JSON.parse(JSON.stringify(interrupted.snapshot())) as ReturnType<
      RunEngine['snapshot']
    >;
    const resumed = createRunEngine('ferngate-l3-test', folder.runConfig, OPTIONS, snapshot);
    resumed.setMeasures(twin.measures);
    const after = twin.readings.filter((r) => r.eventTimeMs > (snapshot.eventTimeMs ?? 0));
    feed(resumed, after, 600);
    expect(snapshot.eventTimeMs).toBeLessThan(cutMs + 1);
    expect(JSON.stringify(resumed.state())).toBe(JSON.stringify(uninterrupted.state()));
    // Same numbers everywhere (key order of the element states may differ, hence toEqual).
    expect(resumed.snapshot()).toEqual(uninterrupted.snapshot());
  });

  it('never lets an outlook change the filter: outlook cadence leaves the calibration unchanged', () => {
    const often = fresh({ ...OPTIONS, outlookEveryAnalyses: 1 });
    const rarely = fresh({ ...OPTIONS, outlookEveryAnalyses: 1000 });
    feed(often, twin.readings, 1800);
    feed(rarely, twin.readings, 1800);
    expect(often.state().outlook).not.toBeNull();
    expect(rarely.state().outlook).toBeNull();
    expect(rarely.state().calibration).toEqual(often.state().calibration);
    expect(rarely.state().utilization).toBe(often.state().utilization);
  });

  it('waits for a lagging stream, then holds the weather and flags the run degraded', () => {
    const engine = fresh();
    const cutMs = Date.parse('2026-07-16T12:00:00+02:00');
    const windSensor = folder.runConfig.weather.sensors.windSpeed;
    const lagging = twin.readings.filter((r) => r.eventTimeMs <= cutMs || r.sensor !== windSensor);
    // Wind stops at 12:00; the others continue to 12:04: the engine waits (tolerance 300 s).
    engine.addReadings(lagging.filter((r) => r.eventTimeMs <= cutMs + 240_000));
    engine.advance();
    expect(engine.state().eventTimeMs).toBe(cutMs);
    // To 12:12: wind is 12 min behind, so it no longer holds the engine back; held (< 15 min).
    engine.addReadings(
      lagging.filter((r) => r.eventTimeMs > cutMs + 240_000 && r.eventTimeMs <= cutMs + 720_000),
    );
    engine.advance();
    const held = engine.state();
    expect(held.eventTimeMs).toBeGreaterThan(cutMs);
    expect(held.quality.degraded).toBe(true);
    expect(held.quality.flags.map((flag) => flag.code)).toContain('weather-held');
    // To 12:40: beyond the 15 min hold, flagged as a gap.
    engine.addReadings(
      lagging.filter((r) => r.eventTimeMs > cutMs + 720_000 && r.eventTimeMs <= cutMs + 2_400_000),
    );
    engine.advance();
    const codes = engine.state().quality.flags.map((flag) => flag.code);
    expect(codes).toContain('weather-gap');
    expect(codes).not.toContain('late-readings');
  });

  it('uses a supplied forecast: humid calm air ahead lowers the outlook against persistence', () => {
    const persistence = fresh();
    feed(persistence, twin.readings, 1800);
    const supplied = fresh();
    const startMs = Date.parse(folder.runConfig.placedAt);
    supplied.setForecast(
      Array.from({ length: 12 }, (_, i) => ({
        timeMs: startMs + i * 3_600_000,
        relativeHumidityPercent: 95,
        windSpeedMs: 0.5,
      })),
    );
    feed(supplied, twin.readings, 1800);
    const a = persistence.state().outlook;
    const b = supplied.state().outlook;
    expect(a?.forecastSource).toBe('persistence');
    expect(b?.forecastSource).toBe('supplied');
    // Before the forecast takes over, the members are the same (the forecast only acts ahead).
    expect(supplied.state().calibration).toEqual(persistence.state().calibration);
    expect(b?.utilizationBand.p50.at(-1)).toBeLessThan(a?.utilizationBand.p50.at(-1) ?? Number.NaN);
  });

  it('reports the contract figures with the caution text and a probe beside the model', () => {
    const engine = fresh();
    feed(engine, twin.readings, 1800);
    const state = engine.state();
    expect(state.caution).toBe(CAUTION_TEXT);
    expect(['plastic', 'hardening']).toContain(state.phase);
    expect(state.utilization).not.toBeNull();
    expect(state.calibration.map((entry) => entry.name)).toContain('permeabilityMultiplier');
    expect(state.profiles?.probes).toHaveLength(5);
    expect(state.profiles?.depthMm).toHaveLength(20);
    expect(state.outlook?.crossings.map((crossing) => crossing.threshold)).toEqual([0.57, 0.69, 1]);
  });
});
