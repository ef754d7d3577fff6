import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  pressureForSaturation,
  pressureOnSameSegment,
  type HydraulicTable,
} from '../../server/src/engine/_hydraulicTable.ts';
import { log2Linear } from '../../server/src/engine/_log2Linear.ts';
import { poreReferenceCurves } from '../../server/src/engine/_poreReferenceCurves.ts';
import { FINE_PASTE_CURVES } from './_scenarios.ts';

const { table } = poreReferenceCurves(FINE_PASTE_CURVES);
const lastNode = table.nodeCount - 1;

/** The forward read the inverse must undo: S interpolated linearly in v between nodes. */
function saturationOf(tableToRead: HydraulicTable, pressurePa: number): number {
  const position =
    (log2Linear(-pressurePa) - tableToRead.coordinateStart) * tableToRead.inverseStep;
  const node = Math.floor(position);
  const s0 = tableToRead.saturation[node] as number;
  return s0 + (position - node) * ((tableToRead.saturation[node + 1] as number) - s0);
}

/** A suction on the table: from just past the air entry to just before the last node, Pa. */
const tabulatedSuction = fc.double({
  min: Math.log10(-table.airEntryPressurePa) + 0.01,
  max: 8.9,
  noNaN: true,
});

describe('pressureForSaturation()', () => {
  it('inverts the saturation interpolant, and the guess changes no bit (property)', () => {
    fc.assert(
      fc.property(tabulatedSuction, fc.double({ min: 1, max: 9.5, noNaN: true }), (log, guess) => {
        const pressure = -(10 ** log);
        const saturation = saturationOf(table, pressure);
        const found = pressureForSaturation(table, saturation, pressure);
        expect(Math.abs(saturationOf(table, found) - saturation)).toBeLessThan(1e-15);
        expect(Math.abs(found / pressure - 1)).toBeLessThan(1e-10);
        // The guess only picks the first segment tried: the one found is the same.
        expect(pressureForSaturation(table, saturation, -(10 ** guess))).toBe(found);
        expect(pressureForSaturation(table, saturation, 0)).toBe(found);
      }),
      { numRuns: 300 },
    );
  });

  it('gives the pressure of the node itself for a node saturation', () => {
    for (const node of [1, 7, 300, lastNode - 1]) {
      const found = pressureForSaturation(table, table.saturation[node] as number, -1e5);
      const position = (log2Linear(-found) - table.coordinateStart) * table.inverseStep;
      expect(Math.abs(position - node)).toBeLessThan(1e-9);
    }
  });
});

describe('pressureOnSameSegment()', () => {
  it("gives pressureForSaturation()'s answer when the saturation stays on the segment, NaN when it leaves it (property)", () => {
    fc.assert(
      fc.property(
        tabulatedSuction,
        fc.double({ min: -0.02, max: 0.02, noNaN: true }),
        (log, change) => {
          const previousPa = -(10 ** log);
          const saturation = saturationOf(table, previousPa) * (1 + change);
          const onSegment = pressureOnSameSegment(table, saturation, previousPa);
          const searched = pressureForSaturation(table, saturation, -1e6);
          const position = (log2Linear(-previousPa) - table.coordinateStart) * table.inverseStep;
          const node = Math.floor(position);
          const stays =
            saturation <= (table.saturation[node] as number) &&
            saturation > (table.saturation[node + 1] as number);
          // The same segment and position; K = 256 is a power of two, so its step 1 / K is exact
          // and the two forms of the position round alike: the same bits.
          if (stays) expect(onSegment).toBe(searched);
          else expect(onSegment).toBeNaN();
        },
      ),
      { numRuns: 300 },
    );
  });

  it('is NaN from a saturated pressure or one beyond the last node', () => {
    expect(pressureOnSameSegment(table, 0.99, table.airEntryPressurePa)).toBeNaN();
    expect(pressureOnSameSegment(table, 0.99, 1e3)).toBeNaN();
    const beyond = table.driestPressurePa * 2;
    expect(pressureOnSameSegment(table, table.saturation[lastNode] as number, beyond)).toBeNaN();
  });
});

describe('buildHydraulicTable()', () => {
  it('sets driestPressurePa to the last node, at 1e9 Pa of suction or just beyond', () => {
    const position =
      (log2Linear(-table.driestPressurePa) - table.coordinateStart) * table.inverseStep;
    expect(position).toBe(lastNode);
    expect(-table.driestPressurePa).toBeGreaterThanOrEqual(1e9);
    expect(-table.driestPressurePa).toBeLessThan(1e9 * (1 + 2 / table.inverseStep));
  });
});
