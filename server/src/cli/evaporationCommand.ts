/**
 * `meniscus evaporation`: the evaporation rate from a fresh concrete surface under given weather
 * (Uno 1998), the wind brought to 0.5 m by the log profile, the +-40 % band of such estimates
 * (Hover 2006) and the ACI 305R precaution verdict.
 */
import {
  evaporationEstimateBand,
  EVAPORATION_ESTIMATE_RELATIVE_UNCERTAINTY,
  UNO_WIND_HEIGHT_M,
  unoEvaporationRateKgM2h,
} from '../physics/evaporation.ts';
import { OPEN_TERRAIN_ROUGHNESS_LENGTH_M, windSpeedAtUnoHeight } from '../physics/windProfile.ts';
import {
  DEFAULT_EVAPORATION_PRECAUTION_OPTIONS,
  evaporationPrecautionVerdict,
} from '../physics/precautions.ts';
import type { CommandDefinition } from './commandDefinition.ts';
import type { NumberRule } from './flags.ts';
import { formatNumber } from './output.ts';
import { UsageError } from './usageError.ts';

/** Temperatures the command accepts, degC: the formula needs T > -18 degC; pours above 60 are not real. */
const TEMPERATURE_RULE: NumberRule = { unit: 'degC', min: -15, max: 60 };

/** Range of the ACI 305R chart that Uno's formula reproduces (from memory): beyond it, extrapolation. */
const CHART_TEMPERATURE_RANGE_C = [0, 40] as const;
const CHART_MAX_WIND_KMH = 40;

