import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { classifyMessage } from '../../server/src/ingest/classifyMessage.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';

const RECEIVED_MS = EXAMPLE_PLACED_AT_MS + 2 * 3_600_000;
const T_S = RECEIVED_MS / 1000 - 10;
let archive: Archive;
const lookup = (site: string, device: string) => archive.bindingsFor(site, device);
const classify = (topic: string, payload: unknown) =>
  classifyMessage(
    topic,
    Buffer.from(typeof payload === 'string' ? payload : JSON.stringify(payload)),
    RECEIVED_MS,
    lookup,
  );

beforeEach(() => {
  archive = Archive.open(':memory:');
  archive.createRun(parseRunConfig(exampleRunInput()), 0, 'run-1');
});
afterEach(() => archive.close());

const PROBE = 'meniscus/harbour-deck/probe-a/data';
const MAST = 'meniscus/harbour-deck/mast-1/data';

describe('classifyMessage()', () => {
  it('accepts a probe pack and converts degF to Cel and km/h to m/s', () => {
    const [item] = classify(PROBE, [
      { bn: 'probe-a/', bt: T_S, n: 'rh-10', u: '%RH', v: 97.2 },
      { n: 't-10', u: 'degF', v: 77 },
    ]);
    expect(item).toMatchObject({ kind: 'accepted', runId: 'run-1' });
    if (item?.kind !== 'accepted') throw new Error('expected accepted');
    expect(item.readings.map((r) => [r.value, r.unit])).toEqual([
      [97.2, '%RH'],
      [25, 'Cel'],
    ]);
    const [wind] = classify(MAST, [{ n: 'wind', u: 'km/h', v: 18, t: T_S }]);
    expect(wind?.kind === 'accepted' && wind.readings[0]).toMatchObject({ value: 5, unit: 'm/s' });
  });

  it('sends one item per open run that listens to the device (a shared weather station)', () => {
    archive.createRun(parseRunConfig(exampleRunInput({ probes: [] })), 0, 'run-2');
    const items = classify(MAST, [{ n: 'air-t', u: 'Cel', v: 24, t: T_S }]);
    expect(items.map((item) => [item.kind, item.runId]).sort()).toEqual([
      ['accepted', 'run-1'],
      ['accepted', 'run-2'],
    ]);
  });

  const rejected: {
    name: string;
    topic: string;
    payload: unknown;
    reason: string;
    runId: string | null;
    detail: RegExp;
  }[] = [
    {
      name: 'a topic outside the scheme',
      topic: 'meniscus/harbour-deck/probe-a',
      payload: [],
      reason: 'bad-topic',
      runId: null,
      detail: /topic must be/,
    },
    {
      name: 'a wildcard-like level',
      topic: 'meniscus/harbour deck/probe-a/data',
      payload: [],
      reason: 'bad-topic',
      runId: null,
      detail: /topic/,
    },
    {
      name: 'a device in no run',
      topic: 'meniscus/harbour-deck/probe-z/data',
      payload: [{ n: 'rh-10', v: 90 }],
      reason: 'unknown-device',
      runId: null,
      detail: /probe-z/,
    },
    {
      name: 'a site in no run',
      topic: 'meniscus/other-site/probe-a/data',
      payload: [{ n: 'rh-10', v: 90 }],
      reason: 'unknown-device',
      runId: null,
      detail: /other-site/,
    },
    {
      name: 'a sensor not configured',
      topic: PROBE,
      payload: [{ n: 'rh-99', v: 90, t: T_S }],
      reason: 'unknown-sensor',
      runId: 'run-1',
      detail: /"rh-99"/,
    },
    {
      name: 'a temperature in %RH',
      topic: PROBE,
      payload: [{ n: 't-10', u: '%RH', v: 20, t: T_S }],
      reason: 'unit-mismatch',
      runId: 'run-1',
      detail: /t-10 measures temperature and must be in Cel, K, degF: got "%RH"/,
    },
    {
      name: 'RH above 103 %',
      topic: PROBE,
      payload: [{ n: 'rh-10', u: '%RH', v: 103.5, t: T_S }],
      reason: 'impossible-value',
      runId: 'run-1',
      detail: /must be between 0 and 103 %RH: got 103.5/,
    },
    {
      name: 'a negative RH',
      topic: PROBE,
      payload: [{ n: 'rh-10', v: -1, t: T_S }],
      reason: 'impossible-value',
      runId: 'run-1',
      detail: /got -1/,
    },
    {
      name: 'a concrete at 95 Cel',
      topic: PROBE,
      payload: [{ n: 't-10', u: 'Cel', v: 95, t: T_S }],
      reason: 'impossible-value',
      runId: 'run-1',
      detail: /between -40 and 90 Cel: got 95/,
    },
    {
      name: 'air at -41 Cel',
      topic: MAST,
      payload: [{ n: 'air-t', v: -41, t: T_S }],
      reason: 'impossible-value',
      runId: 'run-1',
      detail: /got -41/,
    },
    {
      name: 'a time one day ahead',
      topic: PROBE,
      payload: [{ n: 'rh-10', v: 90, t: T_S + 86_400 }],
      reason: 'time-in-future',
      runId: 'run-1',
      detail: /at most 300 s after receipt/,
    },
    {
      name: 'a time a day before placement',
      topic: PROBE,
      payload: [{ n: 'rh-10', v: 90, t: EXAMPLE_PLACED_AT_MS / 1000 - 86_400 }],
      reason: 'time-before-run',
      runId: 'run-1',
      detail: /before placement/,
    },
    {
      name: 'one bad record in a good pack',
      topic: PROBE,
      payload: [
        { n: 'rh-10', v: 90, t: T_S },
        { n: 'rh-40', v: 300, t: T_S },
      ],
      reason: 'impossible-value',
      runId: 'run-1',
      detail: /rh-40/,
    },
    {
      name: 'malformed JSON from a known device',
      topic: PROBE,
      payload: '[{',
      reason: 'malformed-json',
      runId: 'run-1',
      detail: /JSON/,
    },
  ];
  it.each(rejected)('quarantines $name as $reason', ({ topic, payload, reason, runId, detail }) => {
    const items = classify(topic, payload);
    expect(items).toHaveLength(1);
    expect(items[0]).toMatchObject({ kind: 'quarantine', reason, runId, topic });
    expect(items[0]?.kind === 'quarantine' && items[0].detail).toMatch(detail);
  });

  it('keeps readings up to 5 min ahead and up to 1 h before placement (the documented tolerances)', () => {
    const ahead = classify(PROBE, [{ n: 'rh-10', v: 90, t: RECEIVED_MS / 1000 + 299 }]);
    expect(ahead[0]?.kind).toBe('accepted');
    const early = classify(PROBE, [{ n: 'rh-10', v: 90, t: EXAMPLE_PLACED_AT_MS / 1000 - 3599 }]);
    expect(early[0]?.kind).toBe('accepted');
  });
});
