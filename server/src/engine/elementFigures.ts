/**
 * What the element model reports at one instant (physics.md sections 5 to 7): the depth
 * profiles, the drying stress in the element's mode, strength per depth, and the risk figures
 * with their phase. Composes the physics library; computes no physics of its own.
 *
 * The drying stress is counted from the model's stress reference (stressReference.ts): by default
 * from the equivalent pore pressure profile at the element's final set (its bulk sets), so it is zero before and
 * at final set and grows with the drying after it; with 'placement', from the saturated placement.
 */
import {
  dryingStressFromEquivalentPressure,
  dryingStressFromEquivalentPressureIncrement,
  type DryingStressResult,
} from '../physics/dryingStress.ts';
import { schindlerFolliardDegreeOfHydration } from '../physics/hydration.ts';
import {
  bleedFilmRemainingHours,
  coreSurfaceTemperatureCheck,
  evaporationAgainstBleeding,
  evaporationPrecautionVerdict,
  type CoreSurfaceTemperatureCheck,
  type EvaporationAgainstBleeding,
  type EvaporationPrecautionVerdict,
} from '../physics/precautions.ts';
import { riskPhase, type RiskPhase } from '../physics/riskPhase.ts';
import { inPlaceStrength } from '../physics/strengthDevelopment.ts';
import {
  DEFAULT_UTILIZATION_THRESHOLDS,
  riskFigures,
  type UtilizationState,
  type UtilizationThresholds,
} from '../physics/utilization.ts';
import { SECONDS_PER_DAY, SECONDS_PER_HOUR } from '../physics/units.ts';
import type { ElementModel } from './elementModel.ts';
import type { ElementState } from './elementState.ts';
import { DEFAULT_STRESS_REFERENCE, type StressReference } from './stressReference.ts';
import { createAgeTable, type AgeTable } from './_ageTable.ts';
import { sharedByParameters } from './_sharedByParameters.ts';
import {
  DEFAULT_TARGET_COMPRESSIVE_STRENGTH_MPA,
  strengthForecast,
  type StrengthForecast,
} from './strengthForecast.ts';

const DAY_S = SECONDS_PER_DAY;

type Mix = NonNullable<ElementModel['material']['mix']>;

/**
 * The laws the profiles evaluate for every cell at its equivalent age (in-place tensile and
 * compressive strength, Pa; degree of hydration), tabulated once per mix in ln(age)
 * (_ageTable.ts, within about 1e-5 of the laws): evaluating them for every cell of every figure
 * cost about half of the figures.
 */
function lawsAtAge(mix: Mix): AgeTable {
  // One table per mix for every model of it (_sharedByParameters.ts).
  return sharedByParameters('figure-laws', mix, () => {
    // The table fills a node by calling each law at its age in turn: both strengths come from
    // one evaluation of the law.
    let strengthAgeS = Number.NaN;
    let strength = inPlaceStrength(Number.NaN, mix.strength, mix.setting);
    const strengthAt = (ageS: number) => {
      if (ageS !== strengthAgeS) {
        strengthAgeS = ageS;
        strength = inPlaceStrength(ageS / DAY_S, mix.strength, mix.setting);
      }
      return strength;
    };
    return createAgeTable([
      (ageS) => strengthAt(ageS).tensileStrengthMPa * 1e6,
      (ageS) => strengthAt(ageS).compressiveStrengthMPa * 1e6,
      (ageS) => schindlerFolliardDegreeOfHydration(ageS, mix.hydration),
    ]);
  });
}

/** Depth profiles at one instant, index 0 at the exposed surface. SI units. */
export interface ElementProfiles {
  depthM: number[];
  saturation: number[];
  liquidPressurePa: number[];
  relativeHumidity: number[];
  equivalentPorePressurePa: number[];
  stressPa: number[];
  tensileStrengthPa: number[];
  compressiveStrengthPa: number[];
  equivalentAgeS: number[];
  degreeOfHydration: number[];
  temperatureK: number[];
}

