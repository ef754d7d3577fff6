#!/usr/bin/env node
// `npm run demo`: the server as `npm start` runs it (same MENISCUS_* variables) plus the
// simulators playing the demo scenario at 60x. Flags after `--`: --speed, --measures fogging,
// --scenario, --duration-h. Runs the TypeScript through tsx's loader (no build step).
import { register } from 'tsx/esm/api';

register();
const { demoMain } = await import('../simulators/src/demoCommand.ts');
process.exitCode = await demoMain(process.argv.slice(2), process.env);
process.exit();
