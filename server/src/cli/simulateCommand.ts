/**
 * `meniscus simulate`: the drying model of one element (physics.md sections 1 to 7) run through
 * constant weather or a weather file and an optional measure log, for planning a pour: where does
 * the surface stress go against the growing strength, and which protection keeps it below?
 */
import { writeFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { z } from 'zod';
import type { CuringMeasure } from '../physics/curingMeasures.ts';
import type { CommandContext, CommandDefinition } from './commandDefinition.ts';
import type { FlagReader, NumberRule } from './flags.ts';
import { parseIsoTimeMs } from './isoTime.ts';
import { formatNumber } from './output.ts';
import { csvNumber, describeCell, readCsvFile } from './readCsv.ts';
import { readJsonFile } from './readJsonFile.ts';
import { UsageError } from './usageError.ts';

/** The engine and physics, imported when the command runs (keeps other commands' start-up short). */
async function loadEngine() {
  const [presets, material, model, simulation, figures, input, wind, units] = await Promise.all([
    import('../engine/materialPreset.ts'),
    import('../engine/elementMaterial.ts'),
    import('../engine/elementModel.ts'),
    import('../engine/simulateElement.ts'),
    import('../engine/elementFigures.ts'),
    import('../physics/poreSizeDistributionInput.ts'),
    import('../physics/windProfile.ts'),
    import('../physics/units.ts'),
  ]);
  return {
    ...presets,
    ...material,
    ...model,
    ...simulation,
    ...figures,
    ...input,
    ...wind,
    ...units,
  };
}
type Engine = Awaited<ReturnType<typeof loadEngine>>;
type WeatherSample = import('../engine/simulateElement.ts').WeatherSample;

/** Concrete below 0 degC is refused: freezing of pore water is not modelled (boundaryInputs.ts). */
const CONCRETE_TEMPERATURE_RULE: NumberRule = { unit: 'degC', min: 0, max: 60 };
const AIR_TEMPERATURE_RULE: NumberRule = { unit: 'degC', min: -20, max: 60 };
const RH_RULE: NumberRule = { unit: 'percent', min: 0, max: 100 };
const WIND_RULE: NumberRule = { unit: 'km/h', min: 0, max: 150 };

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

function readMeasures(path: string, cwd: string): CuringMeasure[] {
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
function windAt05mMS(engine: Engine, windKmH: number, heightM: number | undefined): number {
  const kmh = heightM === undefined ? windKmH : engine.windSpeedAtUnoHeight(windKmH, heightM);
  return engine.kmhToMs(kmh);
}

/**
 * Weather file: CSV with `time` (ISO 8601, or hours since placement), `airTempC`, `rhPercent`,
 * `windKmH`, optional `concreteTempC` (default: the air temperature) and `evaporationKgM2h`
 * (measured, replaces the estimate). Placement is the first record.
 */
function readWeather(
  engine: Engine,
  path: string,
  windHeightM: number | undefined,
  cwd: string,
): WeatherSample[] {
  const table = readCsvFile('--weather', path, ['time', 'airTempC', 'rhPercent', 'windKmH'], cwd);
  let originMs = Number.NaN;
  const samples: WeatherSample[] = [];
  for (const record of table.records) {
    const text = record.cells.time ?? '';
    let timeS = Number(text);
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
      airTemperatureK: engine.celsiusToKelvin(airC),
      relativeHumidity: csvNumber(table, record, 'rhPercent', RH_RULE) / 100,
      windMS: windAt05mMS(engine, csvNumber(table, record, 'windKmH', WIND_RULE), windHeightM),
      surfaceTemperatureK: engine.celsiusToKelvin(concreteC),
    };
    if ((record.cells.evaporationKgM2h ?? '') !== '') {
      sample.measuredEvaporationKgM2s =
        csvNumber(table, record, 'evaporationKgM2h', { unit: 'kg/m2/h', min: 0, max: 10 }) / 3600;
    }
    samples.push(sample);
  }
  return samples;
}

function readMaterial(engine: Engine, flags: FlagReader, cwd: string) {
  const presetId = flags.optionalString('--material');
  const psdPath = flags.optionalString('--psd');
  if (presetId === undefined && psdPath === undefined) {
    throw new UsageError(
      '--material',
      `or --psd is required (presets: ${engine.listMaterialPresets().join(', ')})`,
    );
  }
  let preset;
  try {
    preset = engine.loadMaterialPreset(presetId ?? 'normal-concrete');
  } catch (error) {
    if (error instanceof engine.MaterialPresetError) {
      throw UsageError.fromMessage(
        '--material',
        `--material must be one of ${engine.listMaterialPresets().join(', ')}: got ${JSON.stringify(presetId)}`,
        error,
      );
    }
    throw error;
  }
  const material = engine.elementMaterialFromPreset(preset);
  if (psdPath === undefined) return material;
  const porosity = flags.number('--porosity', {
    unit: 'fraction',
    min: 0,
    max: 1,
    minExclusive: true,
    maxExclusive: true,
  });
  let freshPores;
  try {
    freshPores = engine.parsePoreSizeDistribution(
      readJsonFile('--psd', psdPath, cwd),
      `--psd ${psdPath}`,
    );
  } catch (error) {
    if (error instanceof engine.PoreSizeDistributionInputError)
      throw UsageError.fromMessage(`--psd ${psdPath}`, error.message, error);
    throw error;
  }
  const own = { ...material, freshPores, porosity };
  if (own.mix !== undefined) own.mix = { ...own.mix, refinementExponent: 0 };
  return own;
}

interface SeriesRow {
  timeH: number;
  surfaceStressMPa: number;
  fctmMPa: number;
}
interface ProfileRow {
  timeH: number;
  depthMm: number[];
  saturation: number[];
}

/**
 * Figure of a run with vega-lite 5 rendered by vega 5 to SVG (PNG through resvg): surface stress
 * and tensile strength over time above, saturation profiles at the requested hours below.
 */
async function writePlot(
  path: string,
  series: readonly SeriesRow[],
  profiles: readonly ProfileRow[],
) {
  const [vega, vegaLite] = await Promise.all([import('vega'), import('vega-lite')]);
  const overTime = series.flatMap((row) => [
    { timeH: row.timeH, valueMPa: row.surfaceStressMPa, quantity: 'surface stress' },
    { timeH: row.timeH, valueMPa: row.fctmMPa, quantity: 'tensile strength' },
  ]);
  const depth = profiles.flatMap((profile) =>
    profile.depthMm.map((depthMm, index) => ({
      depthMm,
      saturation: profile.saturation[index],
      timeH: profile.timeH,
    })),
  );
  const timePanel = {
    title: 'Surface stress against tensile strength',
    width: 520,
    height: 220,
    data: { values: overTime },
    mark: 'line',
    encoding: {
      x: { field: 'timeH', type: 'quantitative', title: 'time since placement (h)' },
      y: { field: 'valueMPa', type: 'quantitative', title: 'MPa' },
      color: { field: 'quantity', type: 'nominal', title: null },
      strokeDash: { field: 'quantity', type: 'nominal', title: null },
    },
  };
  const depthPanel = {
    title: 'Saturation profiles',
    width: 520,
    height: 220,
    data: { values: depth },
    mark: 'line',
    encoding: {
      x: { field: 'depthMm', type: 'quantitative', title: 'depth below the exposed surface (mm)' },
      y: {
        field: 'saturation',
        type: 'quantitative',
        title: 'saturation',
        scale: { domain: [0, 1] },
      },
      color: { field: 'timeH', type: 'ordinal', title: 'time (h)' },
    },
  };
  const spec = {
    $schema: 'https://vega.github.io/schema/vega-lite/v5.json',
    vconcat: depth.length > 0 ? [timePanel, depthPanel] : [timePanel],
    resolve: { scale: { color: 'independent', strokeDash: 'independent' } },
  };
  const compiled = vegaLite.compile(spec as unknown as Parameters<typeof vegaLite.compile>[0]);
  const view = new vega.View(vega.parse(compiled.spec), { renderer: 'none' });
  const svg = await view.toSVG();
  if (/\.svg$/i.test(path)) {
    await writeFile(path, svg);
  } else {
    const { Resvg } = await import('@resvg/resvg-js');
    await writeFile(path, new Resvg(svg, { background: 'white' }).render().asPng());
  }
}

function listOfHours(text: string | undefined, hours: number): number[] {
  if (text === undefined) return [];
  return text.split(',').map((part) => {
    const value = Number(part.trim());
    if (part.trim() === '' || !Number.isFinite(value) || value < 0 || value > hours) {
      throw new UsageError(
        '--profiles-at',
        `must be hours between 0 and --hours (${hours}), separated by commas`,
        JSON.stringify(text),
      );
    }
    return value;
  });
}

async function run(flags: FlagReader, context: CommandContext) {
  const engine = await loadEngine();
  const material = readMaterial(engine, flags, context.cwd);
  const thicknessMm = flags.number('--thickness-mm', { unit: 'mm', min: 5, max: 3000 });
  const drying = flags.choice('--drying', ['one-face', 'two-face'] as const, 'one-face');
  const stressMode = flags.choice('--stress-mode', ['flat', 'curl', 'restrained'] as const, 'flat');
  const hours =
    flags.optionalNumber('--hours', { unit: 'h', min: 0, max: 24 * 60, minExclusive: true }) ?? 24;
  const cells = flags.optionalNumber('--cells', { unit: 'cells', min: 10, max: 2000 }) ?? 60;
  const windHeightM = flags.optionalNumber('--wind-height', { unit: 'm', min: 0.05, max: 100 });
  const weatherPath = flags.optionalString('--weather');
  let weather: WeatherSample[];
  if (weatherPath !== undefined) {
    weather = readWeather(engine, weatherPath, windHeightM, context.cwd);
  } else {
    const airC = flags.number('--air-temp', AIR_TEMPERATURE_RULE);
    const concreteC = flags.optionalNumber('--concrete-temp', CONCRETE_TEMPERATURE_RULE) ?? airC;
    if (concreteC < 0)
      throw new UsageError(
        '--air-temp',
        'stands for the concrete temperature without --concrete-temp and must then be between 0 and 60 (degC; freezing is not modelled)',
        String(airC),
      );
    weather = [
      {
        timeS: 0,
        airTemperatureK: engine.celsiusToKelvin(airC),
        relativeHumidity: flags.number('--rh', RH_RULE) / 100,
        windMS: windAt05mMS(engine, flags.number('--wind', WIND_RULE), windHeightM),
        surfaceTemperatureK: engine.celsiusToKelvin(concreteC),
      },
    ];
  }
  const measuresPath = flags.optionalString('--measures');
  const measures = measuresPath === undefined ? [] : readMeasures(measuresPath, context.cwd);
  const profileHours = listOfHours(flags.optionalString('--profiles-at'), hours);
  const plotPath = flags.optionalString('--plot');
  if (plotPath !== undefined && !/\.(png|svg)$/i.test(plotPath)) {
    throw new UsageError('--plot', 'must name a .png or .svg file', JSON.stringify(plotPath));
  }

  const model = engine.createElementModel({
    material,
    thicknessM: thicknessMm / 1000,
    dryingCase: drying,
    stressMode,
    options: { cellCount: Math.round(cells) },
  });
  const started = Date.now();
  let lastShown = -1;
  const result = engine.simulateElement({
    model,
    weather,
    measures,
    durationS: hours * 3600,
    outputIntervalS: hours <= 48 ? 900 : 3600,
    profileTimesS: profileHours.map((hour) => hour * 3600),
    onProgress: (fraction) => {
      // Progress only for runs longer than a second, on stderr so stdout stays parseable.
      const tenth = Math.floor(fraction * 10);
      if (Date.now() - started > 1000 && tenth > lastShown) {
        lastShown = tenth;
        process.stderr.write(`simulate: ${Math.round(fraction * 100)} %\n`);
      }
    },
  });
  const series = result.series.map((figures) => ({
    timeH: figures.timeS / 3600,
    phase: figures.phase,
    surfaceStressMPa: figures.surfaceStressPa / 1e6,
    fctmMPa: figures.surfaceTensileStrengthPa / 1e6,
    utilization: figures.utilization,
    evaporationKgM2h: figures.evaporationKgM2s * 3600,
    surfaceSaturation: figures.surfaceSaturation,
  }));
  const profiles = result.profiles.map((entry) => ({
    timeH: entry.timeS / 3600,
    depthMm: entry.profiles.depthM.map((depth) => depth * 1000),
    saturation: entry.profiles.saturation,
    stressMPa: entry.profiles.stressPa.map((stress) => stress / 1e6),
    fctmMPa: entry.profiles.tensileStrengthPa.map((strength) => strength / 1e6),
    relativeHumidity: entry.profiles.relativeHumidity,
  }));
  const notes: string[] = [];
  if (plotPath !== undefined) {
    await writePlot(resolve(context.cwd, plotPath), series, profiles);
    notes.push(`figure written to ${plotPath}`);
  }
  notes.push(
    'plastic phase (before final set): utilization is surface suction over the critical suction; hardening phase: surface stress over tensile strength.',
  );
  const summary = {
    maxSurfaceStressMPa: result.maxSurfaceStressPa / 1e6,
    minMarginMPa: result.minMarginPa / 1e6,
    maxUtilization: result.maxUtilization,
    waterLossKgM2: result.waterLossKgM2,
    storageWaterReleasedKgM2: -result.state.transport.storageWaterM * model.liquidDensityKgPerM3,
  };
  const shown = series.filter(
    (_, index) =>
      index % Math.max(1, Math.round(series.length / 24)) === 0 || index === series.length - 1,
  );
  return {
    json: {
      command: 'simulate',
      material: material.preset.id,
      thicknessMm,
      drying,
      stressMode,
      hours,
      cells: model.grid.cellCount,
      ...summary,
      series,
      profiles,
      notes,
    },
    tables: [
      {
        title: `Drying of a ${thicknessMm} mm element (${material.preset.name}, ${drying} drying, ${stressMode} stress)`,
        rows: [
          ['peak surface stress', formatNumber(summary.maxSurfaceStressMPa, 2), 'MPa'],
          ['smallest margin (hardening phase)', formatNumber(summary.minMarginMPa, 2), 'MPa'],
          ['peak utilization', formatNumber(summary.maxUtilization, 2), ''],
          ['water evaporated', formatNumber(summary.waterLossKgM2, 2), 'kg/m2'],
        ],
      },
      {
        title: 'Over time',
        head: [
          'time h',
          'phase',
          'stress MPa',
          'strength MPa',
          'utilization',
          'evaporation kg/m2/h',
          'surface S',
        ],
        rows: shown.map((row) => [
          formatNumber(row.timeH, 1),
          row.phase,
          formatNumber(row.surfaceStressMPa, 2),
          formatNumber(row.fctmMPa, 2),
          formatNumber(row.utilization, 2),
          formatNumber(row.evaporationKgM2h, 3),
          formatNumber(row.surfaceSaturation, 3),
        ]),
      },
    ],
    notes,
  };
}

export const simulateCommand: CommandDefinition = {
  name: 'simulate',
  summary:
    'drying model of an element: surface stress against strength over time (planning a pour)',
  description:
    'Runs the element model of physics.md sections 1 to 7: moisture transport through the depth ' +
    '(capillary bundle of the pore-size distribution, vapour diffusion, implicit steps), Uno ' +
    'evaporation with the falling-rate extension, bleeding, curing measures, maturity, hydration, ' +
    'pore refinement, and the drying stress against the tensile strength. With --psd, the mix, ' +
    'strength and mechanics come from --material (default normal-concrete) and the pores do not refine. ' +
    'Weather file: CSV with time (ISO 8601 or hours since placement), airTempC, rhPercent, windKmH, ' +
    'optional concreteTempC and evaporationKgM2h. Measures file: JSON list of {kind, startH, endH, ' +
    'efficiency | relativeHumidityPercent | windFactor}. Concrete below 0 degC is refused.',
  flags: [
    {
      flags: '--material <preset>',
      description: 'material preset (see the presets folder), e.g. normal-concrete',
    },
    {
      flags: '--psd <file>',
      description: 'pore-size distribution JSON (as drying-stress); needs --porosity',
    },
    { flags: '--porosity <fraction>', description: 'porosity with --psd, 0 to 1' },
    {
      flags: '--thickness-mm <mm>',
      description: 'element thickness, mm (5 to 3000)',
      required: true,
    },
    { flags: '--drying <case>', description: 'one-face (base sealed, default) or two-face' },
    {
      flags: '--stress-mode <mode>',
      description: 'flat (default), curl or restrained (physics.md 5)',
    },
    { flags: '--air-temp <C>', description: 'constant air temperature, degC (-20 to 60)' },
    {
      flags: '--concrete-temp <C>',
      description: 'constant concrete temperature, degC (0 to 60; default: air)',
    },
    { flags: '--rh <percent>', description: 'constant relative humidity, percent' },
    { flags: '--wind <kmh>', description: 'constant wind speed, km/h' },
    {
      flags: '--wind-height <m>',
      description: 'height of the wind reading, m (default 0.5 m: no conversion)',
    },
    { flags: '--weather <file>', description: 'weather CSV instead of the constant-weather flags' },
    {
      flags: '--measures <file>',
      description: 'measure log JSON (curing measures with start and end hours)',
    },
    { flags: '--hours <h>', description: 'hours to simulate from placement (default 24)' },
    { flags: '--cells <n>', description: 'cells over the depth (default 60, physics.md 1)' },
    { flags: '--profiles-at <h,h>', description: 'hours at which to report depth profiles' },
    {
      flags: '--plot <file>',
      description:
        'write a figure (.png or .svg): stress and strength over time, saturation profiles',
    },
  ],
  example:
    'simulate --material normal-concrete --thickness-mm 150 --air-temp 32 --rh 35 --wind 20 --hours 12 --json',
  run,
};
