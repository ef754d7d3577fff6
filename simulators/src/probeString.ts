/**
 * A simulated probe string: RH and temperature sensors at set depths in the element, sampling the
 * hidden truth at an interval and sending one SenML pack per sample. Each sensor has its own bias,
 * noise and resolution; a pack is lost now and then; the device clock drifts; scripted faults
 * make a sensor stick (it repeats its last value) or the device fall silent.
 */
import type { HiddenTruth } from './hiddenTruth.ts';
import { deviceTimeMs } from './deviceClock.ts';
import type { ScenarioFault, ScenarioProbeString } from './scenarioSchema.ts';
import { seededRandom } from './seededRandom.ts';
import type { SeededRandom } from './seededRandom.ts';
import { quantise, senmlPack } from './senmlPack.ts';
import type { SenmlRecord } from './senmlPack.ts';

/** Highest RH a probe reports, %: capacitive sensors read a little over 100 near saturation (common practice). */
export const PROBE_RH_CEILING_PERCENT = 102;

/** Why a sample sent nothing. */
export type SkipReason = 'dropout' | 'silence';

/** What one sample produced. */
export type ProbeSample = { pack: SenmlRecord[] } | { skipped: SkipReason };

export class ProbeStringSimulator {
  readonly device: string;
  readonly intervalS: number;
  readonly #spec: ScenarioProbeString;
  readonly #random: SeededRandom;
  readonly #startMs: number;
  readonly #stuckFromMs = new Map<string, number>();
  readonly #silences: { fromMs: number; toMs: number }[] = [];
  readonly #lastValue = new Map<string, number>();

  /**
   * @param spec - the probe string as the scenario gives it
   * @param seed - scenario seed (the device draws its own stream from it)
   * @param startMs - event time the device clock was set, ms
   * @param faults - the scenario's faults; those naming this device apply
   */
  constructor(
    spec: ScenarioProbeString,
    seed: number,
    startMs: number,
    faults: readonly ScenarioFault[] = [],
  ) {
    this.device = spec.device;
    this.intervalS = spec.intervalS;
    this.#spec = spec;
    this.#random = seededRandom(seed, spec.device);
    this.#startMs = startMs;
    for (const fault of faults) {
      if (fault.device !== spec.device) continue;
      if (fault.kind === 'stuck') this.#stuckFromMs.set(fault.sensor, Date.parse(fault.fromAt));
      else
        this.#silences.push({
          fromMs: Date.parse(fault.fromAt),
          toMs: fault.toAt === undefined ? Number.POSITIVE_INFINITY : Date.parse(fault.toAt),
        });
    }
  }

  /**
   * Samples the truth at event time `timeMs` (the truth must have been advanced to it).
   * Draws the same random numbers whether or not the pack is lost, so a fault does not shift
   * the noise of later samples.
   */
  sample(timeMs: number, truth: HiddenTruth): ProbeSample {
    const lost = this.#random.uniform() < this.#spec.dropoutProbability;
    const measurements = this.#spec.sensors.map((sensor) => {
      const trueValue =
        sensor.quantity === 'rh'
          ? truth.relativeHumidityPercentAt(sensor.depthMm)
          : truth.temperatureCAt(sensor.depthMm);
      const noisy = this.#random.normal(trueValue + sensor.bias, sensor.noiseSd);
      let value = quantise(
        sensor.quantity === 'rh' ? Math.min(PROBE_RH_CEILING_PERCENT, Math.max(0, noisy)) : noisy,
        sensor.quantum,
      );
      const stuckFrom = this.#stuckFromMs.get(sensor.sensor);
      const last = this.#lastValue.get(sensor.sensor);
      if (stuckFrom !== undefined && timeMs >= stuckFrom && last !== undefined) value = last;
      return {
        sensor: sensor.sensor,
        unit: sensor.quantity === 'rh' ? '%RH' : 'Cel',
        value,
      };
    });
    if (this.#silences.some((silence) => timeMs >= silence.fromMs && timeMs < silence.toMs)) {
      return { skipped: 'silence' };
    }
    if (lost) return { skipped: 'dropout' };
    for (const measurement of measurements)
      this.#lastValue.set(measurement.sensor, measurement.value);
    const clock = {
      startMs: this.#startMs,
      offsetS: this.#spec.clockOffsetS,
      driftPpm: this.#spec.clockDriftPpm,
    };
    return {
      pack: senmlPack(this.device, deviceTimeMs(clock, timeMs), measurements, this.intervalS),
    };
  }
}
