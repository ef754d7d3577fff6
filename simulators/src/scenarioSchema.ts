/**
 * The scenario file (`simulators/scenarios/<name>/scenario.json`): what the simulators play.
 * The element's hidden truth (its own parameters, unseen by the server), the weather's daily
 * cycle and scripted events, the probe strings with their imperfections, scripted faults and
 * the crew's measure logs. Validated with zod at the edge; every message names the field, the
 * rule and the value received.
 */
import { z } from 'zod';
import {
  numberBetween,
  sensorName,
  topicLevel,
  weatherSensors,
} from '../../server/src/config/fieldSchemas.ts';
import { ValidationError, formatIssues } from '../../server/src/config/index.ts';

const between = numberBetween;
const deviceId = topicLevel('device id');
const isoTime = z.iso.datetime({
  offset: true,
  error: 'must be an ISO 8601 date and time with an offset, e.g. 2026-07-16T11:15:00+02:00',
});

const probeSensorSchema = z.strictObject({
  sensor: sensorName,
  quantity: z.enum(['rh', 'temperature'], { error: 'must be "rh" or "temperature"' }),
  depthMm: between(0, 5000, 'mm'),
  /** Constant error of this sensor, in its unit (%RH or degC). */
  bias: between(-10, 10, '(%RH or degC)').default(0),
  /** Standard deviation of the reading noise, in its unit. */
  noiseSd: between(0, 5, '(%RH or degC)').default(0.2),
  /** Reading resolution, in its unit: 0.1 (common practice for capacitive RH and digital temperature sensors). */
  quantum: between(0.001, 5, '(%RH or degC)').default(0.1),
});

const probeStringSchema = z.strictObject({
  device: deviceId,
  /** Seconds between packs in event time. */
  intervalS: between(5, 3600, 's').default(60),
  /** Rate of the device clock's drift, parts per million (a cheap crystal: tens of ppm, common practice). */
  clockDriftPpm: between(-500, 500, 'ppm').default(0),
  /** Offset of the device clock at the start, s. */
  clockOffsetS: between(-120, 120, 's').default(0),
  /** Chance that a pack is lost, 0..1. */
  dropoutProbability: between(0, 0.5, '(fraction)').default(0),
  sensors: z.array(probeSensorSchema).min(1).max(32),
});

const weatherEventSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      kind: z.literal('dry-wind'),
      startAt: isoTime,
      endAt: isoTime,
      /** Time the wind takes to rise to its strength, and to fall back at the end, min. */
      rampMin: between(0, 600, 'min').default(45),
      /** Mean wind at mast height at full strength, m/s. */
      windMS: between(0, 40, 'm/s'),
      /** Drop of the air's relative humidity at full strength, percentage points. */
      humidityDropPercent: between(0, 80, '%RH').default(0),
      /** Rise of the air temperature at full strength, K. */
      temperatureRiseK: between(0, 15, 'K').default(0),
    }),
    z.strictObject({
      kind: z.literal('shower'),
      startAt: isoTime,
      endAt: isoTime,
      rainMmH: between(0, 200, 'mm/h'),
      /** Relative humidity of the air during the shower, %. */
      humidityPercent: between(0, 100, '%RH').default(90),
      temperatureDropK: between(0, 15, 'K').default(3),
    }),
  ],
  { error: 'must be an event of kind "dry-wind" or "shower"' },
);

