/**
 * Malformed and hostile payloads for the fuzz tests, built by fast-check, interleaved with valid
 * ones; each knows what ingest must do with it ('stored' or the quarantine reason). The run is
 * the example run placed at PLACED_MS, received at NOW_MS.
 */
import fc from 'fast-check';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { exampleRunInput } from './exampleRun.ts';

export const NOW_MS = Date.parse('2026-06-14T15:00:00Z');
export const PLACED_MS = Date.parse('2026-06-14T09:20:00Z');
const NOW_S = NOW_MS / 1000;
export const PROBE = 'meniscus/harbour-deck/probe-a/data';
const SENSORS = [
  { name: 'rh-10', min: 0, max: 103, unit: '%RH' },
  { name: 't-10', min: -40, max: 90, unit: 'Cel' },
  { name: 'rh-40', min: 0, max: 103, unit: '%RH' },
] as const;

export interface Case {
  topic: string;
  bytes: Buffer;
  /** 'stored' or the quarantine reason. */
  expected: string;
}

type Builder = (index: number, validSoFar: readonly Case[]) => Case;
const json = (value: unknown) => Buffer.from(JSON.stringify(value));
/** A valid reading with a time unique to `index` (1 ms apart, within the run and the past). */
const validRecord = (index: number, sensor: number, fraction: number) => {
  const spec = SENSORS[sensor % SENSORS.length] ?? SENSORS[0];
  return {
    n: spec.name,
    u: spec.unit,
    v: spec.min + fraction * (spec.max - spec.min),
    t: (PLACED_MS + 1000 + index) / 1000,
  };
};

const sensorIndex = fc.nat(SENSORS.length - 1);
const fraction = fc.double({ min: 0, max: 1, noNaN: true });
const anyJson = fc.jsonValue();

