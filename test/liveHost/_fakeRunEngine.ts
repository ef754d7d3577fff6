/**
 * A tiny stand-in RunEngine for the host's plumbing tests (test folder only; the server ships
 * the real one). It consumes buffered readings in event-time order, drops readings older than
 * its event time (as the real engine cannot go back), and folds the values into an
 * order-sensitive checksum, so any difference in what or in which order it was fed shows.
 */
import type {
  CreateRunEngine,
  ForecastPoint,
  LiveReading,
  MeasureEntry,
  RunEngine,
  RunEngineSnapshot,
  RunState,
} from '../../server/src/live/types.ts';

interface FakeBody {
  buffer: LiveReading[];
  eventTimeMs: number | null;
  consumed: number;
  dropped: number;
  checksum: number;
}

/** Every engine the factory made, newest last (for assertions). */
export const madeEngines: { runId: string; resumed: boolean }[] = [];

/** Fake engines; `body` of a snapshot is the FakeBody. */
export const createFakeRunEngine: CreateRunEngine = (runId, _config, _options, snapshot) => {
  madeEngines.push({ runId, resumed: snapshot !== undefined });
  const body: FakeBody = snapshot
    ? structuredClone(snapshot.body as FakeBody)
    : { buffer: [], eventTimeMs: null, consumed: 0, dropped: 0, checksum: 0 };
  let measures: readonly MeasureEntry[] = [];
  let forecast: readonly ForecastPoint[] = [];
  const state = (): RunState =>
    ({
      runId,
      eventTimeMs: body.eventTimeMs,
      phase: 'plastic',
      surfaceStressMPa: body.checksum,
      fctmMPa: null,
      utilization: null,
      marginMPa: null,
      evaporationKgM2h: null,
      inPlaceCompressiveStrengthMPa: null,
      timeToTargetStrengthH: null,
      outlook: null,
      profiles: null,
      calibration: [
        { name: 'consumed', mean: body.consumed, sd: 0, p05: 0, p95: 0 },
        { name: 'dropped', mean: body.dropped, sd: 0, p05: 0, p95: 0 },
        { name: 'measures', mean: measures.length, sd: 0, p05: 0, p95: 0 },
        { name: 'forecastPoints', mean: forecast.length, sd: 0, p05: 0, p95: 0 },
      ],
      quality: { degraded: false, flags: [] },
      caution: 'fake engine',
      // Fields the fake does not compute are left out: only the plumbing is under test.
    }) as unknown as RunState;
  const engine: RunEngine = {
    runId,
    addReadings(readings) {
      body.buffer.push(...readings);
    },
    setMeasures(next) {
      measures = next;
    },
    setForecast(next) {
      forecast = next;
    },
    advance() {
      if (body.buffer.length === 0) return null;
      const sorted = body.buffer
        .splice(0)
        .sort(
          (a, b) =>
            a.eventTimeMs - b.eventTimeMs ||
            a.device.localeCompare(b.device) ||
            a.sensor.localeCompare(b.sensor),
        );
      for (const reading of sorted) {
        if (body.eventTimeMs !== null && reading.eventTimeMs < body.eventTimeMs) {
          body.dropped += 1;
          continue;
        }
        body.eventTimeMs = reading.eventTimeMs;
        body.consumed += 1;
        body.checksum = (body.checksum * 31 + Math.round(reading.value * 100)) % 1_000_003;
      }
      return state();
    },
    state,
    snapshot(): RunEngineSnapshot {
      return { version: 1, runId, eventTimeMs: body.eventTimeMs, body: structuredClone(body) };
    },
  };
  return engine;
};
