/**
 * `meniscus simulate`: the drying model of one element (physics.md sections 1 to 7) run through
 * constant weather or a weather file and an optional measure log, for planning a pour: where does
 * the surface stress go against the growing strength, and which protection keeps it below?
 */
import { resolve } from 'node:path';
import type { CommandContext, CommandDefinition } from './commandDefinition.ts';
import type { FlagReader } from './flags.ts';
import { formatNumber } from './output.ts';
import { readJsonFile } from './readJsonFile.ts';
import { UsageError } from './usageError.ts';

/** The engine and physics, imported when the command runs (keeps other commands' start-up short). */
async function loadEngine() {
  const [presets, material, model, simulation, figures, input, wind, units, edge, plot, reference] =
    await Promise.all([
      import('../engine/materialPreset.ts'),
      import('../engine/elementMaterial.ts'),
      import('../engine/elementModel.ts'),
      import('../engine/simulateElement.ts'),
      import('../engine/elementFigures.ts'),
      import('../physics/poreSizeDistributionInput.ts'),
      import('../physics/windProfile.ts'),
      import('../physics/units.ts'),
      import('./simulateInputs.ts'),
      import('./simulatePlot.ts'),
      import('../engine/stressReference.ts'),
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
    ...edge,
    ...plot,
    ...reference,
  };
}
type Engine = Awaited<ReturnType<typeof loadEngine>>;
type WeatherSample = import('../engine/simulateElement.ts').WeatherSample;

/** Concrete below 0 degC is refused: freezing of pore water is not modelled (boundaryInputs.ts). */
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

/** Hours to the strength target as the table shows them: reached, never, or hours. */
function hoursToTarget(hours: number): string {
  if (hours === 0) return 'reached';
  if (hours === Number.POSITIVE_INFINITY) return 'never at this rate';
  return formatNumber(hours, 1);
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
  const stressReference = flags.choice(
    '--stress-reference',
    engine.STRESS_REFERENCES,
    engine.DEFAULT_STRESS_REFERENCE,
  );
  const hours =
    flags.optionalNumber('--hours', { unit: 'h', min: 0, max: 24 * 60, minExclusive: true }) ?? 24;
  const cells = flags.optionalNumber('--cells', { unit: 'cells', min: 10, max: 2000 }) ?? 60;
  const windHeightM = flags.optionalNumber('--wind-height', { unit: 'm', min: 0.05, max: 100 });
  const weatherPath = flags.optionalString('--weather');
  let weather: WeatherSample[];
  if (weatherPath !== undefined) {
    weather = engine.readWeather(
      weatherPath,
      windHeightM,
      context.cwd,
      flags.optionalString('--placed-at'),
    );
  } else {
    if (flags.optionalString('--placed-at') !== undefined) {
      throw new UsageError(
        '--placed-at',
        'needs --weather with ISO 8601 times (constant weather has no clock)',
        'without --weather',
      );
    }
    const airC = flags.number('--air-temp', engine.AIR_TEMPERATURE_RULE);
    const concreteC =
      flags.optionalNumber('--concrete-temp', engine.CONCRETE_TEMPERATURE_RULE) ?? airC;
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
        relativeHumidity: flags.number('--rh', engine.RH_RULE) / 100,
        windMS: engine.windAt05mMS(flags.number('--wind', engine.WIND_RULE), windHeightM),
        surfaceTemperatureK: engine.celsiusToKelvin(concreteC),
      },
    ];
  }
  const measuresPath = flags.optionalString('--measures');
  const measures = measuresPath === undefined ? [] : engine.readMeasures(measuresPath, context.cwd);
  const profileHours = listOfHours(flags.optionalString('--profiles-at'), hours);
  const targetFcmMPa = flags.optionalNumber('--target-fcm', { unit: 'MPa', min: 0, max: 150 });
  const plotPath = flags.optionalString('--plot');
  if (plotPath !== undefined && !/\.(png|svg)$/i.test(plotPath)) {
    throw new UsageError('--plot', 'must name a .png or .svg file', JSON.stringify(plotPath));
  }

  const model = engine.createElementModel({
    material,
    thicknessM: thicknessMm / 1000,
    dryingCase: drying,
    stressMode,
    stressReference,
    options: { cellCount: Math.round(cells) },
  });
  const started = Date.now();
  const progressAfterMs = context.progressAfterMs ?? 1000;
  const writeProgress = context.progress ?? ((line: string) => void process.stderr.write(line));
  let lastShown = -1;
  const result = engine.simulateElement({
    model,
    weather,
    measures,
    durationS: hours * 3600,
    outputIntervalS: hours <= 48 ? 900 : 3600,
    profileTimesS: profileHours.map((hour) => hour * 3600),
    ...(targetFcmMPa === undefined ? {} : { targetCompressiveStrengthMPa: targetFcmMPa }),
    onProgress: (fraction) => {
      // Progress only for runs longer than a second, on stderr so stdout stays parseable.
      const tenth = Math.floor(fraction * 10);
      if (Date.now() - started >= progressAfterMs && tenth > lastShown) {
        lastShown = tenth;
        writeProgress(`simulate: ${Math.round(fraction * 100)} %\n`);
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
  // A preset's known limits (its own pores only: --psd brings other pores).
  if (flags.optionalString('--psd') === undefined) {
    for (const limitation of material.preset.limitations ?? []) {
      notes.push(`known limit of ${material.preset.id}: ${limitation}.`);
    }
  }
  const weatherEndH = (weather.at(-1)?.timeS ?? 0) / 3600;
  if (weatherPath !== undefined && weatherEndH < hours) {
    notes.push(
      `the weather file ends ${formatNumber(weatherEndH, 1)} h after placement: its last record is held to the end of the run (${formatNumber(hours, 1)} h).`,
    );
  }
  if (plotPath !== undefined) {
    await engine.writePlot(resolve(context.cwd, plotPath), series, profiles);
    notes.push(`figure written to ${plotPath}`);
  }
  notes.push(
    'plastic phase (before final set): utilization is surface suction over the critical suction; hardening phase: surface stress over tensile strength.',
    stressReference === 'final-set'
      ? 'drying stress counted from the stress-free state at the element final set, when its bulk sets (zero before it).'
      : 'drying stress counted from the saturated placement (includes the suction built before final set).',
  );
  const forecast = result.series.at(-1)?.strengthForecast;
  const strengthForecast = {
    targetFcmMPa: forecast?.targetCompressiveStrengthMPa ?? Number.NaN,
    surfaceHours: forecast?.surfaceHours ?? Number.NaN,
    coreHours: forecast?.coreHours ?? Number.NaN,
  };
  // The two phases measure different things (suction against air entry before final set, stress
  // against strength after it), so the readable summary names the phase of each peak.
  const peakInPhase = (phase: 'plastic' | 'hardening') =>
    result.series
      .filter((figures) => figures.phase === phase)
      .reduce(
        (peak, figures) => (peak >= figures.utilization ? peak : figures.utilization),
        Number.NaN,
      );
  const summary = {
    maxSurfaceStressMPa: result.maxSurfaceStressPa / 1e6,
    minMarginMPa: result.minMarginPa / 1e6,
    maxUtilization: result.maxUtilization,
    maxPlasticUtilization: peakInPhase('plastic'),
    maxHardeningUtilization: peakInPhase('hardening'),
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
      stressReference,
      hours,
      cells: model.grid.cellCount,
      ...summary,
      strengthForecast,
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
          [
            'peak utilization, plastic phase (suction / air-entry suction)',
            formatNumber(summary.maxPlasticUtilization, 2),
            '',
          ],
          [
            'peak utilization, hardening phase (stress / strength)',
            formatNumber(summary.maxHardeningUtilization, 2),
            '',
          ],
          ['water evaporated', formatNumber(summary.waterLossKgM2, 2), 'kg/m2'],
          [
            `hours from the end to ${formatNumber(strengthForecast.targetFcmMPa, 1)} MPa, surface / core`,
            `${hoursToTarget(strengthForecast.surfaceHours)} / ${hoursToTarget(strengthForecast.coreHours)}`,
            'h',
          ],
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

/** The `simulate` command of the registry (commands.ts). */
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
    {
      flags: '--stress-reference <ref>',
      description:
        'final-set (default: stress counted from the element final set, when its bulk sets) or placement (from the saturated placement)',
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
      flags: '--placed-at <time>',
      description:
        'placement time (ISO 8601) within a weather file of ISO times, e.g. a forecast (default: its first record)',
    },
    {
      flags: '--measures <file>',
      description: 'measure log JSON (curing measures with start and end hours)',
    },
    { flags: '--hours <h>', description: 'hours to simulate from placement (default 24)' },
    { flags: '--cells <n>', description: 'cells over the depth (default 60, physics.md 1)' },
    { flags: '--profiles-at <h,h>', description: 'hours at which to report depth profiles' },
    {
      flags: '--target-fcm <MPa>',
      description:
        'target in-place compressive strength of the forecast at the end of the run, MPa (default 10)',
    },
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
