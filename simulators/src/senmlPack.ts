/**
 * SenML packs as the devices send them (RFC 8428, JSON): the first record carries the base name
 * `<device>/` and the base time; each record carries its sensor name `n`, unit `u`, value `v`,
 * time offset `t` and `ut`, the longest time before the sensor reports again (section 4.5.1 and
 * 4.5.3), which the server uses to judge silence.
 */

/** One record of a pack (the fields this project sends). */
export interface SenmlRecord {
  bn?: string;
  bt?: number;
  n: string;
  u: string;
  v: number;
  t?: number;
  ut?: number;
}

/** A measurement to put in a pack. */
export interface Measurement {
  sensor: string;
  /** SenML unit: `%RH`, `Cel`, `m/s`, `W/m2`, `mm`. */
  unit: string;
  value: number;
  /** Offset from the pack's base time, s (0 when absent). */
  offsetS?: number;
}

/**
 * Builds a pack for one device at one device-clock time.
 *
 * @param device - device id; the base name is `<device>/`, which the ingest strips
 * @param deviceTimeMs - the device clock's time, ms since the Unix epoch; sent as `bt` in seconds
 *   with millisecond resolution
 * @param measurements - at least one
 * @param updateIntervalS - `ut` on every record, s
 * @returns the pack; an empty `measurements` gives an empty list (callers skip sending it)
 */
export function senmlPack(
  device: string,
  deviceTimeMs: number,
  measurements: readonly Measurement[],
  updateIntervalS: number,
): SenmlRecord[] {
  return measurements.map((measurement, index) => {
    const record: SenmlRecord = {
      n: measurement.sensor,
      u: measurement.unit,
      v: measurement.value,
      ut: updateIntervalS,
    };
    if (measurement.offsetS !== undefined && measurement.offsetS !== 0)
      record.t = measurement.offsetS;
    return index === 0
      ? { bn: `${device}/`, bt: Math.round(deviceTimeMs) / 1000, ...record }
      : record;
  });
}

/**
 * Rounds to the sensor's resolution: round(x / q) q, written without binary noise (e.g. 97.3,
 * not 97.30000000000001). A non-positive or NaN `quantum` returns `value`.
 */
export function quantise(value: number, quantum: number): number {
  if (!(quantum > 0)) return value;
  const decimals = Math.max(0, Math.ceil(-Math.log10(quantum)) + 1);
  return Number((Math.round(value / quantum) * quantum).toFixed(decimals));
}
