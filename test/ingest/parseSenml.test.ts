import { describe, expect, it } from 'vitest';
import { SENML_RELATIVE_TIME_LIMIT_S, parseSenml } from '../../server/src/ingest/parseSenml.ts';

const NOW_MS = Date.parse('2026-06-14T12:00:00Z');

describe('parseSenml()', () => {
  it('resolves base name, base time and base unit (RFC 8428 section 5.1.2 example, from memory)', () => {
    const pack = [
      {
        bn: 'urn:dev:ow:10e2073a0108006:',
        bt: 1.276020076001e9,
        bu: 'A',
        bver: 5,
        n: 'voltage',
        u: 'V',
        v: 120.1,
      },
      { n: 'current', t: -5, v: 1.2 },
      { n: 'current', t: -4, v: 1.3 },
    ];
    const parsed = parseSenml(pack, NOW_MS);
    expect(parsed).toEqual({
      ok: true,
      form: 'senml',
      readings: [
        {
          name: 'urn:dev:ow:10e2073a0108006:voltage',
          eventAtMs: 1_276_020_076_001,
          value: 120.1,
          unit: 'V',
          updateIntervalS: null,
        },
        {
          name: 'urn:dev:ow:10e2073a0108006:current',
          eventAtMs: 1_276_020_071_001,
          value: 1.2,
          unit: 'A',
          updateIntervalS: null,
        },
        {
          name: 'urn:dev:ow:10e2073a0108006:current',
          eventAtMs: 1_276_020_072_001,
          value: 1.3,
          unit: 'A',
          updateIntervalS: null,
        },
      ],
    });
  });

  it('treats times below 2^28 s as relative to the receive time (RFC 8428 section 4.5.3)', () => {
    const parsed = parseSenml(
      [
        { n: 'rh-10', v: 97, t: -30 },
        { n: 'rh-10', v: 96 },
      ],
      NOW_MS,
    );
    expect(parsed.ok && parsed.readings.map((r) => r.eventAtMs)).toEqual([NOW_MS - 30_000, NOW_MS]);
    const edge = parseSenml([{ n: 'x', v: 1, t: SENML_RELATIVE_TIME_LIMIT_S }], NOW_MS);
    expect(edge.ok && edge.readings[0]?.eventAtMs).toBe(SENML_RELATIVE_TIME_LIMIT_S * 1000);
  });

  it('adds the base value and the base sum, keeps ut, ignores unknown fields', () => {
    const parsed = parseSenml(
      [
        { bn: 'probe-a/', bv: 90, n: 'rh-10', v: 7.5, ut: 60, colour: 'blue' },
        { bs: 2, n: 'rain', s: 0.4 },
      ],
      NOW_MS,
    );
    expect(parsed.ok && parsed.readings).toEqual([
      { name: 'probe-a/rh-10', eventAtMs: NOW_MS, value: 97.5, unit: null, updateIntervalS: 60 },
      { name: 'probe-a/rain', eventAtMs: NOW_MS, value: 2.4, unit: null, updateIntervalS: null },
    ]);
  });

  it('lets a record with base fields only set the bases for later records', () => {
    const parsed = parseSenml(
      [
        { bn: 'mast-1/', bu: 'Cel' },
        { n: 'air-t', v: 21 },
      ],
      NOW_MS,
    );
    expect(parsed.ok && parsed.readings[0]).toMatchObject({ name: 'mast-1/air-t', unit: 'Cel' });
  });

  const rejected: { name: string; pack: unknown; reason: string; detail: RegExp }[] = [
    {
      name: 'an object instead of a pack',
      pack: { n: 'x' },
      reason: 'wrong-type',
      detail: /must be a JSON array/,
    },
    { name: 'an empty pack', pack: [], reason: 'wrong-type', detail: /at least one record/ },
    {
      name: 'a record that is a number',
      pack: [3],
      reason: 'wrong-type',
      detail: /record 0 must be a JSON object: got 3/,
    },
    {
      name: 'a must-understand field',
      pack: [{ n: 'x', v: 1, foo_: 2 }],
      reason: 'unsupported-field',
      detail: /"foo_"/,
    },
    {
      name: 'a newer SenML version',
      pack: [{ bver: 11, n: 'x', v: 1 }],
      reason: 'unsupported-field',
      detail: /bver must be at most 10: got 11/,
    },
    {
      name: 'a string value',
      pack: [{ n: 'x', v: '97' }],
      reason: 'wrong-type',
      detail: /v must be a number: got "97"/,
    },
    {
      name: 'a string time',
      pack: [{ n: 'x', v: 1, t: 'now' }],
      reason: 'wrong-type',
      detail: /t must be a number/,
    },
    {
      name: 'a numeric name',
      pack: [{ n: 5, v: 1 }],
      reason: 'wrong-type',
      detail: /n must be a string/,
    },
    {
      name: 'a boolean value',
      pack: [{ n: 'x', vb: true }],
      reason: 'wrong-type',
      detail: /must carry a number/,
    },
    {
      name: 'a record without value',
      pack: [{ n: 'x' }],
      reason: 'wrong-type',
      detail: /has no value/,
    },
    {
      name: 'a name with a space',
      pack: [{ n: 'rh 10', v: 1 }],
      reason: 'wrong-type',
      detail: /name must match/,
    },
    { name: 'an empty name', pack: [{ v: 1 }], reason: 'wrong-type', detail: /name must match/ },
    {
      name: 'a negative ut',
      pack: [{ n: 'x', v: 1, ut: -1 }],
      reason: 'wrong-type',
      detail: /ut must be at least 0/,
    },
    {
      name: 'a base value that overflows',
      pack: [{ bv: 1.7e308, n: 'x', v: 1.7e308 }],
      reason: 'not-finite',
      detail: /finite/,
    },
    {
      name: 'an infinite time',
      pack: [{ n: 'x', v: 1, t: Infinity }],
      reason: 'not-finite',
      detail: /t must be finite/,
    },
  ];
  it.each(rejected)('rejects $name as $reason', ({ pack, reason, detail }) => {
    const parsed = parseSenml(pack, NOW_MS);
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) {
      expect(parsed.reason).toBe(reason);
      expect(parsed.detail).toMatch(detail);
    }
  });
});
