/** The measure log as the fold of a run's measure events (append-only: an end is a new event). */
import type { MeasureEntry } from '../live/types.ts';
import type { RunEventRow } from '../store/types.ts';

/** Event kinds the measure log is made of. */
export const MEASURE_EVENT_KINDS = ['measure-started', 'measure-ended'] as const;

/** Who ended a measure, kept beside the entry the engine reads. */
export interface MeasureEnded {
  id: string;
  endMs: number;
  endedBy: string;
}

/** A measure as the log shows it: the engine's entry and who ended it (null while applied or when logged with its end). */
export type MeasureRecord = MeasureEntry & { endedBy: string | null };

/** The engine's entry of a record (without who ended it). */
export function measureEntry({ endedBy: _endedBy, ...entry }: MeasureRecord): MeasureEntry {
  return entry;
}

/**
 * Folds `measure-started` and `measure-ended` events (in record order) into the log: one entry
 * per started measure, in the order logged, with the end of its first `measure-ended` event.
 * Ends of unknown ids are ignored.
 */
export function foldMeasureLog(events: readonly RunEventRow[]): MeasureRecord[] {
  const entries: MeasureRecord[] = [];
  const byId = new Map<string, MeasureRecord>();
  for (const event of events) {
    if (event.kind === 'measure-started') {
      const entry: MeasureRecord = { ...(event.detail as MeasureEntry), endedBy: null };
      entries.push(entry);
      byId.set(entry.id, entry);
    } else if (event.kind === 'measure-ended') {
      const ended = event.detail as MeasureEnded;
      const entry = byId.get(ended.id);
      if (entry !== undefined && entry.endMs === null) {
        entry.endMs = ended.endMs;
        entry.endedBy = ended.endedBy;
      }
    }
  }
  return entries;
}
