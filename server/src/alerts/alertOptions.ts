/**
 * Options of the crew notices: how the rules read the outlook, the hysteresis that keeps a
 * notice from flickering, and the repeat of an unacknowledged warning. Every option has a
 * default, a unit in its name and its origin; validated with zod where it comes from outside.
 * The thresholds themselves (utilization levels, evaporation rate, lead time) are the run
 * configuration's (`thresholds`, `leadTimeMin`, physics.md 7 and 9).
 */
import { z } from 'zod';
import { ValidationError, formatIssues } from '../config/formatIssues.ts';

const minutes = (fallback: number, most: number) =>
  z
    .number({ error: 'must be a number of minutes' })
    .min(0, { error: `must be between 0 and ${most} min` })
    .max(most, { error: `must be between 0 and ${most} min` })
    .default(fallback);
const fraction = (fallback: number) =>
  z
    .number({ error: 'must be a number' })
    .min(0, { error: 'must be between 0 and 1' })
    .max(1, { error: 'must be between 0 and 1' })
    .default(fallback);

/** The zod schema of the alert options; parseAlertOptions() gives messages a person can act on. */
export const alertOptionsSchema = z.strictObject({
  /** CRACKING LIKELY when the margin is expected to close within this, min [15, our assumption]. */
  imminentMin: minutes(15, 240),
  /**
   * PREPARE when the probability that utilization reaches 1 within the horizon is at least this
   * [0.2, our assumption: one outlook member in five is worth getting protection ready for].
   */
  prepareProbability: fraction(0.2),
  /**
   * The margin is "expected" to close when at least this fraction of the members cross
   * [0.5, our assumption: the ensemble median crosses, so the median crossing time exists].
   */
  expectProbability: fraction(0.5),
  /** A utilization threshold holds a raised notice until utilization falls this far below it [0.05, our assumption]. */
  utilizationHysteresis: z.number().min(0).max(1).default(0.05),
  /** A probability rule holds until the probability falls this far below it [0.1, our assumption]. */
  probabilityHysteresis: fraction(0.1),
  /** A closing expected within the lead time holds until it is this much further away, min [30, our assumption]. */
  leadTimeHysteresisMin: minutes(30, 600),
  /** The evaporation rule holds until the rate falls this far below its threshold, kg/m2/h [0.1, our assumption]. */
  evaporationHysteresisKgM2h: z.number().min(0).max(5).default(0.1),
  /** Event time a condition must stay below its hold thresholds before it eases, min [30, our assumption]. */
  dwellMin: minutes(30, 1440),
  /** Event time after which an unacknowledged ACT NOW or CRACKING LIKELY is sent again, min [30, our assumption; 0: never]. */
  renotifyMin: minutes(30, 1440),
  /**
   * Each further repeat waits this many times longer than the one before: 30, 60, 120 min...
   * [2, our assumption: a warning nobody answers is sent again soon, then less often, so an
   * unattended deck is not flooded; 1: every renotifyMin].
   */
  renotifyGrowth: z.number().min(1).max(10).default(2),
  /** Raise NOTEs for silent sensors and degraded data [true]. */
  dataNotes: z.boolean().default(true),
});

/** Alert options with defaults filled in. */
export type AlertOptions = z.output<typeof alertOptionsSchema>;
/** Alert options as written (every field optional). */
export type AlertOptionsInput = z.input<typeof alertOptionsSchema>;

/** The defaults of every option. */
export const DEFAULT_ALERT_OPTIONS: AlertOptions = alertOptionsSchema.parse({});

/**
 * Validates alert options and fills in defaults.
 *
 * @throws ValidationError naming the field, the rule and the value received
 */
export function parseAlertOptions(input: unknown): AlertOptions {
  const result = alertOptionsSchema.safeParse(input ?? {});
  if (result.success) return result.data;
  throw new ValidationError('alert options', formatIssues(result.error.issues, input));
}
