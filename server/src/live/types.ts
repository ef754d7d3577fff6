/**
 * Types of the per-run live engine (issue 6): what the server feeds it (readings, measure log,
 * forecast) and what it returns (RunState, served by GET /api/runs/:id/state and pushed over
 * socket.io). Agreed in /work/notes/live-contract.md; add fields freely, never rename.
 */
import type { RunConfig } from '../config/index.ts';

/**
 * One committed reading as the engine needs it, in canonical units after ingest conversion:
 * relative humidity in %RH, temperature in degC (`Cel`), wind in m/s, solar radiation in W/m2.
 */
export interface LiveReading {
  device: string;
  sensor: string;
  /** Event time (the device's timestamp), ms since the Unix epoch. */
  eventTimeMs: number;
  value: number;
  /** Canonical SenML unit after ingest conversion (`%RH`, `Cel`, `m/s`, `W/m2`, `mm`). */
  unit: string;
}

/** Kinds of curing measure the log may hold (terms of the trade, physics.md 4). */
export type MeasureKind = 'wet-covering' | 'ponding' | 'curing-compound' | 'fogging' | 'windbreak';

/** One entry of the measure log. */
export interface MeasureEntry {
  id: string;
  kind: MeasureKind | string;
  /** Start of the measure, ms since the Unix epoch. */
  startMs: number;
  /** End, ms since the Unix epoch; null while still applied. */
  endMs: number | null;
  loggedBy: string;
  /** Curing compound efficiency 0..1 (its own figure; the calibration multiplies it). */
  efficiency?: number;
  /** Fogging: relative humidity held over the surface, fraction 0..1 (default of curingMeasures.ts). */
  relativeHumidity?: number;
  /** Windbreak: sheltered over open wind speed, 0..1 (default of curingMeasures.ts). */
  windFactor?: number;
  note?: string;
}

/** A supplied weather forecast point (persistence of the recent mean is used when none). */
export interface ForecastPoint {
  timeMs: number;
  airTemperatureC?: number;
  relativeHumidityPercent?: number;
  /** Wind speed at the station's mast height, m/s. */
  windSpeedMs?: number;
  solarWm2?: number;
}

/** Options of createRunEngine; every field optional, defaults in brackets. */
export interface RunEngineOptions {
  /** Seed of the ensemble [derived from the run id by a string hash, so a replay is identical]. */
  seed?: number;
  /** Ensemble members [32, issue 6]. */
  memberCount?: number;
  /** Outlook horizon, h [6, physics.md 9]. */
  horizonH?: number;
  /** Event time between analyses, s [300, our assumption]. */
  assimilationIntervalS?: number;
  /** Cells through the depth [60, issue 6]. */
  cellCount?: number;
  /** Outlook every n analyses [1, our assumption: each analysis brings a fresh outlook]. */
  outlookEveryAnalyses?: number;
  /** Output step of the outlook, s [600, our assumption]. */
  outlookStepS?: number;
  /** Longest a weather value is held when its stream is silent, s [900, our assumption]. */
  weatherHoldS?: number;
  /** A probe is flagged silent after this long without a reading, s [1800, our assumption]. */
  probeSilentS?: number;
  /** Window of the recent weather mean used for persistence, s [3600, our assumption]. */
  persistenceWindowS?: number;
  /** Late-reading tolerance: a stream that lags the newest reading by more than this no longer holds the engine back, s [300, our assumption]. */
  lateToleranceS?: number;
  /** Assimilate the probes [true]; false runs the prior ensemble (twin experiments, diagnostics). */
  assimilation?: boolean;
  /** Multiplicative covariance inflation per analysis [1.02, calibration default, our assumption]. */
  inflationFactor?: number;
  /**
   * Random error of one probe humidity reading (one sigma), %RH, once the per-probe bias is
   * estimated [1, our assumption; null: the accuracy class of relativeHumidityErrorSd, 2 %RH
   * widening to 4 %RH at saturation]. The class figure is the sensor's accuracy, most of which is a fixed offset
   * that the bias parameters take up; see runEngine.ts for the default chosen.
   */
  observationErrorSdPercent?: number | null;
  /** Gaspari-Cohn half-width of the serial EnSRF's localisation in depth, m [null: ETKF, none]. */
  localisationHalfWidthM?: number | null;
  /** Relaxation to prior spread alpha (Whitaker and Hamill 2012) [0.7, our choice]; null: multiplicative inflation by inflationFactor. */
  rtpsAlpha?: number | null;
  /**
   * Whether RTPS also relaxes the spread of the probes' RH biases [false, our choice from the
   * twin experiment, see engineOptions.ts]: a bias is a constant of the sensor with no model
   * error, so its spread is left where the analysis puts it.
   */
  rtpsOnBiases?: boolean;
  /**
   * What an analysis updates: 'state-and-parameters' (cell suctions, bleed film and parameters)
   * or 'parameters' (each member's state stays its own model run) ['state-and-parameters'].
   */
  analysisUpdates?: 'state-and-parameters' | 'parameters';
  /**
   * What an analysis before final set (of the element, member 0) updates: 'biases' (only the
   * probes' RH biases), 'state-and-biases' (also the cell suctions and the bleed film) or 'all'
   * (also permeability, exposure, curing efficiency, initial film, as after set)
   * ['state-and-biases', our choice from the twin and early-warning experiments]. Before set the
   * surface suction that matters (10-50 kPa) keeps the pore humidity above 99.9 % (Kelvin),
   * below what the probes resolve, so the element parameters are not identifiable then:
   * updating them fitted noise that moved the predicted plastic-phase crossing by up to 54 min
   * (one run of six; 35 min at most without), while 'biases' alone left the hardening-phase
   * stress error about 30 % larger.
   */
  plasticPhaseUpdates?: 'biases' | 'state-and-biases' | 'all';
  /** Target compressive strength for timeToTargetStrengthH, MPa [70 % of fck, common practice]. */
  targetStrengthMPa?: number;
  /**
   * Model error of the surface flux: each member's exposure multiplier follows a random walk of
   * its logarithm in every cycle, `ln m += s sqrt(dt / 1 h) n` with n standard normal from the
   * ensemble's seeded generator and s this value, per square-root hour [0.1, our assumption,
   * origin in engineOptions.ts; 0: the multiplier is a constant and nothing is drawn]. Outlooks
   * hold each member's multiplier constant.
   */
  exposureRandomWalkPerSqrtH?: number;
}

