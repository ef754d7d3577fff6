/**
 * Supplied weather forecasts over MQTT: `meniscus/<site>/forecast`, the JSON of POST
 * /api/runs/:id/forecast (`{ "points": [...] }`), QoS 1, best published retained. Each valid
 * series replaces the forecast of every open run on that site; a retained series delivered
 * again (each reconnect) is not recorded twice. Invalid payloads are logged and counted, never
 * fed to an engine.
 */
import mqtt from 'mqtt';
import type { IClientOptions, MqttClient } from 'mqtt';
import { parseForecast } from '../runs/forecastInput.ts';
import type { RunLifecycle } from '../runs/runLifecycle.ts';
import type { Archive } from '../store/archive.ts';

/** Topic filter of supplied forecasts. */
export const FORECAST_TOPIC_FILTER = 'meniscus/+/forecast';
const FORECAST_TOPIC = /^meniscus\/([A-Za-z0-9._-]{1,64})\/forecast$/;

export interface ForecastSubscriber {
  readonly counters: { accepted: number; rejected: number; lastError: string | null };
  close(): Promise<void>;
}

/**
 * Subscribes to FORECAST_TOPIC_FILTER on the broker at `url`.
 *
 * @param options - MQTT.js options (client id, credentials, TLS); reconnects every second
 * @param onWarning - told about each rejected payload
 */
export function startForecastSubscriber(
  url: string,
  options: IClientOptions,
  archive: Archive,
  lifecycle: RunLifecycle,
  onWarning: (message: string) => void = () => {},
): ForecastSubscriber {
  const counters = { accepted: 0, rejected: 0, lastError: null as string | null };
  const client: MqttClient = mqtt.connect(url, { reconnectPeriod: 1000, ...options });
  client.on('connect', () => {
    client.subscribe(FORECAST_TOPIC_FILTER, { qos: 1 });
  });
  client.on('error', (error) => {
    counters.lastError = error.message;
  });
  client.on('message', (topic, payload) => {
    const site = FORECAST_TOPIC.exec(topic)?.[1];
    if (site === undefined) return;
    try {
      const points = parseForecast(JSON.parse(payload.toString('utf8')));
      for (const run of archive.openRuns()) {
        if (run.site !== site) continue;
        if (JSON.stringify(lifecycle.forecast(run.id)) === JSON.stringify(points)) continue;
        lifecycle.setForecast(run.id, points, 'mqtt');
      }
      counters.accepted += 1;
    } catch (error) {
      counters.rejected += 1;
      counters.lastError = error instanceof Error ? error.message : String(error);
      onWarning(`forecast on ${topic} rejected: ${counters.lastError}`);
    }
  });
  return {
    counters,
    close: () => new Promise<void>((resolve) => client.end(true, {}, () => resolve())),
  };
}
