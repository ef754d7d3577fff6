/**
 * Field rules shared by the files validated at the edge (the run configuration, the simulators'
 * scenario): ids used as MQTT topic levels, SenML sensor names, numbers in a range with a unit,
 * and the weather station's sensor names. Zod schemas; every message names the rule (zod's
 * issue path names the field, formatIssues.ts adds the value received).
 */
import { z } from 'zod';

/** Ids that appear as one MQTT topic level: letters, digits, `.`, `_`, `-` (no `/`, `+`, `#`). */
const TOPIC_LEVEL = /^[A-Za-z0-9._-]{1,64}$/;
/** Sensor names as a SenML name part (RFC 8428 section 4.5.1 characters). */
const SENSOR_NAME = /^[A-Za-z0-9][A-Za-z0-9:./_-]{0,63}$/;

/**
 * An id used as one MQTT topic level: 1 to 64 of A-Z a-z 0-9 . _ - (so never `/`, `+`, `#`).
 *
 * @param what - what the id is, for the message ("device id", "site id")
 */
export const topicLevel = (what: string) =>
  z.string().regex(TOPIC_LEVEL, {
    error: `must be a ${what} of 1 to 64 letters, digits, '.', '_' or '-'`,
  });

/** A sensor name as a SenML name part (RFC 8428 section 4.5.1): 1 to 64 characters. */
export const sensorName = z.string().regex(SENSOR_NAME, {
  error:
    'must be a sensor name of 1 to 64 characters A-Z a-z 0-9 : . / _ - starting with a letter or digit',
});

/**
 * A number within [min, max] inclusive, in `unit`; NaN and non-numbers are refused.
 *
 * @param min - smallest value allowed, in `unit`
 * @param max - largest value allowed, in `unit`
 * @param unit - the unit as written in messages ("mm", "(fraction)")
 */
export const numberBetween = (min: number, max: number, unit: string) =>
  z
    .number({ error: `must be a number in ${unit}` })
    .min(min, { error: `must be at least ${min} ${unit}` })
    .max(max, { error: `must be at most ${max} ${unit}` });

/** The weather station's sensor names: air temperature, humidity and wind required. */
export const weatherSensors = z.strictObject({
  airTemperature: sensorName,
  relativeHumidity: sensorName,
  windSpeed: sensorName,
  solarRadiation: sensorName.optional(),
  rain: sensorName.optional(),
});
