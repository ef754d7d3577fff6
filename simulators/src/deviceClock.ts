/**
 * A device's clock: the true event time plus a start offset and a steady drift.
 *   t_device = t + offset + drift_ppm 1e-6 (t - t_start)
 * A drift of 35 ppm gains about 3 s a day (a cheap crystal, common practice).
 */
export interface DeviceClockOptions {
  /** True event time the clock was set, ms since the Unix epoch. */
  startMs: number;
  /** Offset at the start, s. */
  offsetS: number;
  /** Drift, parts per million (positive runs fast). */
  driftPpm: number;
}

/** The device-clock time at true time `timeMs`, ms. */
export function deviceTimeMs(options: DeviceClockOptions, timeMs: number): number {
  return timeMs + options.offsetS * 1000 + options.driftPpm * 1e-6 * (timeMs - options.startMs);
}
