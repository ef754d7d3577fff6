#!/usr/bin/env node
// Entry point of the `meniscus` command: runs the TypeScript CLI through tsx's loader so no
// build step stands between a clone and a working command.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../src/cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
