/**
 * The probe string's imperfections, on a truth held constant so each one shows alone: bias,
 * noise and resolution, a stuck sensor, a scripted silence, dropouts, the drifting clock, and
 * the seed.
 */
import { describe, expect, it } from 'vitest';
import type { HiddenTruth } from '../../simulators/src/hiddenTruth.ts';
import { ProbeStringSimulator } from '../../simulators/src/probeString.ts';
import type { ProbeSample } from '../../simulators/src/probeString.ts';
import { parseScenario } from '../../simulators/src/scenarioSchema.ts';
import type { ScenarioFault, ScenarioProbeString } from '../../simulators/src/scenarioSchema.ts';
import type { SenmlRecord } from '../../simulators/src/senmlPack.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';

const START_MS = Date.parse('2026-07-16T11:15:00+02:00');
const steadyTruth: HiddenTruth = {
  kind: 'stand-in',
  timeMs: START_MS,
  advanceTo: () => {},
  relativeHumidityPercentAt: (depthMm) => 90 + depthMm / 10,
  temperatureCAt: () => 25,
  evaporationKgM2h: () => 0,
  surfaceSuctionPa: () => Number.NaN,
  riskFigures: () => null,
};
const base = loadScenarioFolder('level3-topping').scenario;
function probeSpec(
  overrides: Partial<ScenarioProbeString['sensors'][number]> & Record<string, unknown> = {},
): ScenarioProbeString {
  const { dropoutProbability = 0, clockDriftPpm = 0, clockOffsetS = 0, ...sensor } = overrides;
  const scenario = parseScenario({
    ...structuredClone(base),
    probeStrings: [
      {
        device: 'probe-x',
        intervalS: 60,
        dropoutProbability,
        clockDriftPpm,
        clockOffsetS,
        sensors: [
          { sensor: 'rh-05', quantity: 'rh', depthMm: 5, bias: 0, noiseSd: 0.3, ...sensor },
          { sensor: 't-05', quantity: 'temperature', depthMm: 5, bias: 0, noiseSd: 0.05 },
        ],
      },
    ],
  });
  return scenario.probeStrings[0] as ScenarioProbeString;
}
const packs = (simulator: ProbeStringSimulator, count: number): ProbeSample[] =>
  Array.from({ length: count }, (_, index) =>
    simulator.sample(START_MS + index * 60_000, steadyTruth),
  );
const valuesOf = (samples: ProbeSample[], sensor: string): number[] =>
  samples.flatMap((sample) =>
    'pack' in sample
      ? sample.pack.filter((record) => record.n === sensor).map((record) => record.v)
      : [],
  );

describe('ProbeStringSimulator.sample()', () => {
  it('reads the truth plus its bias, with noise of its standard deviation, on a 0.1 % grid', () => {
    const samples = packs(new ProbeStringSimulator(probeSpec({ bias: 0.8 }), 7, START_MS), 2000);
    const values = valuesOf(samples, 'rh-05');
    const mean = values.reduce((sum, value) => sum + value, 0) / values.length;
    const sd = Math.sqrt(
      values.reduce((sum, value) => sum + (value - mean) ** 2, 0) / (values.length - 1),
    );
    // truth 90.5 + bias 0.8; 2000 draws: the mean within 4 standard errors (4 * 0.3 / sqrt(2000) = 0.027)
    expect(Math.abs(mean - 91.3)).toBeLessThan(0.03);
    // quantisation adds variance q^2/12 (Sheppard): sqrt(0.09 + 0.01/12) = 0.301; within 10 %
    expect(sd).toBeGreaterThan(0.27);
    expect(sd).toBeLessThan(0.33);
    for (const value of values) expect(Math.round(value * 10) / 10).toBe(value);
  });

  it('never reports RH above its ceiling of 102 %', () => {
    // truth 90.5 + bias 10 = 100.5 with sd 1: about 7 % of draws lie above 102 and are held there
    const samples = packs(
      new ProbeStringSimulator(probeSpec({ bias: 10, noiseSd: 1 }), 7, START_MS),
      300,
    );
    const values = valuesOf(samples, 'rh-05');
    expect(Math.max(...values)).toBe(102);
    expect(values.filter((value) => value === 102).length).toBeGreaterThan(5);
  });

  it('a stuck sensor repeats the last value it sent while the others move on', () => {
    const faults: ScenarioFault[] = [
      { kind: 'stuck', device: 'probe-x', sensor: 't-05', fromAt: '2026-07-16T11:45:00+02:00' },
    ];
    const samples = packs(new ProbeStringSimulator(probeSpec(), 7, START_MS, faults), 90);
    const temperatures = valuesOf(samples, 't-05');
    const stuck = temperatures.slice(30);
    expect(new Set(stuck)).toEqual(new Set([temperatures[29]]));
    expect(new Set(valuesOf(samples, 'rh-05').slice(30)).size).toBeGreaterThan(3);
  });

  it('a scripted silence sends nothing between its times', () => {
    const faults: ScenarioFault[] = [
      {
        kind: 'silence',
        device: 'probe-x',
        fromAt: '2026-07-16T11:25:00+02:00',
        toAt: '2026-07-16T11:35:00+02:00',
      },
    ];
    const samples = packs(new ProbeStringSimulator(probeSpec(), 7, START_MS, faults), 30);
    expect(
      samples.map((sample) => ('skipped' in sample ? sample.skipped : 'sent')).slice(9, 21),
    ).toEqual(['sent', ...Array<string>(10).fill('silence'), 'sent']);
  });

  it('loses about its dropout share of packs (binomial, within 4 sd)', () => {
    const samples = packs(
      new ProbeStringSimulator(probeSpec({ dropoutProbability: 0.05 }), 11, START_MS),
      4000,
    );
    const lost = samples.filter((sample) => 'skipped' in sample).length;
    const sd = Math.sqrt(4000 * 0.05 * 0.95);
    expect(Math.abs(lost - 200)).toBeLessThan(4 * sd);
  });

  it('stamps packs with its drifting clock: offset plus ppm of the elapsed time', () => {
    const simulator = new ProbeStringSimulator(
      probeSpec({ clockDriftPpm: 50, clockOffsetS: 2 }),
      7,
      START_MS,
    );
    const tenHoursMs = 10 * 3_600_000;
    const sample = simulator.sample(START_MS + tenHoursMs, steadyTruth);
    if (!('pack' in sample)) throw new Error('expected a pack');
    const first = sample.pack[0] as SenmlRecord;
    // 2 s + 50e-6 * 36000 s = 3.8 s ahead
    expect((first.bt as number) * 1000 - (START_MS + tenHoursMs)).toBeCloseTo(3800, 0);
  });

  it('gives the same readings for the same seed and others for another seed', () => {
    const run = (seed: number) =>
      valuesOf(packs(new ProbeStringSimulator(probeSpec(), seed, START_MS), 50), 'rh-05');
    expect(run(3)).toEqual(run(3));
    expect(run(3)).not.toEqual(run(4));
  });
});
