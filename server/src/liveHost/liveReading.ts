import type { LiveReading } from '../live/types.ts';
import type { StoredReading } from '../store/types.ts';

/** A stored reading as the live engine takes it (already in its canonical unit). */
export function liveReading(reading: StoredReading): LiveReading {
  return {
    device: reading.device,
    sensor: reading.sensor,
    eventTimeMs: reading.eventAtMs,
    value: reading.value,
    unit: reading.unit,
  };
}
