import { describe, expect, it } from 'vitest';
import { assimilate, type ObservationOperator } from '../../server/src/calibration/assimilate.ts';
import type { Ensemble } from '../../server/src/calibration/ensemble.ts';
import { createEnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';
import type { InflationOption } from '../../server/src/calibration/inflation.ts';
import { biasPrior } from '../../server/src/calibration/parameterPrior.ts';

// A static scalar parameter observed directly at every analysis, error variance R = 1. The
// square-root analysis updates the ensemble variance v exactly as the scalar Kalman filter,
// v_a = v_f R / (v_f + R), so each inflation has a closed-form recurrence:
// - none: v_K = 1 / (1 / v_0 + K / R), collapsing like R / K;
// - multiplicative rho (Anderson and Anderson 1999): v_f = rho v, fixed point v* = R (rho - 1) / rho;
// - RTPS alpha (Whitaker and Hamill 2012): sd <- sd_f ((1 - alpha) r + alpha), r = sqrt(R / (v_f + R)).
const specs = [biasPrior('theta', 1, 'test')];
const layout = { depthM: new Float64Array(0) };
const operator: ObservationOperator = {
  predict: (member) => Float64Array.of(member.parameters[0] ?? NaN),
};
const observation = { id: 'theta', value: 0, errorSd: 1, depthM: Number.NaN };

function priorEnsemble(): Ensemble {
  const random = createEnsembleRandom(17);
  const members = Array.from({ length: 16 }, () => ({
    state: new Float64Array(0),
    parameters: Float64Array.of(2 * random.normal()),
    carried: null,
  }));
  return { members, random, timeS: 0, analysisCount: 0 };
}

function variance(ensemble: Ensemble): number {
  const values = ensemble.members.map((member) => member.parameters[0] ?? NaN);
  const mean = values.reduce((sum, v) => sum + v, 0) / values.length;
  return values.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (values.length - 1);
}

function cycle(inflation: InflationOption, count: number): { initial: number; final: number } {
  let ensemble = priorEnsemble();
  const initial = variance(ensemble);
  for (let k = 0; k < count; k++) {
    ensemble = assimilate(ensemble, [observation], operator, specs, layout, { inflation }).ensemble;
  }
  return { initial, final: variance(ensemble) };
}

describe('assimilate() inflation over repeated analyses of a static parameter', () => {
  const cycles = 500;

  it('without inflation collapses like R / K (closed form, 1e-9 relative)', () => {
    const { initial, final } = cycle({ kind: 'none' }, cycles);
    const expected = 1 / (1 / initial + cycles / 1);
    expect(Math.abs(final - expected)).toBeLessThan(1e-9 * expected);
  });

  it.each([1.02, 1.1, 1.5])(
    'with multiplicative factor %s follows its recurrence towards R (rho - 1) / rho',
    (factor) => {
      const { initial, final } = cycle({ kind: 'multiplicative', factor }, cycles);
      let expected = initial;
      for (let k = 0; k < cycles; k++) expected = (factor * expected) / (factor * expected + 1);
      expect(Math.abs(final - expected)).toBeLessThan(1e-9 * expected);
      // Near the floor the error shrinks by 1/rho per analysis: within 1 % after 500 at rho = 1.02.
      const floor = (factor - 1) / factor;
      expect(Math.abs(final - floor)).toBeLessThan(0.01 * floor);
      expect(final).toBeGreaterThan(5 / cycles); // far above the uninflated R / K
    },
  );

  it('with relaxation to prior spread follows its recurrence and stays above no inflation', () => {
    const alpha = 0.5;
    const { initial, final } = cycle({ kind: 'relaxation-to-prior-spread', alpha }, cycles);
    let sd = Math.sqrt(initial);
    for (let k = 0; k < cycles; k++) sd *= (1 - alpha) * Math.sqrt(1 / (sd * sd + 1)) + alpha;
    expect(Math.abs(final - sd * sd)).toBeLessThan(1e-9 * sd * sd);
    expect(final).toBeGreaterThan(1.5 / cycles);
  });

  it('with relaxation to prior spread except the parameter collapses like R / K (closed form)', () => {
    const { initial, final } = cycle(
      { kind: 'relaxation-to-prior-spread', alpha: 0.5, exceptParameters: ['theta'] },
      cycles,
    );
    const expected = 1 / (1 / initial + cycles / 1);
    expect(Math.abs(final - expected)).toBeLessThan(1e-9 * expected);
  });

  it('relaxation to prior spread excepting another parameter still relaxes this one', () => {
    const relaxed = cycle({ kind: 'relaxation-to-prior-spread', alpha: 0.5 }, cycles);
    const other = cycle(
      { kind: 'relaxation-to-prior-spread', alpha: 0.5, exceptParameters: ['other'] },
      cycles,
    );
    expect(other.final).toBe(relaxed.final);
  });
});
