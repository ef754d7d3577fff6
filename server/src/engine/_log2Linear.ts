/**
 * The coordinate of the engine's look-up tables: a piecewise-linear base-2 logarithm read off a
 * number's bits. For x = m 2^e with 1 <= m < 2,
 *   log2Linear(x) = e + (m - 1),
 * which equals log2(x) at every power of two, is continuous and increasing, and is linear in x
 * between consecutive powers of two (it stays within 0.086 of log2). A table whose nodes fall on
 * every integer of this coordinate (nodes k / K for an integer K per unit) therefore interpolates
 * linearly in x inside each node interval, like a table uniform in ln x does to second order.
 * It costs a few integer operations; Math.log cost some 20 ns in the engine's per-cell loops
 * (three to four times per cell and step), more than the rest of a property evaluation.
 * {@link exp2Linear} is its inverse (to rounding).
 *
 * Valid for positive normal numbers (x >= 2.2250738585072014e-308, finite); other inputs give
 * what {@link log2LinearOfAny} documents. The tables only ever ask for suctions and ages, which
 * are positive and normal.
 */

const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);
/** Index of the word that holds the sign, exponent and top of the mantissa (1 on little-endian). */
const HIGH = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;
const LOW = 1 - HIGH;
const TWO_TO_32 = 4294967296;
const TWO_TO_MINUS_52 = 2.220446049250313e-16;
const SMALLEST_NORMAL = 2.2250738585072014e-308;

/**
 * e + (m - 1) for x = m 2^e (1 <= m < 2): the piecewise-linear log2 of a positive normal x.
 * Exact to the rounding of the sum (the integer part takes a few of the mantissa's bits).
 */
export function log2Linear(x: number): number {
  bits[0] = x;
  const high = words[HIGH] as number;
  const exponent = (high >>> 20) - 1023;
  const fraction = ((high & 0xfffff) * TWO_TO_32 + (words[LOW] as number)) * TWO_TO_MINUS_52;
  return exponent + fraction;
}

/**
 * {@link log2Linear} for any number: NaN for NaN and negative numbers, -Infinity for 0 and
 * subnormals (below every table), +Infinity for +Infinity.
 */
export function log2LinearOfAny(x: number): number {
  if (!(x >= 0)) return Number.NaN;
  if (x < SMALLEST_NORMAL) return Number.NEGATIVE_INFINITY;
  if (x === Number.POSITIVE_INFINITY) return Number.POSITIVE_INFINITY;
  return log2Linear(x);
}

/** 2^e for e = -1022 ... 1023, indexed by e + 1022 (a look-up, not a store and reload of bits). */
const POWERS_OF_TWO = Float64Array.from({ length: 2046 }, (_, index) => 2 ** (index - 1022));

/**
 * The inverse of {@link log2Linear}: (1 + (v - e)) 2^e with e = floor(v), for -1022 <= v < 1024
 * (the normal range); NaN outside it.
 */
export function exp2Linear(coordinate: number): number {
  const exponent = Math.floor(coordinate);
  const index = exponent + 1022;
  // An explicit range check: a read past the table's end would return undefined and leave the
  // optimised code handling two types.
  if (!(index >= 0 && index < 2046)) return Number.NaN;
  return (1 + (coordinate - exponent)) * (POWERS_OF_TWO[index] as number);
}

/**
 * d log2Linear / d ln x at x = m 2^e: m (from 1 just above a power of two to 2 just below the
 * next), computed from the coordinate v = log2Linear(x) as 1 + (v - floor(v)). A table's slope
 * per unit of the coordinate times this, over x, is the slope per unit of x.
 */
export function log2LinearSlopeFactor(coordinate: number): number {
  return 1 + (coordinate - Math.floor(coordinate));
}
