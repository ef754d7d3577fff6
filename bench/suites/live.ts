/**
 * Cost of the live engine (issue 6). One cycle of a run at the defaults (32 members, 60 cells):
 * the 5-minute forecast of every member, one assimilation of the probe humidities, a 6 h
 * outlook of every member (output every 10 min) and the RunState; the baseline is 32
 * single-member forward runs of the same length (5 min + 6 h, in the outlook's 10-minute input
 * steps, from the same member states, under the outlook's persistence inputs, without
 * evaluation or statistics), so the ratio is the
 * overhead of calibration, figures and statistics over the bare model. Runs one core keeps
 * current = 300 s / cost of one cycle (outlook every cycle; with an outlook every second cycle
 * the count is reported too). The readings are those of the simulators' level3-topping
 * scenario (no action), 3 h after placement, the afternoon the margin closes.
 */
import { createRunEngine } from '../../server/src/live/index.ts';
import type { RunEngineSnapshot } from '../../server/src/live/index.ts';
import { createRunModel } from '../../server/src/live/runModel.ts';
import type { StreamBuffer } from '../../server/src/live/readingStreams.ts';
import { streamRoles } from '../../server/src/live/streamRoles.ts';
import type { WeatherQuantity } from '../../server/src/live/streamRoles.ts';
import { windowInputs } from '../../server/src/live/windowInputs.ts';
import type { InputSources } from '../../server/src/live/windowInputs.ts';
import { cloneElementState, deserialiseElementState } from '../../server/src/engine/index.ts';
import type { ElementStateSnapshot } from '../../server/src/engine/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { playTwin } from '../../test/live/twinReadings.ts';
import { type BenchFigure, type BenchSuite, ratioFigure } from '../figure.ts';

const MEMBERS = 32;
const CELLS = 60;
const REPETITIONS = 7;

const suite: BenchSuite = async () => {
  const folder = loadScenarioFolder('level3-topping');
  const twin = playTwin(folder.scenario, { logName: 'no-action', durationH: 4.5 });
  const placedMs = Date.parse(folder.runConfig.placedAt);
  const cutMs = placedMs + 3 * 3_600_000;
  const options = { memberCount: MEMBERS, cellCount: CELLS };
  const warm = createRunEngine('bench-live', folder.runConfig, {
    ...options,
    outlookEveryAnalyses: 1000,
  });
  warm.addReadings(twin.readings.filter((r) => r.eventTimeMs <= cutMs));
  warm.advance();
  const snapshot: RunEngineSnapshot = warm.snapshot();
  const next = twin.readings.filter(
    (r) => r.eventTimeMs > cutMs && r.eventTimeMs <= cutMs + 300_000 + 60_000,
  );

  const cycleMs = (outlookEvery: number): number => {
    let best = Number.POSITIVE_INFINITY;
    for (let repetition = 0; repetition < REPETITIONS; repetition += 1) {
      const engine = createRunEngine(
        'bench-live',
        folder.runConfig,
        { ...options, outlookEveryAnalyses: outlookEvery },
        snapshot,
      );
      const start = performance.now();
      engine.addReadings(next);
      const state = engine.advance();
      const ms = performance.now() - start;
      if (
        state === null ||
        (outlookEvery === 1 && state.outlook?.timesMs[0] !== state.eventTimeMs)
      ) {
        throw new Error('bench live: the cycle did not run with its outlook');
      }
      best = Math.min(best, ms);
    }
    return best;
  };

  const { model } = createRunModel(folder.runConfig, CELLS);
  const body = snapshot.body as {
    ensemble: { members: { carried: ElementStateSnapshot }[] };
  };
  const states = body.ensemble.members.map((m) => deserialiseElementState(m.carried, CELLS));
  // The outlook's own persistence inputs: the last hour of the snapshot's readings.
  const streamsJson = (snapshot.body as { streams: Record<string, StreamBuffer> }).streams;
  const roles = streamRoles(folder.runConfig);
  const weather = new Map<WeatherQuantity, StreamBuffer>();
  const probeTemperatures: InputSources['probeTemperatures'][number][] = [];
  for (const role of roles.values()) {
    const stream = streamsJson[role.key];
    if (stream === undefined) continue;
    if (role.kind === 'weather') weather.set(role.quantity, stream);
    else if (role.quantity === 'temperature') probeTemperatures.push({ role, stream });
  }
  probeTemperatures.sort((a, b) => a.role.domainDepthM - b.role.domainDepthM);
  const inputs = windowInputs(
    { weather, probeTemperatures, mastHeightM: 2, measures: [], holdMs: 900_000 },
    cutMs - 3_600_000,
    cutMs,
  ).inputs;
  if (inputs === null) throw new Error('bench live: no persistence inputs');
  const forwardMs = (): number => {
    let best = Number.POSITIVE_INFINITY;
    for (let repetition = 0; repetition < REPETITIONS; repetition += 1) {
      const start = performance.now();
      for (const member of states) {
        const state = cloneElementState(member);
        const fromS = state.transport.timeS;
        model.advanceTo(state, fromS + 300, inputs);
        for (let t = 600; t <= 6 * 3600; t += 600) model.advanceTo(state, fromS + 300 + t, inputs);
      }
      best = Math.min(best, performance.now() - start);
    }
    return best;
  };

  forwardMs();
  cycleMs(1);
  const baseline = forwardMs();
  const full = cycleMs(1);
  const half = cycleMs(2);
  const figures: BenchFigure[] = [
    ratioFigure({
      name: 'live.cycleWithOutlookVsForwardRuns',
      value: full,
      unit: 'ms',
      baseline,
      target: 'ratio <= 1.5',
      met: full / baseline <= 1.5,
      detail: `${MEMBERS} members, ${CELLS} cells: one 5-min cycle (forecast, assimilation of 5 probes, 6 h outlook, state) against ${MEMBERS} forward runs of 6 h 5 min; best of ${REPETITIONS}`,
    }),
    {
      name: 'live.runsKeptCurrentPerCore',
      value: 300_000 / full,
      unit: 'runs',
      baseline: null,
      ratio: null,
      target: '>= 200',
      met: 300_000 / full >= 200,
      detail: `300 s / ${full.toFixed(0)} ms per cycle with an outlook every cycle; with an outlook every second cycle: ${(300_000 / ((full + half) / 2)).toFixed(0)} runs`,
    },
  ];
  return figures;
};

export default suite;
