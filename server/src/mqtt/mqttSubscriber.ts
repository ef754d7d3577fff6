/**
 * Ingest from an external broker (Mosquitto or any MQTT 3.1.1/5 broker) with MQTT.js: a fixed
 * client id and a persistent session (clean start off; on MQTT 5 a session expiry of 7 days,
 * our assumption: a site box may be off over a long weekend), QoS 1 subscriptions, automatic
 * reconnect and resubscribe.
 *
 * The PUBACK goes out only after the commit: `client.handleMessage` is overridden and its
 * callback called when ingest has committed (dependencies.md: `customHandleAcks` is silently
 * replaced by an immediate ack on MQTT 3.1.1). When the commit fails the callback gets the error,
 * no PUBACK is sent, and the connection is dropped so the broker redelivers after reconnecting.
 *
 * MQTT.js hands over one message at a time per connection (the next waits for the callback), so
 * one connection means one commit per message. With `connections` above 1, data arrives over a
 * shared subscription (`$share/<clientId>/meniscus/+/+/data`, MQTT 5, also honoured by Mosquitto
 * for 3.1.1) on that many connections, and messages that arrive together on different
 * connections share one commit (group commit). Status topics go to the first connection only.
 */
import { readFileSync } from 'node:fs';
import mqtt from 'mqtt';
import type { IClientOptions, MqttClient } from 'mqtt';
import { DATA_TOPIC_FILTER, STATUS_TOPIC_FILTER, parseDeviceTopic } from '../ingest/topics.ts';
import type { BrokerConnection, BrokerState, MessageSink } from './brokerConnection.ts';

export interface MqttSubscriberOptions {
  /** Broker URL, e.g. `mqtt://127.0.0.1:1883` or `mqtts://broker.example:8883`. */
  url: string;
  /** Fixed client id of the persistent session: `meniscus-ingest` (our assumption). */
  clientId?: string;
  username?: string;
  password?: string;
  /** PEM files for TLS (mqtts://). */
  caFile?: string;
  certFile?: string;
  keyFile?: string;
  /** 4 = MQTT 3.1.1, 5 = MQTT 5 (default 5). */
  protocolVersion?: 4 | 5;
  /** Session expiry on MQTT 5, s: 7 days (our assumption). */
  sessionExpiryS?: number;
  /** Wait between reconnect attempts, ms: 1000 (MQTT.js default). */
  reconnectPeriodMs?: number;
  /**
   * Broker connections sharing the data subscription: 1 (no shared subscription). Client ids
   * are `<clientId>-1` ... `<clientId>-N` when above 1; keep N fixed for a deployment, since each
   * id owns a persistent session.
   */
  connections?: number;
}

export interface MqttSubscriber extends BrokerConnection {
  /** Resolves when every connection has its subscriptions acknowledged by the broker. */
  readonly ready: Promise<void>;
}

interface Connection {
  client: MqttClient;
  ready: Promise<void>;
}

/** Connects, subscribes to data and status topics, and hands messages to `sink`. */
export function startMqttSubscriber(
  sink: MessageSink,
  options: MqttSubscriberOptions,
): MqttSubscriber {
  const count = Math.max(1, Math.floor(options.connections ?? 1));
  const baseId = options.clientId ?? 'meniscus-ingest';
  let reconnects = 0;
  let lastError: string | null = null;
  const noteError = (error: unknown) => {
    lastError = error instanceof Error ? error.message : String(error);
  };

  const connect = (index: number): Connection => {
    const protocolVersion = options.protocolVersion ?? 5;
    const connectOptions: IClientOptions = {
      clientId: count === 1 ? baseId : `${baseId}-${index + 1}`,
      clean: false,
      protocolVersion,
      reconnectPeriod: options.reconnectPeriodMs ?? 1000,
      resubscribe: true,
      ...(options.username === undefined ? {} : { username: options.username }),
      ...(options.password === undefined ? {} : { password: options.password }),
      ...(options.caFile === undefined ? {} : { ca: readFileSync(options.caFile) }),
      ...(options.certFile === undefined ? {} : { cert: readFileSync(options.certFile) }),
      ...(options.keyFile === undefined ? {} : { key: readFileSync(options.keyFile) }),
      ...(protocolVersion === 5
        ? { properties: { sessionExpiryInterval: options.sessionExpiryS ?? 7 * 86_400 } }
        : {}),
    };
    const client: MqttClient = mqtt.connect(options.url, connectOptions);

    client.handleMessage = (packet, done) => {
      const topic = packet.topic;
      const payload =
        typeof packet.payload === 'string' ? Buffer.from(packet.payload) : packet.payload;
      if (parseDeviceTopic(topic)?.channel === 'status') {
        try {
          sink.status(topic, payload);
        } catch (error) {
          noteError(error);
        }
        done();
        return;
      }
      sink.data(topic, payload).then(
        () => done(),
        (error: unknown) => {
          noteError(error);
          done(error instanceof Error ? error : new Error(String(error)));
          client.stream.destroy(); // no PUBACK: reconnect so the broker redelivers
        },
      );
    };

    const filters =
      count === 1
        ? [DATA_TOPIC_FILTER, STATUS_TOPIC_FILTER]
        : [`$share/${baseId}/${DATA_TOPIC_FILTER}`, ...(index === 0 ? [STATUS_TOPIC_FILTER] : [])];
    const ready = new Promise<void>((resolve) => {
      // Subscribe on every connect: idempotent when the broker kept the session.
      client.on('connect', () => {
        client.subscribe(filters, { qos: 1 }, (error) => {
          if (error) noteError(error);
          else resolve();
        });
      });
    });
    client.on('reconnect', () => {
      reconnects += 1;
    });
    client.on('error', noteError);
    return { client, ready };
  };

  const connections = Array.from({ length: count }, (_, index) => connect(index));
  return {
    ready: Promise.all(connections.map((c) => c.ready)).then(() => undefined),
    state(): BrokerState {
      return {
        kind: 'external',
        connected: connections.every((c) => c.client.connected),
        url: options.url,
        reconnects,
        lastError,
      };
    },
    async close() {
      await Promise.all(connections.map((c) => c.client.endAsync()));
    },
  };
}
