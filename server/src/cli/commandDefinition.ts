/**
 * What a CLI command is: a name, its flags and a function from validated inputs to a report.
 * A new command is one file exporting a `CommandDefinition` plus one line in commands.ts; the
 * framework (main.ts) adds `--json` and `--help`, parses the flags, renders the report as JSON or
 * tables and appends the cautions, so a command never writes to the terminal itself.
 */
import type { FlagReader } from './flags.ts';
import type { CommandReport } from './output.ts';

/** One flag of a command, in commander's syntax. */
export interface FlagDefinition {
  /** Flag syntax, e.g. `--air-temp <C>` (a value) or `--dry-run` (a switch). */
  readonly flags: string;
  /** One line of help: meaning, unit, range and default with its origin. */
  readonly description: string;
  /** Whether the flag must be given (commander reports a missing one, exit code 2). */
  readonly required?: boolean;
}

/** What a command may use besides its flags. */
export interface CommandContext {
  /** Directory relative file paths are read from. */
  readonly cwd: string;
  /** Where progress lines go (default: the CLI's stderr stream; never stdout). */
  readonly progress?: (line: string) => void;
  /** A long command reports progress only once it has run this long, ms (default 1000). */
  readonly progressAfterMs?: number;
}

/** A command of the `meniscus` CLI. */
export interface CommandDefinition {
  /** Name typed after `meniscus`, e.g. `evaporation`. */
  readonly name: string;
  /** One line shown in `meniscus --help`. */
  readonly summary: string;
  /** Longer help text shown by `meniscus <name> --help` (method, sources, assumptions). */
  readonly description?: string;
  /** Flags in the order help lists them; `--json` and `--help` are added by the framework. */
  readonly flags: readonly FlagDefinition[];
  /** One example invocation (without the leading `meniscus`), shown in the help. */
  readonly example: string;
  /**
   * Computes the report. Throw `UsageError` for bad input (exit code 2); any other error is a
   * failure of the tool (exit code 1).
   */
  run(flags: FlagReader, context: CommandContext): CommandReport | Promise<CommandReport>;
}
