/**
 * The drying model of one element (physics.md sections 1 to 7): moisture transport through the
 * depth, the exposed surface with bleeding and curing measures, maturity, hydration and pore
 * refinement per depth. `advanceTo` is driven by event time; the state is separate from the
 * model so ensemble members share one model and copy only their state. At the step in which the
 * element reaches final set (its bulk, at the setting depth), the model records the equivalent
 * pore pressure profile in the state: the stress-free reference from which the drying stress is
 * counted (stressReference.ts).
 */
import { arrheniusAgeFactor } from '../physics/maturity.ts';
import {
  schindlerFolliardDegreeOfHydration,
  type HydrationHumidityOptions,
} from '../physics/hydration.ts';
import { inPlaceStrength } from '../physics/strengthDevelopment.ts';
import { kelvinToCelsius, SECONDS_PER_DAY as SECONDS_PER_DAY_EXPORT } from '../physics/units.ts';

// Local copy: a module binding read in the per-cell loop costs an accessor call under tsx.
const SECONDS_PER_DAY = SECONDS_PER_DAY_EXPORT;
import {
  checkBoundaryInputs,
  fillCellTemperatures,
  type BoundaryInputs,
} from './boundaryInputs.ts';
import {
  elementMaterialFromPreset,
  refinementDiameterScale,
  type ElementMaterial,
} from './elementMaterial.ts';
import type { ElementModelConfig, InitialStateOverrides } from './elementModelConfig.ts';
import type { ElementState } from './elementState.ts';
import { buildDepthGrid, domainDepthM, type DepthGrid } from './grid.ts';
import { createWorkspace, type SurfaceCondition } from './implicitStep.ts';
import { createPoreHydraulics, type PoreHydraulics } from './poreHydraulics.ts';
import { advanceTransport, type StepControlOptions } from './stepController.ts';
import { createFilmStepCheck, FILM_FLOOR_KG_M2 } from './_filmStepCheck.ts';
import { createAgeTable } from './_ageTable.ts';
import { sharedByParameters } from './_sharedByParameters.ts';
import { createHumidityFactorTable } from './_humidityFactorTable.ts';
import { defaultSettingDepthM, hasReachedFinalSet, settingCellIndex } from './stressReference.ts';
import {
  surfaceEvaporation,
  type SurfaceEvaporation,
  type SurfaceEvaporationOptions,
} from './surfaceEvaporation.ts';

export type {
  ElementModelConfig,
  ElementModelOptions,
  InitialStateOverrides,
} from './elementModelConfig.ts';

/** A ready element model: shared by every state (ensemble member) of the element. */
export interface ElementModel {
  readonly config: ElementModelConfig;
  readonly material: ElementMaterial;
  readonly grid: DepthGrid;
  readonly hydraulics: PoreHydraulics;
  readonly liquidDensityKgPerM3: number;
  /** The cell whose equivalent age decides when the element sets (`config.settingDepthM`). */
  readonly settingCell: number;
  /** True once the element has reached final set (the age at `settingCell` is past it). */
  hasSet(state: ElementState): boolean;
  /**
   * A saturated element at placement (time 0) at a uniform temperature (K, default 293.15), with
   * the options' parameters unless `overrides` gives this member its own (ensembles).
   */
  initialState(temperatureK?: number, overrides?: InitialStateOverrides): ElementState;
  /**
   * Advances `state` in place to `timeS` (s since placement) with `inputs` held over the
   * interval. Throws BoundaryInputError for refused inputs (e.g. freezing) and
   * EngineConvergenceError if the transport cannot converge; a target at or before the state's
   * time only updates the temperatures. The state it leaves has its pressures on its curves: the
   * pore refinement its last step's ages call for is applied at the start of the next interval.
   */
  advanceTo(state: ElementState, timeS: number, inputs: BoundaryInputs): void;
  /** Points the shared hydraulics at a state (temperatures, refinement, storage). */
  applyState(state: ElementState): void;
}

/**
 * Records in `state` the equivalent pore pressure profile of its current pressures as the
 * stress-free reference, at `timeS` (s since placement; NaN: unknown). The shared hydraulics must
 * point at the state ({@link ElementModel.applyState}).
 */
