export * from './detectSilence.ts';
export * from './detectStuck.ts';
