import { describe, expect, it } from 'vitest';
import { createEnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';
import {
  defaultParameterSpecs,
  drawInitialParameters,
  logitNormalPrior,
  logNormalPrior,
} from '../../server/src/calibration/parameterPrior.ts';
import { toAnalysisVariable } from '../../server/src/calibration/variableTransform.ts';

describe('defaultParameterSpecs()', () => {
  it('lists the parameters of physics.md section 8 and one bias per probe, each with an origin', () => {
    const specs = defaultParameterSpecs(['P10', 'P30']);
    expect(specs.map((spec) => spec.name)).toEqual([
      'permeabilityMultiplier',
      'evaporationExposureMultiplier',
      'curingEfficiency',
      'initialBleedFilmKgM2',
      'rhBias:P10',
      'rhBias:P30',
    ]);
    expect(specs.map((spec) => spec.transform.kind)).toEqual([
      'log',
      'log',
      'logit',
      'logit',
      'identity',
      'identity',
    ]);
    for (const spec of specs) {
      expect(spec.priorSd).toBeGreaterThan(0);
      expect(spec.origin.length).toBeGreaterThan(0);
    }
  });
});

describe('logNormalPrior() and logitNormalPrior()', () => {
  it('put the prior mean of the analysis variable at the transformed median', () => {
    const multiplier = logNormalPrior('m', 2, 3, 'test');
    expect(multiplier.priorMean).toBeCloseTo(Math.log(2), 14);
    expect(multiplier.priorSd).toBeCloseTo(Math.log(3), 14);
    const film = logitNormalPrior('f', { lower: 0, upper: 2 }, 0.5, 1, 'test');
    expect(film.priorMean).toBeCloseTo(Math.log(0.25 / 0.75), 14);
  });
});

describe('drawInitialParameters()', () => {
  const specs = defaultParameterSpecs(['P10']);
  const memberCount = 4000;
  const members = drawInitialParameters(specs, memberCount, createEnsembleRandom(31));

  it('draws the prior: transformed mean and sd within 5 Monte Carlo standard errors', () => {
    // Standard errors of a normal sample: sd / sqrt(N) for the mean, sd / sqrt(2 N) for the sd.
    specs.forEach((spec, j) => {
      const z = members.map((values) => toAnalysisVariable(spec.transform, values[j] ?? NaN));
      const mean = z.reduce((sum, v) => sum + v, 0) / memberCount;
      const sd = Math.sqrt(z.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (memberCount - 1));
      expect(Math.abs(mean - spec.priorMean)).toBeLessThan(
        (5 * spec.priorSd) / Math.sqrt(memberCount),
      );
      expect(Math.abs(sd - spec.priorSd)).toBeLessThan(
        (5 * spec.priorSd) / Math.sqrt(2 * memberCount),
      );
    });
  });

  it('keeps bounded parameters inside their bounds and multipliers positive', () => {
    for (const values of members) {
      expect(values[0]).toBeGreaterThan(0);
      expect(values[1]).toBeGreaterThan(0);
      expect(values[2]).toBeGreaterThan(0);
      expect(values[2]).toBeLessThan(1);
      expect(values[3]).toBeGreaterThan(0);
      expect(values[3]).toBeLessThan(2);
    }
  });

  it('is repeatable from the seed', () => {
    expect(drawInitialParameters(specs, 8, createEnsembleRandom(5))).toEqual(
      drawInitialParameters(specs, 8, createEnsembleRandom(5)),
    );
  });
});
