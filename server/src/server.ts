/**
 * Composes the server: archive, ingest, broker connection (embedded broker or a client of an
 * external one), InfluxDB forwarding when configured, the run lifecycle and one live engine per
 * open run (resumed from its last snapshot), HTTP with socket.io on the same port, and the MQTT
 * forecast topic.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import express from 'express';
import { pino } from 'pino';
import type { Logger } from 'pino';
import type { IClientOptions } from 'mqtt';
import { Server as SocketServer } from 'socket.io';
import { CrewNotices } from './alerts/crewNotices.ts';
import { connectNoticeClient, mqttChannel } from './alerts/channels/mqttChannel.ts';
import { noticeChannelsFromSettings } from './alerts/noticeChannels.ts';
import { apiRouter } from './api/apiRouter.ts';
import { dashboardRoutes } from './api/dashboardRoutes.ts';
import { errorToHttp } from './api/httpError.ts';
import { attachLiveSocket, pushNotice, pushState } from './api/liveSocket.ts';
import type { ServerConfig } from './config/serverConfig.ts';
import { Ingestor } from './ingest/ingestor.ts';
import { createRunEngine } from './live/index.ts';
import type { CreateRunEngine, RunEngineOptions } from './live/index.ts';
import { startForecastSubscriber } from './liveHost/forecastSubscriber.ts';
import type { ForecastSubscriber } from './liveHost/forecastSubscriber.ts';
import { LiveHost } from './liveHost/liveHost.ts';
import type { BrokerConnection } from './mqtt/brokerConnection.ts';
import { startEmbeddedBroker } from './mqtt/embeddedBroker.ts';
import { startMqttSubscriber } from './mqtt/mqttSubscriber.ts';
import { Archive } from './store/archive.ts';
import { InfluxForwarder } from './store/influxForwarder.ts';
import { RunLifecycle } from './runs/runLifecycle.ts';

/** The archive's file name inside the data folder. */
export const ARCHIVE_FILE = 'meniscus.sqlite';

export interface RunningServer {
  httpPort: number;
  /** Port of the embedded broker, or null with an external one. */
  mqttPort: number | null;
  archive: Archive;
  ingestor: Ingestor;
  broker: BrokerConnection;
  lifecycle: RunLifecycle;
  live: LiveHost;
  /** Crew notices: rules, alert state, outbox and channels. */
  notices: CrewNotices;
  io: SocketServer;
  logger: Logger;
  /** Stops taking messages and requests, flushes the forwarder, closes the archive. */
  close(): Promise<void>;
}

/**
 * Starts everything; resolves once HTTP and the broker connection listen (an external broker
 * may still be connecting: the client keeps trying).
 */
export interface StartServerOptions {
  /** The live engine factory: createRunEngine of server/src/live (tests may pass another). */
  createEngine?: CreateRunEngine;
  /** Options of every run's engine (RunEngineOptions defaults when absent). */
  engineOptions?: RunEngineOptions;
  /** Folder of the built dashboard [web/dist of the repository; tests build into their own]. */
  webDir?: string;
}

