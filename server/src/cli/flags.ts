/**
 * Reading and validating flag values. Every rejection is a `UsageError` whose one-line message
 * names the flag, the rule (with the unit) and the value received:
 * `--rh must be between 0 and 100 (percent): got 140`.
 */
import { quoteReceived, UsageError } from './usageError.ts';

/** The rule a number must satisfy. Bounds are inclusive unless marked exclusive. */
export interface NumberRule {
  /** Unit the number is typed in, shown in messages, e.g. `percent`, `degC`, `km/h`. */
  readonly unit: string;
  /** Lower bound, none by default. */
  readonly min?: number;
  /** Upper bound, none by default. */
  readonly max?: number;
  /** Whether `min` itself is refused (default false). */
  readonly minExclusive?: boolean;
  /** Whether `max` itself is refused (default false). */
  readonly maxExclusive?: boolean;
}

/** Plain decimal notation with optional exponent; refuses hex, `Infinity`, empty text. */
const DECIMAL_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Words for a range, e.g. `between 0 and 100 (percent)`, `greater than 0 (m)`, `a number (degC)`.
 */
export function describeNumberRule(rule: NumberRule): string {
  const lower =
    rule.min === undefined
      ? undefined
      : `${rule.minExclusive === true ? 'greater than' : 'at least'} ${rule.min}`;
  const upper =
    rule.max === undefined
      ? undefined
      : `${rule.maxExclusive === true ? 'less than' : 'at most'} ${rule.max}`;
  let words: string;
  if (
    rule.min !== undefined &&
    rule.max !== undefined &&
    rule.minExclusive !== true &&
    rule.maxExclusive !== true
  ) {
    words = `between ${rule.min} and ${rule.max}`;
  } else if (lower !== undefined && upper !== undefined) {
    words = `${lower} and ${upper}`;
  } else {
    words = lower ?? upper ?? 'a number';
  }
  return `${words} (${rule.unit})`;
}

/**
 * Parses text typed by the user as a number and checks it against `rule`.
 *
 * @param text the text as typed (surrounding spaces ignored)
 * @param input what to name in the message, e.g. `--rh` or `--csv data.csv line 4, column temperatureC`
 * @throws UsageError `<input> must be a number (<unit>): got "abc"` or
 *   `<input> must be between <min> and <max> (<unit>): got <text>`
 */
export function parseNumberText(text: string, input: string, rule: NumberRule): number {
  const trimmed = text.trim();
  if (!DECIMAL_NUMBER.test(trimmed)) {
    throw new UsageError(input, `must be a number (${rule.unit})`, quoteReceived(text));
  }
  const value = Number(trimmed);
  const belowMin =
    rule.min !== undefined && (rule.minExclusive === true ? value <= rule.min : value < rule.min);
  const aboveMax =
    rule.max !== undefined && (rule.maxExclusive === true ? value >= rule.max : value > rule.max);
  if (belowMin || aboveMax || !Number.isFinite(value)) {
    throw new UsageError(input, `must be ${describeNumberRule(rule)}`, trimmed);
  }
  return value;
}

/** Commander's option key for a long flag: `--air-temp` -> `airTemp`. */
export function flagKey(flag: string): string {
  return flag
    .replace(/^--/, '')
    .replace(/-([a-z])/g, (_match, letter: string) => letter.toUpperCase());
}

/**
 * Typed, validated access to the flags of one command invocation, by flag name as the user types
 * it (`--air-temp`), so every message names the flag the way it appears in the help.
 */
export class FlagReader {
  readonly #values: Readonly<Record<string, unknown>>;

  /** @param values commander's parsed options (`command.opts()`), keyed in camelCase */
  constructor(values: Readonly<Record<string, unknown>>) {
    this.#values = values;
  }

  /** Whether the flag was given. */
  has(flag: string): boolean {
    return this.#values[flagKey(flag)] !== undefined;
  }

  /** The text of an optional flag, or undefined when it was not given. */
  optionalString(flag: string): string | undefined {
    const value = this.#values[flagKey(flag)];
    if (value === undefined) return undefined;
    if (typeof value !== 'string') throw new UsageError(flag, 'needs a value');
    return value;
  }

  /** The text of a required flag. @throws UsageError `--csv is required` */
  string(flag: string): string {
    const value = this.optionalString(flag);
    if (value === undefined) throw new UsageError(flag, 'is required');
    if (value.trim() === '') throw new UsageError(flag, 'must not be empty', '""');
    return value;
  }

  /** A required number within `rule`. @throws UsageError naming flag, rule and value */
  number(flag: string, rule: NumberRule): number {
    return parseNumberText(this.string(flag), flag, rule);
  }

  /** An optional number within `rule`, or undefined when not given. */
  optionalNumber(flag: string, rule: NumberRule): number | undefined {
    const text = this.optionalString(flag);
    return text === undefined ? undefined : parseNumberText(text, flag, rule);
  }

  /**
   * One of a fixed set of words (case-insensitive), or `fallback` when not given; without a
   * fallback the flag is required.
   * @throws UsageError `--method must be one of arrhenius, nurse-saul: got "x"`
   */
  choice<T extends string>(flag: string, choices: readonly T[], fallback?: T): T {
    const text = fallback === undefined ? this.string(flag) : this.optionalString(flag);
    if (text === undefined) return fallback as T;
    const found = choices.find((choice) => choice.toLowerCase() === text.trim().toLowerCase());
    if (found === undefined) {
      throw new UsageError(flag, `must be one of ${choices.join(', ')}`, quoteReceived(text));
    }
    return found;
  }

  /** A switch without value (such as `--json`): true when given. */
  switch(flag: string): boolean {
    return this.#values[flagKey(flag)] === true;
  }
}
