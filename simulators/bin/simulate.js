#!/usr/bin/env node
// The device simulators alone: `node simulators/bin/simulate.js --url mqtt://host:1883
// [--server http://host:8080] [--scenario level3-topping] [--speed 60] [--measures fogging]
// [--passwords FILE]`.
// Runs the TypeScript through tsx's loader (no build step).
import { register } from 'tsx/esm/api';

register();
const { simulateMain } = await import('../src/simulateCommand.ts');
process.exitCode = await simulateMain(process.argv.slice(2));
process.exit();
