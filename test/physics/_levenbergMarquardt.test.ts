import { describe, expect, it } from 'vitest';
import {
  levenbergMarquardt,
  solveLinearSystem,
} from '../../server/src/physics/_levenbergMarquardt.ts';

describe('solveLinearSystem()', () => {
  it('solves a 3 x 3 system that needs pivoting (hand-checked: x = 1, 2, 3)', () => {
    const x = solveLinearSystem(
      [
        [0, 2, 1],
        [1, 1, 1],
        [2, 0, 3],
      ],
      [7, 6, 11],
    );
    expect(x[0]).toBeCloseTo(1, 12);
    expect(x[1]).toBeCloseTo(2, 12);
    expect(x[2]).toBeCloseTo(3, 12);
  });

  it('returns NaN for a singular matrix', () => {
    expect(
      solveLinearSystem(
        [
          [1, 2],
          [2, 4],
        ],
        [1, 2],
      ).every(Number.isNaN),
    ).toBe(true);
  });
});

describe('levenbergMarquardt()', () => {
  // Rosenbrock's function as least squares, r = (10 (y - x^2), 1 - x): minimum 0 at (1, 1),
  // the classic test of Levenberg-Marquardt (More, Garbow and Hillstrom 1981, problem 1).
  const rosenbrock = {
    residuals: ([x = 0, y = 0]: readonly number[]) => [10 * (y - x * x), 1 - x],
    jacobian: ([x = 0]: readonly number[]) => [
      [-20 * x, 10],
      [-1, 0],
    ],
  };

  it('finds the Rosenbrock minimum from the standard start (-1.2, 1)', () => {
    const solution = levenbergMarquardt(rosenbrock, [-1.2, 1]);
    expect(solution.converged).toBe(true);
    expect(solution.parameters[0]).toBeCloseTo(1, 6);
    expect(solution.parameters[1]).toBeCloseTo(1, 6);
    expect(solution.cost).toBeLessThan(1e-12);
  });

  it('rejects infeasible steps signalled by non-finite residuals and stays in the feasible set', () => {
    // Minimise (x - 2)^2 subject to x < 1 (signalled by Infinity): ends at the bound from below.
    const solution = levenbergMarquardt(
      {
        residuals: ([x = 0]) => (x < 1 ? [x - 2] : [Number.POSITIVE_INFINITY]),
        jacobian: () => [[1]],
      },
      [0],
    );
    expect(solution.parameters[0]).toBeLessThan(1);
    expect(solution.parameters[0]).toBeGreaterThan(0.99);
  });

  it('returns an infeasible start unchanged with infinite cost', () => {
    const solution = levenbergMarquardt(
      { residuals: () => [Number.NaN], jacobian: () => [[1]] },
      [3],
    );
    expect(solution).toEqual({
      parameters: [3],
      cost: Number.POSITIVE_INFINITY,
      iterations: 0,
      converged: false,
    });
  });
});
