import { describe, expect, it } from 'vitest';
import {
  type AnalysisMethod,
  assimilate,
  type Observation,
  type ObservationOperator,
} from '../../server/src/calibration/assimilate.ts';
import {
  createEnsemble,
  type Ensemble,
  forecastEnsemble,
} from '../../server/src/calibration/ensemble.ts';
import { createEnsembleRandom } from '../../server/src/calibration/ensembleRandom.ts';
import {
  LOG_SUCTION,
  type ObservationTransform,
} from '../../server/src/calibration/observationTransform.ts';
import {
  exponentialDryingModel,
  initialMember,
  PROBE_DEPTH_M,
  RATE_SPEC,
  TRUE_RATE_PER_S,
  trueRelativeHumidity,
} from './_exponentialDrying.ts';

// Scalar parameter-estimation twin experiment (the set-up of physics.md section 8 in miniature):
// a hidden drying rate, a probe reading every 15 minutes for 12 hours with Gaussian noise of
// 1 %RH and 0.1 %RH quantisation, 32 members started from the prior. The filter must bring the
// parameter to the hidden value, its spread must cover it, and the humidity must track the truth.
const intervalS = 900;
const cycles = 48;
const noiseSd = 0.01;
const layout = { depthM: Float64Array.of(PROBE_DEPTH_M) };
const operator: ObservationOperator = {
  predict: (member) => Float64Array.of(member.state[0] ?? NaN),
};

function runTwin(method: AnalysisMethod, observationTransform: ObservationTransform): Ensemble {
  const truthNoise = createEnsembleRandom(2024); // the sensor's noise, independent of the filter
  const model = exponentialDryingModel();
  let ensemble = createEnsemble({ seed: 99, specs: [RATE_SPEC], timeS: 0, initialMember });
  for (let cycle = 1; cycle <= cycles; cycle++) {
    const timeS = cycle * intervalS;
    ensemble = forecastEnsemble(ensemble, model, timeS);
    const reading =
      Math.round((trueRelativeHumidity(timeS) + noiseSd * truthNoise.normal()) * 1000) / 1000;
    const observation: Observation = {
      id: 'P1',
      value: reading,
      errorSd: noiseSd,
      depthM: PROBE_DEPTH_M,
    };
    ensemble = assimilate(ensemble, [observation], operator, [RATE_SPEC], layout, {
      method,
      observationTransform,
    }).ensemble;
  }
  return ensemble;
}

function logRateMoments(ensemble: Ensemble): { mean: number; sd: number } {
  const logs = ensemble.members.map((member) => Math.log(member.parameters[0] ?? NaN));
  const mean = logs.reduce((sum, value) => sum + value, 0) / logs.length;
  const variance = logs.reduce((sum, value) => sum + (value - mean) ** 2, 0) / (logs.length - 1);
  return { mean, sd: Math.sqrt(variance) };
}

const cases: { name: string; method: AnalysisMethod; transform: ObservationTransform }[] = [
  {
    name: 'ETKF, relative humidity',
    method: { kind: 'etkf' },
    transform: { kind: 'relative-humidity' },
  },
  { name: 'ETKF, log suction', method: { kind: 'etkf' }, transform: LOG_SUCTION },
  {
    name: 'serial EnSRF with localisation, relative humidity',
    method: { kind: 'serial-ensrf', localisation: { halfWidthM: 0.02 } },
    transform: { kind: 'relative-humidity' },
  },
];

describe.each(cases)(
  'assimilate() twin experiment on exponential drying ($name)',
  ({ method, transform }) => {
    const ensemble = runTwin(method, transform);
    const { mean, sd } = logRateMoments(ensemble);
    const priorSd = RATE_SPEC.priorSd;

    it('brings the posterior mean of the rate within 15 % of the hidden rate', () => {
      // Prior median is 60 % below the truth (ln error 0.92); 15 % is ln error 0.14.
      expect(Math.abs(mean - Math.log(TRUE_RATE_PER_S))).toBeLessThan(Math.log(1.15));
    });

    it('covers the hidden rate with its spread (within 3 sd) and has learned (sd < prior sd / 4)', () => {
      expect(Math.abs(mean - Math.log(TRUE_RATE_PER_S))).toBeLessThan(3 * sd);
      expect(sd).toBeLessThan(priorSd / 4);
    });

    it('tracks the true humidity within 2 %RH at the end', () => {
      const meanRh =
        ensemble.members.reduce((sum, member) => sum + (member.state[0] ?? NaN), 0) /
        ensemble.members.length;
      expect(Math.abs(meanRh - trueRelativeHumidity(cycles * intervalS))).toBeLessThan(0.02);
    });
  },
);