/** Figures of one instant. */
export interface ElementFigures {
  timeS: number;
  phase: RiskPhase;
  /** Utilization U of the phase (physics.md section 7). */
  utilization: number;
  /** fct - sigma_s, Pa; NaN in the plastic phase. */
  marginPa: number;
  utilizationState: UtilizationState;
  /** Drying stress at the surface, Pa, counted from `stressReference` (tension positive). */
  surfaceStressPa: number;
  /** Where the stress is counted from (the model's option, default 'final-set'). */
  stressReference: StressReference;
  /**
   * When the final-set reference profile was recorded, s since placement: NaN before final set,
   * when unknown (restored from a version 1 snapshot after set), and with 'placement'.
   */
  stressReferenceTimeS: number;
  surfaceTensileStrengthPa: number;
  surfaceCompressiveStrengthPa: number;
  surfaceLiquidPressurePa: number;
  surfaceSaturation: number;
  surfaceRelativeHumidity: number;
  /** Critical suction of the plastic phase, Pa. */
  criticalSuctionPa: number;
  /** Evaporation over the last step, kg/(m2 s). */
  evaporationKgM2s: number;
  /** Wet-surface (potential) evaporation over the last step, kg/(m2 s). */
  potentialEvaporationKgM2s: number;
  bleedFilmKgM2: number;
  /** Hours until the bleed film is gone at the current rates (0: none; Infinity: growing). */
  bleedFilmRemainingH: number;
  evaporationAgainstBleeding: EvaporationAgainstBleeding;
  evaporationPrecaution: EvaporationPrecautionVerdict;
  coreSurfaceTemperature: CoreSurfaceTemperatureCheck;
  /** Water evaporated since placement, kg/m2. */
  waterLossKgM2: number;
  /** Hours until the surface and the core reach the target compressive strength (physics.md 6). */
  strengthForecast: StrengthForecast;
  profiles: ElementProfiles;
}

/** The element's phase: it sets with its bulk (the setting depth, stressReference.ts). */
function phaseOf(model: ElementModel, state: ElementState): RiskPhase {
  const mix = model.material.mix;
  if (mix === undefined) return 'hardening';
  const settingAgeS = state.equivalentAgeS[model.settingCell] as number;
  return riskPhase(settingAgeS / SECONDS_PER_DAY, mix.setting.finalSetEquivalentAgeDays);
}

/**
 * The drying stress profile of `state` in the element's mode, counted from the model's stress
 * reference (module comment), from the equivalent pore pressure of every cell.
 */
function stressOf(
  model: ElementModel,
  state: ElementState,
  phase: RiskPhase,
  depthsM: readonly number[],
  weightsM: readonly number[],
  equivalentPressuresPa: number[],
): { stress: DryingStressResult; stressReferenceTimeS: number } {
  const { material, config } = model;
  const requestedMode = config.stressMode ?? 'flat';
  const mode =
    config.dryingCase === 'two-face' && requestedMode === 'curl' ? 'flat' : requestedMode;
  const stressOptions = {
    mode,
    restraintDegree: config.restraintDegree ?? 1,
    biotCoefficient: material.biotCoefficient,
    poissonRatio: material.poissonRatio,
    relaxationFactor: material.relaxationFactor,
  };
  const stressProfile = { depthsM, weightsM };
  const reference = config.stressReference ?? DEFAULT_STRESS_REFERENCE;
  // From placement by choice, or set but never recorded (a version 1 snapshot not yet advanced):
  // the placement profile.
  if (reference === 'placement' || (state.stressReferencePa === null && phase === 'hardening')) {
    return {
      stress: dryingStressFromEquivalentPressure(
        stressProfile,
        equivalentPressuresPa,
        stressOptions,
      ),
      stressReferenceTimeS: Number.NaN,
    };
  }
  if (state.stressReferencePa !== null) {
    return {
      stress: dryingStressFromEquivalentPressureIncrement(
        stressProfile,
        equivalentPressuresPa,
        state.stressReferencePa,
        stressOptions,
      ),
      stressReferenceTimeS: state.stressReferenceTimeS,
    };
  }
  // Before final set the mix flows: no drying stress (the plastic criterion applies).
  return {
    stress: dryingStressFromEquivalentPressureIncrement(
      stressProfile,
      equivalentPressuresPa,
      equivalentPressuresPa,
      stressOptions,
    ),
    stressReferenceTimeS: Number.NaN,
  };
}

