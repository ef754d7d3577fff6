/**
 * A tiny stand-in RunEngine for the host's plumbing tests (test folder only; the server ships
 * the real one). Like the real engine (server/src/live/runEngine.ts) it consumes buffered
 * readings in event-time order only up to a watermark (here: 10 min behind the newest reading),
 * counts and drops readings at or before its event time, and leaves buffered readings past its
 * event time out of a snapshot (the host must feed them again on resume). The values fold into
 * an order-sensitive checksum, so any difference in what or in which order it consumed shows.
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

/** The fake consumes readings this far behind the newest one it holds. */
const WATERMARK_MS = 10 * 60_000;

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
      for (const reading of readings) {
        if (body.eventTimeMs !== null && reading.eventTimeMs <= body.eventTimeMs) body.dropped += 1;
        else body.buffer.push(reading);
      }
    },
    setMeasures(next) {
      measures = next;
    },
    setForecast(next) {
      forecast = next;
    },
    advance() {
      const newestMs = Math.max(...body.buffer.map((r) => r.eventTimeMs));
      const watermarkMs = newestMs - WATERMARK_MS;
      const ready = body.buffer.filter((r) => r.eventTimeMs <= watermarkMs);
      if (ready.length === 0) return null;
      body.buffer = body.buffer.filter((r) => r.eventTimeMs > watermarkMs);
      const sorted = ready.sort(
        (a, b) =>
          a.eventTimeMs - b.eventTimeMs ||
          a.device.localeCompare(b.device) ||
          a.sensor.localeCompare(b.sensor),
      );
      for (const reading of sorted) {
        body.eventTimeMs = reading.eventTimeMs;
        body.consumed += 1;
        // The measure log in force when a reading is consumed counts too, as it would in a model.
        body.checksum =
          (body.checksum * 31 + Math.round(reading.value * 100) + 7 * measures.length) % 1_000_003;
      }
      return state();
    },
    state,
    snapshot(): RunEngineSnapshot {
      const kept = structuredClone(body);
      kept.buffer = kept.buffer.filter(
        (r) => body.eventTimeMs === null || r.eventTimeMs <= body.eventTimeMs,
      );
      return { version: 1, runId, eventTimeMs: body.eventTimeMs, body: kept };
    },
  };
  return engine;
};
