import { describe, expect, it } from 'vitest';
import { modelOf, run, steadyWeather } from './_scenarios.ts';

// Grid and step convergence of the peak surface stress (issue 3): fine mortar, 50 mm, one face,
// 6 h at 25 degC, 50 % RH, 3 m/s. Refining must change the peak by less than 2 %, and successive
// differences must shrink at about the order of the scheme (backward Euler: 1 in time; the
// graded cell-centred grid: between 1 and 2 in space).
const weather = steadyWeather(25, 0.5, 3);
const peakStress = (cellCount: number, firstCellM: number, maxStepS: number): number =>
  run(
    modelOf('cement-mortar-fine', 0.05, 'one-face', { cellCount, firstCellM, step: { maxStepS } }),
    weather,
    6,
  ).maxSurfaceStressPa;

function observedOrder(values: readonly number[]): number {
  const [a, b, c] = values.slice(-3) as [number, number, number];
  return Math.log2(Math.abs(b - a) / Math.abs(c - b));
}

describe('grid and step convergence of the peak surface stress', () => {
  it('refining cells (30 to 240, first cell halved each time) changes the peak by < 2 %', () => {
    const peaks = [1, 2, 4, 8].map((factor) => peakStress(30 * factor, 2e-4 / factor, 60));
    const last = peaks.at(-1) ?? Number.NaN;
    const previous = peaks.at(-2) ?? Number.NaN;
    expect(Math.abs(last - previous) / last).toBeLessThan(0.02);
    const order = observedOrder(peaks);
    console.info(
      `grid: peaks ${peaks.map((p) => (p / 1e6).toFixed(5)).join(', ')} MPa, observed order ${order.toFixed(2)}`,
    );
    expect(order).toBeGreaterThan(0.6);
    expect(order).toBeLessThan(2.5);
  });

  it('refining steps (longest step 240 to 30 s) changes the peak by < 2 % at first order', () => {
    const peaks = [240, 120, 60, 30].map((maxStepS) => peakStress(60, 1e-4, maxStepS));
    const last = peaks.at(-1) ?? Number.NaN;
    const previous = peaks.at(-2) ?? Number.NaN;
    expect(Math.abs(last - previous) / last).toBeLessThan(0.02);
    const order = observedOrder(peaks);
    console.info(
      `step: peaks ${peaks.map((p) => (p / 1e6).toFixed(5)).join(', ')} MPa, observed order ${order.toFixed(2)}`,
    );
    expect(order).toBeGreaterThan(0.6);
    expect(order).toBeLessThan(1.6);
  });
});
