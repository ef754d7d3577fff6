import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  dryingStressFromEquivalentPressure,
  dryingStressFromEquivalentPressureIncrement,
  dryingStressOnSaturationProfile,
  trapezoidWeightsM,
  type DryingStressMode,
} from '../../server/src/physics/dryingStress.ts';
import { equivalentPorePressureCurve } from '../../server/src/physics/equivalentPorePressure.ts';
import { retentionFromPoreSizes } from '../../server/src/physics/retention.ts';
import type { PoreSizeDistribution } from '../../server/src/physics/retentionCurve.ts';
import { poreStructureFixture } from './fixtures/poreStructureFixture.ts';

const {
  distributions,
  dryingStress: stressFixture,
  surfaceTensionNPerM: gamma,
} = poreStructureFixture;

/** Increasing depths (m) from sorted positive gaps. */
const depthsArbitrary = fc
  .array(fc.double({ min: 1e-5, max: 5e-3, noNaN: true }), { minLength: 2, maxLength: 40 })
  .map((gaps) =>
    gaps.reduce<number[]>((depths, gap) => [...depths, (depths.at(-1) ?? 0) + gap], [0]),
  );
const profileArbitrary = depthsArbitrary.chain((depths) =>
  fc.tuple(
    fc.constant(depths),
    fc.array(fc.double({ min: -2e7, max: 0, noNaN: true }), {
      minLength: depths.length,
      maxLength: depths.length,
    }),
  ),
);

function weightedSum(
  values: readonly number[],
  weights: readonly number[],
  factors?: readonly number[],
): number {
  return values.reduce(
    (sum, value, i) => sum + value * (weights[i] as number) * (factors?.[i] ?? 1),
    0,
  );
}

describe('dryingStressFromEquivalentPressure() balances (elastic plate, physics.md section 5)', () => {
  it('gives zero stress for a uniform profile in flat and curl modes (fast-check)', () => {
    fc.assert(
      fc.property(
        depthsArbitrary,
        fc.double({ min: -2e7, max: 0, noNaN: true }),
        fc.constantFrom<DryingStressMode>('flat', 'curl'),
        (depths, pi, mode) => {
          const result = dryingStressFromEquivalentPressure(
            { depthsM: depths },
            depths.map(() => pi),
            { mode },
          );
          return result.stressesPa.every(
            (stress) => Math.abs(stress) <= 1e-9 * Math.max(1, Math.abs(pi)),
          );
        },
      ),
    );
  });

  it('flat mode: sum of stress x weight is zero (no net force)', () => {
    fc.assert(
      fc.property(profileArbitrary, ([depths, pis]) => {
        const weights = trapezoidWeightsM(depths);
        const result = dryingStressFromEquivalentPressure({ depthsM: depths }, pis, {
          mode: 'flat',
        });
        return (
          Math.abs(weightedSum(result.stressesPa, weights)) <= 1e-9 * 2e7 * (depths.at(-1) ?? 1)
        );
      }),
    );
  });

  it('curl mode: zero net force and zero net moment', () => {
    fc.assert(
      fc.property(profileArbitrary, ([depths, pis]) => {
        const weights = trapezoidWeightsM(depths);
        const result = dryingStressFromEquivalentPressure({ depthsM: depths }, pis, {
          mode: 'curl',
        });
        const thickness = depths.at(-1) ?? 1;
        return (
          Math.abs(weightedSum(result.stressesPa, weights)) <= 1e-9 * 2e7 * thickness &&
          Math.abs(weightedSum(result.stressesPa, weights, depths)) <=
            1e-9 * 2e7 * thickness * thickness
        );
      }),
    );
  });

  it('curl mode: a linear pi profile is taken up by curvature alone (zero stress)', () => {
    const depths = [0, 0.001, 0.003, 0.006, 0.01, 0.02];
    const result = dryingStressFromEquivalentPressure(
      { depthsM: depths },
      depths.map((x) => -5e6 + 2e8 * x),
      { mode: 'curl' },
    );
    for (const stress of result.stressesPa) expect(Math.abs(stress)).toBeLessThan(1e-6);
  });

  it('restrained mode with R = 1 gives -C pi(x); with R = 0 it equals flat', () => {
    fc.assert(
      fc.property(profileArbitrary, ([depths, pis]) => {
        const full = dryingStressFromEquivalentPressure({ depthsM: depths }, pis, {
          mode: 'restrained',
          restraintDegree: 1,
        });
        const free = dryingStressFromEquivalentPressure({ depthsM: depths }, pis, {
          mode: 'restrained',
          restraintDegree: 0,
        });
        const flat = dryingStressFromEquivalentPressure({ depthsM: depths }, pis, { mode: 'flat' });
        return (
          full.stressesPa.every(
            (stress, i) => Math.abs(stress - -0.75 * (pis[i] as number)) <= 1e-6,
          ) &&
          free.stressesPa.every(
            (stress, i) => Math.abs(stress - (flat.stressesPa[i] as number)) <= 1e-6,
          )
        );
      }),
    );
  });

  it('uses C = b (1 - 2 nu) / (1 - nu) psi with defaults b = 1, nu = 0.2 (EN 1992-1-1 3.1.3), psi = 1', () => {
    const depths = [0, 0.01];
    expect(
      dryingStressFromEquivalentPressure({ depthsM: depths }, [-1e6, 0]).stressFactor,
    ).toBeCloseTo(0.75, 15);
    const custom = dryingStressFromEquivalentPressure({ depthsM: depths }, [-1e6, 0], {
      biotCoefficient: 0.8,
      poissonRatio: 0.25,
      relaxationFactor: 0.5,
    });
    expect(custom.stressFactor).toBeCloseTo((0.8 * 0.5 * 0.5) / 0.75, 15);
    // Tension positive: the drier surface (pi more negative than the mean) is in tension.
    expect(custom.surfaceStressPa).toBeGreaterThan(0);
  });

  it('accepts explicit cell widths for a cell-centred grid and balances with them', () => {
    const widths = [1e-4, 2e-4, 4e-4, 8e-4, 1.6e-3];
    const centres = widths.map(
      (width, i) => widths.slice(0, i).reduce((sum, w) => sum + w, 0) + width / 2,
    );
    const pis = [-8e6, -5e6, -2e6, -1e6, -1e6];
    const result = dryingStressFromEquivalentPressure({ depthsM: centres, weightsM: widths }, pis, {
      mode: 'curl',
    });
    expect(Math.abs(weightedSum(result.stressesPa, widths))).toBeLessThan(1e-6);
    expect(Math.abs(weightedSum(result.stressesPa, widths, centres))).toBeLessThan(1e-9);
    const mean = weightedSum(pis, widths) / widths.reduce((sum, w) => sum + w, 0);
    expect(result.meanEquivalentPressurePa).toBeCloseTo(mean, 6);
  });

  it('returns NaN surface stress for an empty profile', () => {
    expect(dryingStressFromEquivalentPressure({ depthsM: [] }, []).surfaceStressPa).toBeNaN();
  });
});