/** The risk of one instant alone: what an outlook needs of each member at each time. */
export interface ElementRisk {
  phase: RiskPhase;
  /** Utilization U of the phase (physics.md section 7). */
  utilization: number;
  /** fct - sigma_s, Pa; NaN in the plastic phase. */
  marginPa: number;
  /** Drying stress at the surface, Pa (tension positive). */
  surfaceStressPa: number;
  surfaceTensileStrengthPa: number;
}

/** Cell depths and widths of a grid as the stress functions take them, one copy per grid. */
const stressGrids = new WeakMap<ElementModel['grid'], { depthsM: number[]; weightsM: number[] }>();

/**
 * The utilization, margin, surface stress and strength of `state`: the same numbers as
 * {@link evaluateElement} (to the bit), without its profiles, precautions and forecasts. An
 * outlook asks this of every member at every output time, where the whole figures cost about
 * a quarter of a live cycle.
 */
export function evaluateRisk(
  model: ElementModel,
  state: ElementState,
  thresholds: UtilizationThresholds = DEFAULT_UTILIZATION_THRESHOLDS,
): ElementRisk {
  model.applyState(state);
  const { grid, hydraulics, material } = model;
  const n = grid.cellCount;
  let columns = stressGrids.get(grid);
  if (columns === undefined) {
    columns = { depthsM: Array.from(grid.centresM), weightsM: Array.from(grid.widthsM) };
    stressGrids.set(grid, columns);
  }
  const pressures = state.transport.pressurePa;
  const equivalentPressuresPa = new Array<number>(n);
  for (let i = 0; i < n; i += 1) {
    equivalentPressuresPa[i] = hydraulics.equivalentPorePressurePa(i, pressures[i] as number);
  }
  const phase = phaseOf(model, state);
  const { stress } = stressOf(
    model,
    state,
    phase,
    columns.depthsM,
    columns.weightsM,
    equivalentPressuresPa,
  );
  let surfaceStrength = material.fixedStrength?.tensileStrengthPa ?? Number.NaN;
  if (material.mix !== undefined) {
    const laws = lawsAtAge(material.mix);
    laws.at(state.equivalentAgeS[0] as number);
    surfaceStrength = laws.values[0] as number;
  }
  const risk = riskFigures(
    phase === 'plastic'
      ? {
          phase,
          surfacePressurePa: pressures[0] as number,
          criticalSuctionPa: material.criticalSuctionPa,
        }
      : { phase, surfaceStressPa: stress.surfaceStressPa, tensileStrengthPa: surfaceStrength },
    thresholds,
  );
  return {
    phase,
    utilization: risk.utilization,
    marginPa: risk.marginPa,
    surfaceStressPa: stress.surfaceStressPa,
    surfaceTensileStrengthPa: surfaceStrength,
  };
}

/**
 * Evaluates the figures of `state` under `model`. For `two-face` drying the profiles cover the
 * half thickness (surface to symmetry plane) and 'curl' acts as 'flat'.
 *
 * @param thresholds utilization thresholds (physics.md section 7 defaults)
 * @param targetCompressiveStrengthMPa target of the strength forecast, MPa (default
 *   {@link DEFAULT_TARGET_COMPRESSIVE_STRENGTH_MPA}, see strengthForecast.ts)
 */