const builders: fc.Arbitrary<Builder>[] = [
  // valid SenML, with or without a base name naming the device
  fc.tuple(sensorIndex, fraction, fc.boolean()).map(([sensor, f, withBase]): Builder => (index) => {
    const record = validRecord(index, sensor, f);
    const pack = withBase ? [{ bn: 'probe-a/', ...record }] : [record];
    return { topic: PROBE, bytes: json(pack), expected: 'stored' };
  }),
  // valid simple form
  fc.tuple(sensorIndex, fraction).map(([sensor, f]): Builder => (index) => {
    const record = validRecord(index, sensor, f);
    return {
      topic: PROBE,
      bytes: json({
        time: record.t,
        readings: { [record.n]: { value: record.v, unit: record.u } },
      }),
      expected: 'stored',
    };
  }),
  // truncated JSON
  fc
    .tuple(sensorIndex, fraction, fc.double({ min: 0, max: 0.999, noNaN: true }))
    .map(([sensor, f, cut]): Builder => (index) => {
      const text = JSON.stringify([validRecord(index, sensor, f)]);
      return {
        topic: PROBE,
        bytes: Buffer.from(text.slice(0, Math.floor(cut * text.length))),
        expected: 'malformed-json',
      };
    }),
  // invalid UTF-8 inside otherwise valid JSON
  fc.constantFrom(0xff, 0xfe, 0xc0).map((bad): Builder => (index) => {
    const text = Buffer.from(JSON.stringify([{ ...validRecord(index, 0, 0.5), n: 'rh-10' }]));
    return {
      topic: PROBE,
      bytes: Buffer.concat([text.subarray(0, 3), Buffer.from([bad]), text.subarray(3)]),
      expected: 'malformed-json',
    };
  }),
  // NaN and infinities, as bare tokens or beyond double range
  fc
    .constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '-2e400')
    .map((token): Builder => (index) => ({
      topic: PROBE,
      bytes: Buffer.from(`[{"n":"rh-10","v":${token},"t":${(PLACED_MS + 1000 + index) / 1000}}]`),
      expected: 'not-finite',
    })),
  // wrong types: any JSON value that is not a number where the value goes
  anyJson
    .filter((value) => typeof value !== 'number')
    .map((value): Builder => (index) => ({
      topic: PROBE,
      bytes: json([{ n: 'rh-10', v: value, t: (PLACED_MS + 1000 + index) / 1000 }]),
      expected: 'wrong-type',
    })),
  // wrong types: a top level that is neither a pack nor an object of the simple form
  fc
    .oneof(
      fc.string(),
      fc.integer(),
      fc.boolean(),
      fc.constant(null),
      fc.array(fc.oneof(fc.integer(), fc.string()), { minLength: 1 }),
    )
    .map((value): Builder => () => ({ topic: PROBE, bytes: json(value), expected: 'wrong-type' })),
  // must-understand fields
  fc.stringMatching(/^[a-z]{1,8}_$/).map((key): Builder => (index) => ({
    topic: PROBE,
    bytes: json([{ ...validRecord(index, 0, 0.5), [key]: 1 }]),
    expected: 'unsupported-field',
  })),
  // unknown devices and sensors
  fc
    .stringMatching(/^[a-z][a-z0-9-]{0,20}$/)
    .filter((d) => !['probe-a', 'probe-b', 'mast-1'].includes(d))
    .map((device): Builder => (index) => ({
      topic: `meniscus/harbour-deck/${device}/data`,
      bytes: json([validRecord(index, 0, 0.5)]),
      expected: 'unknown-device',
    })),
  fc
    .stringMatching(/^[a-z][a-z0-9-]{0,20}$/)
    .filter((s) => !SENSORS.some((x) => x.name === s))
    .map((sensor): Builder => (index) => ({
      topic: PROBE,
      bytes: json([{ ...validRecord(index, 0, 0.5), n: sensor }]),
      expected: 'unknown-sensor',
    })),
  // units that do not measure the quantity
  fc.constantFrom('m/s', 'W/m2', 'V', 'A', 'lx', 'km/h', '%').map((unit): Builder => (index) => ({
    topic: PROBE,
    bytes: json([{ ...validRecord(index, 0, 0.5), u: unit }]),
    expected: 'unit-mismatch',
  })),
  // impossible values
  fc
    .oneof(
      fc.double({ min: 103.0001, max: 1e12, noNaN: true }),
      fc.double({ min: -1e12, max: -0.0001, noNaN: true }),
    )
    .map((value): Builder => (index) => ({
      topic: PROBE,
      bytes: json([{ ...validRecord(index, 0, 0.5), v: value }]),
      expected: 'impossible-value',
    })),
  fc
    .oneof(
      fc.double({ min: 90.001, max: 5000, noNaN: true }),
      fc.double({ min: -500, max: -40.001, noNaN: true }),
    )
    .map((value): Builder => (index) => ({
      topic: PROBE,
      bytes: json([{ ...validRecord(index, 1, 0.5), v: value }]),
      expected: 'impossible-value',
    })),
  // times far ahead, or long before placement (still above 2^28 s, so absolute)
  fc.double({ min: 301, max: 1e9, noNaN: true }).map((ahead): Builder => () => ({
    topic: PROBE,
    bytes: json([{ ...validRecord(0, 0, 0.5), t: NOW_S + ahead }]),
    expected: 'time-in-future',
  })),
  fc
    .double({ min: 2 ** 28, max: PLACED_MS / 1000 - 3601, noNaN: true })
    .map((t): Builder => () => ({
      topic: PROBE,
      bytes: json([{ ...validRecord(0, 0, 0.5), t }]),
      expected: 'time-before-run',
    })),
  // topics outside the scheme
  fc
    .string({ maxLength: 40 })
    .filter((t) => !/^meniscus\/[^/]+\/[^/]+\/data$/.test(t))
    .map((topic): Builder => () => ({
      topic,
      bytes: json([]),
      expected: 'bad-topic',
    })),
  // a valid payload sent again: a duplicate
  fc.nat().map((pick): Builder => (index, valid) => {
    const earlier = valid[pick % Math.max(1, valid.length)];
    if (earlier === undefined)
      return { topic: PROBE, bytes: json([validRecord(index, 0, 0.5)]), expected: 'stored' };
    return { topic: earlier.topic, bytes: earlier.bytes, expected: 'duplicate' };
  }),
];

/**
 * `count` cases from a fixed seed, plus two oversize payloads (more would only slow the tests).
 *
 * @param count - cases drawn from the generators
 * @param seed - fast-check seed, for a reproducible plan
 */
export function hostileCases(count: number, seed: number): Case[] {
  const plan = fc.sample(fc.oneof(...builders), { numRuns: count, seed });
  const cases: Case[] = [];
  const valid: Case[] = [];
  plan.forEach((build, index) => {
    const next = build(index, valid);
    cases.push(next);
    if (next.expected === 'stored') valid.push(next);
  });
  cases.splice(Math.min(100, cases.length), 0, {
    topic: PROBE,
    bytes: Buffer.alloc(64 * 1024 + 1, 0x20),
    expected: 'oversize',
  });
  cases.splice(Math.floor(cases.length / 2), 0, {
    topic: PROBE,
    bytes: Buffer.alloc(1 << 20, 0x5b),
    expected: 'oversize',
  });
  return cases;
}

/** The run the cases are built for, and the ingest that receives them. */
export interface FuzzTarget {
  /** In-memory archive holding the example run as 'run-1', placed at PLACED_MS. */
  archive: Archive;
  /** Real ingest into that archive, its clock fixed at NOW_MS. */
  ingestor: Ingestor;
}

/** Opens the in-memory archive with the example run placed at PLACED_MS and an ingestor at NOW_MS. */
export function openFuzzTarget(): FuzzTarget {
  const archive = Archive.open(':memory:');
  archive.createRun(
    parseRunConfig(exampleRunInput({ placedAt: new Date(PLACED_MS).toISOString() })),
    PLACED_MS,
    'run-1',
  );
  return { archive, ingestor: new Ingestor(archive, { clock: () => NOW_MS }) };
}
