/**
 * Early warning (physics.md 9): in level3-topping without curing measures the bleed film runs
 * out under the rising dry wind and the margin closes in the early afternoon (the simulators'
 * hidden truth, see twinReadings.ts). The outlook issued the run's lead time (run.json: 60 min)
 * before the truth's crossing of U = 1 must already give that crossing, within 30 minutes of
 * the truth's time. Four run ids (four seeds of the ensemble) at the default 32 members and 60
 * cells; a 3 h horizon and an outlook every 10 min keep the test fast.
 */
import { describe, expect, it } from 'vitest';
import { createRunEngine } from '../../server/src/live/index.ts';
import type { RunOutlook } from '../../server/src/live/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { playTwin, readingBatches } from './twinReadings.ts';

const folder = loadScenarioFolder('level3-topping');
const MINUTE_MS = 60_000;

interface WarningResult {
  runId: string;
  issuedAheadMin: number;
  errorMin: number | null;
  probability: number;
}

describe('live engine early warning (level3-topping, no action)', () => {
  const twin = playTwin(folder.scenario, { logName: 'no-action', durationH: 4.5 });
  // Truth crossing of U = 1: first sample at or above, linear from the previous sample.
  const index = twin.truth.findIndex((sample) => sample.utilization >= 1);
  const after = twin.truth[index];
  const before = twin.truth[index - 1];
  const crossingMs =
    after === undefined || before === undefined
      ? Number.NaN
      : before.timeMs +
        ((1 - before.utilization) / (after.utilization - before.utilization)) *
          (after.timeMs - before.timeMs);
  const leadMs = folder.runConfig.leadTimeMin * MINUTE_MS;
  const batches = readingBatches(twin.readings, 600);

  const warn = (runId: string): WarningResult => {
    const engine = createRunEngine(runId, folder.runConfig, {
      horizonH: 3,
      outlookEveryAnalyses: 2,
    });
    engine.setMeasures(twin.measures);
    const outlooks: RunOutlook[] = [];
    for (const batch of batches) {
      engine.addReadings(batch);
      const outlook = engine.advance()?.outlook;
      if (outlook != null && outlooks.at(-1)?.timesMs[0] !== outlook.timesMs[0]) {
        outlooks.push(outlook);
      }
    }
    const issued = outlooks
      .filter((outlook) => (outlook.timesMs[0] ?? Infinity) <= crossingMs - leadMs)
      .at(-1);
    const predictedMs =
      issued?.crossings.find((crossing) => crossing.threshold === 1)?.medianTimeMs ?? null;
    const result = {
      runId,
      issuedAheadMin:
        issued === undefined ? Number.NaN : (crossingMs - (issued.timesMs[0] ?? 0)) / MINUTE_MS,
      errorMin: predictedMs === null ? null : (predictedMs - crossingMs) / MINUTE_MS,
      probability: issued?.probabilityCrackingWithinHorizon ?? Number.NaN,
    };
    console.info(
      `early warning ${runId}: truth crosses U = 1 at ${new Date(crossingMs).toISOString()}; the outlook issued ${result.issuedAheadMin.toFixed(0)} min ahead predicts it ${result.errorMin === null ? 'not at all' : `${result.errorMin.toFixed(1)} min late`} (probability within the horizon ${result.probability})`,
    );
    return result;
  };
  const results = [1, 2, 3, 4].map((i) => warn(`ferngate-l3-warning-${i}`));

  it('the truth crosses U = 1 within the scenario', () => {
    expect(Number.isFinite(crossingMs)).toBe(true);
  });

  it.each(results)(
    '$runId: the outlook issued the lead time ahead predicts the crossing within 30 minutes',
    (result) => {
      expect(result.issuedAheadMin).toBeGreaterThanOrEqual(folder.runConfig.leadTimeMin);
      expect(result.errorMin).not.toBeNull();
      expect(Math.abs(result.errorMin ?? Number.NaN)).toBeLessThanOrEqual(30);
    },
  );
});
