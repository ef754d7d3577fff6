/**
 * The one-line issues of the ValidationError that a parse at the edge throws, for tests of the
 * edge validators (run configuration, scenario, measure and forecast input).
 */
import { ValidationError } from '../../server/src/config/formatIssues.ts';

/**
 * Runs `action` and returns the issues of the ValidationError it throws.
 *
 * @param action - the parse expected to reject its input
 * @returns the error's issues, one line each ("field: rule, got value")
 * @throws the error itself when it is not a ValidationError, and an Error when `action` returns
 */
export function validationIssues(action: () => unknown): readonly string[] {
  try {
    action();
  } catch (error) {
    if (error instanceof ValidationError) return error.issues;
    throw error;
  }
  throw new Error('expected a ValidationError');
}
