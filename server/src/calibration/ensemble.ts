/**
 * The ensemble a calibration carries: members (model state vector, parameter vector and
 * whatever else the model needs carried along), one seeded generator, the event time, and the
 * interfaces the model supplies. Nothing here knows the physics.
 */
import {
  createEnsembleRandom,
  type EnsembleRandom,
  type EnsembleRandomSnapshot,
  restoreEnsembleRandom,
} from './ensembleRandom.ts';
import { drawInitialParameters, type ParameterSpec } from './parameterPrior.ts';

/**
 * One member. `state` is the part of the model state the analysis updates (e.g. the pore
 * pressure of each cell in an unbounded form), `parameters` the physical values of the
 * estimated parameters in the order of their {@link ParameterSpec}s, and `carried` anything the
 * model keeps per member that the analysis leaves untouched (ledgers, equivalent age, ...).
 */
export interface EnsembleMember<C = null> {
  state: Float64Array;
  parameters: Float64Array;
  carried: C;
}

/** Everything needed to continue a calibration. */
export interface Ensemble<C = null> {
  members: EnsembleMember<C>[];
  random: EnsembleRandom;
  /** Event time the members have reached, s (the model's own clock, e.g. since placement). */
  timeS: number;
  /** Number of analyses done so far. */
  analysisCount: number;
}

/** Supplied by the model: advances one member over [fromS, toS]. */
export interface ForecastModel<C = null> {
  /**
   * Returns the member at `toS` as a new object, leaving the member it was given (and its
   * arrays) unchanged: the ensemble smoother re-runs a window from the same start, snapshots and
   * the outlook keep earlier members. Any model noise must be drawn from `random`, which is
   * shared by all members in index order, so runs are repeatable.
   */
  advance(
    member: EnsembleMember<C>,
    fromS: number,
    toS: number,
    random: EnsembleRandom,
  ): EnsembleMember<C>;
}

/** Supplied by the model: builds member i's initial state from its drawn parameters. */
export type InitialMemberFactory<C = null> = (
  memberIndex: number,
  parameters: Float64Array,
  random: EnsembleRandom,
) => EnsembleMember<C>;

/**
 * Creates an ensemble: a generator from `seed`, parameters drawn from the priors
 * ({@link drawInitialParameters}, all members first), then each member's initial state from the
 * model, in index order.
 *
 * @param memberCount - number of members (default 32 per issue 6; >= 2 for a spread).
 * @param timeS - event time of the initial state, s.
 */
export function createEnsemble<C>(options: {
  seed: number;
  specs: readonly ParameterSpec[];
  memberCount?: number;
  timeS: number;
  initialMember: InitialMemberFactory<C>;
}): Ensemble<C> {
  const random = createEnsembleRandom(options.seed);
  const parameters = drawInitialParameters(options.specs, options.memberCount ?? 32, random);
  const members = parameters.map((values, i) => options.initialMember(i, values, random));
  return { members, random, timeS: options.timeS, analysisCount: 0 };
}

/**
 * Advances every member from the ensemble's time to `toS`, in index order. `toS` before the
 * ensemble's time, or NaN, leaves it unchanged (event time never runs backwards).
 */
export function forecastEnsemble<C>(
  ensemble: Ensemble<C>,
  model: ForecastModel<C>,
  toS: number,
): Ensemble<C> {
  if (!(toS > ensemble.timeS)) return ensemble;
  const members = ensemble.members.map((member) =>
    model.advance(member, ensemble.timeS, toS, ensemble.random),
  );
  return { ...ensemble, members, timeS: toS };
}

/** JSON form of an ensemble. Non-finite numbers are written as null and read back as NaN. */
export interface EnsembleSnapshot {
  version: 1;
  timeS: number;
  analysisCount: number;
  random: EnsembleRandomSnapshot;
  members: { state: (number | null)[]; parameters: (number | null)[]; carried: unknown }[];
}

/**
 * Writes a snapshot. Restoring it with {@link restoreEnsemble} and continuing gives exactly the
 * numbers of an uninterrupted run (JSON keeps every finite double exactly; -0 becomes 0).
 *
 * @param carriedToJson - turns a member's carried data into JSON (default: as is).
 */
export function snapshotEnsemble<C>(
  ensemble: Ensemble<C>,
  carriedToJson: (carried: C) => unknown = (carried) => carried,
): EnsembleSnapshot {
  return {
    version: 1,
    timeS: ensemble.timeS,
    analysisCount: ensemble.analysisCount,
    random: ensemble.random.snapshot(),
    members: ensemble.members.map((member) => ({
      state: Array.from(member.state, finiteOrNull),
      parameters: Array.from(member.parameters, finiteOrNull),
      carried: carriedToJson(member.carried),
    })),
  };
}

/**
 * Restores an ensemble written by {@link snapshotEnsemble}.
 *
 * @param carriedFromJson - inverse of the writer's `carriedToJson` (default: cast as is).
 * @throws Error when the snapshot's version or generator state is not understood.
 */
export function restoreEnsemble<C>(
  snapshot: EnsembleSnapshot,
  carriedFromJson: (json: unknown) => C = (json) => json as C,
): Ensemble<C> {
  if (snapshot.version !== 1) {
    throw new Error(`ensemble snapshot version must be 1: got ${JSON.stringify(snapshot.version)}`);
  }
  return {
    timeS: snapshot.timeS,
    analysisCount: snapshot.analysisCount,
    random: restoreEnsembleRandom(snapshot.random),
    members: snapshot.members.map((member) => ({
      state: Float64Array.from(member.state, nullToNaN),
      parameters: Float64Array.from(member.parameters, nullToNaN),
      carried: carriedFromJson(member.carried),
    })),
  };
}

function finiteOrNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

function nullToNaN(value: number | null): number {
  return value ?? Number.NaN;
}
