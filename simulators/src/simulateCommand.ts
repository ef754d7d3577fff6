/**
 * Command line of the simulators alone (`node simulators/bin/simulate.js`): plays a scenario
 * against any broker, e.g. a site box's Mosquitto with one password per device. Without
 * `--server` it creates no run (post the scenario's run.json to the server first); with
 * `--server <url>` it creates or finds the scenario's run there before playing and logs the
 * crew's measures on it as they start, as `npm run demo` does. Bad flags: exit code 2 and a
 * one-line message on stderr.
 */
import { readFileSync } from 'node:fs';
import { Command, CommanderError, InvalidArgumentError } from 'commander';
import { hostilePayloads } from './hostilePayloads.ts';
import { connectDevice } from './mqttDevice.ts';
import { checkSpeed } from './playClock.ts';
import { playScenario, probeDepthsMm } from './playScenario.ts';
import type { DeviceCredentials } from './playScenario.ts';
import type { ScenarioMeasure } from './scenarioSchema.ts';
import { DEMO_SCENARIO, loadScenarioFolder } from './scenarioFolder.ts';
import { findOrCreateRun, measureLogger } from './serverRun.ts';
import { createStandInTruth } from './standInTruth.ts';

/**
 * Reads a passwords file: one `device:password` per line (the form deploy/mosquitto/
 * make-passwords.sh takes); blank lines and lines starting with `#` are skipped.
 *
 * @throws Error naming the line that is not `device:password`
 */
export function parsePasswords(text: string): Map<string, string> {
  const passwords = new Map<string, string>();
  text.split(/\r?\n/).forEach((line, index) => {
    const trimmed = line.trim();
    if (trimmed === '' || trimmed.startsWith('#')) return;
    const colon = trimmed.indexOf(':');
    if (colon <= 0 || colon === trimmed.length - 1) {
      throw new Error(
        `passwords line ${index + 1} must be device:password: got ${JSON.stringify(trimmed.slice(0, 40))}`,
      );
    }
    passwords.set(trimmed.slice(0, colon), trimmed.slice(colon + 1));
  });
  return passwords;
}

const speedFlag = (text: string) => {
  try {
    return checkSpeed(Number(text));
  } catch (error) {
    throw new InvalidArgumentError((error as Error).message);
  }
};
const seedFlag = (text: string) => {
  const seed = Number(text);
  if (!(Number.isInteger(seed) && seed >= 0 && seed < 2 ** 32)) {
    throw new InvalidArgumentError(
      `seed must be a whole number from 0 to ${2 ** 32 - 1}: got ${text}`,
    );
  }
  return seed;
};

/** How long `--server` waits for a server that cannot be reached yet (a container still starting), ms. */
const SERVER_WAIT_MS = 60_000;

const serverFlag = (text: string) => {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw new InvalidArgumentError(`server must be an http:// or https:// URL: got ${text}`);
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') {
    throw new InvalidArgumentError(`server must be an http:// or https:// URL: got ${text}`);
  }
  return text.replace(/\/+$/, '');
};

/** The simulators' flags after parsing (defaults filled in). */
export interface SimulateFlags {
  scenario: string;
  url: string;
  speed: number;
  measures?: string;
  seed?: number;
  durationH?: number;
  passwords?: string;
  server?: string;
  hostile?: boolean;
  standInTruth?: boolean;
}

/**
 * Parses the command's arguments (without `node simulate.js`) and checks each flag's value;
 * reads no file and connects to nothing (docker-compose.yml's test uses it on the demo's command).
 *
 * @throws CommanderError for an unknown flag, a bad value (message on stderr) or --help (exit code 0)
 */
