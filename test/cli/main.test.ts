/**
 * The CLI framework: exit codes, one-line messages, help, and the command registry. Spawns the
 * real bin for what a user sees; calls main() in-process with a stand-in command for the paths
 * no real command should take (a fault of the tool, exit code 1).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CommandDefinition } from '../../server/src/cli/commandDefinition.ts';
import { COMMANDS } from '../../server/src/cli/commands.ts';
import { main } from '../../server/src/cli/main.ts';
import { CAUTION } from '../../server/src/cli/output.ts';
import { callCli, fixtureFolder, isOneLine, runCli, type FixtureFolder } from './_runCli.ts';

const EVAPORATION = ['evaporation', '--air-temp', '25', '--concrete-temp', '27', '--rh', '50'];

describe.concurrent('meniscus (spawned bin)', () => {
  it('--help lists every registered command and exits 0', async () => {
    const run = await runCli(['--help']);
    expect(run.code).toBe(0);
    for (const command of COMMANDS) expect(run.stdout).toContain(command.name);
  });

  it.each(COMMANDS.map((command) => [command.name]))(
    '%s --help shows usage, the --json flag and an example, exit 0',
    async (name) => {
      const run = await runCli([name, '--help']);
      expect(run.code).toBe(0);
      expect(run.stdout).toContain(`Usage: meniscus ${name}`);
      expect(run.stdout).toContain('--json');
      expect(run.stdout).toContain(`meniscus ${name} --`);
    },
  );

  // Each kind of bad invocation: exit 2 and one line on stderr naming the culprit.
  it.each([
    ['no command at all', [], 'Usage: meniscus'],
    ['an unknown command', ['evaporate'], "unknown command 'evaporate'"],
    [
      'an unknown flag',
      [...EVAPORATION, '--wind', '10', '--gust', '20'],
      "unknown option '--gust'",
    ],
    ['a missing required flag', EVAPORATION, "required option '--wind <kmh>' not specified"],
    ['a flag without its value', [...EVAPORATION, '--wind'], "'--wind <kmh>' argument missing"],
    ['an extra argument', [...EVAPORATION, '--wind', '10', 'now'], 'too many arguments'],
    [
      'a value that is not a number',
      [...EVAPORATION.slice(0, 5), '--rh', 'dry', '--wind', '10'],
      '--rh must be a number (percent): got "dry"',
    ],
    [
      'a hexadecimal number',
      [...EVAPORATION, '--wind', '0x10'],
      '--wind must be a number (km/h): got "0x10"',
    ],
    [
      'an out-of-range value',
      [...EVAPORATION.slice(0, 5), '--rh', '140', '--wind', '10'],
      '--rh must be between 0 and 100 (percent): got 140',
    ],
  ] as const)('%s: exit 2 and a one-line message', async (_case, args, expected) => {
    const run = await runCli(args);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toContain(expected);
    // `meniscus` alone prints the overview help to stderr; every other case is one line.
    if (args.length > 0) expect(isOneLine(run.stderr)).toBe(true);
  });

  // The command tests run their long tables in-process through main(); the bin must answer alike.
  it.each([
    ['a JSON result', [...EVAPORATION, '--wind', '12', '--json']],
    ['a table', ['strength', '--class', 'C25/30', '--cement', 'R', '--age-days', '2']],
    ['a bad value', ['strength', '--class', 'C25/30', '--cement', 'R', '--age-days', '-2']],
    ['an unknown flag', ['maturity', '--csv', 'x.csv', '--fast']],
  ])('the spawned bin and main() in-process give the same %s', async (_case, args) => {
    const [spawned, inProcess] = await Promise.all([runCli(args), callCli(args)]);
    expect(spawned).toEqual(inProcess);
  });

  it('an error names the command whose help to read', async () => {
    const run = await runCli(EVAPORATION);
    expect(run.stderr).toContain('see meniscus evaporation --help');
  });
});

describe('main() in-process with stand-in commands', () => {
  let folder: FixtureFolder;
  beforeAll(() => {
    folder = fixtureFolder();
  });
  afterAll(() => folder.remove());

  const capture = () => {
    const out = { stdout: '', stderr: '' };
    return {
      out,
      streams: {
        stdout: (text: string) => void (out.stdout += text),
        stderr: (text: string) => void (out.stderr += text),
      },
    };
  };

  const echo: CommandDefinition = {
    name: 'echo',
    summary: 'reports its flag',
    flags: [{ flags: '--depth <mm>', description: 'a depth, mm', required: true }],
    example: 'echo --depth 3',
    run: (flags) => {
      const depthMm = flags.number('--depth', { unit: 'mm', min: 0, max: 100 });
      return {
        json: { depthMm },
        tables: [{ title: 'Echo', rows: [['depth', String(depthMm), 'mm']] }],
      };
    },
  };
  const broken: CommandDefinition = {
    name: 'broken',
    summary: 'fails like a bug would',
    flags: [],
    example: 'broken',
    run: () => {
      throw new TypeError('cannot read properties of undefined\n  at somewhere');
    },
  };

  it('a command added to the registry gets --json, the caution and the table output', async () => {
    const json = capture();
    expect(
      await main(['echo', '--depth', '3', '--json'], json.streams, { cwd: folder.path }, [echo]),
    ).toBe(0);
    expect(JSON.parse(json.out.stdout)).toEqual({ depthMm: 3, caution: CAUTION });
    const text = capture();
    expect(await main(['echo', '--depth', '3'], text.streams, { cwd: folder.path }, [echo])).toBe(
      0,
    );
    expect(text.out.stdout).toContain('Echo');
    expect(text.out.stdout).toMatch(/depth\s*│\s*3\s*│\s*mm/);
    expect(text.out.stdout).toContain('Caution: Estimates only');
  });

  it('a fault of the tool exits 1 with one line on stderr, not a stack', async () => {
    const run = capture();
    expect(await main(['broken'], run.streams, { cwd: folder.path }, [broken])).toBe(1);
    expect(run.out.stdout).toBe('');
    expect(isOneLine(run.out.stderr)).toBe(true);
    expect(run.out.stderr).toContain('internal error: cannot read properties of undefined');
  });

  it('a bad flag of a stand-in command exits 2 naming flag, rule and value', async () => {
    const run = capture();
    expect(await main(['echo', '--depth', '-1'], run.streams, { cwd: folder.path }, [echo])).toBe(
      2,
    );
    expect(run.out.stderr).toBe('meniscus: --depth must be between 0 and 100 (mm): got -1\n');
  });
});

describe('the JSON contract of every command', () => {
  let folder: FixtureFolder;
  beforeAll(() => {
    folder = fixtureFolder();
    folder.write('log.csv', 'time,temperatureC\n2026-05-06T18:00Z,21\n2026-05-06T20:30Z,26\n');
    folder.write(
      'psd.json',
      '{"lognormal":[{"medianDiameterUm":0.04,"geometricSd":2.5,"volumeFraction":1}]}',
    );
    folder.write('profile.csv', 'depthMm,saturation\n0,0.5\n2,0.9\n30,1\n');
  });
  afterAll(() => folder.remove());

  /** Unit suffixes of numeric keys (architecture.md: numbers carry the unit in the key). */
  const UNIT_SUFFIX = /(C|K|Percent|KmH|M|Mm|Um|KgM2h|H|Days|MPa|GPa|JMol|NPerM|CH)$/;
  /** Numbers without a unit: counts, ratios, fractions, line numbers. */
  const DIMENSIONLESS = new Set([
    'samples',
    'betaCc',
    'cementCoefficientS',
    'stressFactor',
    'biotCoefficient',
    'poissonRatio',
    'relaxationFactor',
    'restraintDegree',
    'saturation',
    'fromLine',
    'toLine',
  ]);

  function numericKeys(value: unknown, found: string[] = []): string[] {
    if (Array.isArray(value)) value.forEach((item) => numericKeys(item, found));
    else if (value !== null && typeof value === 'object') {
      for (const [key, child] of Object.entries(value)) {
        if (typeof child === 'number') found.push(key);
        else numericKeys(child, found);
      }
    }
    return found;
  }

  it.each([
    ['evaporation', [...EVAPORATION, '--wind', '10']],
    ['maturity', ['maturity', '--csv', 'log.csv', '--max-gap', '2']],
    [
      'strength',
      ['strength', '--class', 'C30/37', '--cement', 'N', '--age-days', '3', '--target-fcm', '20'],
    ],
    [
      'drying-stress',
      ['drying-stress', '--psd', 'psd.json', '--saturation', 'profile.csv', '--mode', 'curl'],
    ],
  ])('%s --json: one object, the caution, a unit on every numeric key', async (_name, args) => {
    const run = await callCli([...args, '--json'], folder.path);
    expect(run.code).toBe(0);
    const json = JSON.parse(run.stdout) as Record<string, unknown>;
    expect(json['caution']).toBe(CAUTION);
    const keys = numericKeys(json);
    expect(keys.length).toBeGreaterThan(3);
    for (const key of keys) {
      if (!DIMENSIONLESS.has(key))
        expect(key, `${key} carries no unit suffix`).toMatch(UNIT_SUFFIX);
    }
  });
});
