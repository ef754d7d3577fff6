/**
 * Maturity of concrete from its temperature history, ASTM C1074 (Standard Practice for
 * Estimating Concrete Strength by the Maturity Method): the Arrhenius equivalent age of
 * Freiesleben Hansen and Pedersen (1977), and the Nurse-Saul temperature-time factor with its
 * equivalent age at the reference temperature. See physics.md section 6.
 *
 * Integration over irregular records: the trapezoid rule over the actual timestamps, applied to
 * the rate factor, i.e. each interval adds dt (f(T1) + f(T2)) / 2, not dt f((T1 + T2) / 2).
 * This is our choice: it integrates the quantity that accumulates (the age rate) under linear
 * interpolation of that rate, it is exact when the rate is constant, and it makes maturity
 * additive when a record is split at a shared sample. The two differ by O(dt^2 f''), which is
 * small at the usual 5 to 30 min logging intervals.
 */
import { celsiusToKelvin, GAS_CONSTANT_J_PER_MOL_K } from './units.ts';

/** Options of the maturity functions. Every field has a default with its origin. */
export interface MaturityOptions {
  /**
   * Apparent activation energy E, J/mol. Default 40 000 J/mol (physics.md section 6; ASTM C1074
   * gives 40 to 45 kJ/mol for ordinary Portland cement without admixtures, from memory). Slag
   * raises it, fly ash and silica fume lower it: use the mix's value when known.
   */
  activationEnergyJMol?: number;
  /** Reference temperature Tr, degC. Default 20 degC (physics.md section 6; C1074 allows 20 or 23). */
  referenceTemperatureC?: number;
  /** Nurse-Saul datum temperature T0, degC. Default 0 degC (ASTM C1074 for Type I cement). */
  datumTemperatureC?: number;
  /** Intervals longer than this are flagged as gaps, s. Default 3600 s (our assumption). */
  maxGapS?: number;
}

/** One temperature reading: time as ms since the Unix epoch or a Date, temperature in degC. */
export interface TemperatureSample {
  time: number | Date;
  temperatureC: number;
}

/** An interval of the record longer than `maxGapS`; it is still integrated, linearly. */
export interface MaturityGap {
  fromIndex: number;
  toIndex: number;
  fromMs: number;
  toMs: number;
  durationS: number;
}

/** A sample left out of the integration, with the rule it broke. */
export interface MaturitySampleIssue {
  index: number;
  field: 'time' | 'temperatureC';
  rule: string;
  value: string;
  message: string;
}

/** Maturity of a temperature record. All ages in s, the temperature-time factor in K s (degC s). */
export interface MaturityResult {
  /** Time from the first to the last accepted sample, s. */
  realAgeS: number;
  /** Arrhenius equivalent age at the reference temperature, s. */
  arrheniusEquivalentAgeS: number;
  /** Nurse-Saul temperature-time factor M = sum (T - T0) dt, K s (= degC s; / 3600 for degC h). */
  nurseSaulTemperatureTimeFactorKS: number;
  /** Nurse-Saul equivalent age at the reference temperature, M / (Tr - T0), s. */
  nurseSaulEquivalentAgeS: number;
  /** Number of samples integrated. */
  samplesUsed: number;
  /** Intervals longer than `maxGapS`. */
  gaps: MaturityGap[];
  /** Samples left out (non-increasing or invalid time, non-finite temperature). */
  issues: MaturitySampleIssue[];
}

/**
 * Arrhenius age conversion factor (rate relative to the reference temperature):
 *   f(T) = exp( -E/R (1/T - 1/Tr) ),  T and Tr absolute (K)
 * Units: temperature degC; E J/mol; R = 8.314462618 J/(mol K). f(Tr) = 1.
 * Range: meaningful between about -10 and 80 degC; at or below absolute zero returns NaN;
 * NaN gives NaN. Source: ASTM C1074, Freiesleben Hansen and Pedersen (1977).
 */
export function arrheniusAgeFactor(temperatureC: number, options: MaturityOptions = {}): number {
  const activationEnergyJMol = options.activationEnergyJMol ?? 40_000;
  const referenceK = celsiusToKelvin(options.referenceTemperatureC ?? 20);
  const temperatureK = celsiusToKelvin(temperatureC);
  if (!(temperatureK > 0) || !(referenceK > 0)) return Number.NaN;
  return Math.exp(
    (-activationEnergyJMol / GAS_CONSTANT_J_PER_MOL_K) * (1 / temperatureK - 1 / referenceK),
  );
}

/**
 * Nurse-Saul temperature excess over the datum, max(T - T0, 0), K: the rate of the
 * temperature-time factor. Below the datum no maturity accrues (ASTM C1074). NaN gives NaN.
 */
export function nurseSaulTemperatureExcessK(
  temperatureC: number,
  options: MaturityOptions = {},
): number {
  const datumC = options.datumTemperatureC ?? 0;
  if (Number.isNaN(temperatureC) || Number.isNaN(datumC)) return Number.NaN;
  return Math.max(temperatureC - datumC, 0);
}

