import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import type { RunState } from '../../server/src/live/types.ts';
import { LiveHost } from '../../server/src/liveHost/liveHost.ts';
import { liveReading } from '../../server/src/liveHost/liveReading.ts';
import { replayRun } from '../../server/src/liveHost/runFeed.ts';
import type { LiveHostOptions } from '../../server/src/liveHost/liveHost.ts';
import type { MeasureStart } from '../../server/src/runs/measureInput.ts';
import { RunLifecycle } from '../../server/src/runs/runLifecycle.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';
import { createFakeRunEngine, madeEngines } from './_fakeRunEngine.ts';

const MINUTE_MS = 60_000;
let dir: string;
const opened: Archive[] = [];

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'meniscus-livehost-'));
  madeEngines.length = 0;
});
afterEach(() => {
  for (const archive of opened.splice(0)) archive.close();
  rmSync(dir, { recursive: true, force: true });
});

interface Rig {
  archive: Archive;
  lifecycle: RunLifecycle;
  host: LiveHost;
  ingestor: Ingestor;
  states: RunState[];
}

/** Logs an open measure of `kind` on run-1 from `minute` minutes after placement. */
function startMeasureAt(
  lifecycle: RunLifecycle,
  kind: MeasureStart['kind'],
  minute: number,
  loggedBy = 'crew lead',
): void {
  lifecycle.startMeasure('run-1', {
    kind,
    startMs: EXAMPLE_PLACED_AT_MS + minute * MINUTE_MS,
    endMs: null,
    loggedBy,
  });
}

function rig(file: string, options: LiveHostOptions = {}): Rig {
  const archive = Archive.open(join(dir, file));
  opened.push(archive);
  const lifecycle = new RunLifecycle(archive, () => EXAMPLE_PLACED_AT_MS);
  const states: RunState[] = [];
  const host = new LiveHost(archive, lifecycle, createFakeRunEngine, {
    snapshotEveryS: 1800,
    onState: (_runId, state) => states.push(state),
    onError: (_runId, error) => {
      throw error;
    },
    ...options,
  });
  host.start();
  const ingestor = new Ingestor(archive, { clock: () => EXAMPLE_PLACED_AT_MS + 24 * 3_600_000 });
  return { archive, lifecycle, host, ingestor, states };
}

/** Minute `minute` after placement: probe-a rh-10 and the weather station's wind. */
async function publishMinute(r: Rig, minute: number): Promise<void> {
  const t = (EXAMPLE_PLACED_AT_MS + minute * MINUTE_MS) / 1000;
  await Promise.all([
    r.ingestor.data(
      'meniscus/harbour-deck/probe-a/data',
      Buffer.from(JSON.stringify([{ bn: 'probe-a/', bt: t, n: 'rh-10', v: 99 - minute / 100 }])),
    ),
    r.ingestor.data(
      'meniscus/harbour-deck/mast-1/data',
      Buffer.from(JSON.stringify([{ bn: 'mast-1/', bt: t, n: 'wind', v: 2 + (minute % 7) / 10 }])),
    ),
  ]);
}

async function publishMinutes(r: Rig, from: number, to: number, step = 5): Promise<void> {
  for (let minute = from; minute < to; minute += step) await publishMinute(r, minute);
}

const createRun = (r: Rig) => r.lifecycle.create(parseRunConfig(exampleRunInput()), 'run-1');
const calibration = (state: RunState | null, name: string) =>
  state?.calibration.find((c) => c.name === name)?.mean;

