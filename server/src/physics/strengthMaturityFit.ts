/**
 * Fit of a project's own strength-maturity data (lab specimens broken at known equivalent ages),
 * ASTM C1074 Appendix: the hyperbolic relation `S = Su k (te - t0) / (1 + k (te - t0))`
 * (Carino 1984) by least squares, and the logarithmic relation `S = a + b ln(te)`.
 *
 * Units: equivalent ages in days at 20 degC, strengths in MPa.
 */
import { levenbergMarquardt } from './_levenbergMarquardt.ts';
import {
  ageForHyperbolicStrengthDays,
  hyperbolicStrengthMPa,
  type HyperbolicStrengthParameters,
} from './strengthDevelopment.ts';

/** One specimen result (or the mean of a set broken together). */
export interface StrengthMaturityPoint {
  /** Equivalent age at 20 degC when the specimen was broken, days (> 0). */
  readonly equivalentAgeDays: number;
  /** Compressive strength, MPa (> 0). */
  readonly strengthMPa: number;
}

/** Raised for data that cannot be fitted; names the field, the rule and the value received. */
export class StrengthMaturityDataError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'StrengthMaturityDataError';
  }
}

/** Options of {@link fitHyperbolicStrengthMaturity}. */
export interface HyperbolicFitOptions {
  /**
   * A known datum age t0 (days), e.g. final set from ASTM C403 converted to equivalent age.
   * Default: undefined, t0 is fitted with Su and k (ASTM C1074 Appendix, Carino 1984).
   */
  readonly datumAgeDays?: number;
}

/** Result of a strength-maturity fit. */
export interface StrengthMaturityFit<Parameters> {
  readonly parameters: Parameters;
  /** Observed minus predicted strength for each point, in input order, MPa. */
  readonly residualsMPa: number[];
  /** Root mean square of the residuals, MPa. */
  readonly rmseMPa: number;
  /** Coefficient of determination 1 - SSres / SStot (NaN when all strengths are equal). */
  readonly rSquared: number;
  /** Predicted strength at an equivalent age (days), MPa. */
  predictStrengthMPa(equivalentAgeDays: number): number;
  /** Equivalent age at which the fitted relation reaches a strength, days (Infinity if never). */
  ageForStrengthDays(targetMPa: number): number;
}

/** Solver report of the hyperbolic fit. */
export interface HyperbolicFitReport {
  readonly iterations: number;
  readonly converged: boolean;
}

function checkPoints(points: readonly StrengthMaturityPoint[], minimum: number): void {
  if (points.length < minimum) {
    throw new StrengthMaturityDataError(
      `strength-maturity data must hold at least ${minimum} points: got ${points.length}`,
    );
  }
  points.forEach((point, index) => {
    if (!(point.equivalentAgeDays > 0 && Number.isFinite(point.equivalentAgeDays))) {
      throw new StrengthMaturityDataError(
        `point ${index} equivalentAgeDays must be a finite number above 0: got ${point.equivalentAgeDays}`,
      );
    }
    if (!(point.strengthMPa > 0 && Number.isFinite(point.strengthMPa))) {
      throw new StrengthMaturityDataError(
        `point ${index} strengthMPa must be a finite number above 0: got ${point.strengthMPa}`,
      );
    }
  });
  const distinctAges = new Set(points.map((point) => point.equivalentAgeDays)).size;
  if (distinctAges < minimum) {
    throw new StrengthMaturityDataError(
      `strength-maturity data must hold at least ${minimum} distinct ages: got ${distinctAges}`,
    );
  }
}