export async function startServer(
  config: ServerConfig,
  logger?: Logger,
  options: StartServerOptions = {},
): Promise<RunningServer> {
  const log = logger ?? pino({ level: config.logLevel });
  mkdirSync(config.dataDir, { recursive: true });
  const archive = Archive.open(join(config.dataDir, ARCHIVE_FILE), {
    synchronous: config.synchronous,
  });
  const lifecycle = new RunLifecycle(archive);
  let io: SocketServer | null = null;
  const notices = new CrewNotices(archive, {
    channels: noticeChannelsFromSettings(config.notices, log),
    alertOptions: { renotifyMin: config.notices?.renotifyMin ?? 30 },
    onNotice: (notice) => {
      if (io !== null) pushNotice(io, notice);
    },
    onError: (runId, error) => log.error({ err: error, runId }, 'crew notices failed on a state'),
    outbox: { onFailure: (failure) => log.warn(failure, 'crew notice delivery failed') },
  });
  notices.watchMeasures(lifecycle);
  const live = new LiveHost(archive, lifecycle, options.createEngine ?? createRunEngine, {
    ...(options.engineOptions === undefined ? {} : { engineOptions: options.engineOptions }),
    snapshotEveryS: config.snapshotEveryS ?? 1800,
    onState: (runId, state) => {
      if (io !== null) pushState(io, runId, state);
    },
    onAdvance: (runId, state, measures) => notices.onState(runId, state, measures),
    onError: (runId, error) => log.error({ err: error, runId }, 'live engine failed on a run'),
  });
  // Before the broker: every commit from now on reaches the engines.
  live.start();
  const ingestor = new Ingestor(archive, {
    onCommitError: (error) =>
      log.error({ err: error }, 'archive commit failed; messages not acknowledged'),
  });

  let broker: BrokerConnection;
  let mqttPort: number | null = null;
  let forecasts: ForecastSubscriber;
  let noticeBroker: { url: string; options: IClientOptions };
  if (config.mqtt.mode === 'embedded') {
    const embedded = await startEmbeddedBroker(ingestor, {
      host: config.mqtt.host,
      port: config.mqtt.port,
    });
    mqttPort = embedded.port;
    broker = embedded;
    const host =
      config.mqtt.host === '0.0.0.0' || config.mqtt.host === '::' ? '127.0.0.1' : config.mqtt.host;
    noticeBroker = {
      url: `mqtt://${host}:${embedded.port}`,
      options: { clientId: `meniscus-notices-${process.pid}` },
    };
    forecasts = startForecastSubscriber(
      `mqtt://${host}:${embedded.port}`,
      { clientId: `meniscus-forecast-${process.pid}` },
      archive,
      lifecycle,
      (message) => log.warn(message),
    );
  } else {
    broker = startMqttSubscriber(ingestor, {
      url: config.mqtt.url,
      clientId: config.mqtt.clientId,
      connections: config.mqtt.connections,
      ...(config.mqtt.username === undefined ? {} : { username: config.mqtt.username }),
      ...(config.mqtt.password === undefined ? {} : { password: config.mqtt.password }),
      ...config.mqtt.tls,
    });
    const { tls } = config.mqtt;
    const clientOptions: IClientOptions = {
      clientId: `${config.mqtt.clientId}-fc`,
      ...(config.mqtt.username === undefined ? {} : { username: config.mqtt.username }),
      ...(config.mqtt.password === undefined ? {} : { password: config.mqtt.password }),
      ...(tls.caFile === undefined ? {} : { ca: readFileSync(tls.caFile) }),
      ...(tls.certFile === undefined ? {} : { cert: readFileSync(tls.certFile) }),
      ...(tls.keyFile === undefined ? {} : { key: readFileSync(tls.keyFile) }),
    };
    noticeBroker = {
      url: config.mqtt.url,
      options: { ...clientOptions, clientId: `${config.mqtt.clientId}-nt` },
    };
    forecasts = startForecastSubscriber(config.mqtt.url, clientOptions, archive, lifecycle, (m) =>
      log.warn(m),
    );
  }

  if (config.notices?.mqtt ?? true) {
    const client = connectNoticeClient(noticeBroker.url, noticeBroker.options);
    notices.outbox.addChannel(mqttChannel(client));
  }
  notices.start();

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
      lifecycle,
      live,
      notices,
      health: () => ({
        live: live.health(),
        forecasts: { ok: true, ...forecasts.counters },
        broker: { ok: broker.state().connected, ...broker.state() },
        forwarder:
          forwarder === null
            ? { ok: true, enabled: false }
            : { enabled: true, ...forwarder.state() },
        ingest: ingestor.counters,
        notices: notices.health(),
      }),
    }),
  );
  app.use(dashboardRoutes(options.webDir));
  app.use(errorToHttp(log));
  const http: Server = await new Promise((resolve, reject) => {
    const server = app.listen(config.httpPort, config.httpHost, (error?: Error) =>
      error ? reject(error) : resolve(server),
    );
  });
  io = new SocketServer(http, { serveClient: false });
  attachLiveSocket(io, archive, live);
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
    lifecycle,
    live,
    notices,
    io,
    logger: log,
    async close() {
      await new Promise<void>((resolve) => {
        // io.close() closes the HTTP server too.
        void io?.close(() => resolve());
        http.closeAllConnections();
      });
      await broker.close();
      await forecasts.close();
      live.close();
      await notices.close();
      await forwarder?.close();
      archive.close();
    },
  };
}
