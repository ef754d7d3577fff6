import { describe, expect, it } from 'vitest';
import { poreReferenceCurves } from '../../server/src/engine/_poreReferenceCurves.ts';
import { waterSurfaceTensionNPerM } from '../../server/src/physics/waterSurfaceTension.ts';

const parameters = (referenceTemperatureK: number) => ({
  poreSizes: {
    kind: 'lognormal' as const,
    modes: [{ medianDiameterM: 0.05e-6, geometricSd: 3, volumeFraction: 1 }],
  },
  porosity: 0.15,
  tortuosity: 3,
  saturatedPermeabilityM2: undefined,
  referenceTemperatureK,
});

describe('poreReferenceCurves()', () => {
  it('shares one set of curves between equal parameters, and builds another for a new reference temperature', () => {
    const first = poreReferenceCurves(parameters(293.15));
    expect(poreReferenceCurves(parameters(293.15))).toBe(first);
    const warm = poreReferenceCurves(parameters(303.15));
    expect(warm).not.toBe(first);
    expect(warm.referenceTensionNPerM).toBe(waterSurfaceTensionNPerM(303.15));
    // Young-Laplace: the air entry scales with the surface tension.
    expect(warm.retention.airEntryPressurePa / first.retention.airEntryPressurePa).toBeCloseTo(
      warm.referenceTensionNPerM / first.referenceTensionNPerM,
      9,
    );
  });

  it('tabulates the retention curve it returns, from its air entry', () => {
    const { table, retention } = poreReferenceCurves(parameters(293.15));
    expect(table.airEntryPressurePa).toBe(retention.airEntryPressurePa);
    expect(table.saturatedPermeabilityM2).toBeGreaterThan(0);
  });
});
