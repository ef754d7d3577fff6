/**
 * One simulated device's MQTT connection, as real hardware would hold it: its own connection
 * with the device id as client id, a retained `online` status on `meniscus/<site>/<device>/status`
 * and a retained last will `offline` on the same topic (published by the broker if the device
 * vanishes), readings published with QoS 1 on `meniscus/<site>/<device>/data`.
 */
import mqtt from 'mqtt';
import type { MqttClient } from 'mqtt';

export interface DeviceConnectionOptions {
  /** Broker URL, e.g. mqtt://127.0.0.1:1883. */
  url: string;
  site: string;
  device: string;
  /** Credentials on a broker with authentication (e.g. Mosquitto with a password file). */
  username?: string;
  password?: string;
  /** MQTT protocol: 4 (3.1.1, the embedded broker) by default, or 5. */
  protocolVersion?: 4 | 5;
  /** Milliseconds between reconnect attempts: 1000 (MQTT.js default). */
  reconnectPeriodMs?: number;
}

/** A connected device. */
export interface DeviceConnection {
  readonly device: string;
  readonly dataTopic: string;
  readonly statusTopic: string;
  /** Publishes a payload (a SenML pack is serialised as JSON) with QoS 1; resolves on PUBACK. */
  publish(payload: unknown, topic?: string): Promise<void>;
  /** Publishes a retained `stopped` status and disconnects cleanly (no last will). */
  close(): Promise<void>;
  /** Drops the connection without a DISCONNECT, as a device losing power: the broker publishes the last will. */
  crash(): void;
}

/** The JSON of a status message. */
export function statusPayload(status: 'online' | 'offline' | 'stopped', atMs: number): string {
  return JSON.stringify({ status, at: new Date(atMs).toISOString() });
}

/** Connects a device and publishes its retained `online` status. Rejects if the broker refuses. */
export async function connectDevice(options: DeviceConnectionOptions): Promise<DeviceConnection> {
  const dataTopic = `meniscus/${options.site}/${options.device}/data`;
  const statusTopic = `meniscus/${options.site}/${options.device}/status`;
  const client: MqttClient = await mqtt.connectAsync(options.url, {
    clientId: options.device,
    clean: true,
    protocolVersion: options.protocolVersion ?? 4,
    reconnectPeriod: options.reconnectPeriodMs ?? 1000,
    connectTimeout: 10_000,
    ...(options.username === undefined ? {} : { username: options.username }),
    ...(options.password === undefined ? {} : { password: options.password }),
    will: {
      topic: statusTopic,
      payload: Buffer.from(JSON.stringify({ status: 'offline' })),
      qos: 1,
      retain: true,
    },
  });
  await client.publishAsync(statusTopic, statusPayload('online', Date.now()), {
    qos: 1,
    retain: true,
  });
  return {
    device: options.device,
    dataTopic,
    statusTopic,
    async publish(payload: unknown, topic = dataTopic) {
      const bytes =
        typeof payload === 'string' || payload instanceof Uint8Array
          ? Buffer.from(payload)
          : Buffer.from(JSON.stringify(payload));
      await client.publishAsync(topic, bytes, { qos: 1 });
    },
    async close() {
      if (client.connected) {
        await client.publishAsync(statusTopic, statusPayload('stopped', Date.now()), {
          qos: 1,
          retain: true,
        });
      }
      await client.endAsync();
    },
    crash() {
      client.options.reconnectPeriod = 0;
      client.stream.destroy();
      client.end(true);
    },
  };
}