describe('LiveHost', () => {
  it('feeds committed readings to the run engine after the commit, not before the acknowledgement', async () => {
    const r = rig('a.sqlite');
    createRun(r);
    await publishMinute(r, 0);
    await r.host.idle();
    // The fake consumes readings 10 min behind the newest: minute 10 releases minute 0.
    await publishMinute(r, 10);
    expect(r.states).toHaveLength(0);
    await r.host.idle();
    expect(r.states).toHaveLength(1);
    expect(calibration(r.states[0] ?? null, 'consumed')).toBe(2);
    expect(r.host.state('run-1')?.eventTimeMs).toBe(EXAMPLE_PLACED_AT_MS);
  });

  it('takes a snapshot each time the engine has moved on by the cadence in event time', async () => {
    const r = rig('a.sqlite', { snapshotEveryS: 1800 });
    createRun(r);
    await publishMinutes(r, 0, 135);
    await r.host.idle();
    // Consumed up to minute 120; the first state (minute 0) snapshots, then 30, 60, 90, 120.
    expect(r.host.counters.snapshots).toBe(5);
    expect(r.archive.latestSnapshot('run-1')?.eventTimeMs).toBe(
      EXAMPLE_PLACED_AT_MS + 120 * MINUTE_MS,
    );
  });

  it('after a crash resumes from the last snapshot, replays the readings since, and ends as an uninterrupted twin', async () => {
    const crashed = rig('crashed.sqlite');
    createRun(crashed);
    await publishMinutes(crashed, 0, 100);
    await crashed.host.idle();
    // Consumed up to minute 85, last snapshot at 60: readings 65..95 were fed but are not in it.
    const snapshotAt = crashed.archive.latestSnapshot('run-1');
    expect(snapshotAt?.eventTimeMs).toBe(EXAMPLE_PLACED_AT_MS + 60 * MINUTE_MS);
    expect(snapshotAt?.lastReadingId).toBeGreaterThan(
      crashed.archive.readings('run-1', { toMs: EXAMPLE_PLACED_AT_MS + 61 * MINUTE_MS }).length,
    );
    // The crash: no close(), no final snapshot; the archive file is all that is left.
    crashed.archive.close();

    const restarted = rig('crashed.sqlite');
    await restarted.host.idle();
    expect(madeEngines.at(-1)).toEqual({ runId: 'run-1', resumed: true });
    await publishMinutes(restarted, 100, 150);
    await restarted.host.idle();

    const twin = rig('twin.sqlite');
    createRun(twin);
    await publishMinutes(twin, 0, 150);
    await twin.host.idle();

    const twinState = twin.host.state('run-1');
    expect(calibration(twinState, 'consumed')).toBe(56);
    expect(restarted.host.state('run-1')).toEqual(twinState);
  });

  it('tells the engine the measure log and the forecast, also after a restart', async () => {
    const r = rig('a.sqlite');
    createRun(r);
    startMeasureAt(r.lifecycle, 'wet-covering', 0);
    r.lifecycle.setForecast(
      'run-1',
      [{ timeMs: EXAMPLE_PLACED_AT_MS + 3_600_000, windSpeedMs: 5 }],
      'api',
    );
    expect(calibration(r.host.state('run-1'), 'measures')).toBe(1);
    expect(calibration(r.host.state('run-1'), 'forecastPoints')).toBe(1);
    r.archive.close();
    const again = rig('a.sqlite');
    expect(calibration(again.host.state('run-1'), 'measures')).toBe(1);
    expect(calibration(again.host.state('run-1'), 'forecastPoints')).toBe(1);
  });

  it('gives the engine a measure in its place among the readings, so a replay of the archive reproduces the live state', async () => {
    const r = rig('a.sqlite');
    createRun(r);
    await publishMinutes(r, 0, 30);
    await r.host.idle();
    startMeasureAt(r.lifecycle, 'windbreak', 25);
    await publishMinutes(r, 30, 60);
    await r.host.idle();
    const live = r.host.state('run-1');

    const replayed = createFakeRunEngine('run-1', parseRunConfig(exampleRunInput()));
    replayRun(r.archive, 'run-1', replayed);
    expect(replayed.state()).toEqual(live);

    // Told the whole log first, an engine computes something else: the order matters.
    const toldFirst = createFakeRunEngine('run-1', parseRunConfig(exampleRunInput()));
    toldFirst.setMeasures(r.lifecycle.measures('run-1'));
    toldFirst.addReadings(r.archive.runReadingsAfter('run-1', 0).map(liveReading));
    toldFirst.advance();
    expect(toldFirst.state().surfaceStressMPa).not.toBe(live?.surfaceStressMPa);
  });

  it('a closed run keeps its last state, also when replayed after a restart', async () => {
    const r = rig('a.sqlite');
    createRun(r);
    await publishMinutes(r, 0, 40);
    await r.host.idle();
    r.lifecycle.close('run-1', null, null);
    const final = r.host.state('run-1');
    expect(calibration(final, 'consumed')).toBe(12);
    expect(r.host.health().runs).toBe(0);
    r.archive.close();
    const again = rig('a.sqlite');
    expect(again.host.health().runs).toBe(0);
    expect(again.host.state('run-1')).toEqual(final);
    expect(again.host.state('nope')).toBeNull();
  });

  it('records every state it reaches in the figure history and reports each one in order, also when one catch-up covers many', async () => {
    const advanced: number[] = [];
    const r = rig('a.sqlite', {
      onAdvance: (_runId, state) => advanced.push(state.eventTimeMs ?? Number.NaN),
    });
    createRun(r);
    // Published all at once: the host catches up on many messages in one turn.
    await Promise.all(Array.from({ length: 12 }, (_, i) => publishMinute(r, i * 5)));
    await r.host.idle();
    const history = r.archive.figures.list('run-1');
    expect(r.states.length).toBeLessThan(r.host.counters.advances);
    expect(advanced).toHaveLength(r.host.counters.advances);
    expect(history.map((point) => point.eventTimeMs)).toEqual(advanced);
    expect([...advanced].sort((a, b) => a - b)).toEqual(advanced);
    expect(history.at(-1)).toMatchObject({
      eventTimeMs: r.host.state('run-1')?.eventTimeMs,
      surfaceStressMPa: r.host.state('run-1')?.surfaceStressMPa,
      utilization: null,
    });
  });

  it("after a crash the figure history of the resumed run equals an uninterrupted twin's, and a closed run replays without reporting", async () => {
    const crashed = rig('crashed.sqlite');
    createRun(crashed);
    await publishMinutes(crashed, 0, 100);
    await crashed.host.idle();
    crashed.archive.close();
    const restarted = rig('crashed.sqlite');
    await publishMinutes(restarted, 100, 150);
    await restarted.host.idle();

    const twin = rig('twin.sqlite');
    createRun(twin);
    await publishMinutes(twin, 0, 150);
    await twin.host.idle();
    expect(restarted.archive.figures.list('run-1')).toEqual(twin.archive.figures.list('run-1'));

    twin.lifecycle.close('run-1', null, null);
    twin.archive.close();
    const reported: number[] = [];
    const reopened = rig('twin.sqlite', {
      onAdvance: (_runId, state) => reported.push(state.eventTimeMs ?? Number.NaN),
    });
    expect(reopened.host.state('run-1')?.eventTimeMs).not.toBeNull();
    expect(reported).toEqual([]);
  });

  it('reports with each state the measure log the engine had for it, in record order and after a resume', async () => {
    const seen: { eventTimeMs: number | null; ids: string[]; engineCount: number | undefined }[] =
      [];
    const options: LiveHostOptions = {
      onAdvance: (_runId, state, measures) =>
        seen.push({
          eventTimeMs: state.eventTimeMs,
          ids: measures.map((m) => m.id),
          engineCount: calibration(state, 'measures'),
        }),
    };
    const r = rig('a.sqlite', options);
    createRun(r);
    await publishMinutes(r, 0, 30);
    await r.host.idle();
    const before = seen.length;
    startMeasureAt(r.lifecycle, 'fogging', 20, 'J. Okafor');
    await publishMinutes(r, 30, 70);
    await r.host.idle();
    expect(before).toBeGreaterThan(0);
    expect(seen.slice(0, before).map((s) => s.ids)).toEqual(Array(before).fill([]));
    expect(seen.slice(before).map((s) => s.ids)).toEqual(Array(seen.length - before).fill(['m1']));
    // what is reported is what the engine was given (the stand-in counts its measures)
    for (const s of seen) expect(s.ids).toHaveLength(s.engineCount ?? -1);
    r.archive.close(); // a crash: the restart resumes from the last snapshot
    seen.length = 0;
    const restarted = rig('a.sqlite', options);
    await publishMinutes(restarted, 70, 100);
    await restarted.host.idle();
    expect(seen.at(-1)?.ids).toEqual(['m1']);
    for (const s of seen) expect(s.ids).toHaveLength(s.engineCount ?? -1);
  });

  it('close() snapshots every open engine so a clean restart replays nothing', async () => {
    const r = rig('a.sqlite');
    createRun(r);
    await publishMinutes(r, 0, 20);
    r.host.close();
    const lastId = r.archive.runReadingsAfter('run-1', 0).at(-1)?.id;
    expect(r.archive.latestSnapshot('run-1')?.lastReadingId).toBe(lastId);
  });
});
