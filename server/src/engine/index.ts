/**
 * The element model (issue 3): public entry of server/src/engine. The live engine, the ensemble
 * calibration and the CLI import from here.
 */
export * from './grid.ts';
export * from './tridiagonal.ts';
export type * from './hydraulics.ts';
export * from './linearDiffusion.ts';
export * from './implicitStep.ts';
export * from './stepController.ts';
export * from './poreHydraulics.ts';
export * from './materialPreset.ts';
export * from './elementMaterial.ts';
export * from './boundaryInputs.ts';
export * from './surfaceEvaporation.ts';
export * from './elementState.ts';
export * from './elementModel.ts';
export * from './stressReference.ts';
export * from './elementFigures.ts';
export * from './strengthForecast.ts';
export * from './simulateElement.ts';
