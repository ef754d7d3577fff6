import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import type { RunState } from '../../server/src/live/types.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { figurePointOf } from '../../server/src/store/figureHistory.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';

/** A state with the fields the history reads; the rest is irrelevant here. */
function stateAt(eventTimeMs: number | null, overrides: Partial<RunState> = {}): RunState {
  return {
    runId: 'run-1',
    eventTimeMs,
    phase: 'hardening',
    surfaceStressMPa: 0.42,
    fctmMPa: 0.8,
    utilization: 0.525,
    marginMPa: 0.38,
    evaporationKgM2h: 0.9,
    bleedFilmKgM2: 0,
    nowBands: {
      utilization: { p05: 0.4, p50: 0.525, p95: 0.7 },
      surfaceStressMPa: { p05: 0.3, p50: 0.42, p95: 0.55 },
      marginMPa: { p05: 0.2, p50: 0.38, p95: 0.5 },
    },
    ...overrides,
  } as RunState;
}

let archive: Archive;
beforeEach(() => {
  archive = Archive.open(':memory:');
  archive.createRun(parseRunConfig(exampleRunInput()), EXAMPLE_PLACED_AT_MS, 'run-1');
});
afterEach(() => archive.close());

describe('figurePointOf()', () => {
  it('keeps the figures with their units and the utilization band, and writes undefined figures as null', () => {
    expect(figurePointOf(stateAt(1000))).toEqual({
      eventTimeMs: 1000,
      phase: 'hardening',
      surfaceStressMPa: 0.42,
      fctmMPa: 0.8,
      utilization: 0.525,
      marginMPa: 0.38,
      evaporationKgM2h: 0.9,
      bleedFilmKgM2: 0,
      utilizationP05: 0.4,
      utilizationP95: 0.7,
    });
    const plastic = figurePointOf(
      stateAt(2000, { phase: 'plastic', marginMPa: null, utilization: Number.NaN, nowBands: null }),
    );
    expect(plastic).toMatchObject({ marginMPa: null, utilization: null, utilizationP05: null });
  });

  it('gives no point for a state before the first reading (no event time)', () => {
    expect(figurePointOf(stateAt(null))).toBeNull();
  });
});

describe('FigureHistory', () => {
  it("lists a run's points oldest first, from a time and up to a limit", () => {
    for (const minute of [10, 0, 5, 15]) archive.figures.record('run-1', stateAt(minute * 60_000));
    const times = (options = {}) =>
      archive.figures.list('run-1', options).map((point) => point.eventTimeMs / 60_000);
    expect(times()).toEqual([0, 5, 10, 15]);
    expect(times({ sinceMs: 5 * 60_000 })).toEqual([5, 10, 15]);
    expect(times({ limit: 2 })).toEqual([0, 5]);
    expect(archive.figures.list('another-run')).toEqual([]);
  });

  it('keeps one point per event time: a replay rewrites it rather than adding a second', () => {
    archive.figures.record('run-1', stateAt(60_000, { surfaceStressMPa: 0.1 }));
    archive.figures.record('run-1', stateAt(60_000, { surfaceStressMPa: 0.2 }));
    archive.figures.record('run-1', stateAt(null));
    expect(archive.figures.list('run-1').map((point) => point.surfaceStressMPa)).toEqual([0.2]);
  });

  it('refuses a point for a run the archive does not hold (foreign key)', () => {
    expect(() => archive.figures.record('no-such-run', stateAt(0))).toThrow(/FOREIGN KEY/);
  });
});
