/**
 * The run configuration: what a run watches (element, probes, weather station) and how it warns.
 * Validated at the edge with zod; every error names the field, the rule and the value received.
 * Keys kept stable by architecture.md "Run configuration"; extend freely.
 */
import { z } from 'zod';
import { numberBetween, sensorName, topicLevel, weatherSensors } from './fieldSchemas.ts';
import { ValidationError, formatIssues } from './formatIssues.ts';

/** Kinds of element a run may watch (terms of the trade). */
export const ELEMENT_KINDS = [
  'slab',
  'deck',
  'wall',
  'render',
  'topping',
  'screed',
  'other',
] as const;
/** Stress modes of physics.md section 5. */
export const RESTRAINT_MODES = ['flat', 'curl', 'restrained'] as const;
/** Weather quantities a station may report, each named to the station's sensor. */
export const WEATHER_QUANTITIES = [
  'airTemperature',
  'relativeHumidity',
  'windSpeed',
  'solarRadiation',
  'rain',
] as const;

const probeSchema = z.strictObject({
  device: topicLevel('device id'),
  sensor: sensorName,
  quantity: z.enum(['rh', 'temperature'], { error: 'must be "rh" or "temperature"' }),
  /** Depth below the exposed surface, mm; checked against the element thickness below. */
  depthMm: z.number({ error: 'must be a number in mm' }),
});

const weatherSchema = z.strictObject({
  device: topicLevel('device id'),
  /** Height of the anemometer above the element's surface, m (Uno's formula wants 0.5 m). */
  mastHeightM: numberBetween(0.1, 50, 'm'),
  sensors: weatherSensors,
});

/** The zod schema of a run configuration; use parseRunConfig() for messages a person can act on. */
export const runConfigSchema = z
  .strictObject({
    /** Site id, used as a topic level: `meniscus/<site>/<device>/data`. */
    site: topicLevel('site id'),
    /** A name for people; defaults to the element kind and placement time. */
    name: z.string().min(1).max(200).optional(),
    element: z.strictObject({
      kind: z.enum(ELEMENT_KINDS, { error: `must be one of ${ELEMENT_KINDS.join(', ')}` }),
      thicknessMm: numberBetween(5, 5000, 'mm'),
      drying: z.enum(['one-face', 'two-face'], { error: 'must be "one-face" or "two-face"' }),
      /** Stress mode and external restraint degree R in 0..1 (physics.md section 5). */
      restraint: z
        .strictObject({
          mode: z.enum(RESTRAINT_MODES, { error: `must be one of ${RESTRAINT_MODES.join(', ')}` }),
          degree: numberBetween(0, 1, '(fraction)').default(0),
        })
        .default({ mode: 'flat', degree: 0 }),
    }),
    placedAt: z.iso.datetime({
      offset: true,
      error: 'must be an ISO 8601 date and time with an offset, e.g. 2026-06-14T11:20:00+02:00',
    }),
    probes: z.array(probeSchema).max(200).default([]),
    weather: weatherSchema,
    /** Mix data; the engine reads what it knows, unknown keys are kept for it. */
    mix: z
      .looseObject({
        strengthClass: z
          .string()
          .regex(/^C\d{1,3}\/\d{1,3}$/, { error: 'must be a class like C30/37' })
          .optional(),
        waterCementRatio: numberBetween(0.2, 1, '(kg/kg)').optional(),
        bleedRateKgM2h: numberBetween(0, 5, 'kg/m2/h').optional(),
      })
      .default({}),
    /** Material (pore-size distribution and the like); passed through to the engine. */
    material: z.looseObject({}).default({}),
    thresholds: z
      .strictObject({
        /** Utilization thresholds; defaults after the cracking-index practice (physics.md 7). */
        utilization: z
          .array(numberBetween(0.05, 5, '(stress/strength)'))
          .min(1)
          .max(5)
          .default([0.57, 0.69, 1.0]),
        /** ACI 305R precaution threshold, kg/m2/h. */
        evaporationKgM2h: numberBetween(0.05, 5, 'kg/m2/h').default(1.0),
      })
      .default({ utilization: [0.57, 0.69, 1.0], evaporationKgM2h: 1.0 }),
    /** How long before the margin is expected to close a warning must go out (physics.md 9). */
    leadTimeMin: numberBetween(1, 1440, 'min').default(90),
    recipients: z
      .array(
        z.strictObject({
          name: z.string().min(1).max(200),
          email: z.email({ error: 'must be an e-mail address' }).optional(),
          phone: z.string().min(3).max(40).optional(),
        }),
      )
      .default([]),
  })
  .superRefine((config, context) => {
    config.probes.forEach((probe, index) => {
      const thicknessMm = config.element.thicknessMm;
      if (!(probe.depthMm >= 0 && probe.depthMm <= thicknessMm)) {
        context.addIssue({
          code: 'custom',
          path: ['probes', index, 'depthMm'],
          message: `must be between 0 and the element thickness (${thicknessMm} mm): got ${probe.depthMm}`,
        });
      }
    });
    const seen = new Map<string, string>();
    const claim = (device: string, sensor: string, path: (string | number)[], what: string) => {
      const key = `${device}\u0000${sensor}`;
      const earlier = seen.get(key);
      if (earlier !== undefined) {
        context.addIssue({
          code: 'custom',
          path,
          message: `must name a sensor used once per run: ${device}/${sensor} is already ${earlier}`,
        });
      } else seen.set(key, what);
    };
    config.probes.forEach((probe, index) =>
      claim(probe.device, probe.sensor, ['probes', index, 'sensor'], `probes[${index}]`),
    );
    for (const [quantity, sensor] of Object.entries(config.weather.sensors)) {
      if (sensor !== undefined) {
        claim(
          config.weather.device,
          sensor,
          ['weather', 'sensors', quantity],
          `weather ${quantity}`,
        );
      }
    }
    if (config.element.restraint.mode !== 'restrained' && config.element.restraint.degree !== 0) {
      context.addIssue({
        code: 'custom',
        path: ['element', 'restraint', 'degree'],
        message: `must be 0 unless the mode is "restrained": got ${config.element.restraint.degree}`,
      });
    }
  });

/** A validated run configuration, defaults filled in. */
export type RunConfig = z.output<typeof runConfigSchema>;
/** A run configuration as written by a person, before defaults. */
export type RunConfigInput = z.input<typeof runConfigSchema>;

/**
 * Validates a run configuration and fills in its defaults.
 *
 * @param input - parsed JSON of the configuration
 * @returns the configuration with defaults
 * @throws ValidationError listing every problem, one line each, naming field, rule and value
 */
export function parseRunConfig(input: unknown): RunConfig {
  const result = runConfigSchema.safeParse(input);
  if (result.success) return result.data;
  throw new ValidationError('run configuration', formatIssues(result.error.issues, input));
}

/** Placement time in ms since the Unix epoch. */
export function placedAtMs(config: RunConfig): number {
  return Date.parse(config.placedAt);
}
