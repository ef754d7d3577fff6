/**
 * When a measure logged "now" from the dashboard starts (or ends). On a live run the readings'
 * event time follows the wall clock, and the server's own clock is the right "now" (the request
 * leaves the time out). A replay or the accelerated demo runs on event time far from the wall
 * clock: there "now" is the time of the latest figures, or the measure would land hours or
 * months away from the run and never act on it. Our assumption: a run whose latest event time
 * is within 15 min of the wall clock is live (readings come every minute or few).
 */

/** Largest gap between event time and wall clock for a live run, ms (our assumption). */
export const LIVE_TOLERANCE_MS = 15 * 60_000;

/**
 * The time to send for "now", or null to let the server use its clock.
 *
 * @param eventTimeMs - event time of the run's latest state, ms (null before the first reading)
 * @param wallMs - this device's clock, ms
 * @returns ISO 8601 (UTC) of the event time when it is further than LIVE_TOLERANCE_MS from
 *   the wall clock, else null
 */
export function measureTimeFor(eventTimeMs: number | null, wallMs: number): string | null {
  if (eventTimeMs === null || Math.abs(wallMs - eventTimeMs) <= LIVE_TOLERANCE_MS) return null;
  return new Date(eventTimeMs).toISOString();
}
