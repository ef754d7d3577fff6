#!/usr/bin/env node
// Entry point of `npm start`: runs the TypeScript server through tsx's loader (no build step).
// Configuration comes from MENISCUS_* environment variables (server/src/config/serverConfig.ts).
import { register } from 'tsx/esm/api';

register();
const { serverConfigFromEnv } = await import('../src/config/serverConfig.ts');
const { startServer } = await import('../src/server.ts');

let config;
try {
  config = serverConfigFromEnv(process.env);
} catch (error) {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(2);
}
let server;
try {
  server = await startServer(config);
} catch (error) {
  // A port in use is the usual cause; say which one and how to change it.
  const code = error && typeof error === 'object' ? error.code : undefined;
  if (code === 'EADDRINUSE') {
    console.error(
      `${error.message}: another program uses that port. Set MENISCUS_HTTP_PORT or MENISCUS_MQTT_PORT (or MENISCUS_MQTT_URL for an external broker).`,
    );
  } else {
    console.error(error);
  }
  process.exit(1);
}
let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    server.logger.info({ signal }, 'stopping');
    server.close().then(
      () => process.exit(0),
      (error) => {
        server.logger.error({ err: error }, 'error while stopping');
        process.exit(1);
      },
    );
  });
}
