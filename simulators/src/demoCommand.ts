/**
 * Command line of `npm run demo` (flags after `--`): `--speed`, `--measures`, `--scenario`,
 * `--duration-h`. Bad flags: exit code 2 and a one-line message on stderr.
 */
import { Command, CommanderError, InvalidArgumentError } from 'commander';
import { serverConfigFromEnv } from '../../server/src/config/index.ts';
import { checkSpeed } from './playClock.ts';
import { noticeSummary, startDemo, warningSummary } from './demo.ts';

const numberFlag = (flag: string, check: (value: number) => number) => (text: string) => {
  const value = Number(text);
  try {
    return check(value);
  } catch (error) {
    throw new InvalidArgumentError(`${flag}: ${(error as Error).message.replace(/^speed /, '')}`);
  }
};

/** Runs the demo; resolves with the exit code once stopped (Ctrl-C) or on a usage error. */
export async function demoMain(argv: readonly string[], env: NodeJS.ProcessEnv): Promise<number> {
  const program = new Command('npm run demo --')
    .exitOverride()
    .configureOutput({ writeErr: (text) => process.stderr.write(text) })
    .option(
      '--speed <times>',
      'event time per wall time, 1 to 120',
      numberFlag('--speed', checkSpeed),
      60,
    )
    .option('--measures <log>', 'measure log of the scenario: no-action or fogging')
    .option('--scenario <name>', 'scenario name or folder', 'level3-topping')
    .option(
      '--duration-h <hours>',
      'hours of event time to play',
      numberFlag('--duration-h', (value) => {
        if (!(value > 0 && value <= 72))
          throw new RangeError(`must be between 0 and 72 h: got ${value}`);
        return value;
      }),
    );
  try {
    program.parse([...argv], { from: 'user' });
  } catch (error) {
    if (error instanceof CommanderError) return error.exitCode === 0 ? 0 : 2;
    throw error;
  }
  const flags = program.opts<{
    speed: number;
    measures?: string;
    scenario: string;
    durationH?: number;
  }>();
  let config;
  try {
    // The demo prints its own lines (readings, notices, the truth beside the server); the
    // server's JSON log would drown them, so it shows errors only unless the user asks for more.
    config = serverConfigFromEnv({ MENISCUS_LOG_LEVEL: 'error', ...env });
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n`);
    return 2;
  }
  const controller = new AbortController();
  let demo;
  try {
    demo = await startDemo({
      config,
      scenario: flags.scenario,
      speed: flags.speed,
      ...(flags.measures === undefined ? {} : { measureLog: flags.measures }),
      ...(flags.durationH === undefined ? {} : { durationH: flags.durationH }),
      signal: controller.signal,
    });
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n`);
    return error instanceof RangeError || (error as Error).name === 'ValidationError' ? 2 : 1;
  }
  const stopped = new Promise<void>((resolve) => {
    for (const signal of ['SIGINT', 'SIGTERM'] as const) process.once(signal, () => resolve());
  });
  void demo.played.then(
    (result) => {
      console.log(
        warningSummary(demo.truthMarginClosedAtMs(), demo.serverStates(), demo.utcOffsetMin),
      );
      console.log(noticeSummary(demo.truthMarginClosedAtMs(), demo.notices(), demo.utcOffsetMin));
      const counts = `${result.packsSent} packs sent (${result.packsDropped} lost on purpose, ${result.packsSilenced} held back by the scripted silence)`;
      console.log(
        controller.signal.aborted
          ? `Scenario stopped: ${counts}. Stopping the server.`
          : `Scenario played: ${counts}. The server keeps running: ${demo.baseUrl}/runs/${demo.runId} (Ctrl-C to stop).`,
      );
    },
    (error: unknown) => console.error(`The scenario stopped: ${(error as Error).message}`),
  );
  await stopped;
  controller.abort();
  await demo.played.catch(() => undefined);
  await demo.server.close();
  return 0;
}
