export * from './archive.ts';
export * from './archiveQueries.ts';
export * from './figureHistory.ts';
export * from './noticeStore.ts';
export * from './openDatabase.ts';
export type * from './types.ts';
export * from './influxForwarder.ts';
