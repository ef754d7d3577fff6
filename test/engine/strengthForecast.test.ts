import { describe, expect, it } from 'vitest';
import { simulateElement } from '../../server/src/engine/simulateElement.ts';
import { strengthForecast } from '../../server/src/engine/strengthForecast.ts';
import { HARSH, HOUR_S, measure, modelOf, run, steadyWeather } from './_scenarios.ts';

/** Wet covering over the whole run: the pores stay saturated, so the humidity factor is 1. */
const wetAllDay = [measure('wet-covering', 0, 500)];

describe('strengthForecast() (physics.md section 6: time to a target strength)', () => {
  it('at placement, 20 degC and saturated, forecasts the EN 1992-1-1 equivalent age of the target (hand computed)', () => {
    const model = modelOf('normal-concrete', 0.1);
    const forecast = strengthForecast(model, model.initialState(293.15), 10);
    // EN 1992-1-1:2004 eqs. (3.1)-(3.2) on the age since final set (t0 = 6 h = 0.25 d, the
    // preset's final set): C30/37 gives fcm = 38 MPa, class N cement s = 0.25, so
    // 10 MPa at t - t0 = 28 / (1 - ln(10 / 38) / 0.25)^2 days; at 20 degC the rate is 1.
    const days = 0.25 + 28 / (1 - Math.log(10 / 38) / 0.25) ** 2;
    expect(forecast.surfaceAgeRate).toBeCloseTo(1, 12);
    expect(forecast.surfaceHours).toBeCloseTo(days * 24, 6);
    expect(forecast.coreHours).toBeCloseTo(days * 24, 6);
  });

  it('runs at the ASTM C1074 Arrhenius rate: 30 degC ages 1.718 times faster than 20 degC (E = 40 kJ/mol, hand computed)', () => {
    const model = modelOf('normal-concrete', 0.1);
    const forecast = strengthForecast(model, model.initialState(303.15), 10);
    // exp(E/R (1/293.15 - 1/303.15)) with E = 40000 J/mol, R = 8.314 J/(mol K): 1.7184.
    expect(forecast.surfaceAgeRate).toBeCloseTo(1.7184, 3);
  });

  it.each([
    [20, 10],
    [30, 15],
    [12, 8],
  ])(
    'holds its word under steady %i degC saturated curing: running to the forecast time reaches %i MPa (within 0.5 %%)',
    (temperatureC, targetMPa) => {
      const model = modelOf('normal-concrete', 0.1);
      const weather = steadyWeather(temperatureC, 1, 2);
      const start = run(model, weather, 2, wetAllDay);
      const forecast = strengthForecast(model, start.state, targetMPa);
      expect(forecast.surfaceHours).toBeGreaterThan(0);
      // Continue the same state for the forecast time (measure times count from placement).
      const later = simulateElement({
        model,
        weather,
        measures: wetAllDay,
        durationS: forecast.surfaceHours * HOUR_S,
        outputIntervalS: 3600,
        initialState: start.state,
      });
      const reachedMPa = (later.series.at(-1)?.surfaceCompressiveStrengthPa ?? Number.NaN) / 1e6;
      expect(Math.abs(reachedMPa - targetMPa) / targetMPa).toBeLessThan(0.005);
    },
  );

  it('a surface dried by harsh weather stops hydrating: its forecast lies beyond the core’s', () => {
    const model = modelOf('normal-concrete', 0.1);
    const dried = run(model, HARSH, 12);
    const forecast = strengthForecast(model, dried.state, 20);
    expect(forecast.surfaceAgeRate).toBeLessThan(forecast.coreAgeRate);
    expect(forecast.surfaceHours).toBeGreaterThan(forecast.coreHours);
  });

  it('is 0 once reached, Infinity above what the strength law ever reaches, NaN without a mix', () => {
    const model = modelOf('normal-concrete', 0.1);
    const weekOld = run(model, steadyWeather(20, 1, 2), 7 * 24, wetAllDay);
    expect(strengthForecast(model, weekOld.state, 5).surfaceHours).toBe(0);
    // EN 1992-1-1 beta_cc never exceeds exp(s) = exp(0.25): 38 MPa * 1.284 = 48.8 MPa.
    expect(strengthForecast(model, weekOld.state, 60).coreHours).toBe(Number.POSITIVE_INFINITY);
    const stone = modelOf('building-stone-coarse', 0.05);
    expect(strengthForecast(stone, stone.initialState()).surfaceHours).toBeNaN();
  });

  it('is part of the figures, with the target the simulation asks for', () => {
    const model = modelOf('normal-concrete', 0.1);
    const result = run(model, steadyWeather(20, 0.6, 2), 1);
    const figures = result.series.at(-1);
    expect(figures?.strengthForecast.targetCompressiveStrengthMPa).toBe(10);
    expect(figures?.strengthForecast.surfaceHours).toBeGreaterThan(0);
  });
});
