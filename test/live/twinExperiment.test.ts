/**
 * Twin experiment of physics.md 8 and the early warning of physics.md 9, offline: the readings
 * come from the simulators' hidden truth of level3-topping (the engine on a 120-cell grid with
 * hidden parameters permeability x1.3, exposure x1.1, bleed film 0.7 kg/m2; its own thermal
 * field) through their weather station and probe strings (noise, bias, quantisation, dropouts,
 * drifting clocks, a stuck sensor, a silent probe), see twinReadings.ts. The engine runs at its
 * defaults (32 members, 60 cells; with 16 members and 40 cells the ratio below scattered
 * from 0.36 to 0.93 over six seeds, so the ensemble size matters here), for four run ids, i.e.
 * four seeds of the ensemble: the ratio depends on how lucky the prior's draw is, so the
 * method is judged on all four. The calibrated engine is compared with the same ensemble run
 * without assimilation and without the model error's random walk of the exposure multiplier
 * (the prior: each member keeps its drawn parameters), through its median, the figure the engine
 * reports. Leaving the walk out of the prior keeps the reference what it was before the walk
 * existed; with the walk in it the prior's error moves with the walk's own draws (run 2: 0.0495
 * to 0.0634 MPa, measured before the engine's bulk setting) and the ratio would improve for a
 * reason that has nothing to do with the calibration.
 *
 * The truth reports utilization and margin, not the stress: its surface stress is recovered as
 * U margin / (1 - U), exact to rounding (test/helpers/twinMetrics.ts; an earlier linear
 * interpolation of fct where |1 - U| < 0.3 put up to 0.012 MPa too much stress into the truth
 * in the first 40 min after set). Surface stress exists in the hardening phase only; the
 * plastic phase's figure is the capillary suction, which the humidity probes cannot see (RH
 * stays above 99.9 % up to 100 kPa of suction, Kelvin), so it is reported but not part of the
 * stress target.
 */
import { describe, expect, it } from 'vitest';
import { createRunEngine } from '../../server/src/live/index.ts';
import type { RunEngineOptions, RunState } from '../../server/src/live/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { playTwin, readingBatches } from './twinReadings.ts';
import type { TwinRun } from './twinReadings.ts';
import { twinFigures } from '../helpers/twinMetrics.ts';

const folder = loadScenarioFolder('level3-topping');
const OPTIONS: RunEngineOptions = { outlookEveryAnalyses: 1000 };
const PRIOR: RunEngineOptions = { ...OPTIONS, assimilation: false, exposureRandomWalkPerSqrtH: 0 };

/** Runs the engine over the twin, feeding 5 minutes at a time; states by event time. */
function replay(twin: TwinRun, runId: string, options: RunEngineOptions): Map<number, RunState> {
  const engine = createRunEngine(runId, folder.runConfig, options);
  engine.setMeasures(twin.measures);
  const states = new Map<number, RunState>();
  for (const batch of readingBatches(twin.readings, 300)) {
    engine.addReadings(batch);
    const state = engine.advance();
    if (state?.eventTimeMs != null) states.set(state.eventTimeMs, state);
  }
  return states;
}

interface TwinResult {
  runId: string;
  count: number;
  rmseRatio: number;
  coverage: number;
  last: RunState | undefined;
}

function twinResult(twin: TwinRun, runId: string): TwinResult {
  const calibrated = replay(twin, runId, OPTIONS);
  const prior = replay(twin, runId, PRIOR);
  const { count, calibratedRmseMPa, priorRmseMPa, rmseRatio, coverage } = twinFigures(
    twin.truth,
    calibrated,
    prior,
  );
  const last = [...calibrated.values()].at(-1);
  console.info(
    `twin ${runId}: ${count} hardening samples, stress RMSE calibrated ${calibratedRmseMPa.toFixed(4)} MPa, prior ${priorRmseMPa.toFixed(4)} MPa, ratio ${rmseRatio.toFixed(3)}, 90 % band coverage ${coverage.toFixed(2)}; ` +
      (last?.calibration ?? [])
        .slice(0, 4)
        .map((c) => `${c.name} ${c.mean.toFixed(3)} [${c.p05.toFixed(3)}, ${c.p95.toFixed(3)}]`)
        .join('; '),
  );
  return {
    runId,
    count,
    rmseRatio,
    coverage,
    last,
  };
}

