/**
 * The step check that holds a step under a bleed film to the water the film and the bleeding
 * hold (physics.md section 4: the film, not the body, is saturated; the body can only take the
 * film's water). The element model's film-mode step holds the surface at 0 Pa; a converged trial
 * that drew more than the film holds is retried shorter, sized by a power law of the film water
 * used against step length (_filmStepSize.ts), so the film runs out within FILM_TOLERANCE of the
 * step's end. A film below FILM_FLOOR_KG_M2 is ended (counted as evaporated) and the surface is
 * exposed; so is a surface whose body draws in more than the bleeding brings.
 */
import type { ElementState } from './elementState.ts';
import type { StepCheck } from './stepController.ts';
import { nextFilmTrialS, type FilmTrial } from './_filmStepSize.ts';

/**
 * Film below which the rest of a bleed film is counted as evaporated and the surface is exposed,
 * kg/m2 (our assumption: a nanometre of water, far below any figure the tool shows; it keeps a
 * vanishing film from asking for ever shorter steps).
 */
export const FILM_FLOOR_KG_M2 = 1e-9;
/**
 * A film step that runs the film out may use up to this fraction more or less than the film
 * (our assumption): more only as evaporation the step could not have (the film ran out just
 * before the end), never as water drawn into the body.
 */
const FILM_TOLERANCE = 0.1;
/** Most retries of one film step before its film is ended (our assumption). */
const FILM_MAX_TRIALS = 40;
/**
 * Shortest film step as a fraction of the model time (at least 1 s), below which the film is
 * ended: about 4500 times the rounding of a double, so the step still moves the time.
 */
const FILM_SHORTEST_STEP_FRACTION = 1e-12;

/** What the check reads of the step being tried, from the element model. */
export interface FilmStepContext {
  /** True while the surface is in film mode (the model's surfaceAt decided it). */
  inFilmMode(): boolean;
  /** The state being advanced. */
  state(): ElementState;
  /** Wet-surface evaporation of the interval, kg/(m2 s). */
  potentialKgM2s(): number;
  /** Bleed rate of the step, kg/(m2 s). */
  bleedRateKgM2s(): number;
  liquidDensityKgPerM3: number;
}

/** The step check of the film, with what the model's surface condition needs to know of it. */
export interface FilmStepCheck extends StepCheck {
  /**
   * True when the step starting at `timeS` must be exposed although bleeding outpaces
   * evaporation or a film was left: the body draws in more than the bleeding brings, or the
   * film was ended.
   */
  forcedExposedAt(timeS: number): boolean;
  /** Forgets the search: a new interval, maybe of another state (members share one model). */
  reset(): void;
}

