/**
 * A lazily filled table of the hydration humidity factor (physics/hydration.ts) for the element
 * model's per-step loop. The factor of a cell is a function of its pore humidity h alone, and
 * h = exp(p / A(T)) (Kelvin), so it is tabulated against the deficit x = -p / A = -ln h: the loop
 * then needs neither the exp of Kelvin nor the fourth power of the factor (together about 100 ns
 * per cell and step on the machines we measure, more than the transport step spends on a cell).
 */
import { hydrationHumidityFactor, type HydrationHumidityOptions } from '../physics/hydration.ts';

/** Options of {@link createHumidityFactorTable}. */
export interface HumidityFactorTableOptions {
  /** Node spacing in x = -ln h, default 1e-4 (our choice; see the error bound below). */
  step?: number;
  /**
   * Largest tabulated x, default 0.7 (h about 0.5, where the factor is about 0.005 with the
   * default steepness); drier cells call the physics function itself.
   */
  maxDeficit?: number;
}

/** Look-up of the humidity factor against x = -ln h. */
export interface HumidityFactorTable {
  /**
   * Below this x the factor is exactly 1 in double precision, and the look-up returns 1 exactly
   * (found by bisection on the physics function, which is monotone in h).
   */
  readonly exactlyOneBelow: number;
  /** The factor at x = -ln h (x >= 0; NaN gives NaN). */
  at(deficit: number): number;
}

/**
 * Tabulates beta_h(exp(-x)) on nodes x_j = j dx, interpolated linearly. The interpolation error
 * is below dx^2 / 8 max |d2 beta / dx2|; for beta = 1 / (1 + (a (1 - e^-x))^4) the second
 * derivative stays below about 2 a^2 (about 110 for a = 7.5), so with dx = 1e-4 the error is below
 * 1.5e-7 of the factor's unit range (test/engine/humidityFactorTable.test.ts checks it against the
 * function on a dense sample): far below the humidity factor's own uncertainty (its constant is
 * from memory, see hydration.ts). Exact (the function itself) beyond `maxDeficit`.
 */
export function createHumidityFactorTable(
  humidityOptions: HydrationHumidityOptions = {},
  options: HumidityFactorTableOptions = {},
): HumidityFactorTable {
  const step = options.step ?? 1e-4;
  const maxDeficit = options.maxDeficit ?? 0.7;
  const inverseStep = 1 / step;
  const lastNode = Math.ceil(maxDeficit * inverseStep);
  const nodes = new Float64Array(lastNode + 1);
  const filled = new Uint8Array(lastNode + 1);
  const exact = (deficit: number): number =>
    hydrationHumidityFactor(Math.exp(-deficit), humidityOptions);
  let low = 0;
  let high = 1;
  for (let k = 0; k < 60; k += 1) {
    const middle = 0.5 * (low + high);
    if (exact(middle) === 1) low = middle;
    else high = middle;
  }
  const exactlyOneBelow = low;
  return {
    exactlyOneBelow,
    at(deficit) {
      if (deficit <= exactlyOneBelow) return 1;
      const position = deficit * inverseStep;
      if (!(position < lastNode)) return exact(deficit);
      const node = Math.floor(position);
      if (filled[node] === 0) {
        nodes[node] = exact(node * step);
        filled[node] = 1;
      }
      if (filled[node + 1] === 0) {
        nodes[node + 1] = exact((node + 1) * step);
        filled[node + 1] = 1;
      }
      const below = nodes[node] as number;
      return below + (position - node) * ((nodes[node + 1] as number) - below);
    },
  };
}
