/**
 * What configures an element model (elementModel.ts): the element (material, thickness, drying,
 * stress mode, setting depth, stress reference) and the model's options, each default with its
 * origin.
 */
import type { MaturityOptions } from '../physics/maturity.ts';
import type { DryingStressMode } from '../physics/dryingStress.ts';
import type { ElementMaterial } from './elementMaterial.ts';
import type { ElementParameters } from './elementState.ts';
import type { DryingCase } from './grid.ts';
import type { MaterialPreset } from './materialPreset.ts';
import type { StepControlOptions } from './stepController.ts';
import type { StressReference } from './stressReference.ts';
import type { SurfaceEvaporationOptions } from './surfaceEvaporation.ts';

/** Options of the element model. Every default states its origin. */
export interface ElementModelOptions {
  /** Cells over the depth, default 60 (physics.md section 1). */
  cellCount?: number;
  /** First cell at the surface, m, default 1e-4 (physics.md section 1). */
  firstCellM?: number;
  /** Vapour diffusion through drained pores, default true (physics.md section 3). */
  vapourDiffusion?: boolean;
  /** Pore refinement with hydration, default true (physics.md section 2, our assumption). */
  poreRefinement?: boolean;
  /** Hydration slows where pores dry, default true (physics.md section 6). */
  hydrationHumidityFactor?: boolean;
  /**
   * Multiplier on permeability, default 1 (the calibration adjusts its log): the default of
   * each new state's `parameters.permeabilityMultiplier`.
   */
  permeabilityMultiplier?: number;
  /** Measured saturated permeability of the fresh material, m2: rescales k(S) (physics.md 3). */
  saturatedPermeabilityM2?: number;
  /** Surface options: exposure multiplier, condensation, curing-measure defaults. */
  surface?: SurfaceEvaporationOptions;
  /** Maturity options (activation energy 40 kJ/mol, reference 20 degC by default). */
  maturity?: MaturityOptions;
  /** Step control (see stepController.ts); maxStepS default 600 s here (our assumption). */
  step?: StepControlOptions;
  /** Bleed film at placement, kg/m2, default 0 (our assumption). */
  initialBleedFilmKgM2?: number;
  /** Bulk modulus of water for the specific storage, Pa, default 2.2e9 (common value, from memory). */
  waterBulkModulusPa?: number;
  /** Density turning water volume into mass in the ledger, kg/m3, default 998.2 (water at 20 degC, IAPWS). */
  liquidDensityKgPerM3?: number;
  /** Relative change of a cell's pore-diameter factor that triggers its update, default 1e-3 (our assumption). */
  refinementUpdateThreshold?: number;
}

/** Configuration of one element. */
export interface ElementModelConfig {
  /**
   * A validated preset (see materialPreset.ts), or a material already derived from one (e.g. with
   * a pore-size distribution of the user's own in place of the preset's).
   */
  material: MaterialPreset | ElementMaterial;
  /** Element thickness, m. */
  thicknessM: number;
  dryingCase: DryingCase;
  /** Stress mode (physics.md section 5), default 'flat'. For `two-face`, 'curl' acts as 'flat' (symmetric profile). */
  stressMode?: DryingStressMode;
  /** External restraint degree for 'restrained', 0..1, default 1 (our assumption, upper bound). */
  restraintDegree?: number;
  /**
   * Depth below the exposed surface whose equivalent age decides when the element sets (the
   * phase of the risk figures and the moment of the stress reference), m; default half the
   * thickness (stressReference.ts: ASTM C403 times setting on mortar of the bulk; our
   * assumption for the depth). Strength at each depth still follows that depth's own age.
   */
  settingDepthM?: number;
  /**
   * Where the drying stress is counted from (stressReference.ts), default 'final-set': the
   * equivalent pore pressure profile at the element's final set, so the stress is zero at set and
   * grows with the drying after it (common practice in early-age stress analysis). 'placement'
   * counts it from the saturated placement (the behaviour before this option).
   */
  stressReference?: StressReference;
  options?: ElementModelOptions;
}

/** Per-member figures for {@link ElementModel.initialState}. */
export interface InitialStateOverrides extends Partial<ElementParameters> {
  /** Bleed film at placement, kg/m2. */
  initialBleedFilmKgM2?: number;
}