function summarise<P>(
  points: readonly StrengthMaturityPoint[],
  parameters: P,
  predict: (ageDays: number) => number,
  inverse: (targetMPa: number) => number,
): StrengthMaturityFit<P> {
  const residualsMPa = points.map((point) => point.strengthMPa - predict(point.equivalentAgeDays));
  const sse = residualsMPa.reduce((sum, r) => sum + r * r, 0);
  const mean = points.reduce((sum, point) => sum + point.strengthMPa, 0) / points.length;
  const sst = points.reduce((sum, point) => sum + (point.strengthMPa - mean) ** 2, 0);
  return {
    parameters,
    residualsMPa,
    rmseMPa: Math.sqrt(sse / points.length),
    rSquared: sst > 0 ? 1 - sse / sst : Number.NaN,
    predictStrengthMPa: predict,
    ageForStrengthDays: inverse,
  };
}

/** Straight-line least squares y = intercept + slope x. */
function lineFit(
  xs: readonly number[],
  ys: readonly number[],
): { intercept: number; slope: number } {
  const n = xs.length;
  const meanX = xs.reduce((s, x) => s + x, 0) / n;
  const meanY = ys.reduce((s, y) => s + y, 0) / n;
  let sxy = 0;
  let sxx = 0;
  xs.forEach((x, i) => {
    sxy += (x - meanX) * ((ys[i] ?? 0) - meanY);
    sxx += (x - meanX) ** 2;
  });
  const slope = sxy / sxx;
  return { intercept: meanY - slope * meanX, slope };
}

/**
 * Starting values: for trial datum ages t0 between 0 and the youngest age, the linearised form
 * `1/S = 1/Su + (1/(Su k)) / (te - t0)` (ASTM C1074 Appendix; Carino 1984) is a straight line;
 * keep the trial with the smallest squared error in strength.
 */
function startingValues(
  points: readonly StrengthMaturityPoint[],
  fixedDatumAgeDays: number | undefined,
): HyperbolicStrengthParameters {
  const youngest = Math.min(...points.map((point) => point.equivalentAgeDays));
  const trials =
    fixedDatumAgeDays === undefined
      ? Array.from({ length: 20 }, (_, i) => (youngest * i) / 20)
      : [fixedDatumAgeDays];
  let best: HyperbolicStrengthParameters = {
    limitingStrengthMPa: 1.2 * Math.max(...points.map((point) => point.strengthMPa)),
    rateConstantPerDay: 1 / youngest,
    datumAgeDays: fixedDatumAgeDays ?? 0,
  };
  let bestError = Number.POSITIVE_INFINITY;
  for (const datumAgeDays of trials) {
    const { intercept, slope } = lineFit(
      points.map((point) => 1 / (point.equivalentAgeDays - datumAgeDays)),
      points.map((point) => 1 / point.strengthMPa),
    );
    if (!(intercept > 0 && slope > 0)) continue;
    const candidate = {
      limitingStrengthMPa: 1 / intercept,
      rateConstantPerDay: intercept / slope,
      datumAgeDays,
    };
    const error = points.reduce(
      (sum, point) =>
        sum + (point.strengthMPa - hyperbolicStrengthMPa(point.equivalentAgeDays, candidate)) ** 2,
      0,
    );
    if (error < bestError) {
      bestError = error;
      best = candidate;
    }
  }
  return best;
}

/**
 * Least-squares fit of the hyperbolic strength-maturity relation to a project's own data, by
 * Levenberg-Marquardt on (ln Su, ln k, t0) so that Su and k stay positive; t0 is kept below the
 * youngest age (a step past it is rejected). Started from the linearised fit.
 *
 * @param points at least 3 points with distinct ages (2 when `datumAgeDays` is given)
 * @param options see {@link HyperbolicFitOptions}
 * @returns parameters, residuals (observed - predicted), RMSE, R^2, a predictor, the inverse,
 *   and the solver's report.
 * @throws StrengthMaturityDataError for too few points or non-positive, non-finite values
 *   (an edge check: the data comes from a lab file).
 * Sources: ASTM C1074 Appendix (hyperbolic strength-maturity relation); Carino (1984), ASTM
 *   Cement, Concrete and Aggregates 6(2).
 */
