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
const server = await startServer(config);
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
