/**
 * Transforms between a quantity's physical value and the unbounded variable the ensemble
 * analysis updates. The Kalman update is a linear regression: it can push a value anywhere on
 * the real line, so a positive multiplier is updated as its logarithm and a bounded quantity as
 * the logit of its position between the bounds; back-transformed, every update stays physical.
 * (Standard practice for parameter estimation with ensemble filters, e.g. Evensen (2009),
 * *Data Assimilation: The Ensemble Kalman Filter*, 2nd ed., Springer, on parameter estimation.)
 */

/** How one variable is represented in the analysis. */
export type VariableTransform =
  | { kind: 'identity' }
  | { kind: 'log' }
  /** ln(x + offset): positive quantities that may reach 0, e.g. suction of a saturated cell. */
  | { kind: 'shifted-log'; offset: number }
  | { kind: 'logit'; lower: number; upper: number };

/**
 * Largest |z| a logit variable is allowed to reach before back-transforming: at 30 the
 * logistic function is 1 - 9.4e-14, so the physical value stays strictly inside its bounds in
 * double precision for any bound width up to about 1e2 relative to the bounds' magnitude.
 */
export const LOGIT_LIMIT = 30;

/** Largest |z| of a log variable: exp(+-700) is still a finite, positive double. */
export const LOG_LIMIT = 700;

/**
 * Physical value -> analysis variable.
 *
 * - identity: `z = x`;
 * - log: `z = ln x`, for x > 0 (x <= 0 gives -Infinity or NaN: a prior must not contain it);
 * - shifted-log: `z = ln(x + offset)`, for x > -offset (same edge behaviour);
 * - logit on (lower, upper): `z = ln(u / (1 - u))` with `u = (x - lower) / (upper - lower)`;
 *   x at or beyond a bound gives -/+Infinity, NaN stays NaN.
 *
 * @param transform - the variable's transform (bounds in the variable's own unit).
 * @param value - the physical value.
 */
export function toAnalysisVariable(transform: VariableTransform, value: number): number {
  switch (transform.kind) {
    case 'identity':
      return value;
    case 'log':
      return Math.log(value);
    case 'shifted-log':
      return Math.log(value + transform.offset);
    case 'logit': {
      const u = (value - transform.lower) / (transform.upper - transform.lower);
      return Math.log(u) - Math.log1p(-u);
    }
  }
}

/**
 * Analysis variable -> physical value (inverse of {@link toAnalysisVariable}).
 *
 * - identity: `x = z`;
 * - log: `x = exp(clamp(z, -700, 700))`: always finite and > 0;
 * - shifted-log: `x = exp(clamp(z, -700, 700)) - offset`: finite and >= -offset (> -offset
 *   unless the exponential is below the offset's rounding unit);
 * - logit: `x = lower + (upper - lower) / (1 + exp(-clamp(z, -30, 30)))`: strictly inside
 *   (lower, upper) for ordinary bounds (see {@link LOGIT_LIMIT}), and if rounding ever lands on a
 *   bound the neighbouring double inside is returned.
 * NaN stays NaN (the caller decides: the analysis never produces it from finite inputs).
 *
 * @param transform - the variable's transform.
 * @param z - the analysis variable (any real number).
 */
export function fromAnalysisVariable(transform: VariableTransform, z: number): number {
  switch (transform.kind) {
    case 'identity':
      return z;
    case 'log':
      return Math.exp(Math.min(LOG_LIMIT, Math.max(-LOG_LIMIT, z)));
    case 'shifted-log':
      return Math.exp(Math.min(LOG_LIMIT, Math.max(-LOG_LIMIT, z))) - transform.offset;
    case 'logit': {
      const { lower, upper } = transform;
      const clamped = Math.min(LOGIT_LIMIT, Math.max(-LOGIT_LIMIT, z));
      const value = lower + (upper - lower) / (1 + Math.exp(-clamped));
      if (value <= lower) return nextTowards(lower, upper);
      if (value >= upper) return nextTowards(upper, lower);
      return value;
    }
  }
}

/**
 * Derivative dz/dx of the forward transform at x (for the delta method when a spread is
 * converted between spaces): 1, 1/x, 1/(x + offset), or (upper - lower) / ((x - lower)(upper - x)).
 */
export function analysisVariableSlope(transform: VariableTransform, value: number): number {
  switch (transform.kind) {
    case 'identity':
      return 1;
    case 'log':
      return 1 / value;
    case 'shifted-log':
      return 1 / (value + transform.offset);
    case 'logit':
      return (
        (transform.upper - transform.lower) /
        ((value - transform.lower) * (transform.upper - value))
      );
  }
}

/**
 * {@link toAnalysisVariable} bound to one transform, for loops over many values (one switch,
 * then a plain function call per value).
 */
export function analysisVariableFunction(transform: VariableTransform): (value: number) => number {
  switch (transform.kind) {
    case 'identity':
      return (value) => value;
    case 'log':
      return Math.log;
    case 'shifted-log':
    case 'logit':
      return (value) => toAnalysisVariable(transform, value);
  }
}

/** {@link fromAnalysisVariable} bound to one transform (see {@link analysisVariableFunction}). */
export function physicalValueFunction(transform: VariableTransform): (z: number) => number {
  switch (transform.kind) {
    case 'identity':
      return (z) => z;
    case 'log':
      return (z) => Math.exp(Math.min(LOG_LIMIT, Math.max(-LOG_LIMIT, z)));
    case 'shifted-log':
    case 'logit':
      return (z) => fromAnalysisVariable(transform, z);
  }
}

/** The double next to `from` in the direction of `towards`. */
function nextTowards(from: number, towards: number): number {
  if (from === towards) return from;
  const buffer = new Float64Array([from]);
  const bits = new BigInt64Array(buffer.buffer);
  const away = from === 0 ? towards > 0 : towards > from === from > 0;
  if (from === 0) {
    buffer[0] = towards > 0 ? Number.MIN_VALUE : -Number.MIN_VALUE;
    return buffer[0];
  }
  bits[0] = (bits[0] ?? 0n) + (away ? 1n : -1n);
  return buffer[0] ?? from;
}