const weatherSchema = z.strictObject({
  device: deviceId,
  mastHeightM: between(0.1, 50, 'm'),
  intervalS: between(5, 3600, 's').default(60),
  sensors: weatherSensors,
  /** Daily cycle: coolest and warmest air, degC, at local hours. */
  airTemperatureMinC: between(-30, 50, 'degC'),
  airTemperatureMaxC: between(-30, 55, 'degC'),
  coolestAtH: between(0, 24, 'h').default(5),
  warmestAtH: between(0, 24, 'h').default(15),
  /** Relative humidity of the air at the coolest and at the warmest hour, %. */
  humidityAtCoolestPercent: between(1, 100, '%RH'),
  humidityAtWarmestPercent: between(1, 100, '%RH'),
  /** Mean wind at mast height outside events, m/s, and gusts over it (peak / mean). */
  windMS: between(0, 40, 'm/s'),
  gustFactor: between(1, 3, '(ratio)').default(1.4),
  /** Global solar radiation at solar noon on a clear day, W/m2; sunrise and sunset local hours. */
  solarNoonWm2: between(0, 1200, 'W/m2').default(0),
  sunriseH: between(0, 24, 'h').default(6),
  sunsetH: between(0, 24, 'h').default(20),
  events: z.array(weatherEventSchema).max(50).default([]),
});

const measureSchema = z.strictObject({
  kind: z.enum(['wet-covering', 'ponding', 'curing-compound', 'fogging', 'windbreak'], {
    error: 'must be one of wet-covering, ponding, curing-compound, fogging, windbreak',
  }),
  startAt: isoTime,
  endAt: isoTime.optional(),
  efficiency: between(0, 1, '(fraction)').optional(),
  relativeHumidity: between(0, 1, '(fraction)').optional(),
  windFactor: between(0, 1, '(fraction)').optional(),
  note: z.string().max(500).optional(),
});

const faultSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      kind: z.literal('stuck'),
      device: deviceId,
      sensor: sensorName,
      /** From then on the sensor repeats the last value it reported. */
      fromAt: isoTime,
    }),
    z.strictObject({
      kind: z.literal('silence'),
      device: deviceId,
      fromAt: isoTime,
      /** Absent: silent to the end. */
      toAt: isoTime.optional(),
    }),
  ],
  { error: 'must be a fault of kind "stuck" or "silence"' },
);

