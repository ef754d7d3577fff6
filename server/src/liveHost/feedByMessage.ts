import type { RunEngine, RunState } from '../live/types.ts';
import type { StoredReading } from '../store/types.ts';
import { liveReading } from './liveReading.ts';

/**
 * Feeds stored readings to an engine one message at a time, in the order given (storage order),
 * advancing after each message. The engine drops a reading whose time it has already processed,
 * so what it computes depends on when it advanced; advancing at every message makes its state a
 * function of the run's messages in storage order alone, whatever the commits' grouping or the
 * timing of the host: a replay of the archive reproduces the live figures exactly.
 *
 * @param engine - the run's engine
 * @param readings - readings in storage order; a message's readings are contiguous
 * @returns the last state an advance returned, and how many advances returned one; null when
 *   no advance moved the engine
 */
export function feedByMessage(
  engine: RunEngine,
  readings: readonly StoredReading[],
): { state: RunState | null; advances: number } {
  let state: RunState | null = null;
  let advances = 0;
  for (let start = 0; start < readings.length;) {
    const messageId = readings[start]?.messageId;
    let end = start + 1;
    while (end < readings.length && readings[end]?.messageId === messageId) end += 1;
    engine.addReadings(readings.slice(start, end).map(liveReading));
    const moved = engine.advance();
    if (moved !== null) {
      state = moved;
      advances += 1;
    }
    start = end;
  }
  return { state, advances };
}
