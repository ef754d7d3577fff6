import { describe, expect, it } from 'vitest';
import { firstCrossingTimeS } from '../../server/src/calibration/firstCrossingTime.ts';
import {
  outlookStatistics,
  quantileBands,
} from '../../server/src/calibration/outlookStatistics.ts';
import { quantileOfSorted } from '../../server/src/calibration/quantile.ts';

// Hand-made member trajectories; every expected value below is worked out by hand from the
// definitions in outlookStatistics.ts (linear interpolation between outputs; mean and median over
// crossing members; ensemble median counting non-crossers as beyond the horizon) and, for the
// bands, Hyndman and Fan (1996) definition 7.
const timesS = [0, 600, 1200, 1800];
const utilization = [
  [0.5, 0.6, 0.8, 1.2], // crosses 0.57 at 420 s, 0.69 at 870 s, 1 at 1500 s
  [0.6, 0.7, 0.9, 1.0], // 0.57 at 0 s (already), 0.69 at 540 s, 1 at 1800 s (reached exactly)
  [0.2, 0.3, 0.4, 0.5], // crosses nothing
  [0.5, Number.NaN, 0.7, 0.7], // gap: 0.57 and 0.69 at 1200 s (the sample after the gap)
];
const marginMPa = [
  [1, 0.8, 0.4, -0.2],
  [2, 1.5, 1.0, 0.0],
  [3, 2.9, 2.8, 2.7],
  [4, Number.NaN, 1.2, 1.2],
];

describe('firstCrossingTimeS()', () => {
  it.each([
    [[0.5, 0.6, 0.8, 1.2], 0.57, 420],
    [[0.5, 0.6, 0.8, 1.2], 1, 1500],
    [[0.6, 0.7, 0.9, 1.0], 0.57, 0],
    [[0.6, 0.7, 0.9, 1.0], 1, 1800],
    [[0.5, Number.NaN, 0.7, 0.7], 0.69, 1200],
    [[0.2, 0.3, 0.4, 0.5], 0.57, null],
    [[0.2, 0.3, 0.4, 0.5], Number.NaN, null],
  ])('%j reaches %s at %s s', (values, threshold, expected) => {
    const time = firstCrossingTimeS(timesS, values, threshold);
    if (expected === null) expect(time).toBeNull();
    else expect(time).toBeCloseTo(expected, 9);
  });
});

describe('outlookStatistics()', () => {
  const outlook = outlookStatistics({ timesS, utilization, marginMPa });

  it.each([
    // threshold, fraction, mean, median over crossing, ensemble median
    [0.57, 0.75, (420 + 0 + 1200) / 3, 420, 420],
    [0.69, 0.75, (870 + 540 + 1200) / 3, 870, 870],
    [1, 0.5, (1500 + 1800) / 2, 1650, 1800],
  ])(
    'threshold %s: fraction %s, mean %s s, median %s s, ensemble median %s s',
    (threshold, fraction, mean, median, ensembleMedian) => {
      const crossing = outlook.crossings.find((c) => c.threshold === threshold);
      expect(crossing?.fractionCrossing).toBe(fraction);
      expect(crossing?.meanCrossingTimeS).toBeCloseTo(mean, 9);
      expect(crossing?.medianCrossingTimeS).toBeCloseTo(median, 9);
      expect(crossing?.ensembleMedianCrossingTimeS).toBeCloseTo(ensembleMedian, 9);
    },
  );

  it('gives the probability that utilization reaches 1 within the horizon', () => {
    expect(outlook.probabilityUtilizationReachesOne).toBe(0.5);
  });

  it('reports no crossing time when fewer than half the members cross', () => {
    const crossing = outlookStatistics({ timesS, utilization, marginMPa, thresholds: [1.1] })
      .crossings[0];
    expect(crossing?.fractionCrossing).toBe(0.25);
    expect(crossing?.meanCrossingTimeS).toBeCloseTo(1200 + (0.3 / 0.4) * 600, 9);
    expect(crossing?.ensembleMedianCrossingTimeS).toBeNull();
  });

  it('gives the 5/50/95 % band of the margin at each time, skipping missing values', () => {
    // t = 0: sorted [1, 2, 3, 4], h = 3p: 1.15, 2.5, 3.85.
    // t = 600: finite [0.8, 1.5, 2.9], h = 2p: 0.8 + 0.1*0.7 = 0.87, 1.5, 1.5 + 0.9*1.4 = 2.76.
    const [low, middle, high] = outlook.marginBandMPa;
    expect(low?.probability).toBe(0.05);
    expect(low?.values[0]).toBeCloseTo(1.15, 12);
    expect(middle?.values[0]).toBeCloseTo(2.5, 12);
    expect(high?.values[0]).toBeCloseTo(3.85, 12);
    expect(low?.values[1]).toBeCloseTo(0.87, 12);
    expect(middle?.values[1]).toBeCloseTo(1.5, 12);
    expect(high?.values[1]).toBeCloseTo(2.76, 12);
  });

  it('with no members gives fraction 0, no times and NaN bands', () => {
    const empty = outlookStatistics({ timesS, utilization: [], marginMPa: [] });
    expect(empty.probabilityUtilizationReachesOne).toBe(0);
    expect(empty.crossings[0]?.meanCrossingTimeS).toBeNull();
    expect(quantileBands([[Number.NaN]], [0.5])[0]?.values[0]).toBeNaN();
  });
});

describe('quantileOfSorted()', () => {
  it.each([
    [[5], 0.3, 5],
    [[1, 2], 0.5, 1.5],
    [[1, 2, 3, 4, 5], 0.25, 2],
    [[1, 2, 3, 4, 5], 1, 5],
    [[1, 2, 3, 4, 5], 1.4, 5],
    [[], 0.5, Number.NaN],
  ])('of %j at %s is %s (Hyndman-Fan 7)', (values, p, expected) => {
    if (Number.isNaN(expected)) expect(quantileOfSorted(values, p)).toBeNaN();
    else expect(quantileOfSorted(values, p)).toBeCloseTo(expected, 12);
  });
});
