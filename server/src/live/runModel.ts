/**
 * The element model of a run from its configuration: the material preset named by
 * `material.preset` (default `normal-concrete`, the project's reference mix), thickness, drying
 * faces, stress mode and restraint; the uncertain parameters are set per member by the ensemble.
 */
import type { RunConfig } from '../config/index.ts';
import { createElementModel, loadMaterialPreset } from '../engine/index.ts';
import type { ElementModel } from '../engine/index.ts';

/** A run's model and the preset it was built from. */
export interface RunModel {
  model: ElementModel;
  presetId: string;
}

/**
 * Builds the run's element model.
 *
 * @param cellCount - cells through the (half) depth, 60 by default in the engine (physics.md 1)
 * @throws MaterialPresetError when `material.preset` names no preset (the configuration edge
 *   should have refused it)
 */
export function createRunModel(config: RunConfig, cellCount: number): RunModel {
  const named = (config.material as { preset?: unknown }).preset;
  const presetId = typeof named === 'string' ? named : 'normal-concrete';
  const model = createElementModel({
    material: loadMaterialPreset(presetId),
    thicknessM: config.element.thicknessMm / 1000,
    dryingCase: config.element.drying,
    stressMode: config.element.restraint.mode,
    restraintDegree: config.element.restraint.degree,
    options: { cellCount },
  });
  return { model, presetId };
}
