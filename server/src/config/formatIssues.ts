import type { z } from 'zod';

/** A configuration, HTTP body or payload that failed validation; `issues` are one line each. */
export class ValidationError extends Error {
  readonly issues: readonly string[];

  constructor(what: string, issues: readonly string[], options?: ErrorOptions) {
    super(`${what} is invalid: ${issues.join('; ')}`, options);
    this.name = 'ValidationError';
    this.issues = issues;
  }
}

/**
 * Turns zod issues into lines that name the field, the rule and the value received, e.g.
 * `probes[0].depthMm must be between 0 and the element thickness (100 mm): got 140`.
 *
 * Messages written by our own refinements already carry the rule and the value; for zod's
 * built-in checks the value is looked up in `input` along the issue's path.
 *
 * @param issues - zod issues from `safeParse(...).error.issues`
 * @param input - the value that was validated, to quote what was received
 * @returns one line per issue, in zod's order
 */
export function formatIssues(issues: readonly z.core.$ZodIssue[], input: unknown): string[] {
  return issues.map((issue) => {
    const field = fieldName(issue.path);
    const received = valueAt(input, issue.path);
    if (issue.code === 'custom') return `${field} ${issue.message}`;
    if (issue.code === 'unrecognized_keys') {
      return `${field === '(root)' ? 'configuration' : field} has unknown field(s) ${issue.keys.join(', ')}`;
    }
    if ((!received.found || received.value === undefined) && issue.code === 'invalid_type')
      return `${field} is required: got nothing`;
    const got = received.found ? `got ${quote(received.value)}` : 'got nothing';
    return `${field} ${lowerFirst(issue.message)}: ${got}`;
  });
}

/** `['probes', 0, 'depthMm']` -> `probes[0].depthMm`; an empty path is `(root)`. */
export function fieldName(path: readonly PropertyKey[]): string {
  if (path.length === 0) return '(root)';
  let name = '';
  for (const key of path) {
    if (typeof key === 'number') name += `[${key}]`;
    else name += name === '' ? String(key) : `.${String(key)}`;
  }
  return name;
}

function valueAt(
  input: unknown,
  path: readonly PropertyKey[],
): { found: boolean; value?: unknown } {
  let current: unknown = input;
  for (const key of path) {
    if (current === null || typeof current !== 'object') return { found: false };
    if (!Object.hasOwn(current, key)) return { found: false };
    current = (current as Record<PropertyKey, unknown>)[key];
  }
  return { found: true, value: current };
}

function quote(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'number' || typeof value === 'boolean' || value === null) {
    return String(value);
  }
  if (Array.isArray(value)) return `a list of ${value.length}`;
  return typeof value;
}

function lowerFirst(text: string): string {
  return text.length === 0 ? text : text.charAt(0).toLowerCase() + text.slice(1);
}
