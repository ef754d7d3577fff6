/**
 * The simulators' own command against the real ingest (embedded broker, archive on disk), at
 * 120x on the real clock for three minutes of event time, with the hostile set sent first.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hostilePayloads } from '../../simulators/src/hostilePayloads.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { parsePasswords, simulateMain } from '../../simulators/src/simulateCommand.ts';
import { startScenarioRig } from './_scenarioRig.ts';
import type { ScenarioRig } from './_scenarioRig.ts';

const { runConfigInput } = loadScenarioFolder('level3-topping');

describe('simulateMain()', () => {
  let rig: ScenarioRig;
  beforeAll(async () => {
    rig = await startScenarioRig(runConfigInput);
  });
  afterAll(async () => {
    await rig.dispose();
  });

  it('plays at 120x on the real clock and the hostile set lands in quarantine by reason', async () => {
    const wallStart = performance.now();
    const code = await simulateMain([
      '--url',
      rig.url,
      '--speed',
      '120',
      '--duration-h',
      '0.05',
      '--hostile',
      '--stand-in-truth',
    ]);
    const wallS = (performance.now() - wallStart) / 1000;
    expect(code).toBe(0);
    // 3 min of event time at 120x is 1.5 s of wall time (plus connecting)
    expect(wallS).toBeGreaterThan(1.4);
    expect(wallS).toBeLessThan(10);
    expect(rig.archive.readings(rig.runId).length).toBeGreaterThan(0);
    const expected: Record<string, number> = {};
    for (const hostile of hostilePayloads('t-05'))
      expected[hostile.reason] = (expected[hostile.reason] ?? 0) + 1;
    // hostile payloads are stamped at the scenario's start; `time-in-future` is stamped a day ahead
    expect(rig.archive.quarantineCounts(rig.runId)).toEqual(expected);
  });

  it.each([
    [['--speed', '121'], 2],
    [['--duration-h', '0'], 2],
    [['--scenario', 'no-such-scenario'], 2],
  ])('%j exits %d', async (argv, code) => {
    expect(await simulateMain(argv)).toBe(code);
  });
});

describe('parsePasswords()', () => {
  it('reads device:password lines, skipping blanks and comments', () => {
    expect(parsePasswords('# site box\nprobe-c5:s3cret:with:colons\n\nmast-l3:pw\n')).toEqual(
      new Map([
        ['probe-c5', 's3cret:with:colons'],
        ['mast-l3', 'pw'],
      ]),
    );
  });
  it('names a line that is not device:password', () => {
    expect(() => parsePasswords('probe-c5\n')).toThrow(
      'passwords line 1 must be device:password: got "probe-c5"',
    );
  });
});
