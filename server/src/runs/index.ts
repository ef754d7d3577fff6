export * from './forecastInput.ts';
export * from './measureInput.ts';
export * from './measureLog.ts';
export * from './runErrors.ts';
export * from './runLifecycle.ts';
