export * from './forecastSubscriber.ts';
export * from './liveHost.ts';
export * from './liveReading.ts';
export * from './runFeed.ts';
