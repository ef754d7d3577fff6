/** The figure history behind the stress plot (web/src/figureHistory.ts). */
import { describe, expect, it } from 'vitest';
import type { FigurePoint, RunState } from '../../web/src/contract.ts';
import { figurePointOf, mergeFigurePoints } from '../../web/src/figureHistory.ts';

function point(eventTimeMs: number, surfaceStressMPa: number | null = null): FigurePoint {
  return {
    eventTimeMs,
    phase: 'hardening',
    surfaceStressMPa,
    fctmMPa: null,
    utilization: null,
    marginMPa: null,
    evaporationKgM2h: null,
    bleedFilmKgM2: null,
    utilizationP05: null,
    utilizationP95: null,
  };
}

describe('mergeFigurePoints()', () => {
  it('keeps the points sorted by event time with one point per time (uPlot needs sorted unique x)', () => {
    const merged = mergeFigurePoints([point(3), point(1)], [point(2), point(5), point(4)]);
    expect(merged.map((entry) => entry.eventTimeMs)).toEqual([1, 2, 3, 4, 5]);
  });

  it('lets a pushed point replace the stored one at the same time', () => {
    const merged = mergeFigurePoints([point(1, 0.1), point(2, 0.2)], [point(2, 0.25)]);
    expect(merged.map((entry) => entry.surfaceStressMPa)).toEqual([0.1, 0.25]);
  });

  it('leaves its inputs unchanged', () => {
    const history = [point(2)];
    mergeFigurePoints(history, [point(1)]);
    expect(history.map((entry) => entry.eventTimeMs)).toEqual([2]);
  });
});

describe('figurePointOf()', () => {
  const state = {
    runId: 'r',
    eventTimeMs: 1000,
    phase: 'hardening',
    surfaceStressMPa: 0.4,
    fctmMPa: 0.9,
    utilization: 0.44,
    marginMPa: 0.5,
    evaporationKgM2h: 0.7,
    bleedFilmKgM2: 0,
    nowBands: {
      utilization: { p05: 0.3, p50: 0.44, p95: 0.6 },
      surfaceStressMPa: { p05: 0.3, p50: 0.4, p95: 0.5 },
      marginMPa: { p05: 0.4, p50: 0.5, p95: 0.6 },
    },
  } as RunState;

  it("takes the state's figures and its utilization band", () => {
    expect(figurePointOf(state)).toEqual({
      eventTimeMs: 1000,
      phase: 'hardening',
      surfaceStressMPa: 0.4,
      fctmMPa: 0.9,
      utilization: 0.44,
      marginMPa: 0.5,
      evaporationKgM2h: 0.7,
      bleedFilmKgM2: 0,
      utilizationP05: 0.3,
      utilizationP95: 0.6,
    });
  });

  it('gives no point before the first reading', () => {
    expect(figurePointOf({ ...state, eventTimeMs: null })).toBeNull();
  });
});
