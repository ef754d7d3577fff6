export * from './detectSilence.ts';
export * from './detectStuck.ts';
export * from './sensorQuality.ts';
