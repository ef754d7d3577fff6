/**
 * Boundary inputs of the element model over one interval of event time, from the buffered
 * readings: window means of the weather (held when a stream is silent, flagged), wind brought
 * from the mast height to 0.5 m by the log profile, concrete temperatures from the probes, the
 * surface temperature from the shallowest probe, rain as a wetting of the surface, and the
 * curing measures of the log.
 */
import type { BoundaryInputs } from '../engine/index.ts';
import { curingMeasuresActiveAt, windSpeedAtUnoHeight } from '../physics/index.ts';
import type { CuringMeasure } from '../physics/index.ts';
import { latestAtOrBefore, windowMean, windowSum } from './readingStreams.ts';
import type { StreamBuffer } from './readingStreams.ts';
import type { ProbeRole, WeatherQuantity } from './streamRoles.ts';
import { REQUIRED_WEATHER } from './streamRoles.ts';

/** Rain rate above which a shower wets the surface like a covering, mm/h (our assumption). */
export const RAIN_WETS_SURFACE_MMH = 0.5;
const KELVIN_OFFSET = 273.15;

/** What the inputs of an interval are built from. */
export interface InputSources {
  weather: ReadonlyMap<WeatherQuantity, StreamBuffer>;
  /** Probe temperature streams with their roles, shallowest first. */
  probeTemperatures: readonly { role: ProbeRole; stream: StreamBuffer }[];
  mastHeightM: number;
  measures: readonly CuringMeasure[];
  /** Longest hold of a silent weather stream before it counts as a gap, ms. */
  holdMs: number;
}

/** Inputs of one interval and what had to be held. */
export interface WindowInputs {
  /** Null when a required weather quantity has never been read. */
  inputs: BoundaryInputs | null;
  /** Weather quantities held from an earlier reading, with the age of the value (ms). */
  held: { quantity: WeatherQuantity; ageMs: number; beyondHold: boolean }[];
  missing: WeatherQuantity[];
}

/** Mean of the window, else the latest earlier value (held), else NaN. */
function windowOrHeld(
  stream: StreamBuffer | undefined,
  fromMs: number,
  toMs: number,
): { value: number; heldSinceMs: number | null } {
  if (stream === undefined) return { value: Number.NaN, heldSinceMs: null };
  const mean = windowMean(stream, fromMs, toMs);
  if (Number.isFinite(mean)) return { value: mean, heldSinceMs: null };
  const latest = latestAtOrBefore(stream, fromMs);
  return latest === null
    ? { value: Number.NaN, heldSinceMs: null }
    : { value: latest.value, heldSinceMs: latest.timeMs };
}

/**
 * Boundary inputs over (fromMs, toMs]: air temperature (degC -> K), relative humidity (%RH ->
 * fraction, clamped to 0..1), wind (m/s at the mast -> 0.5 m by the log profile, z0 0.03 m),
 * probe temperatures at their domain depths, surface temperature from the shallowest probe
 * (the air temperature when there is no temperature probe), rain above 0.5 mm/h as a wet
 * covering, and the measures active at `fromMs`.
 */
export function windowInputs(sources: InputSources, fromMs: number, toMs: number): WindowInputs {
  const held: WindowInputs['held'] = [];
  const missing: WeatherQuantity[] = [];
  const values = new Map<WeatherQuantity, number>();
  for (const quantity of REQUIRED_WEATHER) {
    const { value, heldSinceMs } = windowOrHeld(sources.weather.get(quantity), fromMs, toMs);
    if (!Number.isFinite(value)) missing.push(quantity);
    else {
      values.set(quantity, value);
      if (heldSinceMs !== null) {
        const ageMs = toMs - heldSinceMs;
        held.push({ quantity, ageMs, beyondHold: ageMs > sources.holdMs });
      }
    }
  }
  if (missing.length > 0) return { inputs: null, held, missing };
  const airTemperatureK = (values.get('airTemperature') as number) + KELVIN_OFFSET;
  const probeTemperatures: { depthM: number; temperatureK: number }[] = [];
  for (const { role, stream } of sources.probeTemperatures) {
    const { value } = windowOrHeld(stream, fromMs, toMs);
    if (Number.isFinite(value)) {
      probeTemperatures.push({ depthM: role.domainDepthM, temperatureK: value + KELVIN_OFFSET });
    }
  }
  const measures = curingMeasuresActiveAt(sources.measures, fromMs);
  const rain = sources.weather.get('rain');
  const hours = (toMs - fromMs) / 3_600_000;
  if (
    rain !== undefined &&
    hours > 0 &&
    windowSum(rain, fromMs, toMs) / hours > RAIN_WETS_SURFACE_MMH
  ) {
    measures.push({ kind: 'wet-covering', startMs: fromMs });
  }
  const inputs: BoundaryInputs = {
    airTemperatureK,
    relativeHumidity: Math.min(1, Math.max(0, (values.get('relativeHumidity') as number) / 100)),
    windMS: Math.max(
      0,
      windSpeedAtUnoHeight(Math.max(0, values.get('windSpeed') as number), sources.mastHeightM),
    ),
    surfaceTemperatureK: probeTemperatures[0]?.temperatureK ?? airTemperatureK,
    ...(probeTemperatures.length > 0 ? { probeTemperatures } : {}),
    ...(measures.length > 0 ? { activeMeasures: measures } : {}),
  };
  return { inputs, held, missing };
}