export function parseSimulateFlags(argv: readonly string[]): SimulateFlags {
  const program = new Command('simulate')
    .exitOverride()
    .configureOutput({ writeErr: (text) => process.stderr.write(text) })
    .option('--scenario <name>', 'scenario name or folder', DEMO_SCENARIO)
    .option('--url <url>', 'broker URL', 'mqtt://127.0.0.1:1883')
    .option('--speed <times>', 'event time per wall time, 1 to 120', speedFlag, 60)
    .option('--measures <log>', "measure log of the scenario (the scenario's default)")
    .option('--seed <n>', "random seed (the scenario's)", seedFlag)
    .option(
      '--duration-h <hours>',
      "hours of event time to play (the scenario's)",
      (text: string) => {
        const hours = Number(text);
        if (!(hours > 0 && hours <= 72)) {
          throw new InvalidArgumentError(`duration-h must be between 0 and 72 h: got ${text}`);
        }
        return hours;
      },
    )
    .option(
      '--passwords <file>',
      'device:password per line; each device logs in with its id as username',
    )
    .option(
      '--server <url>',
      "Meniscus server (http://host:8080): create or find the scenario's run there and log the crew's measures on it",
      serverFlag,
    )
    .option('--hostile', 'first send a set of malformed and hostile payloads from the first probe')
    .option(
      '--stand-in-truth',
      'use the simple stand-in instead of the engine (plumbing checks only)',
    );
  program.parse([...argv], { from: 'user' });
  return program.opts<SimulateFlags>();
}

/** Runs the simulators; resolves with the exit code. */
export async function simulateMain(argv: readonly string[]): Promise<number> {
  let flags: SimulateFlags;
  try {
    flags = parseSimulateFlags(argv);
  } catch (error) {
    if (error instanceof CommanderError) return error.exitCode === 0 ? 0 : 2;
    throw error;
  }
  let loaded;
  let passwords = new Map<string, string>();
  try {
    loaded = loadScenarioFolder(flags.scenario);
    if (flags.passwords !== undefined)
      passwords = parsePasswords(readFileSync(flags.passwords, 'utf8'));
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n`);
    return 2;
  }
  const scenario =
    flags.seed === undefined ? loaded.scenario : { ...loaded.scenario, seed: flags.seed };
  const site = loaded.runConfig.site;
  const credentialsFor = (device: string): DeviceCredentials => {
    const password = passwords.get(device);
    return password === undefined ? {} : { username: device, password };
  };
  const controller = new AbortController();
  for (const signal of ['SIGINT', 'SIGTERM'] as const)
    process.once(signal, () => controller.abort());
  try {
    let onMeasureStart: (measure: ScenarioMeasure) => void | Promise<void> = (measure) =>
      console.log(`measure ${measure.kind} starts ${measure.startAt}`);
    if (flags.server !== undefined) {
      const baseUrl = flags.server;
      const { runId, existing } = await findOrCreateRun(
        baseUrl,
        loaded.runConfig,
        loaded.runConfigInput,
        {
          waitMs: SERVER_WAIT_MS,
          onWaiting: (why) => console.log(`waiting for the server at ${baseUrl} (${why})`),
        },
      );
      console.log(
        `${existing ? 'playing into run' : 'created run'} ${runId} on ${baseUrl} (${baseUrl}/api/runs/${runId})`,
      );
      const postMeasure = measureLogger(baseUrl, runId, (line) => console.log(line));
      onMeasureStart = async (measure: ScenarioMeasure) => {
        console.log(`measure ${measure.kind} starts ${measure.startAt}`);
        await postMeasure(measure);
      };
    }
    if (flags.hostile === true) {
      const probe = scenario.probeStrings[0];
      const sensor = probe?.sensors.find((s) => s.quantity === 'temperature')?.sensor ?? 'unknown';
      if (probe !== undefined) {
        const device = await connectDevice({
          url: flags.url,
          site,
          device: probe.device,
          ...credentialsFor(probe.device),
        });
        for (const hostile of hostilePayloads(sensor)) {
          await device.publish(hostile.payload(probe.device, Date.parse(scenario.startAt)));
          console.log(
            `sent ${hostile.what} (the server should quarantine it as ${hostile.reason})`,
          );
        }
        await device.close();
      }
    }
    console.log(`playing ${scenario.name} at ${flags.speed}x to ${flags.url} (site ${site})`);
    const result = await playScenario({
      scenario,
      site,
      url: flags.url,
      speed: flags.speed,
      ...(flags.measures === undefined ? {} : { measureLog: flags.measures }),
      ...(flags.durationH === undefined ? {} : { durationH: flags.durationH }),
      ...(flags.standInTruth === true
        ? { truth: createStandInTruth(scenario.truth, probeDepthsMm(scenario)) }
        : {}),
      credentialsFor,
      signal: controller.signal,
      onMeasureStart,
    });
    console.log(
      `done: ${result.packsSent} packs sent, ${result.packsDropped} lost on purpose, ${result.packsSilenced} held back by scripted silence`,
    );
    return 0;
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n`);
    return error instanceof RangeError ? 2 : 1;
  }
}
