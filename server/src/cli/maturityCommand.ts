/**
 * `meniscus maturity`: equivalent age and temperature-time factor of a logged temperature record
 * (ASTM C1074), integrated over the record's own, possibly irregular, timestamps.
 */
import {
  maturityOfSeries,
  type MaturityOptions,
  type TemperatureSample,
} from '../physics/maturity.ts';
import { SECONDS_PER_HOUR } from '../physics/units.ts';
import type { CommandDefinition } from './commandDefinition.ts';
import { parseIsoTimeMs } from './isoTime.ts';
import { formatNumber } from './output.ts';
import { csvNumber, describeCell, readCsvFile } from './readCsv.ts';
import { quoteReceived, UsageError } from './usageError.ts';

const METHODS = ['arrhenius', 'nurse-saul'] as const;

export const maturityCommand: CommandDefinition = {
  name: 'maturity',
  summary: 'equivalent age and temperature-time factor of a temperature record (ASTM C1074)',
  description:
    'Maturity of a temperature record by ASTM C1074: the Arrhenius equivalent age (Freiesleben ' +
    'Hansen and Pedersen) and the Nurse-Saul temperature-time factor with its equivalent age, ' +
    'both integrated by the trapezoid rule over the actual timestamps. Both are always reported; ' +
    '--method chooses which equivalent age is the primary `equivalentAgeH`. ' +
    'FILE: CSV with a header row and the columns time (ISO 8601; without an offset read as UTC) ' +
    'and temperatureC, times strictly increasing.',
  flags: [
    {
      flags: '--csv <file>',
      description: 'CSV file with columns time,temperatureC',
      required: true,
    },
    {
      flags: '--method <name>',
      description: 'arrhenius or nurse-saul: which equivalent age is primary (default arrhenius)',
    },
    {
      flags: '--activation-energy <Jmol>',
      description:
        'Arrhenius activation energy, J/mol (10000 to 100000; default 40000, physics.md 6)',
    },
    {
      flags: '--reference-temp <C>',
      description: 'reference temperature, degC (0 to 50; default 20)',
    },
    {
      flags: '--datum-temp <C>',
      description: 'Nurse-Saul datum temperature, degC (-20 to 20; default 0, ASTM C1074 for OPC)',
    },
    {
      flags: '--max-gap <h>',
      description: 'flag intervals longer than this, h (default 1 h, our assumption)',
    },
  ],
  example: 'maturity --csv slab-north.csv --method arrhenius --activation-energy 45000',
  run(flags, context) {
    const method = flags.choice('--method', METHODS, 'arrhenius');
    const activationEnergyJMol =
      flags.optionalNumber('--activation-energy', { unit: 'J/mol', min: 10_000, max: 100_000 }) ??
      40_000;
    const referenceTemperatureC =
      flags.optionalNumber('--reference-temp', { unit: 'degC', min: 0, max: 50 }) ?? 20;
    const datumTemperatureC =
      flags.optionalNumber('--datum-temp', { unit: 'degC', min: -20, max: 20 }) ?? 0;
    if (datumTemperatureC >= referenceTemperatureC) {
      throw new UsageError(
        '--datum-temp',
        `must be below the reference temperature (${referenceTemperatureC} degC)`,
        String(datumTemperatureC),
      );
    }
    const maxGapH =
      flags.optionalNumber('--max-gap', { unit: 'h', min: 0, minExclusive: true }) ?? 1;

    const table = readCsvFile(
      '--csv',
      flags.string('--csv'),
      ['time', 'temperatureC'],
      context.cwd,
    );
    const samples: TemperatureSample[] = table.records.map((record) => {
      const timeText = record.cells['time'] ?? '';
      const time = parseIsoTimeMs(timeText);
      if (Number.isNaN(time)) {
        throw new UsageError(
          describeCell(table, record, 'time'),
          'must be an ISO 8601 date-time such as 2026-06-14T07:30:00+02:00',
          quoteReceived(timeText),
        );
      }
      const temperatureC = csvNumber(table, record, 'temperatureC', {
        unit: 'degC',
        min: -50,
        max: 100,
      });
      return { time, temperatureC };
    });

    const options: MaturityOptions = {
      activationEnergyJMol,
      referenceTemperatureC,
      datumTemperatureC,
      maxGapS: maxGapH * SECONDS_PER_HOUR,
    };
    const result = maturityOfSeries(samples, options);
    const issue = result.issues[0];
    if (issue !== undefined) {
      const record = table.records[issue.index];
      const where =
        record === undefined
          ? `${table.flag} ${table.path}`
          : describeCell(table, record, issue.field);
      throw new UsageError(where, issue.rule, record?.cells[issue.field] ?? issue.value);
    }
    if (result.samplesUsed < 2) {
      throw new UsageError(
        `--csv ${table.path}`,
        'must hold at least two readings',
        `${result.samplesUsed}`,
      );
    }

    const arrheniusEquivalentAgeH = result.arrheniusEquivalentAgeS / SECONDS_PER_HOUR;
    const nurseSaulEquivalentAgeH = result.nurseSaulEquivalentAgeS / SECONDS_PER_HOUR;
    const temperatureTimeFactorCH = result.nurseSaulTemperatureTimeFactorKS / SECONDS_PER_HOUR;
    const durationH = result.realAgeS / SECONDS_PER_HOUR;
    const equivalentAgeH =
      method === 'arrhenius' ? arrheniusEquivalentAgeH : nurseSaulEquivalentAgeH;
    const gaps = result.gaps.map((gap) => ({
      from: new Date(gap.fromMs).toISOString(),
      to: new Date(gap.toMs).toISOString(),
      fromLine: table.records[gap.fromIndex]?.line ?? null,
      toLine: table.records[gap.toIndex]?.line ?? null,
      durationH: gap.durationS / SECONDS_PER_HOUR,
    }));
    const notes = gaps.map(
      (gap) =>
        `gap of ${formatNumber(gap.durationH, 2)} h between lines ${gap.fromLine} and ${gap.toLine} (${gap.from} to ${gap.to}), bridged linearly.`,
    );

    return {
      json: {
        command: 'maturity',
        method,
        equivalentAgeH,
        equivalentAgeDays: equivalentAgeH / 24,
        arrheniusEquivalentAgeH,
        nurseSaulEquivalentAgeH,
        temperatureTimeFactorCH,
        durationH,
        samples: result.samplesUsed,
        firstTime: new Date(Number(samples[0]?.time)).toISOString(),
        lastTime: new Date(Number(samples[samples.length - 1]?.time)).toISOString(),
        activationEnergyJMol,
        referenceTemperatureC,
        datumTemperatureC,
        maxGapH,
        gaps,
      },
      tables: [
        {
          title: `Maturity of ${table.path} (ASTM C1074; primary: ${method})`,
          rows: [
            ['readings', String(result.samplesUsed), ''],
            ['duration of the record', formatNumber(durationH, 2), 'h'],
            [
              `equivalent age at ${referenceTemperatureC} degC (${method})`,
              formatNumber(equivalentAgeH, 2),
              'h',
            ],
            [
              `Arrhenius equivalent age (E = ${activationEnergyJMol} J/mol)`,
              formatNumber(arrheniusEquivalentAgeH, 2),
              'h',
            ],
            ['Nurse-Saul equivalent age', formatNumber(nurseSaulEquivalentAgeH, 2), 'h'],
            [
              `temperature-time factor (datum ${datumTemperatureC} degC)`,
              formatNumber(temperatureTimeFactorCH, 1),
              'degC h',
            ],
            [`gaps longer than ${maxGapH} h`, String(gaps.length), ''],
          ],
        },
      ],
      notes,
    };
  },
};
