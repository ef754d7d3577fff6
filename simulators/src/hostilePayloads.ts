/**
 * Malformed and hostile payloads a misbehaving or malicious device might send, each with the
 * quarantine reason the ingest must give it (server/src/ingest/reasons.ts). The simulators can
 * inject them (`--hostile`) and the tests check each one is quarantined, not stored, and that
 * ingest goes on.
 */

export interface HostilePayload {
  /** What the payload is, for people. */
  what: string;
  /** Payload bytes (built for a device and an event time). */
  payload: (device: string, eventTimeMs: number) => string | Uint8Array;
  /** Reason code the ingest must quarantine it with. */
  reason: string;
}

const bt = (eventTimeMs: number) => Math.round(eventTimeMs) / 1000;

/**
 * The set. `sensor` and `unit` must be one of the device's real sensors in the run (a temperature
 * sensor, so `%RH` is the wrong unit).
 */
export function hostilePayloads(sensor: string): HostilePayload[] {
  return [
    { what: 'truncated JSON', payload: () => '[{"bn":"x/","n":"t', reason: 'malformed-json' },
    {
      what: 'invalid UTF-8 bytes',
      payload: () => Uint8Array.from([0x5b, 0xff, 0xfe, 0x5d]),
      reason: 'malformed-json',
    },
    {
      what: 'a bare NaN token',
      payload: (device, at) =>
        `[{"bn":"${device}/","bt":${bt(at)},"n":"${sensor}","u":"Cel","v":NaN}]`,
      reason: 'not-finite',
    },
    {
      what: 'a value as a string',
      payload: (device, at) =>
        JSON.stringify([{ bn: `${device}/`, bt: bt(at), n: sensor, u: 'Cel', v: '21.5' }]),
      reason: 'wrong-type',
    },
    {
      what: 'a must-understand field',
      payload: (device, at) =>
        JSON.stringify([{ bn: `${device}/`, bt: bt(at), n: sensor, u: 'Cel', v: 21.5, x_: 1 }]),
      reason: 'unsupported-field',
    },
    {
      what: 'a sensor the run does not know',
      payload: (device, at) =>
        JSON.stringify([{ bn: `${device}/`, bt: bt(at), n: 'rogue-9', u: 'Cel', v: 21.5 }]),
      reason: 'unknown-sensor',
    },
    {
      what: 'the wrong unit',
      payload: (device, at) =>
        JSON.stringify([{ bn: `${device}/`, bt: bt(at), n: sensor, u: '%RH', v: 21.5 }]),
      reason: 'unit-mismatch',
    },
    {
      what: 'an impossible temperature',
      payload: (device, at) =>
        JSON.stringify([{ bn: `${device}/`, bt: bt(at), n: sensor, u: 'Cel', v: 900 }]),
      reason: 'impossible-value',
    },
    {
      what: 'a time a day in the future',
      payload: (device) =>
        JSON.stringify([
          { bn: `${device}/`, bt: bt(Date.now() + 86_400_000), n: sensor, u: 'Cel', v: 21.5 },
        ]),
      reason: 'time-in-future',
    },
    {
      what: 'a 70 KiB payload',
      payload: () => `[${'0'.repeat(70 * 1024)}]`,
      reason: 'oversize',
    },
  ];
}