describe('live engine twin experiment (level3-topping, no action)', () => {
  const twin = playTwin(folder.scenario, { logName: 'no-action' });
  const results = [1, 2, 3, 4].map((i) => twinResult(twin, `ferngate-l3-twin-${i}`));
  const median = (values: number[]) => {
    const sorted = [...values].sort((a, b) => a - b);
    return ((sorted[1] as number) + (sorted[2] as number)) / 2;
  };

  it('compares over the hardening phase with enough samples', () => {
    for (const result of results) expect(result.count).toBeGreaterThan(40);
  });

  it('calibrated surface-stress RMSE is at most half that of the prior (median of four runs)', () => {
    expect(median(results.map((r) => r.rmseRatio))).toBeLessThanOrEqual(0.5);
  });

  it('the 90 % band covers the truth at least 80 % of the time (mean of four runs)', () => {
    const mean = results.reduce((sum, r) => sum + r.coverage, 0) / results.length;
    expect(mean).toBeGreaterThanOrEqual(0.8);
  });

  // Every run of the four meets both targets, but not every seed: a known gap for the method,
  // measured honestly. With the engine's held water (refinement and temperature change the curves
  // without moving the pressures; each step keeps the water the cells hold) runs 1-4 give ratios
  // 0.451, 0.473, 0.376, 0.309 and coverages 0.98 each; over 22 seeds 18 meet both (misses on the
  // ratio in runs 7, 9, 10, 20 at 0.58 to 0.70), and the floor with the hidden parameters is
  // 0.0073 MPa. Since the bleed-film fix (a film step may use only the water the film holds;
  // before, a film clamped at zero gave the body water from nowhere) and before the held water:
  // 0.451, 0.467, 0.372, 0.302, and 17 of 22 (runs 7, 9, 10, 14, 20 at 0.50 to 0.69). The history
  // below is of the engine before the bleed-film fix. With the simulators' thermal fix (b890b20: a depth follows the surface with
  // d^2/alpha, 36 s at 5 mm, instead of trailing it by some 35 min) and the probes' RH biases
  // kept out of RTPS (engineOptions.ts), runs 1-4 give ratios 0.339, 0.439, 0.413, 0.323 and
  // coverages 0.98, 0.98, 0.83, 0.83. Over 22 seeds (offline, this replay, `npx tsx
  // test/live/twinSeeds.ts 1-22`): both targets in 20 runs; run 10 misses the ratio by a hair
  // (0.504), run 13 by far (ratio 1.08, coverage 0.66). With the biases relaxed like the other
  // parameters (`rtpsOnBiases: true`, the engine before this change): 17 of 22 (ratios 0.388,
  // 0.471, 0.514, 0.337 in runs 1-4; misses 3, 9, 10, 20 near the line, 13 at 0.80 and 0.71);
  // that and no exposure walk: 18 of 22; observation error 0.5 %RH: worse (10 misses in 15
  // runs), stopped there.
  // The model is not the limit: with the truth's hidden parameters in every member and the
  // same readings the engine misses the truth's stress by 0.0069 MPa RMSE (the floor twinSeeds.ts
  // prints; 0.024 MPa before the thermal fix), the calibrated runs by 0.014 to 0.066 MPa. Set
  // and early hardening are not the cause either: the 60-cell model beside the 120-cell truth on
  // the truth's own inputs and parameters sets at 197 against 198 min and stays within 0.001 MPa
  // of its stress for 10 h; on the three probe temperatures alone it sets at 196 min and runs
  // 0.001-0.019 MPa above it; in the live engine with the hidden parameters it is within
  // 0.0065 MPa for the first 100 min after set (the earlier lag of the truth's stress was the
  // thermal field's).
  // What limits the calibration: the probes see little of the drying. By the evening the 5 mm
  // probe's RH has fallen from 100 to about 98.5 %, the 35 mm one to about 99.0 %, against an
  // observation error of 1 %RH; with the biases relaxed their posteriors were still 0.2-0.3 %RH
  // wide at set (run 13: rh-05 0.68 +- 0.29 against the hidden 0.8) and the filter traded them
  // against the drying; out of RTPS they are 0.13-0.16 %RH wide at set (rh-05 0.76 +- 0.15). The permeability stays unidentified (90 % intervals about 0.3 to 10)
  // and the exposure multiplier drifts up through the dry-wind afternoon (means 1.2-1.8 against
  // the hidden 1.1). From the evening shower (445 to 470 min after placement) such members dry
  // again faster than the truth while the prior follows it (run 13: every band miss from 450 to
  // 520 min). Run 13 also misses 200-230 min: its plastic-phase analyses move the members'
  // surface suction (prior members 90-420 kPa at 195 min) to about 0 just before set, so the
  // stress reference is recorded at 0 suction, the median stays near 0 until 210 min and then
  // overshoots (0.028 against 0.016 MPa at 215 min); the probes, above 99.9 %RH, cannot resolve
  // that suction (Kelvin). Not updating the state before set (`plasticPhaseUpdates: 'biases'`)
  // did worse over 22 seeds (17 of 22; run 13 still 1.03).
  // Tried before the thermal fix without a consistent gain: observation error 0.7 and 1.5 %RH,
  // RTPS 0.6 and 0.9, multiplicative inflation 1.02, a 15-min cadence, depth localisation
  // (15 mm), parameters-only updates, walks of 0.05 to 0.3 per sqrt(h), the plastic-phase switch
  // on the surface's set, parameters updated before set too, 48 and 64 members, and an offline
  // ES-MDA sketch over fixed 30 and 60 min windows (ratios 0.58 to 0.93 in runs 1-4).
  it('every run meets both targets (ratio <= 0.5, coverage >= 0.8)', () => {
    for (const result of results) {
      expect(result.rmseRatio).toBeLessThanOrEqual(0.5);
      expect(result.coverage).toBeGreaterThanOrEqual(0.8);
    }
  });

  it('recovers the probe biases within 0.5 %RH in every run (stated tolerance, our assumption)', () => {
    for (const result of results) {
      for (const probe of folder.scenario.probeStrings) {
        for (const sensor of probe.sensors.filter((s) => s.quantity === 'rh')) {
          const bias = result.last?.calibration.find(
            (entry) => entry.name === `rhBias:${probe.device}/${sensor.sensor}`,
          );
          expect(Math.abs((bias?.mean ?? Number.NaN) - sensor.bias / 100)).toBeLessThanOrEqual(
            0.005,
          );
        }
      }
    }
  });

  it.each([
    { name: 'evaporationExposureMultiplier', hidden: 1.1 },
    { name: 'permeabilityMultiplier', hidden: 1.3 },
  ])('the $name 90 % interval holds the hidden $hidden in every run', ({ name, hidden }) => {
    for (const result of results) {
      const entry = result.last?.calibration.find((c) => c.name === name);
      expect(entry?.p05).toBeLessThanOrEqual(hidden);
      expect(entry?.p95).toBeGreaterThanOrEqual(hidden);
    }
  });
});
