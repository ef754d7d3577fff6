/**
 * The rules of crew notices: which conditions a run's state shows, and at which level
 * (vocabulary.md). Pure functions of the engine's RunState, the run configuration and the
 * options; no physics is derived here, only the engine's figures read (architecture.md).
 *
 * Each rule is evaluated twice: with the thresholds as written (conditions that raise a notice)
 * and relaxed by the hysteresis options (conditions that keep a raised notice from easing), so a
 * figure hovering at a threshold does not raise and ease a notice every analysis.
 */
import type { RunConfig } from '../config/runConfig.ts';
import type { RunState } from '../live/types.ts';
import type { AlertOptions } from './alertOptions.ts';
import type { Condition, NoticeFigures, RuleFindings } from './types.ts';
import { marginConditions } from './_marginRules.ts';
import { formatDuration, localClock, offsetMinOf } from './_localTime.ts';

/** Quality flags that say a sensor is silent (server/src/live/runEngine.ts). */
const SILENT_FLAGS = ['probe-silent', 'weather-gap'];
/** Quality flags that say the figures rest on missing data (weather held a few minutes is not one). */
const DEGRADED_FLAGS = ['weather-missing', 'model-refused'];

/**
 * The conditions a state shows, with the thresholds as written and relaxed.
 *
 * Rules (levels of vocabulary.md; thresholds from the run configuration, physics.md 7 and 9):
 * - margin (`_marginRules.ts`): CRACKING LIKELY, ACT NOW and PREPARE from utilization now and
 *   the outlook;
 * - drying: PREPARE when the evaporation rate reaches `thresholds.evaporationKgM2h` (ACI 305R's
 *   precaution threshold, 1.0 kg/m2/h; physics.md 7), or, before final set, when it exceeds the
 *   mix's bleed rate (`mix.bleedRateKgM2h`), so the bleed water is running out (physics.md 7,
 *   common practice);
 * - NOTE for each device with a silent sensor (`probe-silent`, `weather-gap` flags; one notice
 *   per device, as a probe string falls silent as a whole), for figures resting on
 *   missing data (`weather-missing`, `model-refused`), and once the in-place strength reaches
 *   the engine's target (timeToTargetStrengthH is 0).
 *
 * @param state - the engine's state; a state without event time or before placement gives none
 * @param config - the run configuration (thresholds, lead time, mix)
 * @param options - alert options (defaults of alertOptions.ts)
 */
export function noticeRules(
  state: RunState,
  config: RunConfig,
  options: AlertOptions,
): RuleFindings {
  const figures = noticeFigures(state, config);
  if (state.eventTimeMs === null || state.phase === 'before-placement')
    return { raise: [], hold: [], figures };
  return {
    raise: [
      ...marginConditions(state, config, options, false),
      ...dryingConditions(state, config, options, false),
      ...dataConditions(state, config, options),
    ],
    hold: [
      ...marginConditions(state, config, options, true),
      ...dryingConditions(state, config, options, true),
      ...dataConditions(state, config, options),
    ],
    figures,
  };
}

/**
 * The key figures of a state: utilization and margin now (medians), evaporation rate, the
 * expected closing (median crossing of the highest utilization threshold, null when fewer than
 * half the members cross within the horizon) and the probability that utilization reaches 1.
 */
export function noticeFigures(state: RunState, config: RunConfig): NoticeFigures {
  const closing = closingCrossing(state, config);
  return {
    utilization: finite(state.utilization),
    marginMPa: finite(state.marginMPa),
    evaporationKgM2h: finite(state.evaporationKgM2h),
    expectedClosingMs: closing?.medianTimeMs ?? null,
    probabilityCracking: finite(state.outlook?.probabilityCrackingWithinHorizon ?? null),
  };
}

/** The outlook's crossing of the highest utilization threshold (1 by default), or null. */
export function closingCrossing(state: RunState, config: RunConfig) {
  const highest = Math.max(...config.thresholds.utilization);
  return state.outlook?.crossings.find((crossing) => crossing.threshold === highest) ?? null;
}