/** The film step check of one element model (its search state is per model, reset per interval). */
export function createFilmStepCheck(context: FilmStepContext): FilmStepCheck {
  // Start time of a step that must be exposed (NaN: none).
  let exposedFromS = Number.NaN;
  // The search for a film step that uses no more water than the film holds (physics.md
  // section 4: the film, not the body, is saturated; the body can only take the film's water).
  // A trial whose film water `need` (inflow, plus evaporation, less bleeding) exceeds the film by
  // more than FILM_TOLERANCE, or whose inflow alone exceeds film plus bleeding, is retried
  // shorter; a retry is accepted once the film runs out within FILM_TOLERANCE of its end.
  let searchFromS = Number.NaN;
  const shortTrial: FilmTrial = { stepS: 0, needKgM2: 0 };
  const longTrial: FilmTrial = { stepS: 0, needKgM2: 0 };
  const longTrialBefore: FilmTrial = { stepS: 0, needKgM2: 0 };
  let longTrials = 0;
  let searchTrials = 0;
  let exponentOfSearch = Number.NaN;
  // The next step's length after a searched step that left some film: the same absorption,
  // continued until the rest is used (NaN: no guess).
  let guessFromS = Number.NaN;
  let guessS = Number.NaN;
  const endFilm = (state: ElementState): void => {
    // What is left is too little to resolve: counted as evaporated, and the surface is exposed.
    state.evaporatedKgM2 += state.bleedFilmKgM2;
    state.bleedFilmKgM2 = 0;
    exposedFromS = state.transport.timeS;
  };
  const check: StepCheck = {
    longestStepS: (timeS) => (timeS === guessFromS ? guessS : Number.POSITIVE_INFINITY),
    retryStepS: (stepS, result) => {
      if (!context.inFilmMode()) return Number.POSITIVE_INFINITY;
      const state = context.state();
      const timeS = state.transport.timeS;
      const filmKgM2 = state.bleedFilmKgM2;
      const inflowKgM2 = result.surfaceInflowM * context.liquidDensityKgPerM3;
      const bledKgM2 = context.bleedRateKgM2s() * stepS;
      const needKgM2 = inflowKgM2 + context.potentialKgM2s() * stepS - bledKgM2;
      const overdrawn = inflowKgM2 > filmKgM2 + bledKgM2;
      if (filmKgM2 <= FILM_FLOOR_KG_M2) {
        // Film mode only because bleeding outpaces evaporation: a body that draws in more than
        // the bleeding brings takes it through an exposed surface instead.
        if (!overdrawn) return Number.POSITIVE_INFINITY;
        exposedFromS = timeS;
        return stepS;
      }
      if (timeS !== searchFromS) {
        searchFromS = timeS;
        shortTrial.stepS = 0;
        shortTrial.needKgM2 = 0;
        longTrials = 0;
        searchTrials = 0;
      }
      const tooLong = overdrawn || needKgM2 > (1 + FILM_TOLERANCE) * filmKgM2;
      const searching = searchTrials > 0;
      if (!tooLong && (!searching || needKgM2 >= (1 - FILM_TOLERANCE) * filmKgM2)) {
        if (searching || timeS === guessFromS) rememberGuess(timeS, stepS, needKgM2, filmKgM2);
        return Number.POSITIVE_INFINITY;
      }
      searchTrials += 1;
      if (tooLong) {
        if (longTrials > 0) {
          longTrialBefore.stepS = longTrial.stepS;
          longTrialBefore.needKgM2 = longTrial.needKgM2;
        }
        longTrial.stepS = stepS;
        longTrial.needKgM2 = needKgM2;
        longTrials += 1;
      } else {
        shortTrial.stepS = stepS;
        shortTrial.needKgM2 = needKgM2;
      }
      const targetKgM2 = (1 - 0.5 * FILM_TOLERANCE) * filmKgM2;
      const retryS = nextFilmTrialS(
        shortTrial,
        longTrial,
        longTrials > 1 ? longTrialBefore : null,
        targetKgM2,
      );
      exponentOfSearch =
        shortTrial.stepS > 0 && shortTrial.needKgM2 > 0
          ? Math.log(longTrial.needKgM2 / shortTrial.needKgM2) /
            Math.log(longTrial.stepS / shortTrial.stepS)
          : Number.NaN;
      // A film that the body takes faster than model time can resolve, or a search that does
      // not close, must not stall the run.
      if (
        searchTrials > FILM_MAX_TRIALS ||
        !(retryS > FILM_SHORTEST_STEP_FRACTION * Math.max(1, timeS))
      ) {
        if (!tooLong) return Number.POSITIVE_INFINITY;
        endFilm(state);
        return stepS;
      }
      return retryS;
    },
  };
  // What the last guess aimed to use, kg/m2, and a factor learnt from how far the guesses fell
  // short or over (the absorption slows down as the surface wets, which the power law misses).
  let guessNeedKgM2 = Number.NaN;
  let guessCorrection = 1;
  const rememberGuess = (
    timeS: number,
    stepS: number,
    needKgM2: number,
    filmKgM2: number,
  ): void => {
    const exponent = Math.min(2, Math.max(0.25, exponentOfSearch || 0.75));
    const guided = timeS === guessFromS && stepS === guessS;
    guessCorrection = guided
      ? Math.min(5, Math.max(0.2, guessCorrection * (guessNeedKgM2 / needKgM2) ** (1 / exponent)))
      : 1;
    const restKgM2 = filmKgM2 - needKgM2;
    guessFromS = Number.NaN;
    if (!(restKgM2 > FILM_FLOOR_KG_M2) || !(needKgM2 > 0) || !(guessCorrection > 0)) return;
    guessFromS = timeS + stepS;
    guessNeedKgM2 = (1 - 0.5 * FILM_TOLERANCE) * restKgM2;
    guessS = stepS * ((1 + guessNeedKgM2 / needKgM2) ** (1 / exponent) - 1) * guessCorrection;
  };
  return {
    longestStepS: check.longestStepS,
    retryStepS: check.retryStepS,
    forcedExposedAt: (timeS) => timeS === exposedFromS,
    reset() {
      searchFromS = Number.NaN;
      guessFromS = Number.NaN;
      exposedFromS = Number.NaN;
    },
  };
}
