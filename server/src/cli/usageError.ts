/**
 * The one error type the CLI turns into exit code 2: bad input a user can fix (a flag, a file, a
 * row of a file). Its message is a single line that names the input, the rule and the value
 * received, e.g. `--rh must be between 0 and 100 (percent): got 140`.
 */
export class UsageError extends Error {
  /** The input at fault as the user typed it: a flag such as `--rh`, or `--csv FILE line 4`. */
  readonly input: string;

  /**
   * @param input the flag or file location at fault, e.g. `--rh`
   * @param rule what the input must satisfy, e.g. `must be between 0 and 100 (percent)`
   * @param received the value received, as text; omitted when there is none to show
   * @param options standard error options (`cause`)
   */
  constructor(input: string, rule: string, received?: string, options?: ErrorOptions) {
    super(
      oneLine(received === undefined ? `${input} ${rule}` : `${input} ${rule}: got ${received}`),
      options,
    );
    this.name = 'UsageError';
    this.input = input;
  }

  /**
   * Wraps a message that an edge validator elsewhere (a zod schema of the physics library) has
   * already written in the field / rule / value form, e.g. `--psd psd.json lognormal[0].geometricSd
   * must be greater than 1: got 0.8`.
   */
  static fromMessage(input: string, message: string, cause?: unknown): UsageError {
    const error = new UsageError(input, '', undefined, { cause });
    error.message = oneLine(message);
    return error;
  }
}

/** Collapses line breaks and runs of white space so a message always fits on one line. */
export function oneLine(text: string): string {
  return text.replace(/\s*[\r\n]+\s*/g, ' ').trim();
}

/**
 * Quotes a value the user typed for an error message: JSON string quoting, cut to 60 characters
 * so a pasted file does not flood the terminal.
 */
export function quoteReceived(text: string): string {
  const cut = text.length > 60 ? `${text.slice(0, 57)}...` : text;
  return JSON.stringify(cut);
}
