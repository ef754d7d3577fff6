/**
 * The per-run live engine core (issue 6): public entry of server/src/live. No HTTP, MQTT or
 * SQLite here; the server feeds readings, the measure log and forecasts, and serves RunState.
 */
export type * from './types.ts';
export { createRunEngine } from './runEngine.ts';
export { CAUTION_TEXT } from './caution.ts';
