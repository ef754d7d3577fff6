/**
 * windowInputs(): weather readings to boundary inputs. Wind is brought from the mast to 0.5 m by
 * the log profile (checked against windSpeedAtUnoHeight, physics/windProfile.ts); humidity in %
 * to a fraction; surface temperature from the shallowest probe; silent streams held and flagged.
 */
import { describe, expect, it } from 'vitest';
import { emptyStream, insertReading } from '../../server/src/live/readingStreams.ts';
import type { StreamBuffer } from '../../server/src/live/readingStreams.ts';
import type { ProbeRole, WeatherQuantity } from '../../server/src/live/streamRoles.ts';
import { windowInputs } from '../../server/src/live/windowInputs.ts';
import { windSpeedAtUnoHeight } from '../../server/src/physics/index.ts';

function stream(points: readonly (readonly [number, number])[]): StreamBuffer {
  const buffer = emptyStream();
  for (const [t, v] of points) insertReading(buffer, t, v);
  return buffer;
}

function probe(key: string, depthMm: number): ProbeRole {
  return {
    kind: 'probe',
    key,
    device: 'p',
    sensor: key,
    quantity: 'temperature',
    depthMm,
    domainDepthM: depthMm / 1000,
  };
}

const weather = new Map<WeatherQuantity, StreamBuffer>([
  [
    'airTemperature',
    stream([
      [60_000, 30],
      [120_000, 32],
    ]),
  ],
  [
    'relativeHumidity',
    stream([
      [60_000, 40],
      [120_000, 44],
    ]),
  ],
  [
    'windSpeed',
    stream([
      [60_000, 4],
      [120_000, 6],
    ]),
  ],
]);

describe('windowInputs()', () => {
  it('averages the window and converts units; wind by the log profile from a 2 m mast', () => {
    const { inputs, held } = windowInputs(
      {
        weather,
        probeTemperatures: [
          { role: probe('t-05', 5), stream: stream([[100_000, 33]]) },
          { role: probe('t-35', 35), stream: stream([[100_000, 31]]) },
        ],
        mastHeightM: 2,
        measures: [],
        holdMs: 900_000,
      },
      0,
      120_000,
    );
    expect(held).toEqual([]);
    expect(inputs?.airTemperatureK).toBeCloseTo(304.15, 10);
    expect(inputs?.relativeHumidity).toBeCloseTo(0.42, 12);
    expect(inputs?.windMS).toBeCloseTo(windSpeedAtUnoHeight(5, 2), 12);
    expect(inputs?.surfaceTemperatureK).toBeCloseTo(306.15, 10);
    expect(inputs?.probeTemperatures).toHaveLength(2);
  });

  it.each([
    { toMs: 600_000, code: false },
    { toMs: 1_500_000, code: true },
  ])(
    'holds a silent stream (window ending at $toMs ms), beyond the hold: $code',
    ({ toMs, code }) => {
      const { inputs, held } = windowInputs(
        { weather, probeTemperatures: [], mastHeightM: 2, measures: [], holdMs: 900_000 },
        toMs - 300_000,
        toMs,
      );
      expect(inputs?.airTemperatureK).toBeCloseTo(305.15, 10);
      expect(inputs?.surfaceTemperatureK).toBe(inputs?.airTemperatureK);
      expect(held.map((h) => h.quantity).sort()).toEqual([
        'airTemperature',
        'relativeHumidity',
        'windSpeed',
      ]);
      expect(held.every((h) => h.beyondHold === code)).toBe(true);
    },
  );

  it('gives no inputs while a required quantity has never been read', () => {
    const partial = new Map(weather);
    partial.delete('windSpeed');
    const result = windowInputs(
      { weather: partial, probeTemperatures: [], mastHeightM: 2, measures: [], holdMs: 900_000 },
      0,
      120_000,
    );
    expect(result.inputs).toBeNull();
    expect(result.missing).toEqual(['windSpeed']);
  });

  it('turns rain above 0.5 mm/h into a wet covering (our assumption)', () => {
    const wet = new Map(weather);
    wet.set('rain', stream([[100_000, 0.2]]));
    const { inputs } = windowInputs(
      { weather: wet, probeTemperatures: [], mastHeightM: 2, measures: [], holdMs: 900_000 },
      0,
      300_000,
    );
    expect(inputs?.activeMeasures?.map((m) => m.kind)).toEqual(['wet-covering']);
  });
});