function dryingConditions(
  state: RunState,
  config: RunConfig,
  options: AlertOptions,
  relaxed: boolean,
): Condition[] {
  const rate = finite(state.evaporationKgM2h);
  if (rate === null) return [];
  const slack = relaxed ? options.evaporationHysteresisKgM2h : 0;
  const limit = config.thresholds.evaporationKgM2h;
  if (rate >= limit - slack) {
    return [
      {
        key: 'drying',
        kind: 'evaporation-rate',
        level: 'PREPARE',
        reason: `the evaporation rate is ${rate.toFixed(2)} kg/m2/h, at or above the ${limit.toFixed(1)} kg/m2/h precaution limit (ACI 305R)`,
      },
    ];
  }
  const bleed = config.mix.bleedRateKgM2h;
  if (state.phase === 'plastic' && bleed !== undefined && rate > bleed - slack) {
    const left = finite(state.bleedFilmRemainingH);
    const gone =
      left === null
        ? ''
        : left <= 0
          ? '; the bleed water on the surface is gone'
          : `; the bleed water on the surface lasts about ${formatDuration(left * 3_600_000)} more`;
    return [
      {
        key: 'drying',
        kind: 'bleed-exceeded',
        level: 'PREPARE',
        reason: `the surface loses ${rate.toFixed(2)} kg/m2/h, more than the mix bleeds (${bleed.toFixed(2)} kg/m2/h)${gone}`,
      },
    ];
  }
  return [];
}

function dataConditions(state: RunState, config: RunConfig, options: AlertOptions): Condition[] {
  const conditions: Condition[] = [];
  const offset = offsetMinOf(config.placedAt);
  if (options.dataNotes) {
    // one concern per device: a probe string that goes silent silences all its sensors at once
    const silent = new Map<string, { sensors: string[]; sinceMs: number }>();
    for (const flag of state.quality.flags) {
      if (!SILENT_FLAGS.includes(flag.code)) continue;
      const subject = flag.code === 'probe-silent' ? silentProbe(flag.message) : null;
      const device = subject?.split('/')[0] ?? config.weather.device;
      const entry = silent.get(device) ?? { sensors: [], sinceMs: flag.sinceMs };
      entry.sensors.push(subject?.split('/')[1] ?? flag.message.split(' ')[0] ?? flag.code);
      entry.sinceMs = Math.min(entry.sinceMs, flag.sinceMs);
      silent.set(device, entry);
    }
    for (const [device, { sensors, sinceMs }] of silent) {
      conditions.push({
        key: `sensor:${device}`,
        kind: 'sensor-silent',
        level: 'NOTE',
        reason: `no ${sensors.join(', ')} reading from ${device} since ${localClock(sinceMs, offset)}`,
      });
    }
    for (const flag of state.quality.flags) {
      if (DEGRADED_FLAGS.includes(flag.code)) {
        conditions.push({
          key: `data:${flag.code}`,
          kind: 'data-degraded',
          level: 'NOTE',
          reason: flag.message,
        });
      }
    }
  }
  if (state.timeToTargetStrengthH === 0) {
    const strength = finite(state.inPlaceCompressiveStrengthMPa);
    conditions.push({
      key: 'strength',
      kind: 'strength-reached',
      level: 'NOTE',
      reason:
        'the estimated in-place strength has reached the target' +
        (strength === null ? '' : ` (about ${strength.toFixed(1)} MPa)`),
    });
  }
  return conditions;
}

/** `probe-c7/rh-05` of the engine's flag message `probe probe-c7/rh-05 silent`, or null. */
function silentProbe(message: string): string | null {
  return /^probe (\S+) silent/.exec(message)?.[1] ?? null;
}

function finite(value: number | null | undefined): number | null {
  return value === null || value === undefined || !Number.isFinite(value) ? null : value;
}
