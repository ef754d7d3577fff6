/**
 * Early warning (physics.md 9): in level3-topping without curing measures the bleed film runs
 * out under the rising dry wind and the margin closes in the early afternoon (the simulators'
 * hidden truth, see twinReadings.ts). The outlook issued the run's lead time (run.json: 60 min)
 * before the truth's crossing of U = 1 must already give that crossing, within 30 minutes of
 * the truth's time. 16 members and 40 cells (defaults 32 and 60), a 3 h horizon and an outlook
 * every 10 min keep the test fast; the property concerns the timing, not the ensemble size.
 */
import { describe, expect, it } from 'vitest';
import { createRunEngine } from '../../server/src/live/index.ts';
import type { RunOutlook } from '../../server/src/live/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { playTwin } from './twinReadings.ts';

const folder = loadScenarioFolder('level3-topping');
const MINUTE_MS = 60_000;

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

  const engine = createRunEngine('ferngate-l3-warning', folder.runConfig, {
    memberCount: 16,
    cellCount: 40,
    horizonH: 3,
    outlookEveryAnalyses: 2,
  });
  engine.setMeasures(twin.measures);
  const outlooks: RunOutlook[] = [];
  const batches = new Map<number, typeof twin.readings>();
  for (const reading of twin.readings) {
    const key = Math.floor(reading.eventTimeMs / 600_000);
    batches.set(key, [...(batches.get(key) ?? []), reading]);
  }
  for (const key of [...batches.keys()].sort((a, b) => a - b)) {
    engine.addReadings(batches.get(key) ?? []);
    const outlook = engine.advance()?.outlook;
    if (outlook != null && outlooks.at(-1)?.timesMs[0] !== outlook.timesMs[0]) {
      outlooks.push(outlook);
    }
  }
  const predicted = (outlook: RunOutlook) =>
    outlook.crossings.find((crossing) => crossing.threshold === 1)?.medianTimeMs ?? null;
  const issued = outlooks
    .filter((outlook) => (outlook.timesMs[0] ?? Infinity) <= crossingMs - leadMs)
    .at(-1);
  const firstGood = outlooks.find((outlook) => {
    const time = predicted(outlook);
    return time !== null && Math.abs(time - crossingMs) <= 30 * MINUTE_MS;
  });
  console.info(
    `early warning: truth crosses U = 1 at ${new Date(crossingMs).toISOString()}; outlook of ${issued === undefined ? '-' : new Date(issued.timesMs[0] ?? 0).toISOString()} predicts ${issued === undefined || predicted(issued) === null ? 'no crossing' : new Date(predicted(issued) ?? 0).toISOString()} (probability ${issued?.probabilityCrackingWithinHorizon}); first outlook within 30 min: ${firstGood === undefined ? 'none' : `${((crossingMs - (firstGood.timesMs[0] ?? 0)) / MINUTE_MS).toFixed(0)} min ahead`}`,
  );

  it('the truth crosses U = 1 within the scenario', () => {
    expect(Number.isFinite(crossingMs)).toBe(true);
  });

  it('the outlook issued the lead time ahead predicts the crossing within 30 minutes', () => {
    expect(issued).toBeDefined();
    const time = issued === undefined ? null : predicted(issued);
    expect(time).not.toBeNull();
    expect(Math.abs((time ?? Number.NaN) - crossingMs)).toBeLessThanOrEqual(30 * MINUTE_MS);
  });
});
