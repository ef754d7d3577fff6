/**
 * The equivalent pore pressure pi (Coussy 2004, Poromechanics, Wiley, chapter 6; physics.md
 * section 5) on the nodes of a hydraulic table (_hydraulicTable.ts), read like the saturation
 * beside it: linear in v = log2Linear(suction) between nodes, within 2e-6 of the curve
 * (test/engine/poreHydraulics.test.ts). Each node is computed the first time a look-up needs it
 * (all of them would cost 0.4 ms); node 0 lies on the line through the air entry (pi = p_ae) and
 * node 1, as the table's saturation does.
 */
import type { EquivalentPorePressureCurve } from '../physics/equivalentPorePressure.ts';
import { exp2Linear, log2Linear } from './_log2Linear.ts';
import { valueAtFirstNode, type HydraulicTable } from './_hydraulicTable.ts';

/** pi on a hydraulic table's nodes, at the table's reference surface tension. */
export interface EquivalentPressureTable {
  /** pi at node `node` (0 .. nodeCount - 1), Pa. */
  readonly atNode: (node: number) => number;
  /**
   * pi at liquid pressure `pressurePa` (Pa, at the table's reference surface tension), Pa: the
   * pressure itself while saturated, the curve beyond the last node, else the nodes interpolated.
   */
  readonly atPressurePa: (pressurePa: number) => number;
}

/** pi of `curve` on the nodes of `table` (built from the same retention curve), filled lazily. */
export function createEquivalentPressureTable(
  table: HydraulicTable,
  curve: EquivalentPorePressureCurve,
): EquivalentPressureTable {
  const { coordinateStart, inverseStep, airEntryPressurePa } = table;
  const lastNode = table.nodeCount - 1;
  const nodes = new Float64Array(table.nodeCount).fill(Number.NaN);
  const atNode = (node: number): number => {
    let value = nodes[node] as number;
    if (Number.isNaN(value)) {
      value =
        node === 0
          ? valueAtFirstNode(table.airEntryPosition, airEntryPressurePa, atNode(1))
          : curve.fromLiquidPressure(-exp2Linear(coordinateStart + node / inverseStep));
      nodes[node] = value;
    }
    return value;
  };
  const atPressurePa = (pressurePa: number): number => {
    if (!(pressurePa < airEntryPressurePa)) return curve.fromLiquidPressure(pressurePa);
    const position = (log2Linear(-pressurePa) - coordinateStart) * inverseStep;
    if (!(position < lastNode)) return curve.fromLiquidPressure(pressurePa);
    const node = position > 0 ? Math.floor(position) : 0;
    const below = atNode(node);
    return below + (position - node) * (atNode(node + 1) - below);
  };
  return { atNode, atPressurePa };
}
