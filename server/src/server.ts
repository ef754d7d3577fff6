/**
 * Composes the server: archive, ingest, broker connection (embedded broker or a client of an
 * external one), InfluxDB forwarding when configured, and HTTP.
 */
import { mkdirSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import express from 'express';
import { pino } from 'pino';
import type { Logger } from 'pino';
import { apiRouter } from './api/apiRouter.ts';
import { errorToHttp } from './api/httpError.ts';
import type { ServerConfig } from './config/serverConfig.ts';
import { Ingestor } from './ingest/ingestor.ts';
import type { BrokerConnection } from './mqtt/brokerConnection.ts';
import { startEmbeddedBroker } from './mqtt/embeddedBroker.ts';
import { startMqttSubscriber } from './mqtt/mqttSubscriber.ts';
import { Archive } from './store/archive.ts';
import { InfluxForwarder } from './store/influxForwarder.ts';

/** The archive's file name inside the data folder. */
export const ARCHIVE_FILE = 'meniscus.sqlite';

export interface RunningServer {
  httpPort: number;
  /** Port of the embedded broker, or null with an external one. */
  mqttPort: number | null;
  archive: Archive;
  ingestor: Ingestor;
  broker: BrokerConnection;
  logger: Logger;
  /** Stops taking messages and requests, flushes the forwarder, closes the archive. */
  close(): Promise<void>;
}

/**
 * Starts everything; resolves once HTTP and the broker connection listen (an external broker
 * may still be connecting: the client keeps trying).
 */
export async function startServer(config: ServerConfig, logger?: Logger): Promise<RunningServer> {
  const log = logger ?? pino({ level: config.logLevel });
  mkdirSync(config.dataDir, { recursive: true });
  const archive = Archive.open(join(config.dataDir, ARCHIVE_FILE), {
    synchronous: config.synchronous,
  });
  const ingestor = new Ingestor(archive, {
    onCommitError: (error) =>
      log.error({ err: error }, 'archive commit failed; messages not acknowledged'),
  });

  let broker: BrokerConnection;
  let mqttPort: number | null = null;
  if (config.mqtt.mode === 'embedded') {
    const embedded = await startEmbeddedBroker(ingestor, {
      host: config.mqtt.host,
      port: config.mqtt.port,
    });
    mqttPort = embedded.port;
    broker = embedded;
  } else {
    broker = startMqttSubscriber(ingestor, {
      url: config.mqtt.url,
      clientId: config.mqtt.clientId,
      connections: config.mqtt.connections,
      ...(config.mqtt.username === undefined ? {} : { username: config.mqtt.username }),
      ...(config.mqtt.password === undefined ? {} : { password: config.mqtt.password }),
      ...config.mqtt.tls,
    });
  }

  let forwarder: InfluxForwarder | null = null;
  if (config.influx !== null) {
    forwarder = new InfluxForwarder(archive, config.influx, {
      logger: {
        error: (message, error) => log.warn({ err: error }, `influx: ${message}`),
        warn: (message, error) => log.warn({ err: error }, `influx: ${message}`),
      },
    });
    forwarder.start();
  }

  const app = express();
  app.disable('x-powered-by');
  app.use(
    '/api',
    apiRouter({
      archive,
      health: () => ({
        broker: { ok: broker.state().connected, ...broker.state() },
        forwarder:
          forwarder === null
            ? { ok: true, enabled: false }
            : { enabled: true, ...forwarder.state() },
        ingest: ingestor.counters,
      }),
    }),
  );
  app.use(errorToHttp(log));
  const http: Server = await new Promise((resolve, reject) => {
    const server = app.listen(config.httpPort, config.httpHost, (error?: Error) =>
      error ? reject(error) : resolve(server),
    );
  });
  const httpPort = (http.address() as AddressInfo).port;
  log.info(
    { httpPort, mqttPort, mqtt: broker.state().url, dataDir: config.dataDir },
    'meniscus server started',
  );

  return {
    httpPort,
    mqttPort,
    archive,
    ingestor,
    broker,
    logger: log,
    async close() {
      await new Promise<void>((resolve) => {
        http.close(() => resolve());
        http.closeAllConnections();
      });
      await broker.close();
      await forwarder?.close();
      archive.close();
    },
  };
}
