/**
 * The quantities a run's sensors measure: the canonical unit each reading is stored in (a SenML
 * registered unit, RFC 8428 section 12.1) and the range outside which a value is physically
 * impossible and rejected at the edge.
 */
import type { RunConfig } from '../config/runConfig.ts';

export type Quantity =
  | 'rh'
  | 'temperature'
  | 'airTemperature'
  | 'relativeHumidity'
  | 'windSpeed'
  | 'solarRadiation'
  | 'rain';

export interface QuantitySpec {
  /** SenML unit the value is stored in. */
  unit: string;
  /** Smallest possible value, in `unit`. */
  min: number;
  /** Largest possible value, in `unit`. */
  max: number;
  /** Where the limits come from. */
  source: string;
}

const RELATIVE_HUMIDITY: QuantitySpec = {
  unit: '%RH',
  min: 0,
  max: 103,
  source:
    'RH cannot pass 100 %; 3 % allows the stated error of capacitive sensors (common practice)',
};
const TEMPERATURE: QuantitySpec = {
  unit: 'Cel',
  min: -40,
  max: 90,
  source:
    'range of the fresh and early-age concrete and site air this tool watches (our assumption)',
};

/** Canonical unit and possible range of each quantity, with the origin of each range. */
export const QUANTITIES: Readonly<Record<Quantity, QuantitySpec>> = {
  rh: RELATIVE_HUMIDITY,
  temperature: TEMPERATURE,
  airTemperature: TEMPERATURE,
  relativeHumidity: RELATIVE_HUMIDITY,
  windSpeed: {
    unit: 'm/s',
    min: 0,
    max: 100,
    source: 'above the strongest gusts ever recorded near the ground, about 113 m/s (from memory)',
  },
  solarRadiation: {
    unit: 'W/m2',
    min: 0,
    max: 1500,
    source: 'above the solar constant, about 1361 W/m2 (from memory)',
  },
  rain: { unit: 'mm', min: 0, max: 500, source: 'rain depth per reading (our assumption)' },
};

/** One sensor a run listens to, as named in its configuration. */
export interface RunSensor {
  device: string;
  role: 'probe' | 'weather';
  sensor: string;
  quantity: Quantity;
  /** Depth below the exposed surface, mm; null for weather sensors. */
  depthMm: number | null;
}

/** Lists every sensor of a run configuration: its probes, then the weather station's. */
export function sensorsOfRun(config: RunConfig): RunSensor[] {
  const sensors: RunSensor[] = config.probes.map((probe) => ({
    device: probe.device,
    role: 'probe',
    sensor: probe.sensor,
    quantity: probe.quantity,
    depthMm: probe.depthMm,
  }));
  for (const [quantity, sensor] of Object.entries(config.weather.sensors)) {
    if (sensor === undefined) continue;
    sensors.push({
      device: config.weather.device,
      role: 'weather',
      sensor,
      quantity: quantity as Quantity,
      depthMm: null,
    });
  }
  return sensors;
}