function recordStressReference(
  hydraulics: PoreHydraulics,
  state: ElementState,
  timeS: number,
): void {
  const pressures = state.transport.pressurePa;
  const reference = new Float64Array(pressures.length);
  for (let i = 0; i < pressures.length; i += 1) {
    reference[i] = hydraulics.equivalentPorePressurePa(i, pressures[i] as number);
  }
  state.stressReferencePa = reference;
  state.stressReferenceTimeS = timeS;
}

/** Builds the model of one element. */
export function createElementModel(config: ElementModelConfig): ElementModel {
  const options = config.options ?? {};
  const material =
    'preset' in config.material ? config.material : elementMaterialFromPreset(config.material);
  const grid = buildDepthGrid(domainDepthM(config.thicknessM, config.dryingCase), {
    cellCount: options.cellCount ?? 60,
    firstCellM: options.firstCellM ?? 1e-4,
  });
  const n = grid.cellCount;
  const liquidDensity = options.liquidDensityKgPerM3 ?? 998.2;
  const hydraulics = createPoreHydraulics({
    poreSizes: material.freshPores,
    porosity: material.porosity,
    tortuosity: material.tortuosity,
    permeabilityMultiplier: options.permeabilityMultiplier ?? 1,
    ...(options.saturatedPermeabilityM2 === undefined
      ? {}
      : { saturatedPermeabilityM2: options.saturatedPermeabilityM2 }),
    vapourDiffusion: options.vapourDiffusion ?? true,
    liquidDensityKgPerM3: liquidDensity,
    cellCount: n,
  });
  const workspace = createWorkspace(n);
  const stepOptions: StepControlOptions = { maxStepS: 600, ...options.step };
  const refinementOn = (options.poreRefinement ?? true) && material.mix !== undefined;
  const humidityFactorOn = options.hydrationHumidityFactor ?? true;
  const threshold = options.refinementUpdateThreshold ?? 1e-3;
  const waterBulkModulus = options.waterBulkModulusPa ?? 2.2e9;
  const maturityOptions = options.maturity ?? {};
  // One options object for every call (a default parameter would be a new object per call).
  const humidityOptions: HydrationHumidityOptions = {};
  const surfaceOptions: SurfaceEvaporationOptions = { ...options.surface };
  const maturityRate = new Float64Array(n);
  // Temperature for which maturityRate[i] was computed: cells share a handful of temperatures
  // and the Arrhenius factor only changes with them.
  const maturityRateForK = new Float64Array(n).fill(Number.NaN);
  const newTemperatureK = new Float64Array(n);

  const specificStorage = (equivalentAgeS: number): number => {
    let modulusPa: number;
    let floorPa = 0;
    if (material.mix !== undefined) {
      const strength = inPlaceStrength(
        equivalentAgeS / SECONDS_PER_DAY,
        material.mix.strength,
        material.mix.setting,
      );
      modulusPa = strength.modulusGPa * 1e9;
      floorPa = material.mix.drainedBulkModulusFloorPa;
    } else {
      modulusPa = material.fixedStrength?.modulusPa ?? Number.NaN;
    }
    const drainedBulkPa = Math.max(floorPa, modulusPa / (3 * (1 - 2 * material.poissonRatio)));
    return material.porosity / waterBulkModulus + material.biotCoefficient ** 2 / drainedBulkPa;
  };
  // Storage and refinement targets depend on a cell's equivalent age alone: tabulated in
  // log2Linear(age) (see _ageTable.ts) so that every cell can be checked after every step cheaply.
  const mixForScale = material.mix;
  const refinementScale = (ageS: number): number =>
    refinementOn && mixForScale !== undefined
      ? refinementDiameterScale(
          mixForScale,
          schindlerFolliardDegreeOfHydration(ageS, mixForScale.hydration),
        )
      : 1;
  // Shared by every model of the same mix and parameters (_sharedByParameters.ts): a new model
  // of a known material finds the nodes its predecessors filled.
  const targetsAtAge = sharedByParameters(
    'age-targets',
    {
      mix: material.mix ?? null,
      fixedModulusPa: material.fixedStrength?.modulusPa ?? null,
      porosity: material.porosity,
      poissonRatio: material.poissonRatio,
      biotCoefficient: material.biotCoefficient,
      waterBulkModulus,
      refinementOn,
    },
    () => createAgeTable([specificStorage, refinementScale]),
  );
  const targets = targetsAtAge.values;

  const applyState = (state: ElementState): void => {
    hydraulics.temperatureK.set(state.temperatureK);
    hydraulics.diameterScale.set(state.diameterScale);
    hydraulics.specificStoragePerPa.set(state.specificStoragePerPa);
    hydraulics.setPermeabilityMultiplier(state.parameters.permeabilityMultiplier);
    hydraulics.refreshTemperature();
  };

  const initialState = (
    temperatureK = 293.15,
    overrides: InitialStateOverrides = {},
  ): ElementState => ({
    transport: {
      timeS: 0,
      pressurePa: new Float64Array(n),
      nextStepS: 1,
      surfaceInflowM: 0,
      storageWaterM: 0,
      massDefectM: 0,
      acceptedSteps: 0,
      rejectedSteps: 0,
    },
    equivalentAgeS: new Float64Array(n),
    temperatureK: new Float64Array(n).fill(temperatureK),
    diameterScale: new Float64Array(n).fill(1),
    specificStoragePerPa: new Float64Array(n).fill(specificStorage(0)),
    bleedFilmKgM2: overrides.initialBleedFilmKgM2 ?? options.initialBleedFilmKgM2 ?? 0,
    bledKgM2: 0,
    evaporatedKgM2: 0,
    coveringUptakeKgM2: 0,
    lastEvaporationKgM2s: 0,
    lastPotentialEvaporationKgM2s: 0,
    parameters: {
      permeabilityMultiplier:
        overrides.permeabilityMultiplier ?? options.permeabilityMultiplier ?? 1,
      exposureMultiplier: overrides.exposureMultiplier ?? options.surface?.exposureMultiplier ?? 1,
      curingEfficiency: overrides.curingEfficiency ?? null,
    },
    // Saturated at placement, pi = 0: a material without a mix carries stress from placement.
    stressReferencePa: material.mix === undefined ? new Float64Array(n) : null,
    stressReferenceTimeS: material.mix === undefined ? 0 : Number.NaN,
  });

  const settingCell = settingCellIndex(
    grid.centresM,
    config.settingDepthM ?? defaultSettingDepthM(config.thicknessM),
  );
  /** True once the element has reached final set (see stressReference.ts). */
  const elementHasSet = (state: ElementState): boolean =>
    hasReachedFinalSet(material, state.equivalentAgeS[settingCell] ?? 0);

  // Context of the interval being advanced: the surface functions below are built once per
  // model (a closure made per call costs more than the work of a step under tsx) and read it.
  let stepState: ElementState | null = null;
  let intervalEndS = 0;
  let evaporation: SurfaceEvaporation | null = null;
  let bleedRate = 0;
  let condensationFloor = 0;
  type Mode = 'covered' | 'film' | 'exposed';
  let mode: Mode = 'exposed';
  const mix = material.mix;
  const outflowFlux = (surfacePressurePa: number): number => {
    const surface = evaporation as SurfaceEvaporation;
    const humidity = hydraulics.relativeHumidity(0, Math.min(0, surfacePressurePa));
    const net = surface.signedRateKgM2s(humidity) - bleedRate;
    const rate = surface.allowCondensation ? net : Math.max(net, condensationFloor);
    return rate / liquidDensity;
  };
  const outflow: SurfaceCondition = { kind: 'outflow', volumeFluxMs: outflowFlux };
  // A surface that draws in more than the bleeding brings (no film can form): all the bleed water
  // goes into the body, and the clamp at no condensation holds for evaporation alone.
  const absorbingFlux = (surfacePressurePa: number): number => {
    const surface = evaporation as SurfaceEvaporation;
    const humidity = hydraulics.relativeHumidity(0, Math.min(0, surfacePressurePa));
    const evaporationRate = surface.signedRateKgM2s(humidity);
    const rate = surface.allowCondensation
      ? evaporationRate
      : Math.max(evaporationRate, condensationFloor);
    return (rate - bleedRate) / liquidDensity;
  };
  const absorbing: SurfaceCondition = { kind: 'outflow', volumeFluxMs: absorbingFlux };
  const saturatedSurface: SurfaceCondition = { kind: 'pressure', pressurePa: 0 };
  const surfaceAt = (endS: number): SurfaceCondition => {
    const surface = evaporation as SurfaceEvaporation;
    const state = stepState as ElementState;
    bleedRate = mix !== undefined && endS <= mix.bleedingDurationS ? mix.bleedRateKgM2s : 0;
    const forcedExposed = filmCheck.forcedExposedAt(state.transport.timeS);
    if (surface.heldSaturated) mode = 'covered';
    else if (
      !forcedExposed &&
      (state.bleedFilmKgM2 > FILM_FLOOR_KG_M2 ||
        (bleedRate > 0 && surface.potentialKgM2s <= bleedRate))
    )
      mode = 'film';
    else mode = 'exposed';
    if (mode !== 'exposed') return saturatedSurface;
    return forcedExposed ? absorbing : outflow;
  };

  // Holds a film step to the water the film and the bleeding hold (_filmStepCheck.ts).
  const filmCheck = createFilmStepCheck({
    inFilmMode: () => mode === 'film',
    state: () => stepState as ElementState,
    potentialKgM2s: () => (evaporation as SurfaceEvaporation).potentialKgM2s,
    bleedRateKgM2s: () => bleedRate,
    liquidDensityKgPerM3: liquidDensity,
  });

  const onStep = (stepS: number, result: { surfaceInflowM: number }): void => {
    const state = stepState as ElementState;
    const surface = evaporation as SurfaceEvaporation;
    const inflowKgM2 = result.surfaceInflowM * liquidDensity;
    const bled = bleedRate * stepS;
    const evaporatedBefore = state.evaporatedKgM2;
    state.bledKgM2 += bled;
    if (mode === 'covered') {
      state.coveringUptakeKgM2 += inflowKgM2;
      state.bleedFilmKgM2 += bled;
    } else if (mode === 'film') {
      // filmCheck accepted the step only if the inflow is within film plus bleeding: film >= 0.
      const film = state.bleedFilmKgM2 + bled - inflowKgM2;
      const taken = Math.min(film, surface.potentialKgM2s * stepS);
      state.evaporatedKgM2 += taken;
      state.bleedFilmKgM2 = film - taken;
      if (state.bleedFilmKgM2 <= FILM_FLOOR_KG_M2) {
        state.evaporatedKgM2 += state.bleedFilmKgM2;
        state.bleedFilmKgM2 = 0;
      }
    } else {
      // A film too thin to resolve (FILM_FLOOR_KG_M2) evaporates with the step.
      state.evaporatedKgM2 += bled - inflowKgM2 + state.bleedFilmKgM2;
      state.bleedFilmKgM2 = 0;
    }
    state.lastEvaporationKgM2s = (state.evaporatedKgM2 - evaporatedBefore) / stepS;
    state.lastPotentialEvaporationKgM2s = surface.potentialKgM2s;
    advanceMaturity(state, stepS);
  };
  const heldWater = new Float64Array(n);
  const hooks = { onStep, check: filmCheck, heldWater };

  const advanceTo = (state: ElementState, timeS: number, inputs: BoundaryInputs): void => {
    checkBoundaryInputs(inputs);
    applyState(state);
    if (state.stressReferencePa === null && elementHasSet(state)) {
      // Set, but never recorded (a version 1 snapshot): the placement profile, time unknown.
      state.stressReferencePa = new Float64Array(n);
      state.stressReferenceTimeS = Number.NaN;
    }
    fillCellTemperatures(inputs, grid.centresM, newTemperatureK);
    const pressures = state.transport.pressurePa;
    if (!(timeS > state.transport.timeS)) {
      // No step to take: the cells whose temperature changed move their pressures so they keep
      // their water on the new curves (mass conserved to rounding through the change).
      if (hydraulics.setTemperaturesKeepingWater(newTemperatureK, pressures)) {
        state.temperatureK.set(newTemperatureK);
      }
      return;
    }
    // The water each cell holds, on the curves its pressure was solved on; the new temperatures
    // and the refinement of the last step (left until now, so a state between intervals has its
    // pressures on its curves) change the curves, and the first step's balance keeps the water.
    hydraulics.waterContents(pressures, heldWater);
    if (hydraulics.setTemperatures(newTemperatureK)) state.temperatureK.set(newTemperatureK);
    applyRefinement(state);
    for (let i = 0; i < n; i += 1) {
      const temperature = state.temperatureK[i] as number;
      if (temperature === maturityRateForK[i]) continue;
      maturityRateForK[i] = temperature;
      // Cells share a handful of temperatures: the neighbour's factor when it has the same one.
      maturityRate[i] =
        i > 0 && temperature === maturityRateForK[i - 1]
          ? (maturityRate[i - 1] as number)
          : arrheniusAgeFactor(kelvinToCelsius(temperature), maturityOptions);
    }
    const { exposureMultiplier, curingEfficiency } = state.parameters;
    let surfaceInputs = inputs;
    if (curingEfficiency !== null && inputs.activeMeasures !== undefined) {
      surfaceInputs = {
        ...inputs,
        activeMeasures: inputs.activeMeasures.map((measure) =>
          measure.kind === 'curing-compound'
            ? { ...measure, efficiency: curingEfficiency }
            : measure,
        ),
      };
    }
    surfaceOptions.exposureMultiplier = exposureMultiplier;
    evaporation = surfaceEvaporation(surfaceInputs, surfaceOptions);
    // The clamp of evaporation at zero (no condensation) has a kink exactly where the surface
    // comes into equilibrium with the air, and Newton cycles across a kink. Inside the solver the
    // rate continues linearly below zero down to -w, with w = 1e-4 of the wet-surface rate: the
    // equilibrium is then a smooth zero crossing, and at most w of water per m2 and second can
    // return to the surface (our assumption, a numerical regularisation of the clamp).
    condensationFloor = -1e-4 * Math.abs(evaporation.signedRateKgM2s(1));
    stepState = state;
    intervalEndS = timeS;
    // The film search belongs to one state's interval: members share this model.
    filmCheck.reset();
    try {
      advanceTransport(
        grid,
        hydraulics,
        workspace,
        state.transport,
        timeS,
        surfaceAt,
        stepOptions,
        hooks,
      );
    } finally {
      stepState = null;
      evaporation = null;
    }
  };

  /**
   * After an accepted step: equivalent age per cell; at the step in which the element passes final
   * set, records the stress reference (on the curves of the step, so the stress is zero right
   * then); then, unless the step ends the interval, the refinement of the new ages. The pressures
   * stay: the next step's balance keeps each cell's water (`heldWater`).
   */
  const advanceMaturity = (state: ElementState, stepS: number): void => {
    if (mix === undefined) return;
    advanceAges(state, stepS);
    if (state.stressReferencePa === null && elementHasSet(state)) {
      recordStressReference(hydraulics, state, state.transport.timeS);
    }
    if (state.transport.timeS < intervalEndS) applyRefinement(state);
  };

  // Hydration humidity factor against x = -p / A = -ln h (see _humidityFactorTable.ts).
  const humidityFactor = sharedByParameters('humidity-factor', humidityOptions, () =>
    createHumidityFactorTable(humidityOptions),
  );
  const inverseKelvin = hydraulics.inverseKelvinPerPa;

  const advanceAges = (state: ElementState, stepS: number): void => {
    const pressures = state.transport.pressurePa;
    const ages = state.equivalentAgeS;
    for (let i = 0; i < n; i += 1) {
      const pressure = pressures[i] as number;
      let rate = maturityRate[i] as number;
      if (humidityFactorOn && pressure < 0) {
        rate *= humidityFactor.at(-pressure * (inverseKelvin[i] as number));
      }
      ages[i] = (ages[i] as number) + stepS * rate;
    }
  };

  /**
   * Storage and refinement targets of each cell's equivalent age: a cell whose target moved by
   * more than the update threshold takes it (state and shared hydraulics).
   */
  const applyRefinement = (state: ElementState): void => {
    if (mix === undefined) return;
    const ages = state.equivalentAgeS;
    const storages = state.specificStoragePerPa;
    const scales = state.diameterScale;
    for (let i = 0; i < n; i += 1) {
      targetsAtAge.at(ages[i] as number);
      const storage = targets[0] as number;
      const scale = targets[1] as number;
      const storageNow = storages[i] as number;
      const scaleNow = scales[i] as number;
      if (
        Math.abs(storage - storageNow) > threshold * storageNow ||
        Math.abs(scale - scaleNow) > threshold * scaleNow
      ) {
        storages[i] = storage;
        scales[i] = scale;
        hydraulics.rescaleCell(i, scale, storage);
      }
    }
  };

  return {
    config,
    material,
    grid,
    hydraulics,
    liquidDensityKgPerM3: liquidDensity,
    settingCell,
    hasSet: elementHasSet,
    initialState,
    advanceTo,
    applyState,
  };
}