export function fitHyperbolicStrengthMaturity(
  points: readonly StrengthMaturityPoint[],
  options: HyperbolicFitOptions = {},
): StrengthMaturityFit<HyperbolicStrengthParameters> & { readonly solver: HyperbolicFitReport } {
  const fixed = options.datumAgeDays;
  checkPoints(points, fixed === undefined ? 3 : 2);
  const youngest = Math.min(...points.map((point) => point.equivalentAgeDays));
  if (fixed !== undefined && !(fixed < youngest)) {
    throw new StrengthMaturityDataError(
      `datumAgeDays must be below the youngest specimen age (${youngest} d): got ${fixed}`,
    );
  }
  const toParameters = (theta: readonly number[]): HyperbolicStrengthParameters => ({
    limitingStrengthMPa: Math.exp(theta[0] ?? Number.NaN),
    rateConstantPerDay: Math.exp(theta[1] ?? Number.NaN),
    datumAgeDays: fixed ?? theta[2] ?? Number.NaN,
  });
  const start = startingValues(points, fixed);
  const initial = [Math.log(start.limitingStrengthMPa), Math.log(start.rateConstantPerDay)];
  if (fixed === undefined) initial.push(start.datumAgeDays);
  const solution = levenbergMarquardt(
    {
      residuals: (theta) => {
        const parameters = toParameters(theta);
        if (!(parameters.datumAgeDays < youngest)) return [Number.POSITIVE_INFINITY];
        return points.map(
          (point) => hyperbolicStrengthMPa(point.equivalentAgeDays, parameters) - point.strengthMPa,
        );
      },
      jacobian: (theta) => {
        const {
          limitingStrengthMPa: su,
          rateConstantPerDay: k,
          datumAgeDays: t0,
        } = toParameters(theta);
        return points.map((point) => {
          const x = k * (point.equivalentAgeDays - t0);
          const slope = su / (1 + x) ** 2;
          const row = [(su * x) / (1 + x), slope * x];
          if (fixed === undefined) row.push(-slope * k);
          return row;
        });
      },
    },
    initial,
  );
  const parameters = toParameters(solution.parameters);
  return {
    ...summarise(
      points,
      parameters,
      (age) => hyperbolicStrengthMPa(age, parameters),
      (target) => ageForHyperbolicStrengthDays(target, parameters),
    ),
    solver: { iterations: solution.iterations, converged: solution.converged },
  };
}

/** Parameters of the logarithmic strength-maturity relation `S = a + b ln(te)`. */
export interface LogarithmicStrengthParameters {
  /** Strength at te = 1 day, MPa. */
  readonly interceptMPa: number;
  /** Strength gain per unit of ln(te / 1 day), MPa. */
  readonly slopeMPa: number;
}

/**
 * Linear least-squares fit of `S = a + b ln(te)` (te in days). The relation has no limiting
 * strength and turns negative at young ages; the predictor returns max(0, a + b ln te).
 *
 * @param points at least 2 points with distinct ages
 * @throws StrengthMaturityDataError for too few points or non-positive values.
 * Source: ASTM C1074 (strength-maturity relationship plotted against the log of maturity);
 *   Plowman (1956), Magazine of Concrete Research 8(22) (citation from memory).
 */
export function fitLogarithmicStrengthMaturity(
  points: readonly StrengthMaturityPoint[],
): StrengthMaturityFit<LogarithmicStrengthParameters> {
  checkPoints(points, 2);
  const { intercept, slope } = lineFit(
    points.map((point) => Math.log(point.equivalentAgeDays)),
    points.map((point) => point.strengthMPa),
  );
  const parameters = { interceptMPa: intercept, slopeMPa: slope };
  const predict = (age: number): number =>
    age > 0 ? Math.max(0, intercept + slope * Math.log(age)) : Number.isNaN(age) ? age : 0;
  const inverse = (target: number): number =>
    slope > 0 ? Math.exp((target - intercept) / slope) : Number.NaN;
  return summarise(points, parameters, predict, inverse);
}
