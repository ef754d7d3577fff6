import { describe, expect, it } from 'vitest';
import {
  diurnalFraction,
  localHourOfDay,
  scriptedWeatherAt,
} from '../../simulators/src/weatherScript.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';

const { scenario } = loadScenarioFolder('level3-topping');
const weatherAt = (localTime: string) =>
  scriptedWeatherAt(scenario.weather, Date.parse(`2026-07-16T${localTime}:00+02:00`), 120);

describe('diurnalFraction()', () => {
  it.each([
    { hour: 5, expected: 0 },
    { hour: 15, expected: 1 },
    { hour: 10, expected: 0.5 },
    { hour: 5 + 24, expected: 0 },
  ])('is $expected at $hour h (coolest 5 h, warmest 15 h)', ({ hour, expected }) => {
    expect(diurnalFraction(hour % 24, 5, 15)).toBeCloseTo(expected, 12);
  });

  it('rises from the coolest to the warmest hour and falls after', () => {
    const hours = Array.from({ length: 48 }, (_, index) => index / 2);
    for (const hour of hours) {
      const next = diurnalFraction(hour + 0.25, 5, 15);
      const now = diurnalFraction(hour, 5, 15);
      if (hour >= 5 && hour < 14.75) expect(next).toBeGreaterThan(now);
      if (hour >= 15 || hour < 4.75) expect(next).toBeLessThan(now);
    }
  });
});

describe('localHourOfDay()', () => {
  it('applies the offset', () => {
    expect(localHourOfDay(Date.parse('2026-07-16T09:15:00Z'), 120)).toBeCloseTo(11.25, 12);
  });
});

describe('scriptedWeatherAt() on the level3-topping day', () => {
  it('the dry wind rises in the afternoon: stronger and drier at 14:00 than at 12:00', () => {
    const noon = weatherAt('12:00');
    const afternoon = weatherAt('14:00');
    expect(noon.windMS).toBeCloseTo(scenario.weather.windMS, 12);
    expect(afternoon.windMS).toBeCloseTo(7.5, 12);
    expect(afternoon.relativeHumidityPercent).toBeLessThan(noon.relativeHumidityPercent - 10);
  });

  it('half-way up its ramp the wind is half-way to its strength', () => {
    expect(weatherAt('13:07').windMS).toBeCloseTo(2.2 + (7.5 - 2.2) * (22 / 45), 9);
  });

  it('rains only during the shower, moist and cooler', () => {
    expect(weatherAt('18:30').rainMmH).toBe(0);
    const shower = weatherAt('18:50');
    expect(shower.rainMmH).toBe(8);
    expect(shower.relativeHumidityPercent).toBeGreaterThanOrEqual(88);
    expect(shower.airTemperatureC).toBeLessThan(weatherAt('18:30').airTemperatureC - 3);
    expect(weatherAt('19:10').rainMmH).toBe(0);
  });

  it('has no sun at night and most of it near solar noon', () => {
    expect(weatherAt('03:00').solarWm2).toBe(0);
    expect(weatherAt('13:24').solarWm2).toBeCloseTo(scenario.weather.solarNoonWm2, 0);
  });
});
