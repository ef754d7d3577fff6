/**
 * The state of one element's drying model: plain numbers and typed arrays, so a member of an
 * ensemble is copied with {@link cloneElementState} in microseconds and a snapshot for restart
 * is a small JSON object ({@link serialiseElementState}, versioned). The state also carries the
 * stress-free reference of the drying stress (stressReference.ts): the equivalent pore pressure
 * profile recorded at the element's final set (stressReference.ts).
 */
import type { TransportState } from './stepController.ts';

/**
 * Version of the snapshot layout written by {@link serialiseElementState}: 2 adds the stress
 * reference (version 1 snapshots are still read, see {@link deserialiseElementState}).
 */
export const ELEMENT_STATE_VERSION = 2;

/** Snapshot versions {@link deserialiseElementState} reads. */
export const READABLE_ELEMENT_STATE_VERSIONS: readonly number[] = [1, 2];

/**
 * Uncertain parameters a state carries, so the members of an ensemble can differ in them while
 * sharing one model (physics.md section 8).
 */
export interface ElementParameters {
  /** Multiplier on permeability (the calibration adjusts its logarithm). */
  permeabilityMultiplier: number;
  /** Multiplier on the evaporation estimate (exposure). */
  exposureMultiplier: number;
  /** Efficiency of every active curing compound, 0..1; null: each measure's own (or the default). */
  curingEfficiency: number | null;
}

/** Everything that evolves in time; the configuration lives in the model, not here. */
export interface ElementState {
  /** Moisture transport: time (s since placement), pressures, ledger, step control. */
  transport: TransportState;
  /** Equivalent age at 20 degC of each cell, s (ASTM C1074). */
  equivalentAgeS: Float64Array;
  /** Temperature of each cell at the last boundary inputs, K. */
  temperatureK: Float64Array;
  /** Pore-diameter factor applied in each cell (refinement), (0, 1]. */
  diameterScale: Float64Array;
  /** Specific storage applied in each cell, 1/Pa (physics.md section 3). */
  specificStoragePerPa: Float64Array;
  /** Bleed-water film on the surface, kg/m2. */
  bleedFilmKgM2: number;
  /** Water bled to the surface since placement, kg/m2. */
  bledKgM2: number;
  /** Water evaporated from the surface (film and pores) since placement, kg/m2. */
  evaporatedKgM2: number;
  /** Water taken up from a wet covering or ponding since placement, kg/m2. */
  coveringUptakeKgM2: number;
  /** Evaporation rate over the last accepted step, kg/(m2 s). */
  lastEvaporationKgM2s: number;
  /** Potential (wet-surface) evaporation rate over the last step, kg/(m2 s). */
  lastPotentialEvaporationKgM2s: number;
  /** This state's uncertain parameters. */
  parameters: ElementParameters;
  /**
   * Equivalent pore pressure of each cell at the stress-free reference, the element's final set
   * (stressReference.ts), Pa; null until the element has set. A material without a mix records
   * the placement profile (zeros) at time 0.
   */
  stressReferencePa: Float64Array | null;
  /**
   * When `stressReferencePa` was recorded, s since placement; NaN while it is null, and when the
   * moment is unknown (a version 1 snapshot restored after final set: the reference is then the
   * placement profile, zeros, so that run's figures continue as they were computed).
   */
  stressReferenceTimeS: number;
}

/** JSON form of an {@link ElementState}. */
export interface ElementStateSnapshot {
  version: number;
  transport: Omit<TransportState, 'pressurePa'> & { pressurePa: number[] };
  equivalentAgeS: number[];
  temperatureK: number[];
  diameterScale: number[];
  specificStoragePerPa: number[];
  bleedFilmKgM2: number;
  bledKgM2: number;
  evaporatedKgM2: number;
  coveringUptakeKgM2: number;
  lastEvaporationKgM2s: number;
  lastPotentialEvaporationKgM2s: number;
  parameters: ElementParameters;
  /** Absent in version 1; null until final set. */
  stressReferencePa?: number[] | null;
  /** Absent in version 1; null stands for NaN (JSON has no NaN). */
  stressReferenceTimeS?: number | null;
}

