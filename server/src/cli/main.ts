/**
 * The `meniscus` command line: builds the program from the command registry, runs one command
 * and maps every outcome to an exit code.
 *
 * Exit codes: 0 success (and `--help`); 2 bad input (a `UsageError`, or commander's unknown
 * command, unknown flag, missing flag or value), reported as ONE line on stderr; 1 any other
 * failure (a fault of the tool), reported as one line plus the stack when `MENISCUS_DEBUG` is set.
 */
import { Command, CommanderError, Option } from 'commander';
import type { CommandContext, CommandDefinition } from './commandDefinition.ts';
import { COMMANDS } from './commands.ts';
import { FlagReader } from './flags.ts';
import { renderJson, renderText } from './output.ts';
import { oneLine, UsageError } from './usageError.ts';

/** Where the CLI writes; the process streams by default, strings in in-process tests. */
export interface CliStreams {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
}

const PROCESS_STREAMS: CliStreams = {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
};

/** Exit code for bad input (flags, files, rows). */
export const EXIT_USAGE = 2;
/** Exit code for a failure of the tool itself. */
export const EXIT_FAILURE = 1;

/**
 * Runs the CLI on `argv` (the arguments after `meniscus`) and resolves to the exit code; never
 * throws and never calls `process.exit`.
 *
 * @param argv arguments, e.g. `['evaporation', '--air-temp', '30', ...]`
 * @param streams output sinks (default: process stdout / stderr)
 * @param context working directory for relative file paths (default: `process.cwd()`)
 * @param commands the commands offered (default: the registry of commands.ts)
 */
export async function main(
  argv: readonly string[],
  streams: CliStreams = PROCESS_STREAMS,
  context: CommandContext = { cwd: process.cwd() },
  commands: readonly CommandDefinition[] = COMMANDS,
): Promise<number> {
  if (streams === PROCESS_STREAMS) ignoreClosedPipe();
  const program = buildProgram(commands, streams, context);
  try {
    // Without a command commander throws (help on stderr), so reaching the end means success.
    await program.parseAsync([...argv], { from: 'user' });
    return 0;
  } catch (error) {
    const invoked = commands.find((definition) => definition.name === argv[0]);
    return reportError(
      error,
      streams,
      invoked === undefined ? 'meniscus --help' : `meniscus ${invoked.name} --help`,
    );
  }
}

/** `meniscus ... | head` closes stdout early: that is not an error of the command. */
let closedPipeIgnored = false;
function ignoreClosedPipe(): void {
  if (closedPipeIgnored) return;
  closedPipeIgnored = true;
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code !== 'EPIPE') throw error;
  });
}

function buildProgram(
  commands: readonly CommandDefinition[],
  streams: CliStreams,
  context: CommandContext,
): Command {
  const program = new Command('meniscus')
    .description(
      'Quick checks for fresh concrete and mortar: evaporation, maturity, strength, drying stress.',
    )
    .exitOverride()
    .configureOutput({
      writeOut: streams.stdout,
      writeErr: streams.stderr,
      // Errors are printed once, as one line, by reportError().
      outputError: () => undefined,
    })
    .showSuggestionAfterError(true)
    .helpCommand(false);
  for (const definition of commands) addCommand(program, definition, streams, context);
  return program;
}

function addCommand(
  program: Command,
  definition: CommandDefinition,
  streams: CliStreams,
  context: CommandContext,
): void {
  const command = program
    .command(definition.name)
    .summary(definition.summary)
    .description(definition.description ?? definition.summary)
    .addHelpText('after', `\nExample:\n  meniscus ${definition.example}\n`);
  for (const flag of definition.flags) {
    const option = new Option(flag.flags, flag.description);
    if (flag.required === true) option.makeOptionMandatory(true);
    command.addOption(option);
  }
  command.option('--json', 'print one JSON object on stdout (numeric keys carry their unit)');
  command.action(async (_options: unknown, invoked: Command) => {
    const flags = new FlagReader(invoked.opts());
    const report = await definition.run(flags, { progress: streams.stderr, ...context });
    streams.stdout(flags.switch('--json') ? renderJson(report) : renderText(report));
  });
}

function reportError(error: unknown, streams: CliStreams, helpHint: string): number {
  if (error instanceof CommanderError) {
    // --help and --version end here with exit code 0; their text is already written.
    if (error.exitCode === 0) return 0;
    if (error.code === 'commander.help') return EXIT_USAGE; // `meniscus` alone: help on stderr
    const message = oneLine(error.message.replace(/^error: /, ''));
    streams.stderr(`meniscus: ${message} (see ${helpHint})\n`);
    return EXIT_USAGE;
  }
  if (error instanceof UsageError) {
    streams.stderr(`meniscus: ${error.message}\n`);
    return EXIT_USAGE;
  }
  const message = error instanceof Error ? error.message : String(error);
  streams.stderr(`meniscus: internal error: ${oneLine(message)}\n`);
  if (process.env['MENISCUS_DEBUG'] !== undefined && error instanceof Error && error.stack) {
    streams.stderr(`${error.stack}\n`);
  }
  return EXIT_FAILURE;
}
