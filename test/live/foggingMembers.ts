/**
 * Script (not a test): `npx tsx test/live/foggingMembers.ts <n> <HH:MM> [HH:MM ...]` replays the
 * level3-topping twin with the measure log "fogging" for run id `ferngate-l3-fog-<n>`
 * (foggingReplay.ts) and, at each given event time (a multiple of 5 min after 11:15), runs the
 * outlook's members again from the engine's snapshot with the engine's own inputs (persistence
 * of the last hour, the logged measures active at each output time), printing the inputs, the
 * measures the outlook applies, and per member its exposure and permeability multipliers and
 * curing efficiency, when it sets and crosses U = 1, and every 20 min the phase, utilization,
 * surface suction, surface stress and tensile strength, bleed film and the equivalent ages of
 * the surface and of the setting depth. Then the truth's phase and utilization.
 */
import type { BoundaryInputs, ElementStateSnapshot } from '../../server/src/engine/index.ts';
import {
  cloneElementState,
  deserialiseElementState,
  evaluateElement,
} from '../../server/src/engine/index.ts';
import { streamsFromJson } from '../../server/src/live/engineBody.ts';
import type { EngineBody } from '../../server/src/live/engineBody.ts';
import { toCuringMeasures } from '../../server/src/live/measureLog.ts';
import { forecastInputs, outlookOffsetsS } from '../../server/src/live/outlook.ts';
import type { OutlookRequest } from '../../server/src/live/outlook.ts';
import type { StreamBuffer } from '../../server/src/live/readingStreams.ts';
import { createRunModel } from '../../server/src/live/runModel.ts';
import { streamRoles } from '../../server/src/live/streamRoles.ts';
import type { ProbeRole, WeatherQuantity } from '../../server/src/live/streamRoles.ts';
import { windowInputs } from '../../server/src/live/windowInputs.ts';
import type { RunEngine } from '../../server/src/live/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { replayFogging } from './foggingReplay.ts';
import { playTwin } from './twinReadings.ts';

const folder = loadScenarioFolder('level3-topping');
const config = folder.runConfig;
const runId = `ferngate-l3-fog-${process.argv[2] ?? '1'}`;
const stopsMs = process.argv.slice(3).map((time) => Date.parse(`2026-07-16T${time}:00+02:00`));
const clock = (ms: number) => new Date(ms + 2 * 3_600_000).toISOString().slice(11, 16);
const fixed = (value: number, digits = 2) =>
  Number.isFinite(value) ? value.toFixed(digits) : 'NaN';
const placedMs = Date.parse(config.placedAt);
const { model } = createRunModel(config, 60);
const roles = streamRoles(config);
const twin = playTwin(folder.scenario, { logName: 'fogging', durationH: 6, sampleEveryS: 600 });

