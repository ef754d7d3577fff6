/**
 * Numerical helpers private to the pore-structure files (poreSizeDistribution, retention,
 * equivalentPorePressure, capillaryBundlePermeability): monotone cubic Hermite interpolation,
 * a bracketed root finder and adaptive Gauss-Legendre quadrature.
 */

/**
 * Slopes of the monotone piecewise cubic Hermite interpolant (PCHIP) through (x, y), x strictly
 * increasing: weighted harmonic mean of the neighbouring secants, zero at local extrema, and the
 * shape-preserving three-point end formula. Fritsch and Butland (1984), SIAM J. Sci. Stat. Comput.
 * 5(2); the same rule as MATLAB `pchip` and SciPy `PchipInterpolator` (which the tests use as an
 * independent implementation). Two points give the straight line.
 */
export function pchipSlopes(x: readonly number[], y: readonly number[]): number[] {
  const count = x.length;
  const slopes = new Array<number>(count).fill(0);
  if (count < 2) return slopes;
  const widths: number[] = [];
  const secants: number[] = [];
  for (let k = 0; k < count - 1; k++) {
    const width = (x[k + 1] as number) - (x[k] as number);
    widths.push(width);
    secants.push(((y[k + 1] as number) - (y[k] as number)) / width);
  }
  if (count === 2) {
    slopes[0] = secants[0] as number;
    slopes[1] = secants[0] as number;
    return slopes;
  }
  for (let k = 1; k < count - 1; k++) {
    const left = secants[k - 1] as number;
    const right = secants[k] as number;
    if (left === 0 || right === 0 || Math.sign(left) !== Math.sign(right)) continue;
    const w1 = 2 * (widths[k] as number) + (widths[k - 1] as number);
    const w2 = (widths[k] as number) + 2 * (widths[k - 1] as number);
    slopes[k] = (w1 + w2) / (w1 / left + w2 / right);
  }
  slopes[0] = pchipEndSlope(
    widths[0] as number,
    widths[1] as number,
    secants[0] as number,
    secants[1] as number,
  );
  slopes[count - 1] = pchipEndSlope(
    widths[count - 2] as number,
    widths[count - 3] as number,
    secants[count - 2] as number,
    secants[count - 3] as number,
  );
  return slopes;
}

function pchipEndSlope(h0: number, h1: number, m0: number, m1: number): number {
  const slope = ((2 * h0 + h1) * m0 - h0 * m1) / (h0 + h1);
  if (Math.sign(slope) !== Math.sign(m0)) return 0;
  if (Math.sign(m0) !== Math.sign(m1) && Math.abs(slope) > Math.abs(3 * m0)) return 3 * m0;
  return slope;
}

/**
 * Limits given node slopes so that every cubic Hermite piece is monotone (Fritsch and Carlson
 * 1980, SIAM J. Numer. Anal. 17(2): slopes of the secant's sign and at most 3 times the secant).
 * Works in place on `slopes`; y must be non-decreasing.
 */
export function limitSlopesMonotone(
  x: readonly number[],
  y: readonly number[],
  slopes: number[],
): void {
  for (let k = 0; k < x.length - 1; k++) {
    const secant =
      ((y[k + 1] as number) - (y[k] as number)) / ((x[k + 1] as number) - (x[k] as number));
    if (!(secant > 0)) {
      slopes[k] = 0;
      slopes[k + 1] = 0;
      continue;
    }
    slopes[k] = Math.min(Math.max(slopes[k] as number, 0), 3 * secant);
    slopes[k + 1] = Math.min(Math.max(slopes[k + 1] as number, 0), 3 * secant);
  }
}

/** Value of the cubic Hermite piece on [x0, x0 + h] with end values y0, y1 and slopes d0, d1. */
export function hermiteValue(
  t: number,
  h: number,
  y0: number,
  y1: number,
  d0: number,
  d1: number,
): number {
  // Power form about x0: adds small increments to y0, which keeps rounding monotone near nodes.
  const rise = y1 - y0;
  const linear = h * d0;
  const quadratic = 3 * rise - 2 * h * d0 - h * d1;
  const cubic = h * d0 + h * d1 - 2 * rise;
  return y0 + t * (linear + t * (quadratic + t * cubic));
}

