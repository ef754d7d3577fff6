#!/usr/bin/env node
// `npm run demo`: the server on the embedded defaults plus the simulators playing the demo
// scenario. The simulators and the scenario are not built yet, so for now this starts the
// server exactly as `npm start` does and says so.
import { spawn } from 'node:child_process';

console.error(
  'meniscus demo: the device simulators and the demo scenario are not built yet; ' +
    'starting the server as `npm start` does.',
);
const server = spawn(
  process.execPath,
  [new URL('../server/bin/meniscus-server.js', import.meta.url).pathname],
  {
    stdio: 'inherit',
  },
);
server.on('exit', (code, signal) => process.exit(signal ? 1 : (code ?? 0)));
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