/**
 * Nurse-Saul age conversion factor: f(T) = max(T - T0, 0) / (Tr - T0), dimensionless; f(Tr) = 1.
 * Units: degC. Returns NaN when Tr <= T0 (no equivalent age is defined) or on NaN input.
 * Source: ASTM C1074 (equivalent age from the temperature-time factor).
 */
export function nurseSaulAgeFactor(temperatureC: number, options: MaturityOptions = {}): number {
  const datumC = options.datumTemperatureC ?? 0;
  const referenceC = options.referenceTemperatureC ?? 20;
  if (!(referenceC > datumC)) return Number.NaN;
  return nurseSaulTemperatureExcessK(temperatureC, options) / (referenceC - datumC);
}

/**
 * Trapezoid increment of an age-like integral over one interval: dt (f1 + f2) / 2, in the unit
 * of dt times the factors' unit. For the engine's step-by-step use with the factors above.
 * NaN in, NaN out; a negative duration gives a negative increment (the caller orders time).
 */
export function trapezoidAgeIncrement(
  durationS: number,
  startFactor: number,
  endFactor: number,
): number {
  return (durationS * (startFactor + endFactor)) / 2;
}

const isoOrRaw = (timeMs: number): string =>
  Number.isFinite(timeMs) ? new Date(timeMs).toISOString() : String(timeMs);

/**
 * Arrhenius and Nurse-Saul maturity of an irregular temperature record (ASTM C1074),
 * integrated by the trapezoid rule over the actual timestamps on the rate factors:
 *   te = sum dt (f(T_i) + f(T_i+1)) / 2,   M = sum dt (max(T_i - T0, 0) + max(T_i+1 - T0, 0)) / 2
 * Units: time ms epoch or Date; temperatures degC; results in s and K s.
 * Bad samples are skipped and reported in `issues` with field, rule and value: a time that is
 * not later than the last accepted sample's (non-increasing or duplicate), an invalid time, or a
 * non-finite temperature. Intervals longer than `maxGapS` are integrated (linear between the
 * two samples) and reported in `gaps`. Fewer than two accepted samples give zero ages.
 * Source: ASTM C1074; Freiesleben Hansen and Pedersen (1977); Nurse (1949), Saul (1951).
 */
export function maturityOfSeries(
  samples: readonly TemperatureSample[],
  options: MaturityOptions = {},
): MaturityResult {
  const maxGapS = options.maxGapS ?? 3600;
  const result: MaturityResult = {
    realAgeS: 0,
    arrheniusEquivalentAgeS: 0,
    nurseSaulTemperatureTimeFactorKS: 0,
    nurseSaulEquivalentAgeS: 0,
    samplesUsed: 0,
    gaps: [],
    issues: [],
  };
  let previous: { index: number; timeMs: number; arrhenius: number; excessK: number } | undefined;
  let firstMs = Number.NaN;
  samples.forEach((sample, index) => {
    const timeMs = sample.time instanceof Date ? sample.time.getTime() : sample.time;
    if (!Number.isFinite(timeMs)) {
      result.issues.push({
        index,
        field: 'time',
        rule: 'must be a valid time',
        value: String(sample.time),
        message: `sample ${index} time must be a valid time: got ${String(sample.time)}`,
      });
      return;
    }
    if (!Number.isFinite(sample.temperatureC)) {
      result.issues.push({
        index,
        field: 'temperatureC',
        rule: 'must be a finite number',
        value: String(sample.temperatureC),
        message: `sample ${index} temperatureC must be a finite number: got ${String(sample.temperatureC)}`,
      });
      return;
    }
    if (previous !== undefined && timeMs <= previous.timeMs) {
      const rule = `must be later than the previous accepted sample (${isoOrRaw(previous.timeMs)})`;
      result.issues.push({
        index,
        field: 'time',
        rule,
        value: isoOrRaw(timeMs),
        message: `sample ${index} time ${rule}: got ${isoOrRaw(timeMs)}`,
      });
      return;
    }
    const current = {
      index,
      timeMs,
      arrhenius: arrheniusAgeFactor(sample.temperatureC, options),
      excessK: nurseSaulTemperatureExcessK(sample.temperatureC, options),
    };
    if (previous === undefined) {
      firstMs = timeMs;
    } else {
      const durationS = (timeMs - previous.timeMs) / 1000;
      if (durationS > maxGapS) {
        result.gaps.push({
          fromIndex: previous.index,
          toIndex: index,
          fromMs: previous.timeMs,
          toMs: timeMs,
          durationS,
        });
      }
      result.arrheniusEquivalentAgeS += trapezoidAgeIncrement(
        durationS,
        previous.arrhenius,
        current.arrhenius,
      );
      result.nurseSaulTemperatureTimeFactorKS += trapezoidAgeIncrement(
        durationS,
        previous.excessK,
        current.excessK,
      );
      result.realAgeS = (timeMs - firstMs) / 1000;
    }
    result.samplesUsed += 1;
    previous = current;
  });
  const datumC = options.datumTemperatureC ?? 0;
  const referenceC = options.referenceTemperatureC ?? 20;
  result.nurseSaulEquivalentAgeS =
    referenceC > datumC
      ? result.nurseSaulTemperatureTimeFactorKS / (referenceC - datumC)
      : Number.NaN;
  return result;
}
