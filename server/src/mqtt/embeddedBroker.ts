/**
 * The embedded broker (aedes 1.x, MQTT 3.1.1) in-process, for a site box with nothing else
 * installed. Readings are committed inside the broker's `authorizePublish` hook, which aedes
 * calls before it sends the PUBACK to the publishing device: the device's QoS 1 publish is
 * acknowledged only after the archive has committed it. If the commit fails the hook returns an
 * error, aedes closes that client's connection without a PUBACK, and the device sends again.
 *
 * Why not an MQTT.js client subscribed to the embedded broker: aedes acknowledges a publisher
 * before forwarding, so when this process dies, messages the devices saw acknowledged would be
 * lost with the in-memory broker.
 *
 * Messages on topics outside `meniscus/+/+/data` pass through untouched (the broker also serves
 * other clients), as an external broker would not deliver them to ingest either.
 *
 * Status messages (retained status and last wills, which aedes publishes itself) are read
 * through an in-process subscription.
 */
import { createServer } from 'node:net';
import type { AddressInfo, Server } from 'node:net';
import { Aedes } from 'aedes';
import { DATA_TOPIC_FILTER, STATUS_TOPIC_FILTER, matchesDataFilter } from '../ingest/topics.ts';
import type { BrokerConnection, BrokerState, MessageSink } from './brokerConnection.ts';

export interface EmbeddedBrokerOptions {
  /** Bind address: 127.0.0.1 (our assumption: devices on a site network need it set). */
  host?: string;
  /** TCP port: 1883 (MQTT's registered port); 0 picks a free one. */
  port?: number;
}

export interface EmbeddedBroker extends BrokerConnection {
  /** The port actually listened on. */
  readonly port: number;
}

/**
 * Starts the broker and listens.
 *
 * @param sink - ingest; `data` is awaited before the device's PUBACK
 * @throws when the port cannot be bound
 */
export async function startEmbeddedBroker(
  sink: MessageSink,
  options: EmbeddedBrokerOptions = {},
): Promise<EmbeddedBroker> {
  const host = options.host ?? '127.0.0.1';
  let lastError: string | null = null;
  const broker = await Aedes.createBroker({
    authorizePublish(client, packet, callback) {
      const topic = packet.topic;
      if (client === null || !matchesDataFilter(topic)) {
        callback(null);
        return;
      }
      sink.data(topic, packet.payload as Buffer).then(
        () => callback(null),
        (error: unknown) => {
          lastError = error instanceof Error ? error.message : String(error);
          callback(error instanceof Error ? error : new Error(lastError));
        },
      );
    },
  });
  broker.subscribe(
    STATUS_TOPIC_FILTER,
    (packet, callback) => {
      try {
        sink.status(packet.topic, packet.payload as Buffer);
      } catch (error) {
        lastError = error instanceof Error ? error.message : String(error);
      }
      callback();
    },
    () => {},
  );
  const server: Server = createServer(broker.handle);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 1883, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', (error) => {
    lastError = error.message;
  });
  const port = (server.address() as AddressInfo).port;
  return {
    port,
    state(): BrokerState {
      return {
        kind: 'embedded',
        connected: server.listening,
        url: `mqtt://${host}:${port}`,
        clients: broker.connectedClients,
        lastError,
      };
    },
    async close() {
      await new Promise<void>((resolve) => broker.close(() => resolve()));
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

/** The topic filter the embedded broker commits on, for documentation and tests. */
export const EMBEDDED_DATA_FILTER = DATA_TOPIC_FILTER;
