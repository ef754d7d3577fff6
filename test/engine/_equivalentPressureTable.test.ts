import { describe, expect, it } from 'vitest';
import { exp2Linear } from '../../server/src/engine/_log2Linear.ts';
import { poreReferenceCurves } from '../../server/src/engine/_poreReferenceCurves.ts';
import { FINE_PASTE_CURVES } from './_scenarios.ts';

const curves = poreReferenceCurves(FINE_PASTE_CURVES);
const { table, equivalentPressure, equivalentTable } = curves;
const nodePressurePa = (node: number): number =>
  -exp2Linear(table.coordinateStart + node / table.inverseStep);

describe('createEquivalentPressureTable()', () => {
  it('atNode() is the curve (Coussy 2004) at nodes 1 and on', () => {
    for (const node of [1, 2, 100, 1000, table.nodeCount - 1]) {
      expect(equivalentTable.atNode(node)).toBe(
        equivalentPressure.fromLiquidPressure(nodePressurePa(node)),
      );
    }
  });

  it('atNode(0) lies on the line through the air entry (pi = p_ae) and node 1', () => {
    const position = table.airEntryPosition;
    const atOne = equivalentTable.atNode(1);
    const slope = atOne - equivalentTable.atNode(0);
    expect(equivalentTable.atNode(0) + position * slope).toBeCloseTo(table.airEntryPressurePa, 6);
  });

  it('atPressurePa() interpolates the nodes, is the pressure while saturated and the curve beyond the table', () => {
    const halfway = -exp2Linear(table.coordinateStart + 10.5 / table.inverseStep);
    const mean = (equivalentTable.atNode(10) + equivalentTable.atNode(11)) / 2;
    expect(equivalentTable.atPressurePa(halfway)).toBeCloseTo(mean, 9);
    expect(equivalentTable.atPressurePa(0.5 * table.airEntryPressurePa)).toBe(
      0.5 * table.airEntryPressurePa,
    );
    const beyond = 2 * table.driestPressurePa;
    expect(equivalentTable.atPressurePa(beyond)).toBe(
      equivalentPressure.fromLiquidPressure(beyond),
    );
  });
});
