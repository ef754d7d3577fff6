/**
 * The demo's fogging case on the live engine without the server (foggingReplay.ts): level3-topping
 * with the crew's fogging from 12:50 and windbreak from 13:00, each measure handed to the engine
 * when it starts, the states put through the crew-notice rules. The hidden truth keeps its margin
 * open, yet the engine's outlook still closes it about 14:15 to 14:45, just before the element
 * sets, and the margin's ACT NOW and CRACKING LIKELY come back after the measures.
 *
 * Cause (measured with foggingMembers.ts and foggingNotices.ts): the bleed film. The outlook does
 * carry the measures (fogging to 18:00 and the windbreak at every output time before 18:00); most
 * of its members cross U = 1 in the plastic phase (surface suction reaching air entry, 20 to 30
 * kPa) 10 to 30 min before their own set, not on stress against the skin's strength after set
 * (run 1 at 13:45: 26 of the 28 members that cross). At 13:45 the members' median film is below
 * 0.01 kg/m2, where the truth, which started from 0.7 kg/m2, keeps a film until about 15:15.
 * Under the fog the surface still loses 0.1 to 0.2 kg/m2/h (it is 1 to 2 degC warmer than the
 * air), which takes a surface without film to air entry in about 40 min. The members' initial
 * film comes from the prior (median 0.2 kg/m2, calibration/parameterPrior.ts) and nothing
 * corrects it: under a film, and up to hundreds of kPa of suction, the probes read about 100 %RH
 * (the truth's 5 mm humidity is still 99.7 %RH at 400 kPa without measures). Without
 * assimilation (`assimilation: false`) the runs raise the same warnings.
 */
import { describe, expect, it } from 'vitest';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { replayFogging, warningsFrom } from './foggingReplay.ts';
import type { MarginNotice } from './foggingReplay.ts';
import { playTwin } from './twinReadings.ts';

const folder = loadScenarioFolder('level3-topping');
/** 4 h from 11:00: through the element's set (about 14:35 in the truth, 14:45 in the members). */
const DURATION_H = 4;
/** The measures counted: 15 min after the windbreak (as the demo test, our assumption). */
const SETTLED_MS = Date.parse('2026-07-16T13:15:00+02:00');
const RUN_IDS = ['ferngate-l3-fog-1', 'ferngate-l3-fog-2'];
const peakUtilization = (samples: readonly { utilization: number }[]) =>
  Math.max(...samples.map((sample) => sample.utilization));
const summary = (notices: readonly MarginNotice[]) =>
  notices
    .map(
      (n) => `${new Date(n.raisedAtMs).toISOString()} ${n.level} (${n.kind}, U ${n.utilization})`,
    )
    .join('\n');

describe("live engine with the crew's fogging and windbreak (level3-topping)", () => {
  const twin = playTwin(folder.scenario, { logName: 'fogging', durationH: DURATION_H });

  it("the truth's margin stays open only because of its bleed film: with the prior's median film (0.2 kg/m2) it closes under the same measures", () => {
    // Our scenario's truth (simulators/): 0.7 kg/m2 at placement lasts under the fog until after
    // set; 0.2 kg/m2 is gone before 12:30 and the surface suction passes air entry.
    expect(folder.scenario.truth.initialBleedFilmKgM2).toBe(0.7);
    expect(peakUtilization(twin.truth)).toBeLessThan(1);
    const thin = playTwin(folder.scenario, {
      logName: 'fogging',
      durationH: DURATION_H,
      truthOverrides: { initialBleedFilmKgM2: 0.2 },
    });
    expect(peakUtilization(thin.truth)).toBeGreaterThan(1);
  });

  it.each(RUN_IDS)(
    "%s: with the truth's initial bleed film in every member, no ACT NOW or CRACKING LIKELY about the margin once the measures are counted",
    (runId) => {
      const { marginNotices } = replayFogging(twin, folder.runConfig, runId, {
        memberInitialFilmKgM2: folder.scenario.truth.initialBleedFilmKgM2,
      });
      expect(warningsFrom(marginNotices, SETTLED_MS), summary(marginNotices)).toEqual([]);
    },
    60_000,
  );

  // Not met yet: from the prior's films (median 0.2 kg/m2, which the probes cannot correct) most
  // members have run dry by 13:45 and the outlook closes the margin before set; see the file
  // comment. Turns red the day the engine stops raising them (e.g. the crew's observation of
  // bleed water on the surface taken as evidence of the film).
  it.fails.each(RUN_IDS)(
    '%s: from the prior, no ACT NOW or CRACKING LIKELY about the margin once the measures are counted',
    (runId) => {
      const { marginNotices } = replayFogging(twin, folder.runConfig, runId);
      expect(warningsFrom(marginNotices, SETTLED_MS), summary(marginNotices)).toEqual([]);
    },
    60_000,
  );
});