/** The outlook's members again from the engine's snapshot at its event time. */
function printMembers(engine: RunEngine): void {
  const snapshot = engine.snapshot();
  const body = snapshot.body as EngineBody;
  const startMs = snapshot.eventTimeMs as number;
  const streams = streamsFromJson(body.streams);
  const weather = new Map<WeatherQuantity, StreamBuffer>();
  const temperatures: { role: ProbeRole; stream: StreamBuffer }[] = [];
  for (const role of roles.values()) {
    const stream = streams.get(role.key) as StreamBuffer;
    if (role.kind === 'weather') weather.set(role.quantity, stream);
    else if (role.quantity === 'temperature') temperatures.push({ role, stream });
  }
  temperatures.sort((a, b) => a.role.domainDepthM - b.role.domainDepthM);
  const measures = toCuringMeasures(body.measures);
  const sources = {
    weather,
    probeTemperatures: temperatures,
    mastHeightM: config.weather.mastHeightM,
    measures,
    holdMs: 900_000,
  };
  // As runEngine.ts: persistence of the last hour (default window), without its measures.
  const persistence = windowInputs(sources, startMs - 3_600_000, startMs).inputs as BoundaryInputs;
  const { activeMeasures: _measuresNow, ...persistenceWithoutMeasures } = persistence;
  void _measuresNow;
  const request: OutlookRequest = {
    model,
    members: [],
    placedMs,
    startMs,
    horizonS: 6 * 3600,
    stepS: 600,
    persistence: persistenceWithoutMeasures,
    forecast: [],
    mastHeightM: config.weather.mastHeightM,
    measures,
    thresholds: config.thresholds.utilization,
  };
  const offsetsS = outlookOffsetsS(request.horizonS, request.stepS);
  const inputs = offsetsS.map((offsetS) => forecastInputs(request, startMs + offsetS * 1000));
  const state = engine.state();
  const closing = state.outlook?.crossings.find((crossing) => crossing.threshold === 1);
  console.log(
    `${runId} at ${clock(startMs)}: U now ${fixed(state.utilization ?? Number.NaN)} (${state.phase}); ` +
      `outlook closes at ${closing?.medianTimeMs == null ? '-' : clock(closing.medianTimeMs)}, p ${fixed(closing?.probability ?? Number.NaN)}`,
  );
  console.log(
    `  persistence: air ${fixed(persistence.airTemperatureK - 273.15, 1)} C, RH ${fixed(persistence.relativeHumidity)}, ` +
      `wind at 0.5 m ${fixed(persistence.windMS)} m/s, surface ${fixed(persistence.surfaceTemperatureK - 273.15, 1)} C`,
  );
  const measuresAt = (j: number) =>
    (inputs[j]?.activeMeasures ?? [])
      .map((m) => `${m.kind}${m.endMs === undefined ? '' : ` to ${clock(m.endMs)}`}`)
      .join(' + ') || 'none';
  console.log(
    `  measures in the outlook at +0, +1 h, +3 h, +6 h: ${[0, 6, 18, offsetsS.length - 1].map(measuresAt).join(' | ')}`,
  );
  const members = (body.ensemble as unknown as { members: { carried: ElementStateSnapshot }[] })
    .members;
  members.forEach((member, index) => {
    const state0 = deserialiseElementState(member.carried, model.grid.cellCount);
    const memberState = cloneElementState(state0);
    const lines: string[] = [];
    let setMs: number | null = null;
    let crossMs: number | null = null;
    offsetsS.forEach((offsetS, j) => {
      if (j > 0) {
        model.advanceTo(
          memberState,
          (startMs - placedMs) / 1000 + offsetS,
          inputs[j - 1] as BoundaryInputs,
        );
      }
      const figures = evaluateElement(model, memberState);
      const timeMs = startMs + offsetS * 1000;
      if (setMs === null && figures.phase === 'hardening') setMs = timeMs;
      if (crossMs === null && figures.utilization >= 1) crossMs = timeMs;
      if (j % 2 === 0 && j <= 12) {
        lines.push(
          `${clock(timeMs)} ${figures.phase} U ${fixed(figures.utilization)} ` +
            `suction ${fixed(-figures.surfaceLiquidPressurePa / 1000, 1)} kPa ` +
            `stress ${fixed(figures.surfaceStressPa / 1e6, 3)} strength ${fixed(figures.surfaceTensileStrengthPa / 1e6, 3)} MPa ` +
            `film ${fixed(figures.bleedFilmKgM2, 3)} kg/m2 ` +
            `age ${fixed((memberState.equivalentAgeS[0] ?? 0) / 3600, 1)} h (setting depth ${fixed((memberState.equivalentAgeS[model.settingCell] ?? 0) / 3600, 1)} h)`,
        );
      }
    });
    const p = state0.parameters;
    console.log(
      `  member ${index}: exposure ${fixed(p.exposureMultiplier)}, permeability ${fixed(p.permeabilityMultiplier)}, ` +
        `curing efficiency ${p.curingEfficiency === null ? '-' : fixed(p.curingEfficiency)}; ` +
        `sets ${setMs === null ? '-' : clock(setMs)}, crosses U = 1 ${crossMs === null ? 'never' : clock(crossMs)}`,
    );
    for (const line of lines) console.log(`      ${line}`);
  });
  const truth = twin.truth.filter((sample) => sample.timeMs >= startMs);
  console.log(
    `  truth: ${truth
      .slice(0, 13)
      .map((s) => `${clock(s.timeMs)} ${s.phase} U ${fixed(s.utilization)}`)
      .join(', ')}`,
  );
}

replayFogging(twin, config, runId, {
  onState: (engine, state) => {
    if (state.eventTimeMs !== null && stopsMs.includes(state.eventTimeMs)) printMembers(engine);
  },
});
