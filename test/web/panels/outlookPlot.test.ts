/** The outlook's crossing sentences (web/src/panels/outlookPlot.ts). */
import { describe, expect, it } from 'vitest';
import type { RunState } from '../../../web/src/contract.ts';
import { crossingSentences, outlookSeries } from '../../../web/src/panels/outlookPlot.ts';

const NBSP = '\u00a0';
const eventTimeMs = Date.parse('2026-07-16T13:00:00+02:00');
const outlook: NonNullable<RunState['outlook']> = {
  horizonH: 6,
  timesMs: [eventTimeMs, eventTimeMs + 600_000],
  utilizationBand: { p05: [0.2, 0.3], p50: [0.3, 0.4], p95: [0.4, Number.NaN] },
  marginBandMPa: { p05: [0, 0], p50: [0, 0], p95: [0, 0] },
  crossings: [
    {
      threshold: 0.57,
      probability: 0.8,
      expectedTimeMs: eventTimeMs + 70 * 60_000,
      medianTimeMs: null,
    },
    { threshold: 1, probability: 0.05, expectedTimeMs: null, medianTimeMs: null },
  ],
  probabilityCrackingWithinHorizon: 0.05,
  forecastSource: 'persistence',
};

describe('crossingSentences()', () => {
  it("says when a likely crossing is expected on the site's clock, and that an unreached one is not", () => {
    expect(crossingSentences(outlook, eventTimeMs, 0.3, 120)).toEqual([
      `Utilization 0.57: expected at 14:10, in${NBSP}1${NBSP}h 10${NBSP}min (probability within 6${NBSP}h: 80${NBSP}%).`,
      `Utilization 1.00: not reached within 6${NBSP}h (probability 5${NBSP}%).`,
    ]);
  });

  it('calls a crossing few members make unlikely, giving their mean time as such', () => {
    const unlikely = {
      ...outlook,
      crossings: [
        {
          threshold: 0.69,
          probability: 0.09,
          expectedTimeMs: eventTimeMs + 70 * 60_000,
          medianTimeMs: null,
        },
      ],
    };
    expect(crossingSentences(unlikely, eventTimeMs, 0.3, 120)).toEqual([
      `Utilization 0.69: unlikely within 6${NBSP}h (probability 9${NBSP}%); where it is reached, at about 14:10, in${NBSP}1${NBSP}h 10${NBSP}min.`,
    ]);
  });

  it('says a threshold utilization has already reached is reached, not expected later', () => {
    expect(crossingSentences(outlook, eventTimeMs, 0.6, 120)[0]).toBe(
      'Utilization 0.57: already reached (utilization now 0.60).',
    );
  });
});

describe('outlookSeries()', () => {
  it('gives uPlot seconds, the band with null for NaN, and one flat line per threshold', () => {
    expect(outlookSeries(outlook, [0.57, 1])).toEqual([
      [eventTimeMs / 1000, eventTimeMs / 1000 + 600],
      [0.2, 0.3],
      [0.3, 0.4],
      [0.4, null],
      [0.57, 0.57],
      [1, 1],
    ]);
  });
});