export const scenarioSchema = z
  .strictObject({
    name: z
      .string()
      .regex(/^[a-z0-9-]{1,64}$/, { error: 'must be lower-case letters, digits and "-"' }),
    description: z.string().max(4000).default(''),
    /** Seed of every random draw (noise, gusts, dropouts): same seed, same readings. */
    seed: z
      .number({ error: 'must be a whole number' })
      .int({ error: 'must be a whole number' })
      .min(0, { error: 'must be at least 0' })
      .max(2 ** 32 - 1, { error: `must be at most ${2 ** 32 - 1}` }),
    /** Event time the simulation starts and how long it plays. */
    startAt: isoTime,
    durationH: between(0.1, 72, 'h'),
    /** Hidden truth: the drying model with its own parameters, unseen by the server. */
    truth: z.strictObject({
      material: z.string().regex(/^[a-z0-9-]+$/, { error: 'must be a material preset id' }),
      thicknessMm: between(5, 5000, 'mm'),
      drying: z.enum(['one-face', 'two-face'], { error: 'must be "one-face" or "two-face"' }),
      placedAt: isoTime,
      placementTemperatureC: between(1, 45, 'degC'),
      /** Stress mode and external restraint degree of the truth (physics.md section 5). */
      restraint: z
        .strictObject({
          mode: z.enum(['flat', 'curl', 'restrained'], {
            error: 'must be one of flat, curl, restrained',
          }),
          degree: between(0, 1, '(fraction)').default(0),
        })
        .default({ mode: 'flat', degree: 0 }),
      /** Cells of the truth's grid: finer than the server's 60 (our assumption). */
      cellCount: z
        .number({ error: 'must be a whole number' })
        .int({ error: 'must be a whole number' })
        .min(10, { error: 'must be at least 10' })
        .max(400, { error: 'must be at most 400' })
        .default(120),
      permeabilityMultiplier: between(0.05, 20, '(ratio)').default(1),
      exposureMultiplier: between(0.2, 5, '(ratio)').default(1),
      /** Water film left on the surface by placing and finishing, kg/m2. */
      initialBleedFilmKgM2: between(0, 5, 'kg/m2').default(0),
      /** Rise of the surface over the air temperature per 1000 W/m2 of sun, K. */
      solarGainKPerKWm2: between(0, 20, 'K per kW/m2').default(6),
      /** Time constant of the surface temperature following the air, min. */
      surfaceLagMin: between(1, 600, 'min').default(30),
      /** Largest event-time step of the truth, s. */
      stepS: between(5, 900, 's').default(60),
    }),
    weather: weatherSchema,
    probeStrings: z.array(probeStringSchema).min(1).max(20),
    /** Named measure logs; `--measures <name>` picks one. */
    measureLogs: z.record(z.string().regex(/^[a-z0-9-]{1,40}$/), z.array(measureSchema).max(100)),
    defaultMeasureLog: z.string(),
    faults: z.array(faultSchema).max(50).default([]),
  })
  .superRefine((scenario, context) => {
    if (!Object.hasOwn(scenario.measureLogs, scenario.defaultMeasureLog)) {
      context.addIssue({
        code: 'custom',
        path: ['defaultMeasureLog'],
        message: `must name one of measureLogs (${Object.keys(scenario.measureLogs).join(', ')}): got ${JSON.stringify(scenario.defaultMeasureLog)}`,
      });
    }
    scenario.probeStrings.forEach((probeString, index) =>
      probeString.sensors.forEach((sensor, sensorIndex) => {
        if (sensor.depthMm > scenario.truth.thicknessMm) {
          context.addIssue({
            code: 'custom',
            path: ['probeStrings', index, 'sensors', sensorIndex, 'depthMm'],
            message: `must be between 0 and the element thickness (${scenario.truth.thicknessMm} mm): got ${sensor.depthMm}`,
          });
        }
      }),
    );
    const ordered = (path: (string | number)[], from: string, to: string | undefined) => {
      if (to !== undefined && !(Date.parse(to) > Date.parse(from))) {
        context.addIssue({ code: 'custom', path, message: `must be after ${from}: got ${to}` });
      }
    };
    scenario.weather.events.forEach((event, index) =>
      ordered(['weather', 'events', index, 'endAt'], event.startAt, event.endAt),
    );
    for (const [name, log] of Object.entries(scenario.measureLogs)) {
      log.forEach((measure, index) =>
        ordered(['measureLogs', name, index, 'endAt'], measure.startAt, measure.endAt),
      );
    }
    scenario.faults.forEach((fault, index) => {
      if (fault.kind === 'silence') ordered(['faults', index, 'toAt'], fault.fromAt, fault.toAt);
    });
  });

/** A validated scenario, defaults filled in. */
export type Scenario = z.output<typeof scenarioSchema>;
export type ScenarioInput = z.input<typeof scenarioSchema>;
export type ScenarioProbeString = Scenario['probeStrings'][number];
export type ScenarioWeather = Scenario['weather'];
export type ScenarioMeasure = Scenario['measureLogs'][string][number];
export type ScenarioFault = Scenario['faults'][number];

/**
 * Validates a scenario and fills in its defaults.
 *
 * @throws ValidationError listing every problem, one line each, naming field, rule and value
 */
export function parseScenario(input: unknown): Scenario {
  const result = scenarioSchema.safeParse(input);
  if (result.success) return result.data;
  throw new ValidationError('scenario', formatIssues(result.error.issues, input));
}

/**
 * Offset from UTC, minutes, written in an ISO 8601 time (`+02:00` -> 120, `Z` -> 0).
 * Returns 0 when the string carries no offset.
 */
export function utcOffsetMin(isoTimeText: string): number {
  const match = /([+-])(\d{2}):?(\d{2})$/.exec(isoTimeText);
  if (match === null) return 0;
  const sign = match[1] === '-' ? -1 : 1;
  return sign * (Number(match[2]) * 60 + Number(match[3]));
}
