/**
 * What each configured sensor means to the engine: a weather quantity of the station, or a probe
 * (relative humidity or temperature) at a depth. Keys are `<device>/<sensor>`.
 */
import type { RunConfig } from '../config/index.ts';

/** Weather quantities the engine reads. */
export type WeatherQuantity =
  'airTemperature' | 'relativeHumidity' | 'windSpeed' | 'solarRadiation' | 'rain';

/** Weather quantities without which the surface flux cannot be computed. */
export const REQUIRED_WEATHER: readonly WeatherQuantity[] = [
  'airTemperature',
  'relativeHumidity',
  'windSpeed',
];

/** A probe sensor. */
export interface ProbeRole {
  kind: 'probe';
  key: string;
  device: string;
  sensor: string;
  quantity: 'rh' | 'temperature';
  depthMm: number;
  /** Depth in the modelled domain, m (two-face elements are symmetric about the middle). */
  domainDepthM: number;
}

/** A weather sensor. */
export interface WeatherRole {
  kind: 'weather';
  key: string;
  quantity: WeatherQuantity;
}

export type StreamRole = ProbeRole | WeatherRole;

/** The stream key of a device and sensor. */
export function streamKey(device: string, sensor: string): string {
  return `${device}/${sensor}`;
}

/** Roles of every configured sensor, keyed by stream key. */
export function streamRoles(config: RunConfig): Map<string, StreamRole> {
  const roles = new Map<string, StreamRole>();
  const thicknessMm = config.element.thicknessMm;
  for (const probe of config.probes) {
    const key = streamKey(probe.device, probe.sensor);
    const domainDepthMm =
      config.element.drying === 'two-face'
        ? Math.min(probe.depthMm, thicknessMm - probe.depthMm)
        : probe.depthMm;
    roles.set(key, {
      kind: 'probe',
      key,
      device: probe.device,
      sensor: probe.sensor,
      quantity: probe.quantity,
      depthMm: probe.depthMm,
      domainDepthM: domainDepthMm / 1000,
    });
  }
  for (const [quantity, sensor] of Object.entries(config.weather.sensors)) {
    if (sensor === undefined) continue;
    const key = streamKey(config.weather.device, sensor);
    roles.set(key, { kind: 'weather', key, quantity: quantity as WeatherQuantity });
  }
  return roles;
}