/** Derivative d/dx of the cubic Hermite piece at local coordinate t = (x - x0) / h. */
export function hermiteDerivative(
  t: number,
  h: number,
  y0: number,
  y1: number,
  d0: number,
  d1: number,
): number {
  return (
    ((6 * t * t - 6 * t) * (y0 - y1)) / h + (3 * t * t - 4 * t + 1) * d0 + (3 * t * t - 2 * t) * d1
  );
}

/** Index k of the last element of the increasing array `values` with values[k] <= target (0 if none). */
export function lowerIndex(values: ArrayLike<number>, target: number): number {
  let low = 0;
  let high = values.length - 1;
  while (high - low > 1) {
    const middle = (low + high) >> 1;
    if ((values[middle] as number) <= target) low = middle;
    else high = middle;
  }
  return low;
}

/**
 * Root of a non-decreasing function g on [low, high] with g(low) <= 0 <= g(high): Newton steps
 * when a derivative is given and the step stays inside the bracket, bisection otherwise
 * (the safeguarded Newton of Press et al., Numerical Recipes, 3rd ed., section 9.4).
 * Returns the smallest x found with g(x) >= 0 to within `tolerance` (absolute, in x).
 * `initialGuess` (inside the bracket) replaces the midpoint as the first iterate.
 */
export function solveIncreasing(
  g: (x: number) => number,
  low: number,
  high: number,
  tolerance: number,
  derivative?: (x: number) => number,
  initialGuess?: number,
): number {
  let a = low;
  let b = high;
  let x =
    initialGuess !== undefined && initialGuess > a && initialGuess < b
      ? initialGuess
      : 0.5 * (a + b);
  for (let iteration = 0; iteration < 200 && b - a > tolerance; iteration++) {
    const value = g(x);
    if (value >= 0) b = x;
    else a = x;
    if (derivative !== undefined) {
      const slope = derivative(x);
      const next = slope > 0 ? x - value / slope : Number.NaN;
      if (next >= a && next <= b) {
        if (Math.abs(next - x) < tolerance) return next;
        x = next;
        continue;
      }
    }
    x = 0.5 * (a + b);
  }
  return b;
}

const GAUSS_NODES = [
  0, -0.5384693101056831, 0.5384693101056831, -0.906179845938664, 0.906179845938664,
];
const GAUSS_WEIGHTS = [
  0.5688888888888889, 0.47862867049936647, 0.47862867049936647, 0.23692688505618908,
  0.23692688505618908,
];

/** Five-point Gauss-Legendre rule on [a, b] (exact for polynomials of degree <= 9). */
export function gaussLegendre5(f: (x: number) => number, a: number, b: number): number {
  const half = 0.5 * (b - a);
  const centre = 0.5 * (a + b);
  let sum = 0;
  for (let i = 0; i < 5; i++)
    sum += (GAUSS_WEIGHTS[i] as number) * f(centre + half * (GAUSS_NODES[i] as number));
  return sum * half;
}

/**
 * Adaptive Gauss-Legendre quadrature of f over [a, b]: a panel is split in two until the
 * five-point estimates of the panel and of its halves agree to `relativeTolerance` of the
 * panel's magnitude (or the depth reaches 40). Smooth integrands converge to about 1e-12.
 */
export function integrateAdaptive(
  f: (x: number) => number,
  a: number,
  b: number,
  relativeTolerance = 1e-11,
): number {
  if (!(b > a)) return 0;
  const whole = gaussLegendre5(f, a, b);
  return refine(f, a, b, whole, relativeTolerance, 0);
}

function refine(
  f: (x: number) => number,
  a: number,
  b: number,
  whole: number,
  tolerance: number,
  depth: number,
): number {
  const middle = 0.5 * (a + b);
  const left = gaussLegendre5(f, a, middle);
  const right = gaussLegendre5(f, middle, b);
  const halves = left + right;
  const scale = Math.abs(left) + Math.abs(right);
  if (depth >= 40 || Math.abs(halves - whole) <= tolerance * scale || scale === 0) return halves;
  return (
    refine(f, a, middle, left, tolerance, depth + 1) +
    refine(f, middle, b, right, tolerance, depth + 1)
  );
}
