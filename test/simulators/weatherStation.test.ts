import { describe, expect, it } from 'vitest';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { RAIN_TIP_MM, WeatherStationSimulator } from '../../simulators/src/weatherStation.ts';
import type { ScriptedWeather } from '../../simulators/src/weatherScript.ts';

const { scenario } = loadScenarioFolder('level3-topping');
const START_MS = Date.parse('2026-07-16T11:00:00+02:00');
const calm: ScriptedWeather = {
  airTemperatureC: 30,
  relativeHumidityPercent: 40,
  windMS: 5,
  solarWm2: 800,
  rainMmH: 0,
};

function play(weather: ScriptedWeather, count: number) {
  const station = new WeatherStationSimulator(scenario.weather, scenario.seed);
  return Array.from({ length: count }, (_, index) =>
    station.sample(START_MS + index * 60_000, weather),
  );
}
const series = (packs: ReturnType<typeof play>, sensor: string) =>
  packs.map((pack) => pack.find((record) => record.n === sensor)?.v ?? Number.NaN);

describe('WeatherStationSimulator.sample()', () => {
  it('reports every sensor run.json names for the station, with SenML units', () => {
    const [pack] = play(calm, 1);
    expect(pack?.map((record) => [record.n, record.u])).toEqual([
      ['air-t', 'Cel'],
      ['air-rh', '%RH'],
      ['wind', 'm/s'],
      ['sun', 'W/m2'],
      ['rain', 'mm'],
    ]);
    expect(pack?.[0]).toMatchObject({ bn: 'mast-l3/', bt: START_MS / 1000, ut: 60 });
  });

  it('gusts around the mean wind: mean kept, peaks up to about the gust factor', () => {
    const wind = series(play(calm, 3000), 'wind');
    const mean = wind.reduce((sum, value) => sum + value, 0) / wind.length;
    // AR(1) with correlation 0.7: the effective sample is about 3000 * 0.3 / 1.7 = 530; 4 standard errors
    expect(Math.abs(mean - 5)).toBeLessThan((4 * 5 * (0.5 / 3)) / Math.sqrt(530));
    expect(Math.max(...wind)).toBeGreaterThan(5 * 1.3);
    expect(Math.max(...wind)).toBeLessThan(5 * 1.5 * 1.3);
    expect(Math.min(...wind)).toBeGreaterThanOrEqual(0);
  });

  it('tips the rain gauge in 0.2 mm steps that add up to the rain that fell', () => {
    const rain = series(play({ ...calm, rainMmH: 8 }, 30), 'rain');
    for (const tip of rain) expect(Math.round(tip / RAIN_TIP_MM) * RAIN_TIP_MM).toBeCloseTo(tip, 9);
    // 29 intervals of a minute after the first sample at 8 mm/h = 3.87 mm, plus the first minute; less than one tip left over
    const total = rain.reduce((sum, value) => sum + value, 0);
    expect(total).toBeGreaterThan(8 * (30 / 60) - RAIN_TIP_MM);
    expect(total).toBeLessThanOrEqual(8 * (30 / 60) + 1e-9);
  });
});
