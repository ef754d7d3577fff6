import { describe, expect, it } from 'vitest';
import { DEFAULT_ALERT_OPTIONS } from '../../server/src/alerts/alertOptions.ts';
import { noticeFigures, noticeRules } from '../../server/src/alerts/noticeRules.ts';
import type { NoticeLevel } from '../../server/src/alerts/types.ts';
import { CONFIG, MIN, T0, runState } from './_runStates.ts';
import type { StateFigures } from './_runStates.ts';

/** Highest level raised per key, e.g. `{ margin: 'ACT NOW' }`. */
function raised(figures: StateFigures, which: 'raise' | 'hold' = 'raise') {
  const findings = noticeRules(runState(figures), CONFIG, DEFAULT_ALERT_OPTIONS);
  const order: NoticeLevel[] = ['NOTE', 'PREPARE', 'ACT NOW', 'CRACKING LIKELY'];
  const top: Record<string, { level: NoticeLevel; kind: string }> = {};
  for (const condition of findings[which]) {
    const before = top[condition.key];
    if (before === undefined || order.indexOf(condition.level) > order.indexOf(before.level))
      top[condition.key] = condition;
  }
  return Object.fromEntries(
    Object.entries(top).map(([key, { level, kind }]) => [key, `${level} (${kind})`]),
  );
}

describe('noticeRules()', () => {
  it.each([
    { name: 'nothing when the outlook is quiet', figures: {}, expected: {} },
    {
      name: 'CRACKING LIKELY when utilization now reaches 1',
      figures: { utilization: 1.02 },
      expected: { margin: 'CRACKING LIKELY (utilization)' },
    },
    {
      name: 'CRACKING LIKELY when the margin is expected to close within 15 min',
      figures: { utilization: 0.3, probability: 0.9, closingInMin: 10 },
      expected: { margin: 'CRACKING LIKELY (margin-outlook)' },
    },
    {
      name: 'ACT NOW when the margin is expected to close within the lead time (90 min)',
      figures: { utilization: 0.3, probability: 0.8, closingInMin: 70 },
      expected: { margin: 'ACT NOW (margin-outlook)' },
    },
    {
      name: 'ACT NOW when utilization is past the first threshold (0.57)',
      figures: { utilization: 0.6 },
      expected: { margin: 'ACT NOW (utilization)' },
    },
    {
      name: 'PREPARE when the closing is expected beyond the lead time',
      figures: { utilization: 0.3, probability: 0.8, closingInMin: 150 },
      expected: { margin: 'PREPARE (margin-outlook)' },
    },
    {
      name: 'PREPARE, not ACT NOW, when fewer than half the members cross (no median time)',
      figures: { utilization: 0.3, probability: 0.3, closingInMin: null },
      expected: { margin: 'PREPARE (margin-outlook)' },
    },
    {
      name: 'nothing when the probability of closing is below 0.2',
      figures: { utilization: 0.3, probability: 0.1 },
      expected: {},
    },
    {
      name: 'PREPARE when evaporation reaches the ACI 305R limit (1.0 kg/m2/h)',
      figures: { evaporationKgM2h: 1.1 },
      expected: { drying: 'PREPARE (evaporation-rate)' },
    },
    {
      name: 'PREPARE when, before set, evaporation exceeds the bleed rate (0.3 kg/m2/h)',
      figures: {
        phase: 'plastic',
        utilization: 0,
        evaporationKgM2h: 0.5,
        bleedFilmRemainingH: 0.5,
      },
      expected: { drying: 'PREPARE (bleed-exceeded)' },
    },
    {
      name: 'no bleed rule after final set',
      figures: { evaporationKgM2h: 0.5 },
      expected: {},
    },
    {
      name: 'NOTE for a silent probe',
      figures: { flags: [{ code: 'probe-silent', message: 'probe probe-a/rh-10 silent' }] },
      expected: { 'sensor:probe-a': 'NOTE (sensor-silent)' },
    },
    {
      name: 'no NOTE for weather held a few minutes',
      figures: {
        flags: [{ code: 'weather-held', message: 'windSpeed held from a reading 6 min old' }],
      },
      expected: {},
    },
    {
      name: 'NOTE when the strength target is reached',
      figures: { timeToTargetStrengthH: 0 },
      expected: { strength: 'NOTE (strength-reached)' },
    },
  ])('$name', ({ figures, expected }) => {
    expect(raised(figures as StateFigures)).toEqual(expected);
  });

  it.each([
    {
      name: 'utilization 0.55 still holds ACT NOW (0.57 - 0.05)',
      figures: { utilization: 0.55 },
      level: 'ACT NOW (utilization)',
    },
    {
      name: 'utilization 0.97 still holds CRACKING LIKELY (1 - 0.05)',
      figures: { utilization: 0.97 },
      level: 'CRACKING LIKELY (utilization)',
    },
    {
      name: 'a closing 110 min ahead still holds ACT NOW (90 + 30 min)',
      figures: { probability: 0.8, closingInMin: 110 },
      level: 'ACT NOW (margin-outlook)',
    },
    {
      name: 'a probability of 0.15 still holds PREPARE (0.2 - 0.1)',
      figures: { probability: 0.15 },
      level: 'PREPARE (margin-outlook)',
    },
  ])('relaxed by the hysteresis: $name, which does not raise it', ({ figures, level }) => {
    expect(raised(figures, 'hold').margin).toBe(level);
    expect(raised(figures, 'raise').margin).not.toBe(level);
  });

  it('raises nothing before placement or without an event time', () => {
    const before = noticeRules(
      runState({ phase: 'before-placement', utilization: 2 }),
      CONFIG,
      DEFAULT_ALERT_OPTIONS,
    );
    expect(before.raise).toEqual([]);
    const none = noticeRules(
      { ...runState({ utilization: 2 }), eventTimeMs: null },
      CONFIG,
      DEFAULT_ALERT_OPTIONS,
    );
    expect(none.raise).toEqual([]);
  });

  it("writes the expected closing in the site's local time (placedAt at +02:00)", () => {
    const findings = noticeRules(
      runState({ probability: 0.9, closingInMin: 70 }),
      CONFIG,
      DEFAULT_ALERT_OPTIONS,
    );
    // T0 is 12:20 on site; 70 min later is 13:30
    expect(findings.raise[0]?.reason).toContain('at about 13:30, in about 1 h 10 min');
  });

  it('gathers the silent sensors of one device into one condition, with the time since when', () => {
    const flags = ['rh-10', 't-10'].map((sensor) => ({
      code: 'probe-silent',
      message: `probe probe-a/${sensor} silent`,
    }));
    const findings = noticeRules(runState({ flags }), CONFIG, DEFAULT_ALERT_OPTIONS);
    expect(findings.raise).toEqual([
      {
        key: 'sensor:probe-a',
        kind: 'sensor-silent',
        level: 'NOTE',
        reason: 'no rh-10, t-10 reading from probe-a since 12:20',
      },
    ]);
  });

  it('noticeFigures() quotes the median closing, the probability and the figures now', () => {
    expect(
      noticeFigures(runState({ utilization: 0.4, probability: 0.8, closingInMin: 30 }), CONFIG),
    ).toEqual({
      utilization: 0.4,
      marginMPa: 0.3,
      evaporationKgM2h: 0.2,
      expectedClosingMs: T0 + 30 * MIN,
      probabilityCracking: 0.8,
    });
  });
});
