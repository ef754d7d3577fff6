/**
 * createRunEngine: the per-run live engine. First thin version: buffers readings and reports an
 * empty state; the calibrated model follows in the next commits.
 */
import type { RunConfig } from '../config/index.ts';
import { CAUTION_TEXT } from './caution.ts';
import type {
  ForecastPoint,
  LiveReading,
  MeasureEntry,
  RunEngine,
  RunEngineOptions,
  RunEngineSnapshot,
  RunState,
} from './types.ts';

/**
 * Creates the live engine of one run, or resumes it from a snapshot.
 *
 * @param runId - the run's id (also seeds the ensemble unless `options.seed` is given)
 * @param config - the validated run configuration
 * @param options - see RunEngineOptions (every field optional)
 * @param snapshot - a snapshot from `RunEngine.snapshot()` of the same run to resume from
 */
export function createRunEngine(
  runId: string,
  config: RunConfig,
  options: RunEngineOptions = {},
  snapshot?: RunEngineSnapshot,
): RunEngine {
  void config;
  void options;
  void snapshot;
  const buffer: LiveReading[] = [];
  const state = (): RunState => ({
    runId,
    eventTimeMs: null,
    phase: 'before-placement',
    surfaceStressMPa: null,
    fctmMPa: null,
    utilization: null,
    marginMPa: null,
    evaporationKgM2h: null,
    inPlaceCompressiveStrengthMPa: null,
    timeToTargetStrengthH: null,
    outlook: null,
    profiles: null,
    calibration: [],
    quality: { degraded: false, flags: [] },
    caution: CAUTION_TEXT,
  });
  return {
    runId,
    addReadings: (readings) => void buffer.push(...readings),
    setMeasures: (measures: readonly MeasureEntry[]) => void measures,
    setForecast: (points: readonly ForecastPoint[]) => void points,
    advance: () => null,
    state,
    snapshot: () => ({ version: 1, runId, eventTimeMs: null, body: null }),
  };
}
