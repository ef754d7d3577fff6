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
 *
 * The inverse look-ups ({@link pressureForSaturation}, {@link pressureOnSameSegment}) solve the
 * same interpolant for the pressure, so a water content found from them reads back to rounding.
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
  /** Pressure at the last node, Pa (< 0): the curves are flat beyond it. */
  readonly driestPressurePa: number;
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
    driestPressurePa: -exp2Linear(coordinateStart + (nodeCount - 1) / nodesPerUnit),
    nodeCount,
  };
}

/**
 * The pressure (Pa, < 0) at which the table's saturation interpolant equals `saturation`: the
 * segment holding it (binary search on the decreasing node saturations) solved for the position,
 * then p = -exp2Linear(v). For saturation above the last node's (the caller handles the flat part
 * beyond it); a saturation above node 0's extrapolates segment 0. The segment of `guessPa` (Pa) is
 * tried first: a remap after a change of temperature or refinement moves a cell's saturation very
 * little, so it holds the answer most of the time, without the search.
 */
export function pressureForSaturation(
  table: HydraulicTable,
  saturation: number,
  guessPa: number,
): number {
  const nodes = table.saturation;
  const { coordinateStart, inverseStep } = table;
  let low = 0; // nodes[low] >= saturation
  let high = table.nodeCount - 1; // nodes[high] < saturation
  if (guessPa < table.airEntryPressurePa) {
    const position = (log2Linear(-guessPa) - coordinateStart) * inverseStep;
    const node = position > 0 ? Math.floor(position) : 0;
    if (
      node < high &&
      (nodes[node] as number) >= saturation &&
      (nodes[node + 1] as number) < saturation
    ) {
      low = node;
      high = node + 1;
    }
  }
  while (high - low > 1) {
    const middle = (low + high) >> 1;
    if ((nodes[middle] as number) >= saturation) low = middle;
    else high = middle;
  }
  const s0 = nodes[low] as number;
  const s1 = nodes[low + 1] as number;
  const weight = s1 === s0 ? 0 : (saturation - s0) / (s1 - s0);
  return -exp2Linear(coordinateStart + (low + weight) / inverseStep);
}

/**
 * The pressure (Pa, < 0) at which the table's saturation interpolant equals `saturation` on the
 * segment that holds `previousPa` (Pa), or NaN when `previousPa` is not on a table segment (at or
 * above the air entry, beyond the last node) or that segment does not hold the saturation: the
 * position on the segment, then its pressure. {@link pressureForSaturation}'s answer (to rounding)
 * without its search, for a saturation a change of curves moved a few per mil.
 */
export function pressureOnSameSegment(
  table: HydraulicTable,
  saturation: number,
  previousPa: number,
): number {
  if (!(previousPa < table.airEntryPressurePa)) return Number.NaN;
  const { coordinateStart, inverseStep } = table;
  const position = (log2Linear(-previousPa) - coordinateStart) * inverseStep;
  if (!(position < table.nodeCount - 1)) return Number.NaN;
  const node = position > 0 ? Math.floor(position) : 0;
  const s0 = table.saturation[node] as number;
  const s1 = table.saturation[node + 1] as number;
  if (!(s1 < s0 && saturation <= s0 && saturation > s1)) return Number.NaN;
  const step = 1 / inverseStep;
  return -exp2Linear(coordinateStart + (node + (saturation - s0) / (s1 - s0)) * step);
}