// Independent implementation: test/physics/fixtures/poreStructure.py computes pi(S) by mpmath
// quadrature of Coussy's definition and the stresses with numpy (weighted polyfit for curl) on
// the same steep profile (S 0.2 at the surface to 1 at 5 mm, 50 mm, graded nodes). The issue asks
// 2 %; checked here to 2 % of the largest stress magnitude at every node.
describe('dryingStressOnSaturationProfile() agrees with the Python implementation', () => {
  const curve = equivalentPorePressureCurve(
    retentionFromPoreSizes(distributions.mortarLogNormal.psd, gamma),
  );
  const profile = { depthsM: stressFixture.depthsM };
  it.each([
    ['flat', stressFixture.flatPa, { mode: 'flat' }],
    ['curl', stressFixture.curlPa, { mode: 'curl' }],
    [
      'restrained R = 0.5',
      stressFixture.restrainedHalfPa,
      { mode: 'restrained', restraintDegree: 0.5 },
    ],
    [
      'curl, b 0.8, nu 0.25, psi 0.6',
      stressFixture.curlBiot08Nu025Psi06Pa,
      { mode: 'curl', biotCoefficient: 0.8, poissonRatio: 0.25, relaxationFactor: 0.6 },
    ],
  ] as const)('%s', (_label, expected, options) => {
    const result = dryingStressOnSaturationProfile(
      profile,
      stressFixture.saturations,
      curve.fromSaturation,
      options,
    );
    const scale = Math.max(...expected.map(Math.abs));
    result.stressesPa.forEach((stress, i) =>
      expect(Math.abs(stress - (expected[i] as number))).toBeLessThan(0.02 * scale),
    );
    expect(Math.abs(result.surfaceStressPa / (expected[0] as number) - 1)).toBeLessThan(0.02);
  });
});

