import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type AnalysisMethod,
  assimilate,
  type Observation,
  type ObservationOperator,
} from '../../server/src/calibration/assimilate.ts';
import type { Ensemble } from '../../server/src/calibration/ensemble.ts';
import { createEnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';
import {
  defaultParameterSpecs,
  drawInitialParameters,
  type ParameterSpec,
} from '../../server/src/calibration/parameterPrior.ts';

const methods: { name: string; method: AnalysisMethod }[] = [
  { name: 'ETKF', method: { kind: 'etkf' } },
  { name: 'serial EnSRF', method: { kind: 'serial-ensrf', localisation: null } },
];

// Six members, four state entries built so that their perturbations are (sample) orthogonal or
// correlated on purpose: entry 0 is what probe A sees, entry 1 is uncorrelated with it, entry 2
// is what probe B sees (also uncorrelated with A), entry 3 = entry 0 + entry 1 (correlated with A).
const perturbations = [
  [1, -1, 1, -1, 0, 0],
  [1, 1, -1, -1, 0, 0],
  [0, 0, 0, 0, 1, -1],
  [2, 0, 0, -2, 0, 0],
];
const means = [0.9, 0.8, 0.7, 1.7];
const noSpecs: ParameterSpec[] = [];
const layout = { depthM: Float64Array.from([0.005, 0.01, 0.05, 0.005]) };
const operator: ObservationOperator = {
  predict: (member, observations) =>
    Float64Array.from(observations, (o) =>
      o.id === 'A' ? (member.state[0] ?? NaN) : (member.state[2] ?? NaN),
    ),
};

function handMadeEnsemble(): Ensemble {
  const members = Array.from({ length: 6 }, (_, k) => ({
    state: Float64Array.from(means, (mean, i) => mean + 0.01 * (perturbations[i]?.[k] ?? 0)),
    parameters: new Float64Array(0),
    carried: null,
  }));
  return { members, random: createEnsembleRandom(1), timeS: 0, analysisCount: 0 };
}

const probeA: Observation = { id: 'A', value: 0.85, errorSd: 0.02, depthM: 0.005 };
const probeB: Observation = { id: 'B', value: 0.75, errorSd: 0.02, depthM: 0.05 };

describe.each(methods)('assimilate() with missing observations ($name)', ({ method }) => {
  const options = { method, inflation: { kind: 'none' } as const };

  it('treats a missing reading (NaN) exactly as an absent one', () => {
    const prior = handMadeEnsemble();
    const withMissing = assimilate(
      prior,
      [probeA, { ...probeB, value: Number.NaN }],
      operator,
      noSpecs,
      layout,
      options,
    );
    const onlyA = assimilate(prior, [probeA], operator, noSpecs, layout, options);
    expect(withMissing.ensemble.members).toEqual(onlyA.ensemble.members);
    expect(withMissing.diagnostics.skipped).toEqual([{ id: 'B', reason: 'missing value' }]);
    expect(withMissing.diagnostics.usedIds).toEqual(['A']);
  });

  it('changes the unobserved part only through its correlation with the reporting probe', () => {
    const prior = handMadeEnsemble();
    const { ensemble } = assimilate(prior, [probeA], operator, noSpecs, layout, options);
    ensemble.members.forEach((member, k) => {
      const before = prior.members[k]?.state ?? new Float64Array(4);
      expect(member.state[0]).not.toBeCloseTo(before[0] ?? NaN, 6); // observed: moves
      expect(Math.abs((member.state[1] ?? NaN) - (before[1] ?? NaN))).toBeLessThan(1e-14); // uncorrelated
      expect(Math.abs((member.state[2] ?? NaN) - (before[2] ?? NaN))).toBeLessThan(1e-14); // B's, uncorrelated
      expect(member.state[3]).not.toBeCloseTo(before[3] ?? NaN, 6); // correlated with A: moves
    });
  });

  it('returns the ensemble unchanged when no probe reported', () => {
    const prior = handMadeEnsemble();
    const result = assimilate(
      prior,
      [{ ...probeA, value: Number.NaN }],
      operator,
      noSpecs,
      layout,
      options,
    );
    expect(result.ensemble).toBe(prior);
    expect(assimilate(prior, [], operator, noSpecs, layout, options).ensemble).toBe(prior);
  });

  it('skips an observation a member cannot predict, and one with an invalid error', () => {
    const prior = handMadeEnsemble();
    const blind: ObservationOperator = {
      predict: (member, observations) => {
        const values = operator.predict(member, observations);
        return values.map((value, j) =>
          observations[j]?.id === 'B' && member === prior.members[2] ? NaN : value,
        );
      },
    };
    const result = assimilate(
      prior,
      [probeA, probeB, { ...probeA, id: 'C', errorSd: 0 }],
      blind,
      noSpecs,
      layout,
      options,
    );
    expect(result.diagnostics.usedIds).toEqual(['A']);
    expect(result.diagnostics.skipped).toEqual([
      { id: 'C', reason: 'invalid error' },
      { id: 'B', reason: 'non-finite prediction' },
    ]);
  });
});

describe('assimilate() with a non-finite entry', () => {
  it.each(methods)('$name leaves that entry as it was and updates the others', ({ method }) => {
    const prior = handMadeEnsemble();
    const broken = prior.members.map((member, k) => {
      const state = member.state.slice();
      if (k === 2) state[1] = Number.NaN;
      return { ...member, state };
    });
    const result = assimilate({ ...prior, members: broken }, [probeA], operator, noSpecs, layout, {
      method,
      inflation: { kind: 'none' },
    });
    expect(result.diagnostics.frozenRows).toEqual([1]);
    result.ensemble.members.forEach((member, k) => {
      expect(member.state[1]).toEqual(broken[k]?.state[1]);
      expect(Number.isFinite(member.state[0])).toBe(true);
      expect(member.state[0]).not.toBeCloseTo(broken[k]?.state[0] ?? NaN, 6);
    });
  });
});

describe('assimilate() with depth localisation (serial EnSRF, Gaspari-Cohn)', () => {
  it('leaves correlated entries beyond twice the half-width untouched, nearby ones fully updated', () => {
    // Entries 0 and 3 both correlate with probe A; with c = 5 mm an entry at 50 mm depth is
    // 45 mm from the probe (> 2c: weight 0), one at the probe's depth has weight 1.
    const prior = handMadeEnsemble();
    const deep = { depthM: Float64Array.from([0.005, 0.01, 0.05, 0.05]) };
    const localised = assimilate(prior, [probeA], operator, noSpecs, deep, {
      method: { kind: 'serial-ensrf', localisation: { halfWidthM: 0.005 } },
      inflation: { kind: 'none' },
    }).ensemble;
    const global = assimilate(prior, [probeA], operator, noSpecs, deep, {
      method: { kind: 'serial-ensrf', localisation: null },
      inflation: { kind: 'none' },
    }).ensemble;
    localised.members.forEach((member, k) => {
      expect(member.state[0]).toBe(global.members[k]?.state[0]);
      expect(member.state[3]).toBe(prior.members[k]?.state[3]);
      expect(global.members[k]?.state[3]).not.toBe(prior.members[k]?.state[3]);
    });
  });
});

describe('assimilate() keeps every parameter physical under any update', () => {
  // Property (fast-check): whatever the ensemble and however wild the observations, multipliers
  // stay positive and finite, bounded parameters strictly inside their bounds.
  const specs = defaultParameterSpecs(['P1']);
  const weird: ObservationOperator = {
    predict: (member, observations) =>
      Float64Array.from(observations, (_, j) => {
        const [k = NaN, e = NaN, c = NaN, w = NaN, b = NaN] = member.parameters;
        return j === 0 ? Math.log(k) + 3 * e * (1 - c) + w + b : c * c - w + 0.1 * Math.sin(40 * e);
      }),
  };
  const outOfBounds = (values: Float64Array, all: readonly ParameterSpec[]) =>
    all.some((spec, j) => {
      const x = values[j] ?? NaN;
      if (!Number.isFinite(x)) return true;
      if (spec.transform.kind === 'log') return !(x > 0);
      if (spec.transform.kind === 'logit')
        return !(x > spec.transform.lower && x < spec.transform.upper);
      return false;
    });

  it.each(methods)('$name', ({ method }) => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 10_000 }),
        fc.integer({ min: 2, max: 12 }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.double({ min: 1e-9, max: 10, noNaN: true }),
        fc.double({ min: 1, max: 20, noNaN: true }),
        (seed, memberCount, valueA, valueB, errorSd, priorScale) => {
          const wide = specs.map((spec) => ({ ...spec, priorSd: spec.priorSd * priorScale }));
          const random = createEnsembleRandom(seed);
          const members = drawInitialParameters(wide, memberCount, random).map((parameters) => ({
            state: Float64Array.of(0.9),
            parameters,
            carried: null,
          }));
          const prior: Ensemble = { members, random, timeS: 0, analysisCount: 0 };
          const observations = [
            { id: 'A', value: valueA, errorSd, depthM: 0.01 },
            { id: 'B', value: valueB, errorSd, depthM: 0.02 },
          ];
          const { ensemble } = assimilate(
            prior,
            observations,
            weird,
            specs,
            { depthM: Float64Array.of(0.01) },
            { method },
          );
          return ensemble.members.every((member) => !outOfBounds(member.parameters, specs));
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('assimilate() does not consume random numbers', () => {
  it('leaves the generator where it was (the analysis is deterministic)', () => {
    const prior = handMadeEnsemble();
    const before = prior.random.snapshot();
    assimilate(prior, [probeA, probeB], operator, noSpecs, layout);
    expect(prior.random.snapshot()).toEqual(before);
  });
});
