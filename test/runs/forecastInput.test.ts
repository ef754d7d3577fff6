import { describe, expect, it } from 'vitest';
import { validationIssues as issuesOf } from '../helpers/validationIssues.ts';
import { parseForecast } from '../../server/src/runs/forecastInput.ts';

describe('parseForecast()', () => {
  it('turns times into ms and keeps only the quantities given', () => {
    expect(
      parseForecast({
        points: [
          { time: '2026-06-14T15:00:00+02:00', airTemperatureC: 28, windSpeedMs: 4.5 },
          { time: '2026-06-14T16:00:00+02:00', relativeHumidityPercent: 40, solarWm2: 650 },
        ],
      }),
    ).toEqual([
      { timeMs: Date.parse('2026-06-14T13:00:00Z'), airTemperatureC: 28, windSpeedMs: 4.5 },
      { timeMs: Date.parse('2026-06-14T14:00:00Z'), relativeHumidityPercent: 40, solarWm2: 650 },
    ]);
  });

  it('takes an empty series (back to persistence)', () => {
    expect(parseForecast({ points: [] })).toEqual([]);
  });

  const t = (hour: number) => `2026-06-14T${String(hour).padStart(2, '0')}:00:00Z`;
  it.each([
    [{}, 'points is required: got nothing'],
    [
      { points: [{ time: t(10), windSpeedMs: -1 }] },
      'points[0].windSpeedMs must be at least 0 m/s: got -1',
    ],
    [
      { points: [{ time: t(10), relativeHumidityPercent: 120 }] },
      'points[0].relativeHumidityPercent must be at most 100 %: got 120',
    ],
    [
      {
        points: [
          { time: t(10), windSpeedMs: 1 },
          { time: t(10), windSpeedMs: 2 },
        ],
      },
      `points[1].time must be after points[0].time: got ${t(10)}`,
    ],
    [{ points: [{ time: t(10) }] }, 'points[0] must give at least one quantity: got only a time'],
    [
      { points: [{ time: t(10), windSpeedKmH: 10 }] },
      'points[0] has unknown field(s) windSpeedKmH',
    ],
  ])('rejects %j naming the field', (body, issue) => {
    expect(issuesOf(() => parseForecast(body))).toContain(issue);
  });
});
