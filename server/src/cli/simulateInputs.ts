/**
 * Inputs of `meniscus simulate` read at the edge: the weather CSV and the measure log, checked
 * row by row with one-line messages naming the file, the line, the column, the rule and the value.
 */
import { z } from 'zod';
import type { CuringMeasure } from '../physics/curingMeasures.ts';
import { celsiusToKelvin, kmhToMs } from '../physics/units.ts';
import { windSpeedAtUnoHeight } from '../physics/windProfile.ts';
import type { WeatherSample } from '../engine/simulateElement.ts';
import type { NumberRule } from './flags.ts';
import { parseIsoTimeMs } from './isoTime.ts';
import { csvNumber, describeCell, readCsvFile } from './readCsv.ts';
import { readJsonFile } from './readJsonFile.ts';
import { UsageError } from './usageError.ts';

/** Concrete below 0 degC is refused: freezing of pore water is not modelled (boundaryInputs.ts). */
export const CONCRETE_TEMPERATURE_RULE: NumberRule = { unit: 'degC', min: 0, max: 60 };
/** Air temperatures accepted, degC (the air may be below freezing). */
export const AIR_TEMPERATURE_RULE: NumberRule = { unit: 'degC', min: -20, max: 60 };
/** Relative humidity of the air, percent. */
export const RH_RULE: NumberRule = { unit: 'percent', min: 0, max: 100 };
/** Wind speed as measured, km/h. */
export const WIND_RULE: NumberRule = { unit: 'km/h', min: 0, max: 150 };

const measureFileSchema = z.array(
  z
    .object({
      kind: z.enum(['wet-covering', 'ponding', 'curing-compound', 'fogging', 'windbreak']),
      startH: z.number().min(0),
      endH: z.number().min(0).optional(),
      efficiency: z.number().min(0).max(1).optional(),
      relativeHumidityPercent: z.number().min(0).max(100).optional(),
      windFactor: z.number().min(0).max(1).optional(),
    })
    .strict(),
);

/** Reads the measure log: a JSON list of {kind, startH, endH, efficiency | relativeHumidityPercent | windFactor}. */
export function readMeasures(path: string, cwd: string): CuringMeasure[] {
  const parsed = readJsonFile('--measures', path, cwd);
  const result = measureFileSchema.safeParse(parsed);
  if (!result.success) {
    const issue = result.error.issues[0];
    const where = issue === undefined ? '' : `[${issue.path.join('].')}`.replace(/\]\.$/, ']');
    throw UsageError.fromMessage(
      `--measures ${path}`,
      `--measures ${path} ${where} ${issue?.message ?? 'is invalid'}`,
    );
  }
  return result.data.map((entry) => {
    const measure: CuringMeasure = { kind: entry.kind, startMs: entry.startH * 3.6e6 };
    if (entry.endH !== undefined) measure.endMs = entry.endH * 3.6e6;
    if (entry.efficiency !== undefined) measure.efficiency = entry.efficiency;
    if (entry.relativeHumidityPercent !== undefined)
      measure.relativeHumidity = entry.relativeHumidityPercent / 100;
    if (entry.windFactor !== undefined) measure.windFactor = entry.windFactor;
    return measure;
  });
}

/** Wind at 0.5 m (m/s) from a reading in km/h at the given height. */
export function windAt05mMS(windKmH: number, heightM: number | undefined): number {
  const kmh = heightM === undefined ? windKmH : windSpeedAtUnoHeight(windKmH, heightM);
  return kmhToMs(kmh);
}

/**
 * Weather file: CSV with `time` (ISO 8601, or hours since placement), `airTempC`, `rhPercent`,
 * `windKmH`, optional `concreteTempC` (default: the air temperature) and `evaporationKgM2h`
 * (measured, replaces the estimate). Placement is the first record, or `placedAt` (an ISO 8601
 * time, `--placed-at`) for a file of ISO times that covers it: a forecast read from a planned
 * placement on, the records before it only to interpolate at placement.
 */
export function readWeather(
  path: string,
  windHeightM: number | undefined,
  cwd: string,
  placedAt?: string,
): WeatherSample[] {
  const table = readCsvFile('--weather', path, ['time', 'airTempC', 'rhPercent', 'windKmH'], cwd);
  let originMs = Number.NaN;
  if (placedAt !== undefined) {
    originMs = parseIsoTimeMs(placedAt);
    if (Number.isNaN(originMs)) {
      throw new UsageError(
        '--placed-at',
        'must be an ISO 8601 time, e.g. 2026-07-01T11:00+02:00',
        JSON.stringify(placedAt),
      );
    }
  }
  const samples: WeatherSample[] = [];
  for (const record of table.records) {
    const text = record.cells.time ?? '';
    let timeS = Number(text);
    if (placedAt !== undefined && text.trim() !== '' && Number.isFinite(timeS)) {
      throw new UsageError(
        describeCell(table, record, 'time'),
        'must be an ISO 8601 time with --placed-at (hours since placement leave no time to place at)',
        JSON.stringify(text),
      );
    }
    if (text.trim() === '' || !Number.isFinite(timeS)) {
      const ms = parseIsoTimeMs(text);
      if (Number.isNaN(ms)) {
        throw new UsageError(
          describeCell(table, record, 'time'),
          'must be an ISO 8601 time or hours since placement',
          JSON.stringify(text),
        );
      }
      if (Number.isNaN(originMs)) originMs = ms;
      timeS = (ms - originMs) / 1000;
    } else {
      timeS *= 3600;
    }
    const previous = samples.at(-1);
    if (previous !== undefined && timeS <= previous.timeS) {
      throw new UsageError(
        describeCell(table, record, 'time'),
        'must increase from row to row',
        JSON.stringify(text),
      );
    }
    const airC = csvNumber(table, record, 'airTempC', AIR_TEMPERATURE_RULE);
    const concreteC =
      (record.cells.concreteTempC ?? '') === ''
        ? airC
        : csvNumber(table, record, 'concreteTempC', CONCRETE_TEMPERATURE_RULE);
    if (concreteC < 0) {
      throw new UsageError(
        describeCell(table, record, 'airTempC'),
        'is the concrete temperature when concreteTempC is absent, and must be at least 0 (degC; freezing is not modelled)',
        String(airC),
      );
    }
    const sample: WeatherSample = {
      timeS,
      airTemperatureK: celsiusToKelvin(airC),
      relativeHumidity: csvNumber(table, record, 'rhPercent', RH_RULE) / 100,
      windMS: windAt05mMS(csvNumber(table, record, 'windKmH', WIND_RULE), windHeightM),
      surfaceTemperatureK: celsiusToKelvin(concreteC),
    };
    if ((record.cells.evaporationKgM2h ?? '') !== '') {
      sample.measuredEvaporationKgM2s =
        csvNumber(table, record, 'evaporationKgM2h', { unit: 'kg/m2/h', min: 0, max: 10 }) / 3600;
    }
    samples.push(sample);
  }
  const first = samples[0];
  const last = samples.at(-1);
  if (placedAt !== undefined && first !== undefined && last !== undefined) {
    if (first.timeS > 0 || last.timeS < 0) {
      throw new UsageError(
        '--placed-at',
        `must lie within the weather file (${table.records[0]?.cells.time ?? ''} to ${table.records.at(-1)?.cells.time ?? ''})`,
        JSON.stringify(placedAt),
      );
    }
  }
  return samples;
}
