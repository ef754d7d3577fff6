/**
 * Adaptive time stepping for the moisture transport: grows the step while the Picard iteration
 * converges easily, shortens it and retries when it fails, and lands exactly on the requested
 * event time (the readings' own timestamps drive the model, architecture.md "Event time").
 */
import type { DepthGrid } from './grid.ts';
import type { CellHydraulics } from './hydraulics.ts';
import {
  implicitStep,
  type ImplicitStepOptions,
  type StepResult,
  type StepWorkspace,
  type SurfaceCondition,
} from './implicitStep.ts';

/** Step-size controls. Every default is our assumption, tuned on the tests in test/engine. */
export interface StepControlOptions extends ImplicitStepOptions {
  /** Shortest step before the run is declared failed, s; default 1e-3. */
  minStepS?: number;
  /** Longest step, s; default 900 (15 min). */
  maxStepS?: number;
  /** Step growth after an easy step (<= `easyIterations`); default 1.5. */
  growthFactor?: number;
  /** Iterations at or below which a step counts as easy; default 10 (Newton converges in 3 to 8 iterations on easy steps; Picard needs 15 to 20 at dry surfaces whatever the step, so raise it when using Picard). */
  easyIterations?: number;
  /** Picard iterations allowed when a Newton step fails, before the step is cut; default 60. */
  picardFallbackIterations?: number;
  /** Step reduction after a failed step; default 0.3. */
  cutFactor?: number;
  /**
   * Longest step as a fraction of the time elapsed since `timeOriginS`; default Infinity (no
   * limit). Diffusion from a sudden boundary change needs short steps early: a fraction of
   * about 0.005 keeps backward Euler within 0.5 % of the plane-sheet series (test/engine).
   */
  maxStepFractionOfElapsed?: number;
  /** Origin of the elapsed time for `maxStepFractionOfElapsed`, s; default 0. */
  timeOriginS?: number;
}

/**
 * A caller's own limits on the steps, besides convergence (the element model's bleed film: a step
 * that holds the surface saturated may not draw more water than the film holds).
 */
export interface StepCheck {
  /**
   * Longest step the caller allows from the current state, s; asked before each new step
   * (not before a retry). Infinity: no limit. A step shortened by it keeps the controller's plan.
   */
  longestStepS(timeS: number): number;
  /**
   * After a converged trial of `stepS` seconds: Infinity accepts it; a finite length, s, refuses
   * it and asks for a retry of that length from the same state (with the surface condition asked
   * for again; longer than `stepS` too, but not past the target). A refusal does not count as a
   * convergence failure, and the retry may be shorter than `minStepS`, which bounds only the cuts
   * after failed convergence.
   */
  retryStepS(stepS: number, result: StepResult): number;
}

/** A caller's hooks into {@link advanceTransport}; each is optional. */
export interface TransportHooks {
  /**
   * After every accepted step, with the step length, before the next one is tried (the element
   * model updates hydration and pore refinement there).
   */
  onStep?: (stepS: number, result: StepResult) => void;
  /** The caller's own limits on the steps ({@link StepCheck}). */
  check?: StepCheck;
  /**
   * The water content theta (m3/m3) each cell holds, read and written: on entry, that of the
   * state's pressures on the curves they were solved on; each step's balance counts from it and
   * an accepted step writes its own. The curves may then change between steps (`onStep`:
   * refinement) or before the first (temperature) without moving the pressures to keep the water:
   * the next step's Newton iteration finds the pressure that holds it. Absent: each step counts
   * from the water of the old pressures on the current curves.
   */
  heldWater?: Float64Array;
}

/** The transport part of an element's state: plain numbers and typed arrays only. */
export interface TransportState {
  /** Model time, s since placement. */
  timeS: number;
  /** Liquid pressure per cell, Pa. */
  pressurePa: Float64Array;
  /** Step the controller will try next, s. */
  nextStepS: number;
  /** Water that entered through the surface since placement, m (negative: net drying). */
  surfaceInflowM: number;
  /** Water released by the storage term since placement, m (physics.md section 3 asks for it). */
  storageWaterM: number;
  /** Sum of the absolute per-step mass defects, m. */
  massDefectM: number;
  acceptedSteps: number;
  rejectedSteps: number;
}

/** Raised when a step fails even at the shortest allowed step: the run cannot continue. */
export class EngineConvergenceError extends Error {
  readonly timeS: number;
  constructor(timeS: number, stepS: number) {
    super(
      `moisture transport did not converge at model time ${(timeS / 3600).toFixed(4)} h ` +
        `even with a step of ${stepS} s`,
    );
    this.name = 'EngineConvergenceError';
    this.timeS = timeS;
  }
}