// Rule of thumb, common practice, not a published source (physics.md section 5): under the same
// steep drying profile a coarse-pored building stone stays near 0.1 MPa while a fine-pored
// cement mortar reaches several MPa, above its roughly 3 MPa tensile strength.
describe('drying stress rule of thumb: coarse stone versus fine mortar (common practice)', () => {
  const depths = Array.from({ length: 201 }, (_, i) => i * 2.5e-4); // 0 .. 50 mm
  const saturations = depths.map((depth) => Math.min(1, 0.2 + (0.8 * depth) / 5e-3));
  // Invented examples: stone with half its pore volume wider than 1 um and almost none below
  // 0.05 um (F(0.05 um) ~ 1e-5); mortar with 90 % of its pore volume below 0.1 um.
  const stone: PoreSizeDistribution = {
    kind: 'lognormal',
    modes: [{ medianDiameterM: 1e-6, geometricSd: 2, volumeFraction: 1 }],
  };
  const mortar = distributions.mortarLogNormal.psd;
  const surfaceStressMPa = (psd: PoreSizeDistribution, mode: DryingStressMode): number => {
    const curve = equivalentPorePressureCurve(retentionFromPoreSizes(psd, gamma));
    return (
      dryingStressOnSaturationProfile({ depthsM: depths }, saturations, curve.fromSaturation, {
        mode,
      }).surfaceStressPa / 1e6
    );
  };
  it.each(['flat', 'curl'] as const)('%s mode: stone below 0.3 MPa, mortar above 3 MPa', (mode) => {
    expect(surfaceStressMPa(stone, mode)).toBeGreaterThan(0.05);
    expect(surfaceStressMPa(stone, mode)).toBeLessThan(0.3);
    expect(surfaceStressMPa(mortar, mode)).toBeGreaterThan(3);
  });
});

describe('dryingStressFromEquivalentPressureIncrement() counts from a stress-free reference', () => {
  const modes = fc.constantFrom<DryingStressMode>('flat', 'curl', 'restrained');
  const twoProfiles = profileArbitrary.chain(([depths, now]) =>
    fc.tuple(
      fc.constant(depths),
      fc.constant(now),
      fc.array(fc.double({ min: -2e7, max: 0, noNaN: true }), {
        minLength: depths.length,
        maxLength: depths.length,
      }),
    ),
  );

  it('equals S[pi] - S[pi_ref] in every mode (linear in pi; fast-check)', () => {
    fc.assert(
      fc.property(twoProfiles, modes, ([depths, now, reference], mode) => {
        const options = { mode, restraintDegree: 0.6 };
        const increment = dryingStressFromEquivalentPressureIncrement(
          { depthsM: depths },
          now,
          reference,
          options,
        );
        const a = dryingStressFromEquivalentPressure({ depthsM: depths }, now, options);
        const b = dryingStressFromEquivalentPressure({ depthsM: depths }, reference, options);
        // Rounding of sums of up to 40 terms of 2e7 Pa: 1e-6 Pa absolute is far above it.
        return increment.stressesPa.every(
          (stress, i) =>
            Math.abs(stress - ((a.stressesPa[i] as number) - (b.stressesPa[i] as number))) < 1e-6,
        );
      }),
    );
  });

  it('gives zero stress everywhere when pi equals the reference (fast-check)', () => {
    fc.assert(
      fc.property(profileArbitrary, modes, ([depths, pi], mode) =>
        dryingStressFromEquivalentPressureIncrement({ depthsM: depths }, pi, pi, {
          mode,
        }).stressesPa.every((stress) => stress === 0),
      ),
    );
  });

  it('with an all-zero reference (saturated placement) equals the stress of pi itself', () => {
    fc.assert(
      fc.property(profileArbitrary, modes, ([depths, pi], mode) => {
        const zero = new Float64Array(depths.length);
        const increment = dryingStressFromEquivalentPressureIncrement(
          { depthsM: depths },
          pi,
          zero,
          {
            mode,
          },
        );
        const plain = dryingStressFromEquivalentPressure({ depthsM: depths }, pi, { mode });
        return increment.stressesPa.every((stress, i) => stress === plain.stressesPa[i]);
      }),
    );
  });

  it('a missing reference value gives NaN (no silent zero)', () => {
    const result = dryingStressFromEquivalentPressureIncrement(
      { depthsM: [0, 0.01, 0.02] },
      [-3e6, -1e6, 0],
      [-1e6, -1e6],
    );
    expect(result.surfaceStressPa).toBeNaN();
  });
});