export const evaporationCommand: CommandDefinition = {
  name: 'evaporation',
  summary: 'evaporation rate from a fresh concrete surface (Uno 1998) and the ACI 305R verdict',
  description:
    'Evaporation rate from a wet concrete surface by the metric formula of Uno (1998, ACI Materials ' +
    'Journal 95(4)): E = 5 [(Tc + 18)^2.5 - r (Ta + 18)^2.5] (V + 4) 1e-6 kg/m2/h, with the wind V ' +
    'about 0.5 m above the surface. A wind measured higher is brought to 0.5 m by the logarithmic ' +
    'wind profile. Such estimates carry about +-40 % against measured evaporation (Hover 2006).',
  flags: [
    { flags: '--air-temp <C>', description: 'air temperature, degC (-15 to 60)', required: true },
    {
      flags: '--concrete-temp <C>',
      description: 'concrete surface temperature, degC (-15 to 60)',
      required: true,
    },
    {
      flags: '--rh <percent>',
      description: 'relative humidity of the air, percent (0 to 100)',
      required: true,
    },
    { flags: '--wind <kmh>', description: 'wind speed, km/h (0 to 150)', required: true },
    {
      flags: '--wind-height <m>',
      description: 'height the wind was measured at, m (default 0.5 m: no conversion)',
    },
    {
      flags: '--roughness-length <m>',
      description: `terrain roughness length for the wind profile, m (default ${OPEN_TERRAIN_ROUGHNESS_LENGTH_M} m, open terrain, WMO-No. 8)`,
    },
    {
      flags: '--sensitive-mix',
      description:
        'mix with silica fume or low w/c: halve the precaution threshold (ACI 305R, about half)',
    },
  ],
  example: 'evaporation --air-temp 31 --concrete-temp 34 --rh 35 --wind 18 --wind-height 10',
  run(flags) {
    const airTemperatureC = flags.number('--air-temp', TEMPERATURE_RULE);
    const concreteTemperatureC = flags.number('--concrete-temp', TEMPERATURE_RULE);
    const relativeHumidityPercent = flags.number('--rh', { unit: 'percent', min: 0, max: 100 });
    const windKmH = flags.number('--wind', { unit: 'km/h', min: 0, max: 150 });
    const roughnessLengthM =
      flags.optionalNumber('--roughness-length', {
        unit: 'm',
        min: 0,
        max: 2,
        minExclusive: true,
      }) ?? OPEN_TERRAIN_ROUGHNESS_LENGTH_M;
    const windHeightGiven = flags.optionalNumber('--wind-height', {
      unit: 'm',
      min: 0,
      max: 100,
      minExclusive: true,
    });
    if (windHeightGiven !== undefined && windHeightGiven <= roughnessLengthM) {
      throw new UsageError(
        '--wind-height',
        `must be above the roughness length (${roughnessLengthM} m)`,
        String(windHeightGiven),
      );
    }
    const windHeightM = windHeightGiven ?? UNO_WIND_HEIGHT_M;
    const windAt05mKmH =
      windHeightGiven === undefined
        ? windKmH
        : windSpeedAtUnoHeight(windKmH, windHeightM, { roughnessLengthM });

    const evaporationKgM2h = unoEvaporationRateKgM2h({
      airTemperatureC,
      concreteTemperatureC,
      relativeHumidity: relativeHumidityPercent / 100,
      windKmH: windAt05mKmH,
    });
    const band = evaporationEstimateBand(evaporationKgM2h);
    const sensitiveMix = flags.switch('--sensitive-mix');
    const verdict = evaporationPrecautionVerdict(evaporationKgM2h, {
      ...DEFAULT_EVAPORATION_PRECAUTION_OPTIONS,
      sensitiveMix,
    });
    const precautionsNeeded = verdict.verdict === 'precautions-needed';
    const verdictWords = precautionsNeeded
      ? 'take precautions against plastic shrinkage cracking'
      : 'below the precaution threshold';

    const notes: string[] = [];
    if (windHeightGiven === undefined) {
      notes.push(
        'no --wind-height given: the wind is taken as measured about 0.5 m above the surface.',
      );
    } else {
      notes.push(
        `wind at ${windHeightM} m converted to 0.5 m by the log wind profile (roughness length ${roughnessLengthM} m).`,
      );
    }
    const outsideChart = [airTemperatureC, concreteTemperatureC].some(
      (temperatureC) =>
        temperatureC < CHART_TEMPERATURE_RANGE_C[0] || temperatureC > CHART_TEMPERATURE_RANGE_C[1],
    );
    if (outsideChart || windAt05mKmH > CHART_MAX_WIND_KMH) {
      notes.push(
        'inputs outside the range of the evaporation chart (0-40 degC, wind up to 40 km/h): extrapolated.',
      );
    }
    if (evaporationKgM2h === 0) {
      notes.push(
        'the air holds more vapour than the surface gives off: no evaporation (condensation is not estimated).',
      );
    }

    const uncertaintyPercent = EVAPORATION_ESTIMATE_RELATIVE_UNCERTAINTY * 100;
    return {
      json: {
        command: 'evaporation',
        airTemperatureC,
        concreteTemperatureC,
        relativeHumidityPercent,
        windKmH,
        windHeightM,
        windHeightAssumed: windHeightGiven === undefined,
        roughnessLengthM,
        windAt05mKmH,
        evaporationKgM2h,
        evaporationLowKgM2h: band.low,
        evaporationHighKgM2h: band.high,
        uncertaintyPercent,
        precautionThresholdKgM2h: verdict.thresholdKgM2h,
        sensitiveMix,
        precautionsNeeded,
        verdict: verdict.verdict,
        method:
          'Uno (1998) metric formula; wind height by the log profile; band after Hover (2006); threshold ACI 305R',
        notes,
      },
      tables: [
        {
          title: 'Evaporation from the concrete surface (Uno 1998)',
          rows: [
            ['air temperature', formatNumber(airTemperatureC, 1), 'degC'],
            ['concrete surface temperature', formatNumber(concreteTemperatureC, 1), 'degC'],
            ['relative humidity', formatNumber(relativeHumidityPercent, 0), '%'],
            [
              `wind as measured (at ${windHeightM} m${windHeightGiven === undefined ? ', assumed' : ''})`,
              formatNumber(windKmH, 1),
              'km/h',
            ],
            ['wind at 0.5 m used', formatNumber(windAt05mKmH, 1), 'km/h'],
            ['evaporation rate', formatNumber(evaporationKgM2h, 2), 'kg/m2/h'],
            [
              `band (+-${uncertaintyPercent} %, Hover 2006)`,
              `${formatNumber(band.low, 2)} to ${formatNumber(band.high, 2)}`,
              'kg/m2/h',
            ],
            [
              `ACI 305R precaution threshold${sensitiveMix ? ' (halved: sensitive mix)' : ''}`,
              formatNumber(verdict.thresholdKgM2h, 2),
              'kg/m2/h',
            ],
            ['verdict', verdictWords, ''],
          ],
        },
      ],
      notes,
    };
  },
};
