/**
 * The run's measure log as the physics library's curing measures (physics.md 4), which the
 * element model applies at the surface while each is in place.
 */
import type { CuringMeasure, CuringMeasureKind } from '../physics/index.ts';
import type { MeasureEntry } from './types.ts';

const MEASURE_KINDS: readonly CuringMeasureKind[] = [
  'wet-covering',
  'ponding',
  'curing-compound',
  'fogging',
  'windbreak',
];

/**
 * Measure-log entries of a known kind as the physics library's measures; entries of another
 * kind are left out (the log may record notes the model cannot use). `endMs: null` (still in
 * place) becomes an open end.
 */
export function toCuringMeasures(entries: readonly MeasureEntry[]): CuringMeasure[] {
  return entries
    .filter((entry) => (MEASURE_KINDS as readonly string[]).includes(entry.kind))
    .map((entry) => ({
      kind: entry.kind as CuringMeasureKind,
      startMs: entry.startMs,
      ...(entry.endMs === null ? {} : { endMs: entry.endMs }),
      ...(entry.efficiency === undefined ? {} : { efficiency: entry.efficiency }),
      ...(entry.relativeHumidity === undefined ? {} : { relativeHumidity: entry.relativeHumidity }),
      ...(entry.windFactor === undefined ? {} : { windFactor: entry.windFactor }),
    }));
}
