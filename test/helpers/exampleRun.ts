/**
 * An invented run used across the ingest tests: a 120 mm topping slab on the "harbour-deck"
 * site, two probe strings and a weather station.
 */
import type { RunConfigInput } from '../../server/src/config/runConfig.ts';

export const EXAMPLE_PLACED_AT = '2026-06-14T11:20:00+02:00';
export const EXAMPLE_PLACED_AT_MS = Date.parse(EXAMPLE_PLACED_AT);

export function exampleRunInput(overrides: Partial<RunConfigInput> = {}): RunConfigInput {
  return {
    site: 'harbour-deck',
    element: { kind: 'topping', thicknessMm: 120, drying: 'one-face' },
    placedAt: EXAMPLE_PLACED_AT,
    probes: [
      { device: 'probe-a', sensor: 'rh-10', quantity: 'rh', depthMm: 10 },
      { device: 'probe-a', sensor: 't-10', quantity: 'temperature', depthMm: 10 },
      { device: 'probe-a', sensor: 'rh-40', quantity: 'rh', depthMm: 40 },
      { device: 'probe-b', sensor: 'rh-10', quantity: 'rh', depthMm: 10 },
    ],
    weather: {
      device: 'mast-1',
      mastHeightM: 2,
      sensors: {
        airTemperature: 'air-t',
        relativeHumidity: 'air-rh',
        windSpeed: 'wind',
        solarRadiation: 'sun',
      },
    },
    ...overrides,
  };
}
