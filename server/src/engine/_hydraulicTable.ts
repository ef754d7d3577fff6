/**
 * A fast form of the retention and permeability curves for the transport solver's inner loop:
 * the physics library's curves (retention.ts, capillaryBundlePermeability.ts) sampled once on a
 * uniform grid in u = ln(suction / Pa) and interpolated linearly, with no allocation per call.
 * The capacity is the slope of the same interpolant, so Newton and the mass balance see one
 * consistent curve; the test in test/engine/hydraulicTable.test.ts bounds the difference from the
 * library's curves.
 */
import type { CapillaryBundlePermeability } from '../physics/capillaryBundlePermeability.ts';
import type { PoreRetentionCurve } from '../physics/retention.ts';

/** Largest suction tabulated, Pa (about 0.0005 relative humidity at 20 degC; beyond: constant). */
const MAX_SUCTION_PA = 1e9;

/** Curves on a uniform grid in ln(suction), at the curve's reference surface tension. */
export interface HydraulicTable {
  /** Air-entry pressure, Pa (< 0): saturated above it. */
  readonly airEntryPressurePa: number;
  readonly logSuctionStart: number;
  readonly inverseStep: number;
  /** S at the nodes. */
  readonly saturation: Float64Array;
  /** k at the nodes, m2. */
  readonly permeabilityM2: Float64Array;
  /** k at saturation, m2. */
  readonly saturatedPermeabilityM2: number;
  readonly nodeCount: number;
}

/**
 * Samples `retention` and `permeability` at `nodeCount` points from the air entry to 1e9 Pa of
 * suction (default 4096 nodes, step about 0.003 in ln suction: our choice, see the test).
 */
export function buildHydraulicTable(
  retention: PoreRetentionCurve,
  permeability: CapillaryBundlePermeability,
  nodeCount = 4096,
): HydraulicTable {
  const airEntryPressurePa = retention.airEntryPressurePa;
  const start = Math.log(-airEntryPressurePa);
  const end = Math.log(MAX_SUCTION_PA);
  const step = (end - start) / (nodeCount - 1);
  const saturation = new Float64Array(nodeCount);
  const permeabilityM2 = new Float64Array(nodeCount);
  for (let j = 0; j < nodeCount; j += 1) {
    const pressure = j === 0 ? airEntryPressurePa : -Math.exp(start + j * step);
    saturation[j] = j === 0 ? 1 : retention.saturation(pressure);
    permeabilityM2[j] =
      j === 0
        ? permeability.saturatedPermeabilityM2
        : permeability.permeabilityAtPressureM2(pressure);
  }
  return {
    airEntryPressurePa,
    logSuctionStart: start,
    inverseStep: 1 / step,
    saturation,
    permeabilityM2,
    saturatedPermeabilityM2: permeability.saturatedPermeabilityM2,
    nodeCount,
  };
}
