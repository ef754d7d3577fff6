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
}

export interface MqttSubscriber extends BrokerConnection {
  /** Resolves at the first subscription acknowledged by the broker. */
  readonly ready: Promise<void>;
}

/** Connects, subscribes to data and status topics, and hands messages to `sink`. */
export function startMqttSubscriber(
  sink: MessageSink,
  options: MqttSubscriberOptions,
): MqttSubscriber {
  const protocolVersion = options.protocolVersion ?? 5;
  const connectOptions: IClientOptions = {
    clientId: options.clientId ?? 'meniscus-ingest',
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
  let reconnects = 0;
  let lastError: string | null = null;

  client.handleMessage = (packet, done) => {
    const topic = packet.topic;
    const payload =
      typeof packet.payload === 'string' ? Buffer.from(packet.payload) : packet.payload;
    const channel = parseDeviceTopic(topic)?.channel;
    if (channel === 'status') {
      try {
        sink.status(topic, payload);
      } catch (error) {
        lastError = error instanceof Error ? error.message : String(error);
      }
      done();
      return;
    }
    sink.data(topic, payload).then(
      () => done(),
      (error: unknown) => {
        lastError = error instanceof Error ? error.message : String(error);
        done(error instanceof Error ? error : new Error(lastError));
        client.stream.destroy(); // no PUBACK: reconnect so the broker redelivers
      },
    );
  };

  const ready = new Promise<void>((resolve) => {
    client.on('connect', (connack) => {
      // A broker that kept our session has the subscriptions; subscribe anyway (idempotent).
      void connack;
      client.subscribe([DATA_TOPIC_FILTER, STATUS_TOPIC_FILTER], { qos: 1 }, (error) => {
        if (error) lastError = error.message;
        else resolve();
      });
    });
  });
  client.on('reconnect', () => {
    reconnects += 1;
  });
  client.on('error', (error) => {
    lastError = error.message;
  });

  return {
    ready,
    state(): BrokerState {
      return {
        kind: 'external',
        connected: client.connected,
        url: options.url,
        reconnects,
        lastError,
      };
    },
    async close() {
      await client.endAsync();
    },
  };
}