/**
 * Advances `state` in place to `targetTimeS` in adaptive backward-Euler steps. The surface
 * condition of each step is asked for at the step's end time (backward Euler). `hooks.onStep`
 * runs after every accepted step ({@link TransportHooks}).
 *
 * `hooks.check`, when given, may shorten a step before it is tried and refuse a converged trial
 * with a shorter retry ({@link StepCheck}); the surface condition is asked for again for the retry.
 *
 * Throws {@link EngineConvergenceError} only when a step fails at `minStepS`. A target at or
 * before the current time does nothing.
 */
export function advanceTransport(
  grid: DepthGrid,
  hydraulics: CellHydraulics,
  workspace: StepWorkspace,
  state: TransportState,
  targetTimeS: number,
  surfaceAt: (timeS: number) => SurfaceCondition,
  options: StepControlOptions = {},
  hooks: TransportHooks = {},
): void {
  const { onStep, check, heldWater } = hooks;
  const minStepS = options.minStepS ?? 1e-3;
  const maxStepS = options.maxStepS ?? 900;
  const growthFactor = options.growthFactor ?? 1.5;
  const easyIterations = options.easyIterations ?? 10;
  const cutFactor = options.cutFactor ?? 0.3;
  const picardFallbackIterations = options.picardFallbackIterations ?? 60;
  const elapsedFraction = options.maxStepFractionOfElapsed ?? Number.POSITIVE_INFINITY;
  const timeOriginS = options.timeOriginS ?? 0;
  const next = workspace.trialPressurePa; // no allocation per call (one per interval)
  // A retry the check asked for (NaN: none): same start, shorter step.
  let retryS = Number.NaN;
  let picardOptions: ImplicitStepOptions | null = null; // built on the first Newton failure
  /** One trial step from the state's pressures into `next`. */
  const attempt = (stepS: number, surface: SurfaceCondition, stepOptions: ImplicitStepOptions) =>
    implicitStep(
      grid,
      hydraulics,
      workspace,
      state.pressurePa,
      next,
      stepS,
      surface,
      stepOptions,
      heldWater,
    );
  while (state.timeS < targetTimeS) {
    const remaining = targetTimeS - state.timeS;
    const elapsedLimitS = Number.isFinite(elapsedFraction)
      ? Math.max(minStepS, elapsedFraction * (state.timeS - timeOriginS))
      : Number.POSITIVE_INFINITY;
    const plannedS = Math.min(state.nextStepS, maxStepS, elapsedLimitS);
    let stepS: number;
    if (retryS > 0) {
      stepS = Math.min(retryS, remaining);
    } else {
      const limitedS = Math.min(plannedS, check?.longestStepS(state.timeS) ?? plannedS);
      // Avoid leaving a sliver shorter than a tenth of a step before the target.
      stepS = limitedS >= remaining || remaining - limitedS < 0.1 * limitedS ? remaining : limitedS;
    }
    retryS = Number.NaN;
    const endS = state.timeS + stepS;
    const surface = surfaceAt(endS);
    let result = attempt(stepS, surface, options);
    if (!result.converged && (options.linearisation ?? 'newton') === 'newton') {
      // Newton can cycle where the curves have kinks (air entry, fully drained pores); the
      // Picard iteration is slower but monotone there, so it gets one try before the step is cut.
      picardOptions ??= {
        ...options,
        linearisation: 'picard',
        maxIterations: picardFallbackIterations,
      };
      result = attempt(stepS, surface, picardOptions);
    }
    if (!result.converged) {
      state.rejectedSteps += 1;
      state.nextStepS = stepS * cutFactor;
      if (!(state.nextStepS >= minStepS)) throw new EngineConvergenceError(state.timeS, stepS);
      continue;
    }
    if (check !== undefined) {
      const askedS = check.retryStepS(stepS, result);
      if (askedS !== Number.POSITIVE_INFINITY) {
        // Not a convergence failure: the plan stays, only this step is tried again.
        if (!(askedS > 0)) throw new RangeError(`step check asked for a retry of ${askedS} s`);
        retryS = askedS;
        continue;
      }
    }
    state.pressurePa.set(next);
    heldWater?.set(workspace.water);
    state.timeS = stepS === remaining ? targetTimeS : endS;
    state.surfaceInflowM += result.surfaceInflowM;
    state.storageWaterM += result.storageWaterM;
    state.massDefectM += Math.abs(result.massDefectM);
    state.acceptedSteps += 1;
    // A step shortened only to land on the target keeps the controller's plan.
    if (stepS >= plannedS) {
      const proposed = result.iterations <= easyIterations ? stepS * growthFactor : stepS;
      state.nextStepS = Math.max(minStepS, Math.min(proposed, maxStepS));
    }
    onStep?.(stepS, result);
  }
}
