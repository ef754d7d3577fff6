/**
 * What a run engine's snapshot holds (plain JSON): the ensemble with its generator, the recent
 * readings up to the engine's time, the flags, the last outlook and state, the measure log and
 * the supplied forecast. Readings after the engine's time are left out: the caller feeds them
 * again after resuming.
 */
import type { EnsembleSnapshot, OutlookStatistics } from '../calibration/index.ts';
import type { StreamBuffer } from './readingStreams.ts';
import type { ForecastPoint, MeasureEntry, QualityFlag, RunState } from './types.ts';

/** JSON form of one stream (`lastSeenMs` null: never seen). */
export interface StreamJson {
  timesMs: number[];
  values: number[];
  lastSeenMs: number | null;
}

/** What a snapshot's body holds (JSON). */
export interface EngineBody {
  engineTimeMs: number | null;
  cycle: number;
  streams: Record<string, StreamJson>;
  ensemble: EnsembleSnapshot | null;
  flags: Record<string, QualityFlag>;
  lateReadings: number;
  previousAge: { timeMs: number; ageS: number } | null;
  ageRate: number;
  outlook: {
    startMs: number;
    statistics: OutlookStatistics;
    source: 'persistence' | 'supplied';
  } | null;
  measures: MeasureEntry[];
  forecast: ForecastPoint[];
  state: RunState | null;
}

/**
 * Streams as JSON, keeping only readings at or before `engineTimeMs` (all when null) and
 * `lastSeenMs` capped at it, so a resumed engine fed the later readings again ends where an
 * uninterrupted one does.
 */
export function streamsToJson(
  streams: ReadonlyMap<string, StreamBuffer>,
  engineTimeMs: number | null,
): Record<string, StreamJson> {
  const keep = (t: number) => engineTimeMs === null || t <= engineTimeMs;
  return Object.fromEntries(
    [...streams].map(([key, stream]) => [
      key,
      {
        timesMs: stream.timesMs.filter(keep),
        values: stream.values.filter((_, i) => keep(stream.timesMs[i] as number)),
        lastSeenMs: Number.isFinite(stream.lastSeenMs)
          ? Math.min(stream.lastSeenMs, engineTimeMs ?? stream.lastSeenMs)
          : null,
      },
    ]),
  );
}

/** Streams back from JSON (null `lastSeenMs`: never seen, -Infinity). */
export function streamsFromJson(json: Record<string, StreamJson>): Map<string, StreamBuffer> {
  return new Map(
    Object.entries(json).map(([key, stream]) => [
      key,
      {
        timesMs: [...stream.timesMs],
        values: [...stream.values],
        lastSeenMs: stream.lastSeenMs ?? Number.NEGATIVE_INFINITY,
      },
    ]),
  );
}