/** Deep copy: new typed arrays, same numbers. */
export function cloneElementState(state: ElementState): ElementState {
  return {
    ...state,
    transport: { ...state.transport, pressurePa: state.transport.pressurePa.slice() },
    equivalentAgeS: state.equivalentAgeS.slice(),
    temperatureK: state.temperatureK.slice(),
    diameterScale: state.diameterScale.slice(),
    specificStoragePerPa: state.specificStoragePerPa.slice(),
    parameters: { ...state.parameters },
    stressReferencePa: state.stressReferencePa === null ? null : state.stressReferencePa.slice(),
  };
}

/** JSON-ready snapshot (numbers and arrays of numbers only), tagged with the layout version. */
export function serialiseElementState(state: ElementState): ElementStateSnapshot {
  return {
    ...state,
    version: ELEMENT_STATE_VERSION,
    transport: { ...state.transport, pressurePa: Array.from(state.transport.pressurePa) },
    equivalentAgeS: Array.from(state.equivalentAgeS),
    temperatureK: Array.from(state.temperatureK),
    diameterScale: Array.from(state.diameterScale),
    specificStoragePerPa: Array.from(state.specificStoragePerPa),
    parameters: { ...state.parameters },
    stressReferencePa:
      state.stressReferencePa === null ? null : Array.from(state.stressReferencePa),
    stressReferenceTimeS: Number.isNaN(state.stressReferenceTimeS)
      ? null
      : state.stressReferenceTimeS,
  };
}

/** Raised when a snapshot has another version or the wrong shape. */
export class SnapshotError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SnapshotError';
  }
}

/**
 * Restores a state from {@link serialiseElementState} output, of version 2 or 1. A version 1
 * snapshot has no stress reference: it is restored as not recorded (null, time NaN); if the
 * surface had already set, the model then takes the placement profile (zeros) as the reference,
 * time unknown (NaN), so a run resumed across the upgrade keeps computing the figures it
 * computed before. Throws {@link SnapshotError} when the version is not readable or the arrays
 * do not match `cellCount`.
 */
export function deserialiseElementState(
  snapshot: ElementStateSnapshot,
  cellCount: number,
): ElementState {
  if (!READABLE_ELEMENT_STATE_VERSIONS.includes(snapshot.version)) {
    throw new SnapshotError(
      `snapshot version must be ${READABLE_ELEMENT_STATE_VERSIONS.join(' or ')}: got ${String(snapshot.version)}`,
    );
  }
  const reference = snapshot.version === 1 ? null : (snapshot.stressReferencePa ?? null);
  for (const [field, values] of [
    ['transport.pressurePa', snapshot.transport.pressurePa],
    ['equivalentAgeS', snapshot.equivalentAgeS],
    ['temperatureK', snapshot.temperatureK],
    ['diameterScale', snapshot.diameterScale],
    ['specificStoragePerPa', snapshot.specificStoragePerPa],
    ...(reference === null ? [] : [['stressReferencePa', reference] as const]),
  ] as const) {
    if (values.length !== cellCount) {
      throw new SnapshotError(
        `snapshot ${field} must have ${cellCount} values: got ${values.length}`,
      );
    }
  }
  return {
    bleedFilmKgM2: snapshot.bleedFilmKgM2,
    bledKgM2: snapshot.bledKgM2,
    evaporatedKgM2: snapshot.evaporatedKgM2,
    coveringUptakeKgM2: snapshot.coveringUptakeKgM2,
    lastEvaporationKgM2s: snapshot.lastEvaporationKgM2s,
    lastPotentialEvaporationKgM2s: snapshot.lastPotentialEvaporationKgM2s,
    parameters: { ...snapshot.parameters },
    transport: {
      ...snapshot.transport,
      pressurePa: Float64Array.from(snapshot.transport.pressurePa),
    },
    equivalentAgeS: Float64Array.from(snapshot.equivalentAgeS),
    temperatureK: Float64Array.from(snapshot.temperatureK),
    diameterScale: Float64Array.from(snapshot.diameterScale),
    specificStoragePerPa: Float64Array.from(snapshot.specificStoragePerPa),
    stressReferencePa: reference === null ? null : Float64Array.from(reference),
    stressReferenceTimeS:
      reference === null ? Number.NaN : (snapshot.stressReferenceTimeS ?? Number.NaN),
  };
}
