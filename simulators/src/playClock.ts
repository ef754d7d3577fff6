/**
 * The wall clock the player paces itself by, injected so tests run on fake time. Event time
 * advances `speed` times as fast as this clock: t_event = t_start + speed (t_wall - t_wall0).
 */
export interface PlayClock {
  /** Milliseconds, any origin. */
  now(): number;
  /** Waits `ms` milliseconds (0 or less: yields once). */
  sleep(ms: number): Promise<void>;
}

/** The real clock: performance.now() and setTimeout. */
export const realClock: PlayClock = {
  now: () => performance.now(),
  sleep: (ms) => new Promise((resolve) => setTimeout(resolve, Math.max(0, ms))),
};

/**
 * A fake clock for tests: `sleep` moves `now` forward at once and yields to the event loop, so a
 * scenario of hours plays as fast as the broker acknowledges.
 */
export function virtualClock(startMs = 0): PlayClock {
  let nowMs = startMs;
  return {
    now: () => nowMs,
    sleep: (ms) => {
      nowMs += Math.max(0, ms);
      return new Promise((resolve) => setImmediate(resolve));
    },
  };
}

/** Fastest and slowest speeds, multiples of real time: 1 to 120 (issue 5). */
export const MIN_SPEED = 1;
export const MAX_SPEED = 120;

/**
 * Checks a speed at the edge.
 *
 * @throws RangeError "speed must be between 1 and 120 (times real time): got 500"
 */
export function checkSpeed(speed: number): number {
  if (!(Number.isFinite(speed) && speed >= MIN_SPEED && speed <= MAX_SPEED)) {
    throw new RangeError(
      `speed must be between ${MIN_SPEED} and ${MAX_SPEED} (times real time): got ${speed}`,
    );
  }
  return speed;
}