export function evaluateElement(
  model: ElementModel,
  state: ElementState,
  thresholds: UtilizationThresholds = DEFAULT_UTILIZATION_THRESHOLDS,
  targetCompressiveStrengthMPa: number = DEFAULT_TARGET_COMPRESSIVE_STRENGTH_MPA,
): ElementFigures {
  model.applyState(state);
  const { grid, hydraulics, material, config } = model;
  const n = grid.cellCount;
  // Arrays of their final length written by index (pushing grew each of them several times).
  const column = (): number[] => new Array<number>(n);
  const copy = (values: Float64Array): number[] => {
    const out = column(); // a loop: Array.from walks a typed array through its iterator
    for (let i = 0; i < n; i += 1) out[i] = values[i] as number;
    return out;
  };
  const profiles: ElementProfiles = {
    depthM: copy(grid.centresM),
    saturation: column(),
    liquidPressurePa: column(),
    relativeHumidity: column(),
    equivalentPorePressurePa: column(),
    stressPa: [],
    tensileStrengthPa: column(),
    compressiveStrengthPa: column(),
    equivalentAgeS: copy(state.equivalentAgeS),
    degreeOfHydration: column(),
    temperatureK: copy(state.temperatureK),
  };
  const mix = material.mix;
  const fixedTensilePa = material.fixedStrength?.tensileStrengthPa ?? Number.NaN;
  const pressures = state.transport.pressurePa;
  const ages = state.equivalentAgeS;
  const laws = mix === undefined ? undefined : lawsAtAge(mix);
  hydraulics.fillProfiles(
    pressures,
    profiles.saturation,
    profiles.relativeHumidity,
    profiles.equivalentPorePressurePa,
  );
  for (let i = 0; i < n; i += 1) {
    profiles.liquidPressurePa[i] = pressures[i] as number;
    if (laws !== undefined) {
      laws.at(ages[i] as number);
      profiles.tensileStrengthPa[i] = laws.values[0] as number;
      profiles.compressiveStrengthPa[i] = laws.values[1] as number;
      profiles.degreeOfHydration[i] = laws.values[2] as number;
    } else {
      profiles.tensileStrengthPa[i] = fixedTensilePa;
      profiles.compressiveStrengthPa[i] = Number.NaN;
      profiles.degreeOfHydration[i] = Number.NaN;
    }
  }
  const phase = phaseOf(model, state);
  const { stress, stressReferenceTimeS } = stressOf(
    model,
    state,
    phase,
    profiles.depthM,
    copy(grid.widthsM),
    profiles.equivalentPorePressurePa,
  );
  profiles.stressPa = stress.stressesPa;
  const surfacePressure = profiles.liquidPressurePa[0] as number;
  const surfaceStrength = profiles.tensileStrengthPa[0] as number;
  const risk = riskFigures(
    phase === 'plastic'
      ? { phase, surfacePressurePa: surfacePressure, criticalSuctionPa: material.criticalSuctionPa }
      : { phase, surfaceStressPa: stress.surfaceStressPa, tensileStrengthPa: surfaceStrength },
    thresholds,
  );
  const potentialKgM2h = state.lastPotentialEvaporationKgM2s * SECONDS_PER_HOUR;
  const bleedRateKgM2h =
    material.mix !== undefined && state.transport.timeS <= material.mix.bleedingDurationS
      ? material.mix.bleedRateKgM2s * SECONDS_PER_HOUR
      : 0;
  return {
    timeS: state.transport.timeS,
    phase,
    utilization: risk.utilization,
    marginPa: risk.marginPa,
    utilizationState: risk.state,
    surfaceStressPa: stress.surfaceStressPa,
    stressReference: config.stressReference ?? DEFAULT_STRESS_REFERENCE,
    stressReferenceTimeS,
    surfaceTensileStrengthPa: surfaceStrength,
    surfaceCompressiveStrengthPa: profiles.compressiveStrengthPa[0] as number,
    surfaceLiquidPressurePa: surfacePressure,
    surfaceSaturation: profiles.saturation[0] as number,
    surfaceRelativeHumidity: profiles.relativeHumidity[0] as number,
    criticalSuctionPa: material.criticalSuctionPa,
    evaporationKgM2s: state.lastEvaporationKgM2s,
    potentialEvaporationKgM2s: state.lastPotentialEvaporationKgM2s,
    bleedFilmKgM2: state.bleedFilmKgM2,
    bleedFilmRemainingH: bleedFilmRemainingHours(
      state.bleedFilmKgM2,
      potentialKgM2h,
      bleedRateKgM2h,
    ),
    evaporationAgainstBleeding: evaporationAgainstBleeding(potentialKgM2h, bleedRateKgM2h),
    evaporationPrecaution: evaporationPrecautionVerdict(potentialKgM2h),
    coreSurfaceTemperature: coreSurfaceTemperatureCheck(
      state.temperatureK[n - 1] as number,
      state.temperatureK[0] as number,
    ),
    waterLossKgM2: state.evaporatedKgM2,
    strengthForecast: strengthForecast(model, state, targetCompressiveStrengthMPa),
    profiles,
  };
}
