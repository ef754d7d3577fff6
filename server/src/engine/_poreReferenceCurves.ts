/**
 * A material's hydraulic curves at the reference temperature with its pores as placed (fresh),
 * from its pore-size distribution (physics.md sections 2, 3 and 5): retention from Young-Laplace
 * drainage, capillary-bundle permeability, equivalent pore pressure, and their tables for the
 * transport solver. poreHydraulics.ts scales them per cell for temperature and pore refinement.
 * They are shared by every model of the same pores (_sharedByParameters.ts): built once per
 * process, about 1.4 ms, and the lazily filled nodes of pi are filled once.
 */
import { retentionFromPoreSizes, type PoreRetentionCurve } from '../physics/retention.ts';
import {
  equivalentPorePressureCurve,
  type EquivalentPorePressureCurve,
} from '../physics/equivalentPorePressure.ts';
import type { PoreSizeDistribution } from '../physics/retentionCurve.ts';
import { waterSurfaceTensionNPerM } from '../physics/waterSurfaceTension.ts';
import {
  capillaryBundlePermeability,
  type CapillaryBundlePermeability,
} from '../physics/capillaryBundlePermeability.ts';
import { buildHydraulicTable, type HydraulicTable } from './_hydraulicTable.ts';
import {
  createEquivalentPressureTable,
  type EquivalentPressureTable,
} from './_equivalentPressureTable.ts';
import { sharedByParameters } from './_sharedByParameters.ts';

/** What the curves depend on (the fields of PoreHydraulicsOptions of the same names). */
export interface PoreReferenceParameters {
  /** Pore-size distribution of the material as placed (fresh). */
  poreSizes: PoreSizeDistribution;
  /** Porosity phi, 0..1. */
  porosity: number;
  /** Tortuosity tau >= 1 of the capillary bundle. */
  tortuosity: number;
  /** Measured saturated permeability, m2; undefined: the bundle's own k(1). */
  saturatedPermeabilityM2: number | undefined;
  /** Reference temperature of the curves, K. */
  referenceTemperatureK: number;
}

/** The curves at the reference temperature, fresh pores. */
export interface PoreReferenceCurves {
  /** Surface tension of water at the reference temperature, N/m. */
  readonly referenceTensionNPerM: number;
  readonly retention: PoreRetentionCurve;
  readonly permeability: CapillaryBundlePermeability;
  readonly equivalentPressure: EquivalentPorePressureCurve;
  /** Retention and permeability tabulated (_hydraulicTable.ts). */
  readonly table: HydraulicTable;
  /** Equivalent pore pressure on the table's nodes (_equivalentPressureTable.ts). */
  readonly equivalentTable: EquivalentPressureTable;
}

/** The curves of `parameters`, shared with every earlier call for the same parameters. */
export function poreReferenceCurves(parameters: PoreReferenceParameters): PoreReferenceCurves {
  const { poreSizes, porosity, tortuosity, saturatedPermeabilityM2 } = parameters;
  const referenceK = parameters.referenceTemperatureK;
  return sharedByParameters(
    'pore-hydraulics',
    {
      poreSizes,
      porosity,
      tortuosity,
      saturatedPermeabilityM2: saturatedPermeabilityM2 ?? null,
      referenceK,
    },
    () => {
      const referenceTensionNPerM = waterSurfaceTensionNPerM(referenceK);
      const retention = retentionFromPoreSizes(poreSizes, referenceTensionNPerM);
      const permeability = capillaryBundlePermeability(retention, {
        porosity,
        tortuosity,
        ...(saturatedPermeabilityM2 === undefined ? {} : { saturatedPermeabilityM2 }),
      });
      const table = buildHydraulicTable(retention, permeability);
      const equivalentPressure = equivalentPorePressureCurve(retention);
      return {
        referenceTensionNPerM,
        retention,
        permeability,
        equivalentPressure,
        table,
        equivalentTable: createEquivalentPressureTable(table, equivalentPressure),
      };
    },
  );
}
