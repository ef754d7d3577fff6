/**
 * Time acceleration: event time runs `speed` times as fast as the wall clock. Checked on the
 * real player with a recording fake clock and a real broker (no readings are judged here).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkSpeed } from '../../simulators/src/playClock.ts';
import type { PlayClock } from '../../simulators/src/playClock.ts';
import { playScenario, probeDepthsMm } from '../../simulators/src/playScenario.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { createStandInTruth } from '../../simulators/src/standInTruth.ts';
import { startScenarioRig } from './_scenarioRig.ts';
import type { ScenarioRig } from './_scenarioRig.ts';

const { scenario, runConfig, runConfigInput } = loadScenarioFolder('level3-topping');

describe('checkSpeed()', () => {
  it.each([1, 60, 120])('accepts %d', (speed) => expect(checkSpeed(speed)).toBe(speed));
  it.each([0, 0.5, 121, Number.NaN])('refuses %d naming the range', (speed) => {
    expect(() => checkSpeed(speed)).toThrow(
      `speed must be between 1 and 120 (times real time): got ${speed}`,
    );
  });
});

describe('playScenario() pacing', () => {
  let rig: ScenarioRig;
  beforeAll(async () => {
    rig = await startScenarioRig(runConfigInput);
  });
  afterAll(async () => {
    await rig.dispose();
  });

  it.each([60, 120])(
    'at %dx a pack due t event-seconds after the start goes out at t / speed wall seconds',
    async (speed) => {
      let nowMs = 0;
      const clock: PlayClock = {
        now: () => nowMs,
        sleep: async (ms) => {
          nowMs += Math.max(0, ms);
        },
      };
      const sentAt: { eventMs: number; wallMs: number }[] = [];
      await playScenario({
        scenario,
        site: runConfig.site,
        url: rig.url,
        speed,
        clock,
        durationH: 0.5,
        truth: createStandInTruth(scenario.truth, probeDepthsMm(scenario)),
        onProgress: (eventMs) => {
          sentAt.push({ eventMs, wallMs: nowMs });
        },
      });
      const startMs = Date.parse(scenario.startAt);
      expect(sentAt).toHaveLength(31);
      for (const { eventMs, wallMs } of sentAt)
        expect(wallMs).toBeCloseTo((eventMs - startMs) / speed, 6);
    },
  );
});
