export * from './units.ts';
export * from './youngLaplace.ts';
export * from './washburn.ts';
export type * from './retentionCurve.ts';
export * from './evaporation.ts';
export * from './windProfile.ts';
export * from './curingMeasures.ts';
export * from './concreteClass.ts';
