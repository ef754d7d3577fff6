import { describe, expect, it } from 'vitest';
import { MAX_PAYLOAD_BYTES, parsePayload } from '../../server/src/ingest/parsePayload.ts';

const NOW_MS = Date.parse('2026-06-14T12:00:00Z');
const bytes = (text: string) => Buffer.from(text, 'utf8');

describe('parsePayload()', () => {
  it('reads a JSON array as a SenML pack and an object as the simple form', () => {
    expect(parsePayload(bytes('[{"n":"rh-10","v":97}]'), NOW_MS)).toMatchObject({
      ok: true,
      form: 'senml',
    });
    const simple = parsePayload(
      bytes(
        '{"time":"2026-06-14T13:40:00+02:00","readings":{"rh-10":97.5,"t-10":{"value":71.6,"unit":"degF"}},"ut":60}',
      ),
      NOW_MS,
    );
    expect(simple).toEqual({
      ok: true,
      form: 'simple',
      readings: [
        {
          name: 'rh-10',
          eventAtMs: Date.parse('2026-06-14T11:40:00Z'),
          value: 97.5,
          unit: null,
          updateIntervalS: 60,
        },
        {
          name: 't-10',
          eventAtMs: Date.parse('2026-06-14T11:40:00Z'),
          value: 71.6,
          unit: 'degF',
          updateIntervalS: 60,
        },
      ],
    });
    const epoch = parsePayload(bytes('{"time":1781436000.5,"readings":{"rh-10":97}}'), NOW_MS);
    expect(epoch.ok && epoch.readings[0]?.eventAtMs).toBe(1_781_436_000_500);
  });

  it('accepts exactly 64 KiB and rejects one byte more as oversize', () => {
    const pack = '[{"n":"rh-10","v":97}]';
    const atLimit = pack + ' '.repeat(MAX_PAYLOAD_BYTES - pack.length);
    expect(parsePayload(bytes(atLimit), NOW_MS).ok).toBe(true);
    const over = parsePayload(bytes(`${atLimit} `), NOW_MS);
    expect(over).toMatchObject({
      ok: false,
      reason: 'oversize',
      detail: `payload must be at most 65536 bytes: got 65537`,
    });
  });

  const rejected: { name: string; payload: Uint8Array; reason: string }[] = [
    { name: 'truncated JSON', payload: bytes('[{"n":"rh-10","v":9'), reason: 'malformed-json' },
    { name: 'an empty payload', payload: bytes(''), reason: 'malformed-json' },
    {
      name: 'invalid UTF-8',
      payload: Uint8Array.from([0x5b, 0xff, 0xfe, 0x5d]),
      reason: 'malformed-json',
    },
    { name: 'a bare NaN', payload: bytes('[{"n":"rh-10","v":NaN}]'), reason: 'not-finite' },
    {
      name: 'a bare -Infinity',
      payload: bytes('{"time":1781436000,"readings":{"x":-Infinity}}'),
      reason: 'not-finite',
    },
    {
      name: 'a number beyond double range',
      payload: bytes('[{"n":"rh-10","v":1e999}]'),
      reason: 'not-finite',
    },
    {
      name: '"NaN" inside a string is not a token',
      payload: bytes('[{"n":"NaN","v":"NaN"'),
      reason: 'malformed-json',
    },
    { name: 'a JSON string', payload: bytes('"hello"'), reason: 'wrong-type' },
    { name: 'JSON null', payload: bytes('null'), reason: 'wrong-type' },
    {
      name: 'simple form without time',
      payload: bytes('{"readings":{"x":1}}'),
      reason: 'wrong-type',
    },
    {
      name: 'simple form with a local time',
      payload: bytes('{"time":"2026-06-14T13:40:00","readings":{"x":1}}'),
      reason: 'wrong-type',
    },
    {
      name: 'simple form with no readings',
      payload: bytes('{"time":1781436000,"readings":{}}'),
      reason: 'wrong-type',
    },
    {
      name: 'simple form with a string value',
      payload: bytes('{"time":1781436000,"readings":{"x":"1"}}'),
      reason: 'wrong-type',
    },
    {
      name: 'simple form with a numeric unit',
      payload: bytes('{"time":1781436000,"readings":{"x":{"value":1,"unit":5}}}'),
      reason: 'wrong-type',
    },
    {
      name: 'a deeply nested array',
      payload: bytes('['.repeat(20_000) + ']'.repeat(20_000)),
      reason: 'wrong-type',
    },
  ];
  it.each(rejected)('rejects $name as $reason', ({ payload, reason }) => {
    const parsed = parsePayload(payload, NOW_MS);
    expect(parsed).toMatchObject({ ok: false, reason });
  });
});
