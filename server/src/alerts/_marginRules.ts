/**
 * The margin rules of noticeRules(): utilization now and the outlook's closing of the margin.
 * "Warn while there is still time to act, not when the margin has already closed" (physics.md 9).
 */
import type { RunConfig } from '../config/runConfig.ts';
import type { RunState } from '../live/types.ts';
import type { AlertOptions } from './alertOptions.ts';
import type { Condition } from './types.ts';
import { fixed2, formatDuration, localClock, offsetMinOf } from './_localTime.ts';

/**
 * Margin conditions of a state (key `margin`), every level whose rule holds:
 * - CRACKING LIKELY: utilization now (median over the members) at or above the highest threshold
 *   (1 by default: stress reaches strength, physics.md 7); or the margin expected to close within
 *   `imminentMin` (our assumption, 15 min).
 * - ACT NOW: the margin expected to close within the run's lead time (`leadTimeMin`, physics.md 9);
 *   or utilization now at or above the first threshold (0.57 by default, the cracking-index
 *   practice of physics.md 7: vocabulary.md "past the first threshold").
 * - PREPARE: the probability that utilization reaches 1 within the horizon at or above
 *   `prepareProbability` (our assumption, 0.2): the outlook shows the margin closing.
 *
 * "Expected to close": at least `expectProbability` of the members (0.5: the median member)
 * cross the highest threshold within the horizon, at the ensemble-median crossing time. The
 * median rather than the mean of the members that cross, so that a few early members do not
 * pull the warning forward, and the band's upper members alone raise only PREPARE (our
 * assumption). Relaxed, each threshold is loosened by its hysteresis option.
 *
 * @param relaxed - loosen the thresholds (conditions that hold a raised notice)
 */
export function marginConditions(
  state: RunState,
  config: RunConfig,
  options: AlertOptions,
  relaxed: boolean,
): Condition[] {
  const nowMs = state.eventTimeMs;
  if (nowMs === null) return [];
  const thresholds = [...config.thresholds.utilization].sort((a, b) => a - b);
  const first = thresholds[0] ?? 0.57;
  const highest = thresholds.at(-1) ?? 1;
  const uSlack = relaxed ? options.utilizationHysteresis : 0;
  const pSlack = relaxed ? options.probabilityHysteresis : 0;
  const tSlackMs = relaxed ? options.leadTimeHysteresisMin * 60_000 : 0;
  const offset = offsetMinOf(config.placedAt);
  const conditions: Condition[] = [];
  const utilization = Number.isFinite(state.utilization) ? state.utilization : null;
  const stress = state.phase === 'plastic' ? 'surface suction' : 'surface stress';
  const against = state.phase === 'plastic' ? 'air-entry suction' : 'tensile strength';

  if (utilization !== null && utilization >= highest - uSlack) {
    conditions.push({
      key: 'margin',
      kind: 'utilization',
      level: 'CRACKING LIKELY',
      reason: `the ${stress} has reached the ${against} (utilization ${fixed2(utilization)})`,
    });
  } else if (utilization !== null && utilization >= first - uSlack) {
    conditions.push({
      key: 'margin',
      kind: 'utilization',
      level: 'ACT NOW',
      reason: `utilization is ${fixed2(utilization)}, past the first threshold ${fixed2(first)}`,
    });
  }

  const crossing = state.outlook?.crossings.find((entry) => entry.threshold === highest);
  const expectedMs =
    crossing !== undefined &&
    crossing.medianTimeMs !== null &&
    crossing.probability >= options.expectProbability - pSlack
      ? crossing.medianTimeMs
      : null;
  if (expectedMs !== null) {
    const inMs = Math.max(0, expectedMs - nowMs);
    const share = Math.round((crossing?.probability ?? 0) * 100);
    const reason =
      inMs <= 0
        ? `the outlook has the ${stress} at or past the ${against} now (${share} % of the outlook's runs)`
        : `the outlook has the ${stress} passing the ${against} at about ${localClock(expectedMs, offset)}, in about ${formatDuration(inMs)} (${share} % of the outlook's runs)`;
    if (inMs <= options.imminentMin * 60_000 + tSlackMs) {
      conditions.push({ key: 'margin', kind: 'margin-outlook', level: 'CRACKING LIKELY', reason });
    } else if (inMs <= config.leadTimeMin * 60_000 + tSlackMs) {
      conditions.push({ key: 'margin', kind: 'margin-outlook', level: 'ACT NOW', reason });
    }
  }

  const probability = state.outlook?.probabilityCrackingWithinHorizon;
  if (
    probability !== undefined &&
    Number.isFinite(probability) &&
    probability >= options.prepareProbability - pSlack
  ) {
    const horizon = state.outlook?.horizonH ?? 6;
    conditions.push({
      key: 'margin',
      kind: 'margin-outlook',
      level: 'PREPARE',
      reason:
        expectedMs === null
          ? `${Math.round(probability * 100)} % of the outlook's runs have the margin closing within the next ${horizon} h`
          : `the outlook has the ${stress} passing the ${against} at about ${localClock(expectedMs, offset)} (${Math.round(probability * 100)} % of its runs within ${horizon} h)`,
    });
  }
  return conditions;
}
