/**
 * The element model as the calibration sees it (server/src/calibration README): a member's
 * analysed state is the suction of each cell, `-p` in Pa, analysed as ln(suction + 1 kPa), plus
 * the bleed film on the surface (kg/m2, an entry without depth, never localised); the element
 * state itself rides along in `carried`. Parameters in the order of defaultParameterSpecs:
 * permeability multiplier, exposure multiplier, curing efficiency, initial bleed film, then one
 * relative-humidity bias per RH probe.
 */
import type {
  EnsembleMember,
  ForecastModel,
  InitialMemberFactory,
  Observation,
  ObservationOperator,
  StateLayout,
} from '../calibration/index.ts';
import { cloneElementState } from '../engine/index.ts';
import type { BoundaryInputs, ElementModel, ElementState } from '../engine/index.ts';

/** Index of each element parameter in a member's parameter vector. */
export const PARAMETER_INDEX = {
  permeabilityMultiplier: 0,
  exposureMultiplier: 1,
  curingEfficiency: 2,
  initialBleedFilmKgM2: 3,
  firstBias: 4,
} as const;

/** A member of the live ensemble: the element state is carried. */
export type LiveMember = EnsembleMember<ElementState>;

/** Offset of the shifted-log state transform, Pa (calibration README, our assumption). */
export const SUCTION_OFFSET_PA = 1000;

/** Analysed state vector of an element state: suction per cell, then the bleed film. */
export function stateVector(state: ElementState): Float64Array {
  const pressures = state.transport.pressurePa;
  const vector = new Float64Array(pressures.length + 1);
  for (let i = 0; i < pressures.length; i += 1) vector[i] = -(pressures[i] as number);
  vector[pressures.length] = state.bleedFilmKgM2;
  return vector;
}

/**
 * Writes an analysed member back into its element state (in place): pressures from the suctions
 * and the bleed film (floored at 0 kg/m2) unless `updateState` is false (parameters only: the
 * state stays the member's own model run), and the element parameters. Non-finite entries keep the
 * state's value.
 */
export function applyAnalysis(member: LiveMember, updateState = true): void {
  const state = member.carried;
  const pressures = state.transport.pressurePa;
  if (updateState) {
    for (let i = 0; i < pressures.length; i += 1) {
      const suction = member.state[i] as number;
      if (Number.isFinite(suction)) pressures[i] = -suction;
    }
    const film = member.state[pressures.length] as number;
    if (Number.isFinite(film)) state.bleedFilmKgM2 = Math.max(0, film);
  }
  const parameters = member.parameters;
  const permeability = parameters[PARAMETER_INDEX.permeabilityMultiplier] as number;
  const exposure = parameters[PARAMETER_INDEX.exposureMultiplier] as number;
  const efficiency = parameters[PARAMETER_INDEX.curingEfficiency] as number;
  if (Number.isFinite(permeability) && permeability > 0) {
    state.parameters.permeabilityMultiplier = permeability;
  }
  if (Number.isFinite(exposure) && exposure > 0) state.parameters.exposureMultiplier = exposure;
  if (Number.isFinite(efficiency)) {
    state.parameters.curingEfficiency = Math.min(1, Math.max(0, efficiency));
  }
  member.state = stateVector(state);
}

/** The layout of the analysed state: cell centres (m), the bleed film without depth. */
export function stateLayout(model: ElementModel): StateLayout {
  const n = model.grid.cellCount;
  const depthM = new Float64Array(n + 1);
  depthM.set(model.grid.centresM);
  depthM[n] = Number.NaN;
  return { depthM, transform: { kind: 'shifted-log', offset: SUCTION_OFFSET_PA } };
}

/** Initial members: a saturated element at placement with the member's drawn parameters. */
export function initialMemberFactory(
  model: ElementModel,
  placementTemperatureK: number,
): InitialMemberFactory<ElementState> {
  return (_index, parameters) => {
    const carried = model.initialState(placementTemperatureK, {
      permeabilityMultiplier: parameters[PARAMETER_INDEX.permeabilityMultiplier] as number,
      exposureMultiplier: parameters[PARAMETER_INDEX.exposureMultiplier] as number,
      curingEfficiency: parameters[PARAMETER_INDEX.curingEfficiency] as number,
      initialBleedFilmKgM2: parameters[PARAMETER_INDEX.initialBleedFilmKgM2] as number,
    });
    return { state: stateVector(carried), parameters: parameters.slice(), carried };
  };
}

/**
 * The forecast step: copies the member's element state and advances the copy to `toS` (s since
 * placement) with `inputs` held over the interval. Model noise: with `exposureWalkPerSqrtH` s > 0
 * the member's exposure multiplier m first takes one step of a random walk of its logarithm,
 * `ln m += s sqrt((toS - fromS) / 3600) n`, n one standard normal draw of the ensemble's
 * generator per member (members in index order, so a replay draws the same numbers); with s = 0
 * nothing is drawn.
 */
export function forecastModel(
  model: ElementModel,
  inputs: () => BoundaryInputs,
  exposureWalkPerSqrtH = 0,
): ForecastModel<ElementState> {
  return {
    advance(member, fromS, toS, random) {
      const carried = cloneElementState(member.carried);
      const parameters = member.parameters.slice();
      if (exposureWalkPerSqrtH > 0 && toS > fromS) {
        const step = exposureWalkPerSqrtH * Math.sqrt((toS - fromS) / 3600) * random.normal();
        const exposure =
          (parameters[PARAMETER_INDEX.exposureMultiplier] as number) * Math.exp(step);
        if (Number.isFinite(exposure) && exposure > 0) {
          parameters[PARAMETER_INDEX.exposureMultiplier] = exposure;
          carried.parameters.exposureMultiplier = exposure;
        }
      }
      model.advanceTo(carried, toS, inputs());
      return { state: stateVector(carried), parameters, carried };
    },
  };
}

/** Relative humidity (fraction) of the model at a depth (m): linear between cell centres. */
export function modelRelativeHumidityAt(
  model: ElementModel,
  state: ElementState,
  depthM: number,
): number {
  const centres = model.grid.centresM;
  const n = centres.length;
  const pressures = state.transport.pressurePa;
  const rh = (i: number) =>
    model.hydraulics.relativeHumidity(i, Math.min(0, pressures[i] as number));
  if (depthM <= (centres[0] as number)) return rh(0);
  if (depthM >= (centres[n - 1] as number)) return rh(n - 1);
  let j = 1;
  while ((centres[j] as number) < depthM) j += 1;
  const weight =
    (depthM - (centres[j - 1] as number)) / ((centres[j] as number) - (centres[j - 1] as number));
  return rh(j - 1) + weight * (rh(j) - rh(j - 1));
}

/**
 * Observation operator of physics.md 8: model relative humidity at the probe's depth (Kelvin at
 * the cell's temperature, through the model's hydraulics) plus the member's bias of that probe.
 *
 * @param biasIndexById - parameter index of each probe's `rhBias:<id>`
 */
export function observationOperator(
  model: ElementModel,
  biasIndexById: ReadonlyMap<string, number>,
): ObservationOperator<ElementState> {
  return {
    predict(member, observations: readonly Observation[]) {
      model.applyState(member.carried);
      return Float64Array.from(observations, (observation) => {
        const index = biasIndexById.get(observation.id);
        const bias = index === undefined ? 0 : (member.parameters[index] as number);
        return modelRelativeHumidityAt(model, member.carried, observation.depthM) + bias;
      });
    },
  };
}
