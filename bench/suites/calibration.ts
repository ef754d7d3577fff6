/**
 * Cost of one ensemble analysis at the engine's size: 32 members, 70 state entries, the 4
 * default parameters plus one bias per probe, 6 probes. The baseline is the irreducible
 * arithmetic of any ensemble Kalman analysis, the cross-covariances of every entry with every
 * observation (n x m x N multiply-adds), timed in the same process, so the ratio says how much
 * the full analysis (transforms, inflation, square-root update, new members) costs on top.
 */
import {
  type AnalysisMethod,
  assimilate,
  createEnsembleRandom,
  defaultParameterSpecs,
  drawInitialParameters,
  type Ensemble,
  type ObservationOperator,
} from '../../server/src/calibration/index.ts';
import { type BenchFigure, type BenchSuite, ratioFigure } from '../figure.ts';

const memberCount = 32;
const stateCount = 70;
const probeIds = ['P05', 'P10', 'P20', 'P30', 'P50', 'P80'];
const probeDepthM = [0.005, 0.01, 0.02, 0.03, 0.05, 0.08];

function microsecondsPerCall(run: () => void, repetitions: number): number {
  for (let i = 0; i < repetitions / 4; i++) run();
  const start = performance.now();
  for (let i = 0; i < repetitions; i++) run();
  return ((performance.now() - start) / repetitions) * 1000;
}

const suite: BenchSuite = async () => {
  const specs = defaultParameterSpecs(probeIds);
  const random = createEnsembleRandom(2026);
  const depthM = Float64Array.from({ length: stateCount }, (_, i) => 0.1 * (i / stateCount) ** 2);
  const members = drawInitialParameters(specs, memberCount, random).map((parameters) => ({
    state: Float64Array.from({ length: stateCount }, () => 0.9 + 0.02 * random.normal()),
    parameters,
    carried: null,
  }));
  const ensemble: Ensemble = { members, random, timeS: 0, analysisCount: 0 };
  const cells = probeDepthM.map((d) => depthM.findIndex((x) => x >= d));
  const operator: ObservationOperator = {
    predict: (member, observations) =>
      Float64Array.from(observations, (observation) => {
        const probe = probeIds.indexOf(observation.id);
        return (member.state[cells[probe] ?? 0] ?? NaN) + (member.parameters[4 + probe] ?? 0);
      }),
  };
  const observations = probeIds.map((id, j) => ({
    id,
    value: 0.88,
    errorSd: 0.02,
    depthM: probeDepthM[j] ?? 0,
  }));

  const rowCount = stateCount + specs.length;
  const block = new Float64Array(rowCount * memberCount).map((_, i) => Math.sin(i));
  const predicted = new Float64Array(probeIds.length * memberCount).map((_, i) => Math.cos(i));
  const covariances = new Float64Array(rowCount * probeIds.length);
  const baselineUs = microsecondsPerCall(() => {
    for (let i = 0; i < rowCount; i++) {
      for (let j = 0; j < probeIds.length; j++) {
        let sum = 0;
        for (let k = 0; k < memberCount; k++)
          sum += (block[i * memberCount + k] ?? 0) * (predicted[j * memberCount + k] ?? 0);
        covariances[i * probeIds.length + j] = sum;
      }
    }
  }, 4000);

  const methods: { name: string; method: AnalysisMethod }[] = [
    { name: 'etkf', method: { kind: 'etkf' } },
    {
      name: 'serialEnsrfLocalised',
      method: { kind: 'serial-ensrf', localisation: { halfWidthM: 0.02 } },
    },
  ];
  const figures: BenchFigure[] = [];
  for (const { name, method } of methods) {
    const valueUs = microsecondsPerCall(
      () => assimilate(ensemble, observations, operator, specs, { depthM }, { method }),
      2000,
    );
    figures.push(
      ratioFigure({
        name: `calibration.${name}AnalysisVsCrossCovariances`,
        value: valueUs,
        unit: 'us',
        baseline: baselineUs,
        target: 'value < 1000 us (one analysis well under a millisecond)',
        met: valueUs < 1000,
        detail: `${memberCount} members, ${stateCount} state entries, ${specs.length} parameters, ${probeIds.length} probes`,
      }),
    );
  }
  return figures;
};

export default suite;
