import { describe, expect, it } from 'vitest';
import { sensorQuality } from '../../server/src/quality/sensorQuality.ts';
import type { QualityReading } from '../../server/src/quality/sensorQuality.ts';

const T0 = Date.parse('2026-07-16T09:15:00Z');
const minute = (index: number) => T0 + index * 60_000;

describe('sensorQuality()', () => {
  it('judges each sensor on its own: one stuck, one silent, one fine', () => {
    const readings: QualityReading[] = [];
    for (let index = 0; index < 90; index += 1) {
      readings.push({
        device: 'probe-b',
        sensor: 't-20',
        eventAtMs: minute(index),
        value: index < 30 ? 20 + index / 10 : 23.1,
        updateIntervalS: 60,
      });
      if (index < 40 || index >= 70)
        readings.push({
          device: 'probe-a',
          sensor: 'rh-05',
          eventAtMs: minute(index),
          value: 95 - index / 10,
          updateIntervalS: 60,
        });
      readings.push({
        device: 'probe-a',
        sensor: 't-05',
        eventAtMs: minute(index),
        value: 25 + (index % 7) / 10,
        updateIntervalS: 60,
      });
    }
    const found = sensorQuality(readings.reverse());
    expect(
      found.map((entry) => [
        entry.device,
        entry.sensor,
        entry.readings,
        entry.silences.length,
        entry.stuck.length,
      ]),
    ).toEqual([
      ['probe-a', 'rh-05', 60, 1, 0],
      ['probe-a', 't-05', 90, 0, 0],
      ['probe-b', 't-20', 90, 0, 1],
    ]);
    expect(found[0]?.silences[0]).toMatchObject({ fromMs: minute(39), toMs: minute(70) });
    expect(found[2]?.stuck[0]).toMatchObject({ fromMs: minute(30), toMs: minute(89), value: 23.1 });
  });

  it('gives nothing for no readings', () => {
    expect(sensorQuality([])).toEqual([]);
  });
});