/** Quantiles of one figure over the members at one time. */
export interface BandPoint {
  p05: number;
  p50: number;
  p95: number;
}

/** Quantile band at 5 %, 50 % and 95 % (one value per time or depth). */
export interface Band {
  p05: number[];
  p50: number[];
  p95: number[];
}

/** The outlook of physics.md 9. */
export interface RunOutlook {
  horizonH: number;
  timesMs: number[];
  utilizationBand: Band;
  marginBandMPa: Band;
  crossings: {
    threshold: number;
    probability: number;
    expectedTimeMs: number | null;
    medianTimeMs: number | null;
  }[];
  probabilityCrackingWithinHorizon: number;
  forecastSource: 'persistence' | 'supplied';
}

/** A probe reading beside the model's value at its depth. */
export interface ProbeProfilePoint {
  device: string;
  sensor: string;
  depthMm: number;
  measuredRhPercent: number | null;
  modelRhPercent: number;
  modelRhSdPercent: number;
}

/** Depth profiles (cell centres) with probe readings beside the model. */
export interface RunProfiles {
  depthMm: number[];
  saturation: Band;
  stressMPa: Band;
  probes: ProbeProfilePoint[];
}

/** One data-quality flag: `weather-held`, `weather-gap`, `probe-silent`, `degraded`... */
export interface QualityFlag {
  code: string;
  message: string;
  sinceMs: number;
}

/**
 * What GET /api/runs/:id/state returns and socket.io pushes (JSON; keys with unit suffixes).
 * Scalars are null when not defined (e.g. the margin in the plastic phase); band arrays may hold
 * NaN in memory for such times, which JSON writes as null. Times in ms since the Unix epoch.
 */
export interface RunState {
  runId: string;
  /** Engine's event time, ms (null before the first reading). */
  eventTimeMs: number | null;
  phase: 'before-placement' | 'plastic' | 'hardening';
  surfaceStressMPa: number | null;
  fctmMPa: number | null;
  utilization: number | null;
  marginMPa: number | null;
  evaporationKgM2h: number | null;
  inPlaceCompressiveStrengthMPa: number | null;
  timeToTargetStrengthH: number | null;
  /** Quantiles over the members of the figures now (the scalars above are the medians). */
  nowBands: { utilization: BandPoint; surfaceStressMPa: BandPoint; marginMPa: BandPoint } | null;
  /** Bleed film on the surface, kg/m2 (median over members), and hours until it is gone. */
  bleedFilmKgM2: number | null;
  bleedFilmRemainingH: number | null;
  /** Analyses so far and members of the ensemble. */
  analysisCount: number;
  memberCount: number;
  outlook: RunOutlook | null;
  profiles: RunProfiles | null;
  calibration: { name: string; mean: number; sd: number; p05: number; p95: number }[];
  quality: { degraded: boolean; flags: QualityFlag[] };
  caution: string;
}

/** JSON-serialisable snapshot of a run engine (version tag, opaque body). */
export interface RunEngineSnapshot {
  version: 1;
  runId: string;
  /** Event time the snapshot was taken at, ms (null before the first reading). */
  eventTimeMs: number | null;
  body: unknown;
}

/** The per-run live engine. */
export interface RunEngine {
  readonly runId: string;
  /** Readings in any order; buffered and consumed in event-time order. */
  addReadings(readings: readonly LiveReading[]): void;
  /** Replace the measure log (the whole log, as stored). */
  setMeasures(measures: readonly MeasureEntry[]): void;
  /** Replace the supplied forecast series (empty: persistence). */
  setForecast(points: readonly ForecastPoint[]): void;
  /** Advance as far as the buffered readings allow; returns the new state when it moved, else null. */
  advance(): RunState | null;
  /** Latest state (figures, outlook, profiles, calibration, quality). */
  state(): RunState;
  /** JSON-serialisable snapshot; createRunEngine(runId, config, options, snapshot) resumes from it. */
  snapshot(): RunEngineSnapshot;
}

/** Signature of the factory, for callers that inject it. */
export type CreateRunEngine = (
  runId: string,
  config: RunConfig,
  options?: RunEngineOptions,
  snapshot?: RunEngineSnapshot,
) => RunEngine;
