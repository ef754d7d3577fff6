export * from './units.ts';
export * from './youngLaplace.ts';
export * from './washburn.ts';
export type * from './retentionCurve.ts';
