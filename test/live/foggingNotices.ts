/**
 * Script (not a test): `npx tsx test/live/foggingNotices.ts [first-last] [options JSON]
 * [member film kg/m2]` replays the level3-topping twin with the measure log "fogging" for run
 * ids `ferngate-l3-fog-<n>` (foggingReplay.ts: each measure handed to the engine when it starts,
 * states through the crew-notice rules) and prints the margin's notices, marking the ACT NOW
 * and CRACKING LIKELY raised once the measures are counted (13:15). With a film, every member
 * starts from that initial bleed film instead of the prior's draws (the truth's is 0.7 kg/m2).
 * About 6 s per run on one core.
 */
import type { RunEngineOptions } from '../../server/src/live/index.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { replayFogging } from './foggingReplay.ts';
import { playTwin } from './twinReadings.ts';

const folder = loadScenarioFolder('level3-topping');
const [first, last] = (process.argv[2] ?? '1-8').split('-').map(Number) as [number, number];
const engineOptions = JSON.parse(process.argv[3] ?? '{}') as RunEngineOptions;
const film = process.argv[4] === undefined ? undefined : Number(process.argv[4]);
const settledMs = Date.parse('2026-07-16T13:15:00+02:00');
/** Local clock of the scenario (UTC+2). */
const clock = (ms: number) => new Date(ms + 2 * 3_600_000).toISOString().slice(11, 16);

const twin = playTwin(folder.scenario, { logName: 'fogging', durationH: 5 });
const truthPeak = Math.max(...twin.truth.map((sample) => sample.utilization));
console.log(`truth with the measures: highest utilization ${truthPeak.toFixed(3)}`);
let runsWarned = 0;
for (let n = first; n <= last; n += 1) {
  const runId = `ferngate-l3-fog-${n}`;
  const { marginNotices } = replayFogging(twin, folder.runConfig, runId, {
    engineOptions,
    ...(film === undefined ? {} : { memberInitialFilmKgM2: film }),
  });
  console.log(runId);
  let warned = false;
  for (const notice of marginNotices) {
    const late =
      notice.raisedAtMs >= settledMs &&
      (notice.level === 'ACT NOW' || notice.level === 'CRACKING LIKELY');
    warned ||= late;
    const closing = notice.expectedClosingMs === null ? '-' : clock(notice.expectedClosingMs);
    console.log(
      `  ${clock(notice.raisedAtMs)} ${notice.level}${notice.repeat ? ' (repeat)' : ''} ${notice.kind}; ` +
        `U now ${notice.utilization?.toFixed(2)} (${notice.phase}); outlook closes at ${closing}, ` +
        `p ${notice.closingProbability?.toFixed(2)}${late ? '   <-- after the measures' : ''}`,
    );
  }
  if (warned) runsWarned += 1;
}
console.log(
  `${runsWarned} of ${last - first + 1} runs raise ACT NOW or CRACKING LIKELY about the margin after 13:15`,
);
