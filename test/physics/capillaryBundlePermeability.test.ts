import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  capillaryBundlePermeability,
  squaredPoreDiameterIntegralM2,
} from '../../server/src/physics/capillaryBundlePermeability.ts';
import { retentionFromPoreSizes } from '../../server/src/physics/retention.ts';
import type { PoreSizeDistribution } from '../../server/src/physics/retentionCurve.ts';
import { poreStructureFixture } from './fixtures/poreStructureFixture.ts';

const { distributions, surfaceTensionNPerM: gamma } = poreStructureFixture;
const names = Object.keys(distributions) as (keyof typeof distributions)[];

// integral_0^S D(s)^2 ds from test/physics/fixtures/poreStructure.py: mpmath tanh-sinh in s
// (single log-normal mode, van Genuchten) or scipy quad against the density in ln D (mixture,
// table). Tolerance 1e-6 relative for the accurate form; the fast form's k_r to 1e-5 relative.
describe.each(names)('squaredPoreDiameterIntegralM2() for %s', (name) => {
  const fixture = distributions[name];
  const bundle = capillaryBundlePermeability(retentionFromPoreSizes(fixture.psd, gamma), {
    porosity: 0.15,
  });
  const full =
    fixture.squaredDiameterIntegral.find(([saturation]) => saturation === 1)?.[1] ?? Number.NaN;
  it.each(fixture.squaredDiameterIntegral)(
    'at S = %s agrees with the independent quadrature',
    (saturation, expectedM2) => {
      expect(
        Math.abs(squaredPoreDiameterIntegralM2(fixture.psd, saturation) / expectedM2 - 1),
      ).toBeLessThan(1e-6);
      expect(
        Math.abs(bundle.relativePermeability(saturation) / (expectedM2 / full) - 1),
      ).toBeLessThan(1e-5);
    },
  );
});

describe('capillaryBundlePermeability()', () => {
  it.each(names)(
    'fast k_r stays within 1e-6 of the accurate form for S >= 0.01, %s (stated accuracy)',
    (name) => {
      const psd = distributions[name].psd;
      const bundle = capillaryBundlePermeability(retentionFromPoreSizes(psd, gamma), {
        porosity: 0.1,
      });
      const full = squaredPoreDiameterIntegralM2(psd, 1);
      for (let i = 1; i < 400; i++) {
        const saturation = 0.01 + 0.99 * (i / 400) ** 1.5;
        const accurate = squaredPoreDiameterIntegralM2(psd, saturation) / full;
        expect(Math.abs(bundle.relativePermeability(saturation) / accurate - 1)).toBeLessThan(1e-6);
      }
    },
  );

  // Hagen-Poiseuille for one tube size D0: k = phi D0^2 / (32 tau) (a bundle of parallel tubes;
  // e.g. Dullien 1992, Porous Media, ch. 3). A log-normal mode with gsd 1.001 stands for it; the
  // spread changes D^2 by e^{2 sigma^2} ~ 1 + 2e-6.
  it('gives phi D0^2 / (32 tau) for a single pore size', () => {
    const psd: PoreSizeDistribution = {
      kind: 'lognormal',
      modes: [{ medianDiameterM: 1e-7, geometricSd: 1.001, volumeFraction: 1 }],
    };
    const bundle = capillaryBundlePermeability(retentionFromPoreSizes(psd, gamma), {
      porosity: 0.12,
      tortuosity: 2.5,
    });
    expect(bundle.saturatedPermeabilityM2 / ((0.12 * 1e-14) / (32 * 2.5))).toBeCloseTo(1, 4);
    // With one size every filled fraction carries its share: k_r(S) = S (the 0.1 % spread of D
    // moves k_r(0.4) by about 2 x 0.1 % x 0.4 x 1.4; tolerance 0.5 %).
    expect(Math.abs(bundle.relativePermeability(0.4) / 0.4 - 1)).toBeLessThan(0.005);
  });

  // Log-normal moment E[D^2] = D50^2 exp(2 ln^2 sg) (Aitchison and Brown 1957, The Lognormal
  // Distribution); truncated at D_max the share kept is Phi(z_max - 2 ln sg) / F(D_max), with
  // z_max = ln(D_max / D50) / ln sg from the scipy fixture. Tolerance 1e-9 relative.
  it('gives phi D50^2 exp(2 ln^2 sg) / 32 for a log-normal mode, truncated at D_max', () => {
    const fixture = distributions.mortarLogNormal;
    const bundle = capillaryBundlePermeability(retentionFromPoreSizes(fixture.psd, gamma), {
      porosity: 0.1,
    });
    const sigma = Math.log(2.5);
    const zMax = Math.log((fixture.maxDiameterM ?? Number.NaN) / 3e-8) / sigma;
    const untruncated = (0.1 * 3e-8 ** 2 * Math.exp(2 * sigma ** 2)) / 32;
    const kept = normalCdf(zMax - 2 * sigma, 0, 1) / (1 - 1e-6);
    expect(Math.abs(bundle.bundleSaturatedPermeabilityM2 / (untruncated * kept) - 1)).toBeLessThan(
      1e-9,
    );
    expect(1 - kept).toBeLessThan(2e-3);
  });

  it('rescales to a measured saturated permeability and keeps the shape', () => {
    const retention = retentionFromPoreSizes(distributions.mixtureLogNormal.psd, gamma);
    const own = capillaryBundlePermeability(retention, { porosity: 0.1 });
    const measured = capillaryBundlePermeability(retention, {
      porosity: 0.1,
      saturatedPermeabilityM2: 1e-19,
    });
    expect(measured.saturatedPermeabilityM2).toBe(1e-19);
    expect(measured.bundleSaturatedPermeabilityM2).toBe(own.saturatedPermeabilityM2);
    for (const saturation of [0.2, 0.5, 0.9]) {
      expect(measured.permeabilityM2(saturation) / 1e-19).toBeCloseTo(
        own.relativePermeability(saturation),
        12,
      );
    }
  });

  it('has the documented edge values and agrees between k(S) and k(p)', () => {
    const retention = retentionFromPoreSizes(distributions.porosimetryTable.psd, gamma);
    const bundle = capillaryBundlePermeability(retention, { porosity: 0.1, tortuosity: 3 });
    expect(bundle.permeabilityM2(0)).toBe(0);
    expect(bundle.permeabilityM2(1)).toBe(bundle.saturatedPermeabilityM2);
    expect(bundle.permeabilityM2(Number.NaN)).toBeNaN();
    expect(bundle.permeabilityAtPressureM2(0)).toBe(bundle.saturatedPermeabilityM2);
    for (const saturation of [0.1, 0.5, 0.9]) {
      const pressurePa = retention.liquidPressure(saturation);
      expect(
        bundle.permeabilityAtPressureM2(pressurePa) / bundle.permeabilityM2(saturation),
      ).toBeCloseTo(1, 6);
    }
  });

  it('k(S) is non-decreasing in S (fast-check)', () => {
    const bundles = names.map((name) =>
      capillaryBundlePermeability(retentionFromPoreSizes(distributions[name].psd, gamma), {
        porosity: 0.1,
      }),
    );
    fc.assert(
      fc.property(
        fc.constantFrom(...bundles),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (bundle, first, second) => {
          const [low, high] = first <= second ? [first, second] : [second, first];
          const kLow = bundle.permeabilityM2(low);
          const kHigh = bundle.permeabilityM2(high);
          return kLow <= kHigh || kLow <= kHigh * (1 + 1e-12);
        },
      ),
    );
  });
});
