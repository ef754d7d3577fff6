/**
 * A fast form of the retention and permeability curves for the transport solver's inner loop:
 * the physics library's curves (retention.ts, capillaryBundlePermeability.ts) sampled once on a
 * uniform grid in v = log2Linear(suction / Pa) (_log2Linear.ts: a piecewise-linear log2 read off
 * the number's bits, no Math.log in the loop) and interpolated linearly, with no allocation per
 * call. The nodes sit on multiples of 1/K, so every power of two of the suction is a node and
 * the interpolant is linear in suction inside each node interval. The capacity is the slope of
 * the same interpolant, so Newton and the mass balance see one consistent curve; the tests in
 * test/engine/poreHydraulics.test.ts bound the difference from the library's curves.
 *
 * The first node (index 0) is the multiple of 1/K nearest the air entry; its values are those of
 * the straight line through the air entry (S = 1, k = k_sat at position `airEntryPosition`, within
 * half a node of 0) and node 1, so that the interpolant meets the saturated branch exactly at the
 * air entry.
 */
import type { CapillaryBundlePermeability } from '../physics/capillaryBundlePermeability.ts';
import type { PoreRetentionCurve } from '../physics/retention.ts';
import { exp2Linear, log2Linear } from './_log2Linear.ts';

/** Largest suction tabulated, Pa (about 0.0005 relative humidity at 20 degC; beyond: constant). */
const MAX_SUCTION_PA = 1e9;

/** Curves on a uniform grid in v = log2Linear(suction), at the curve's reference surface tension. */
export interface HydraulicTable {
  /** Air-entry pressure, Pa (< 0): saturated above it. */
  readonly airEntryPressurePa: number;
  /** v of node 0 (a multiple of 1 / nodesPerUnit). */
  readonly coordinateStart: number;
  /** Nodes per unit of v (K): position = (v - coordinateStart) * K. */
  readonly inverseStep: number;
  /** Position of the air entry, (v_ae - coordinateStart) K, in [-0.5, 0.5]. */
  readonly airEntryPosition: number;
  /** S at the nodes. */
  readonly saturation: Float64Array;
  /** k at the nodes, m2. */
  readonly permeabilityM2: Float64Array;
  /** k at saturation, m2. */
  readonly saturatedPermeabilityM2: number;
  readonly nodeCount: number;
}

/** Value at node 0 of the line through (airEntryPosition, atAirEntry) and (1, atNodeOne). */
export function valueAtFirstNode(
  airEntryPosition: number,
  atAirEntry: number,
  atNodeOne: number,
): number {
  return (atAirEntry - airEntryPosition * atNodeOne) / (1 - airEntryPosition);
}

/**
 * Samples `retention` and `permeability` from the air entry to 1e9 Pa of suction at
 * `nodesPerUnit` nodes per unit of log2Linear(suction), i.e. per doubling of the suction
 * (default 256: steps of 0.2 to 0.4 % of the suction, our choice, see the tests).
 */
export function buildHydraulicTable(
  retention: PoreRetentionCurve,
  permeability: CapillaryBundlePermeability,
  nodesPerUnit = 256,
): HydraulicTable {
  const airEntryPressurePa = retention.airEntryPressurePa;
  const airEntryCoordinate = log2Linear(-airEntryPressurePa);
  const coordinateStart = Math.round(airEntryCoordinate * nodesPerUnit) / nodesPerUnit;
  const airEntryPosition = (airEntryCoordinate - coordinateStart) * nodesPerUnit;
  const nodeCount = Math.ceil((log2Linear(MAX_SUCTION_PA) - coordinateStart) * nodesPerUnit) + 1;
  const saturation = new Float64Array(nodeCount);
  const permeabilityM2 = new Float64Array(nodeCount);
  for (let j = 1; j < nodeCount; j += 1) {
    const pressure = -exp2Linear(coordinateStart + j / nodesPerUnit);
    saturation[j] = retention.saturation(pressure);
    permeabilityM2[j] = permeability.permeabilityAtPressureM2(pressure);
  }
  saturation[0] = valueAtFirstNode(airEntryPosition, 1, saturation[1] as number);
  permeabilityM2[0] = valueAtFirstNode(
    airEntryPosition,
    permeability.saturatedPermeabilityM2,
    permeabilityM2[1] as number,
  );
  return {
    airEntryPressurePa,
    coordinateStart,
    inverseStep: nodesPerUnit,
    airEntryPosition,
    saturation,
    permeabilityM2,
    saturatedPermeabilityM2: permeability.saturatedPermeabilityM2,
    nodeCount,
  };
}
