import { describe, expect, it } from 'vitest';
import { parseSenml } from '../../server/src/ingest/parseSenml.ts';
import { sensorNameOf } from '../../server/src/ingest/matchReadings.ts';
import { quantise, senmlPack } from '../../simulators/src/senmlPack.ts';

const AT_MS = Date.parse('2026-07-16T11:15:00.250+02:00');

describe('senmlPack()', () => {
  it('builds a pack the ingest parser resolves to names, times, units and ut (RFC 8428)', () => {
    const pack = senmlPack(
      'probe-c5',
      AT_MS,
      [
        { sensor: 'rh-05', unit: '%RH', value: 97.3 },
        { sensor: 't-05', unit: 'Cel', value: 28.4, offsetS: 0.5 },
      ],
      60,
    );
    expect(pack[0]).toMatchObject({
      bn: 'probe-c5/',
      bt: AT_MS / 1000,
      n: 'rh-05',
      u: '%RH',
      v: 97.3,
      ut: 60,
    });
    const parsed = parseSenml(JSON.parse(JSON.stringify(pack)), Date.now());
    if (!parsed.ok) throw new Error(parsed.detail);
    expect(parsed.readings).toEqual([
      { name: 'probe-c5/rh-05', eventAtMs: AT_MS, value: 97.3, unit: '%RH', updateIntervalS: 60 },
      {
        name: 'probe-c5/t-05',
        eventAtMs: AT_MS + 500,
        value: 28.4,
        unit: 'Cel',
        updateIntervalS: 60,
      },
    ]);
    expect(parsed.readings.map((reading) => sensorNameOf(reading.name, 'probe-c5'))).toEqual([
      'rh-05',
      't-05',
    ]);
  });

  it('gives an empty list for no measurements', () => {
    expect(senmlPack('probe-c5', AT_MS, [], 60)).toEqual([]);
  });
});

describe('quantise()', () => {
  it.each([
    { value: 97.34, quantum: 0.1, expected: 97.3 },
    { value: 97.35000001, quantum: 0.1, expected: 97.4 },
    { value: 0.30000000000000004, quantum: 0.1, expected: 0.3 },
    { value: 1013.4, quantum: 1, expected: 1013 },
    { value: 0.37, quantum: 0.2, expected: 0.4 },
    { value: 12.345, quantum: 0, expected: 12.345 },
  ])('quantise($value, $quantum) is $expected', ({ value, quantum, expected }) => {
    expect(quantise(value, quantum)).toBe(expected);
  });
});
