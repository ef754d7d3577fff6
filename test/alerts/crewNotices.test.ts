/**
 * Crew notices end to end on a real archive file and the real live host: states in, notices
 * stored with their deliveries, and a crash and restart that replays the states since the
 * engine's last snapshot without raising any notice twice.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pino } from 'pino';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CrewNotices } from '../../server/src/alerts/crewNotices.ts';
import { logChannel } from '../../server/src/alerts/channels/logChannel.ts';
import type { Notice } from '../../server/src/alerts/types.ts';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import type { CreateRunEngine, RunState } from '../../server/src/live/types.ts';
import { LiveHost } from '../../server/src/liveHost/liveHost.ts';
import type { MeasureStart } from '../../server/src/runs/measureInput.ts';
import { RunLifecycle } from '../../server/src/runs/runLifecycle.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';
import { createFakeRunEngine } from '../liveHost/_fakeRunEngine.ts';
import { MIN, outlookAt } from './_runStates.ts';

let dir: string;
const opened: { archive: Archive; notices: CrewNotices }[] = [];
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'meniscus-notices-'));
});
afterEach(async () => {
  for (const { archive, notices } of opened.splice(0)) {
    await notices.close();
    archive.close();
  }
  rmSync(dir, { recursive: true, force: true });
});

/**
 * The host's stand-in engine (test/liveHost/_fakeRunEngine.ts) with figures scripted in event
 * time: utilization climbs 0.1 per 10 min from placement to 1.2 at 120 min, then falls back, and
 * the outlook sees the climb coming. A replay therefore reaches the same figures at the same
 * event times, as the real engine does (DEVELOPERS.md, "Event time, not wall clock").
 */
const scriptedEngine: CreateRunEngine = (runId, config, options, snapshot) => {
  const inner = createFakeRunEngine(runId, config, options, snapshot);
  const withFigures = (state: RunState): RunState => {
    if (state.eventTimeMs === null) return state;
    const minutes = (state.eventTimeMs - EXAMPLE_PLACED_AT_MS) / MIN;
    const utilization = minutes <= 120 ? minutes / 100 : Math.max(0.1, 1.2 - (minutes - 120) / 50);
    const closingInMin = minutes < 100 ? 100 - minutes : null;
    return {
      ...state,
      phase: 'hardening',
      utilization,
      marginMPa: 0.5 * (1 - utilization),
      evaporationKgM2h: 0.4,
      outlook: outlookAt(state.eventTimeMs, {
        probability: minutes < 110 ? 0.9 : 0,
        closingInMin,
      }),
      quality: { degraded: false, flags: [] },
    };
  };
  return {
    ...inner,
    advance: () => {
      const state = inner.advance();
      return state === null ? null : withFigures(state);
    },
    state: () => withFigures(inner.state()),
  };
};

interface Rig {
  archive: Archive;
  lifecycle: RunLifecycle;
  host: LiveHost;
  ingestor: Ingestor;
  notices: CrewNotices;
  logged: string[];
  announced: Notice[];
}

/** Logs an open measure of `kind` on run-1 from `minute` minutes after placement. */
function startMeasureAt(
  lifecycle: RunLifecycle,
  kind: MeasureStart['kind'],
  minute: number,
  loggedBy = 'J. Okafor',
): void {
  lifecycle.startMeasure('run-1', {
    kind,
    startMs: EXAMPLE_PLACED_AT_MS + minute * MIN,
    endMs: null,
    loggedBy,
  });
}

function rig(file: string): Rig {
  const archive = Archive.open(join(dir, file));
  const logged: string[] = [];
  const announced: Notice[] = [];
  const logger = pino({ level: 'info' }, { write: (line: string) => logged.push(line) });
  const notices = new CrewNotices(archive, {
    channels: [logChannel(logger)],
    onNotice: (notice) => announced.push(notice),
    onError: (_runId, error) => {
      throw error;
    },
  });
  opened.push({ archive, notices });
  const lifecycle = new RunLifecycle(archive, () => EXAMPLE_PLACED_AT_MS);
  notices.watchMeasures(lifecycle);
  const host = new LiveHost(archive, lifecycle, scriptedEngine, {
    snapshotEveryS: 1800,
    onAdvance: (runId, state, measures) => notices.onState(runId, state, measures),
  });
  host.start();
  const ingestor = new Ingestor(archive, { clock: () => EXAMPLE_PLACED_AT_MS + 24 * 3_600_000 });
  return { archive, lifecycle, host, ingestor, notices, logged, announced };
}

async function publishMinutes(r: Rig, from: number, to: number): Promise<void> {
  for (let minute = from; minute < to; minute += 5) {
    const t = (EXAMPLE_PLACED_AT_MS + minute * MIN) / 1000;
    await r.ingestor.data(
      'meniscus/harbour-deck/probe-a/data',
      Buffer.from(JSON.stringify([{ bn: 'probe-a/', bt: t, n: 'rh-10', v: 95 }])),
    );
  }
}

const createRun = (r: Rig) =>
  r.lifecycle.create(parseRunConfig({ ...exampleRunInput(), leadTimeMin: 60 }), 'run-1');
const summary = (notices: readonly Notice[]) =>
  notices.map(
    (n) =>
      `${n.seq} ${(n.raisedAtMs - EXAMPLE_PLACED_AT_MS) / MIN} ${n.level} ${n.kind}${n.repeat ? ' repeat' : ''}`,
  );

describe('CrewNotices', () => {
  it('onState() stores each notice with a delivery per channel, announces it, and the outbox sends it', async () => {
    const r = rig('one.sqlite');
    createRun(r);
    await publishMinutes(r, 0, 200);
    await r.host.idle();
    await r.notices.outbox.flush();
    const notices = r.notices.list('run-1');
    // lead time 60 min: ACT NOW when the closing is 60 min ahead (minute 40), CRACKING LIKELY
    // 15 min ahead (85), a first repeat 30 min later unacknowledged, eased 30 min after U < 0.95 (135)
    expect(summary([...notices].reverse())).toEqual([
      '1 0 PREPARE margin-outlook',
      '2 40 ACT NOW margin-outlook',
      '3 70 ACT NOW margin-outlook repeat',
      '4 85 CRACKING LIKELY margin-outlook',
      '5 115 CRACKING LIKELY utilization repeat',
      '6 165 NOTE eased',
    ]);
    expect(r.announced.map((n) => n.id)).toEqual([...notices].reverse().map((n) => n.id));
    for (const notice of notices) {
      expect(notice.id).toBe(`n-run-1-${notice.seq}`);
      expect(notice.deliveries).toMatchObject([
        { channel: 'log', recipient: 'log', status: 'sent', attempts: 1 },
      ]);
    }
    expect(r.logged.filter((line) => line.includes('"noticeId"'))).toHaveLength(notices.length);
    // every text reads as sentences: no clause left empty before its full stop
    for (const notice of notices) expect(notice.text).not.toMatch(/:\s*\./);
  });

  it('after a crash and restart the replay of the states since the last snapshot raises nothing twice, and the run goes on as an uninterrupted twin', async () => {
    const crashed = rig('crashed.sqlite');
    createRun(crashed);
    await publishMinutes(crashed, 0, 100);
    await crashed.host.idle();
    const before = crashed.notices.list('run-1');
    expect(summary(before).at(0)).toBe('4 85 CRACKING LIKELY margin-outlook');
    // the engine's last snapshot is older than the last notice: the restart replays past it
    expect(crashed.archive.latestSnapshot('run-1')?.eventTimeMs).toBeLessThan(
      before[0]?.raisedAtMs ?? 0,
    );
    crashed.archive.close(); // the crash: no close() of the host or the notices

    const restarted = rig('crashed.sqlite');
    await restarted.host.idle();
    expect(restarted.announced).toEqual([]);
    expect(restarted.notices.list('run-1')).toHaveLength(before.length);
    await publishMinutes(restarted, 100, 200);
    await restarted.host.idle();

    const twin = rig('twin.sqlite');
    createRun(twin);
    await publishMinutes(twin, 0, 200);
    await twin.host.idle();
    const strip = (notices: Notice[]) => notices.map(({ deliveries: _d, ...rest }) => rest);
    expect(strip(restarted.notices.list('run-1'))).toEqual(strip(twin.notices.list('run-1')));
  });

  it('acknowledge() records who and when, announces it, and stops the repeats', async () => {
    const r = rig('ack.sqlite');
    createRun(r);
    await publishMinutes(r, 0, 60);
    await r.host.idle();
    const actNow = r.notices.list('run-1').find((n) => n.level === 'ACT NOW');
    expect(actNow).toBeDefined();
    const acked = r.notices.acknowledge('run-1', actNow?.id ?? '', 'J. Okafor');
    expect(acked).toMatchObject({
      acknowledgedBy: 'J. Okafor',
      acknowledgedAtMs: expect.any(Number),
    });
    expect(r.announced.at(-1)).toEqual(acked);
    // a second acknowledgement changes nothing
    expect(r.notices.acknowledge('run-1', actNow?.id ?? '', 'someone else')?.acknowledgedBy).toBe(
      'J. Okafor',
    );
    await publishMinutes(r, 60, 85);
    await r.host.idle();
    expect(r.notices.list('run-1').filter((n) => n.repeat)).toEqual([]);
    expect(r.notices.acknowledge('run-1', 'n-run-1-99', 'x')).toBeNull();
  });

  it("a warning's stored text names the measures the engine counted at its time, and only those", async () => {
    const r = rig('counted.sqlite');
    createRun(r);
    await publishMinutes(r, 0, 30);
    await r.host.idle();
    startMeasureAt(r.lifecycle, 'windbreak', 20);
    await publishMinutes(r, 30, 100);
    await r.host.idle();
    const warnings = r.notices.list('run-1').filter((n) => n.kind === 'margin-outlook');
    const at = (minute: number) =>
      warnings.find((n) => n.raisedAtMs === EXAMPLE_PLACED_AT_MS + minute * MIN);
    const logged = 'A windbreak is logged since 11:40 and is counted in this forecast.';
    // the PREPARE at placement came before the windbreak
    expect(at(0)?.text).not.toContain('windbreak is logged');
    expect(at(0)?.text).toContain('keep windbreaks and shade up');
    // the ACT NOW at minute 40 (lead time 60 min) came after it: named, not advised again
    expect(at(40)?.title).toMatch(/^ACT NOW: add curing protection/);
    expect(at(40)?.text).toContain(logged);
    expect(at(40)?.text).toContain('Keep the windbreak going.');
    expect(at(40)?.text).not.toContain('put up windbreaks');
    expect(at(40)?.text).not.toContain('keep windbreaks and shade up');
  });

  it('notes each measure of the log once, at its start, also after a restart', async () => {
    const r = rig('measures.sqlite');
    createRun(r);
    await publishMinutes(r, 0, 30);
    await r.host.idle();
    startMeasureAt(r.lifecycle, 'fogging', 20);
    r.lifecycle.endMeasure('run-1', 'm1', EXAMPLE_PLACED_AT_MS + 90 * MIN, 'J. Okafor');
    const noted = r.notices.list('run-1').filter((n) => n.kind === 'measure-logged');
    expect(noted.map((n) => [n.level, n.raisedAtMs, n.title])).toEqual([
      [
        'NOTE',
        EXAMPLE_PLACED_AT_MS + 20 * MIN,
        'NOTE: measure logged - fogging from 11:40, logged by J. Okafor',
      ],
    ]);
    r.archive.close();
    const restarted = rig('measures.sqlite');
    startMeasureAt(restarted.lifecycle, 'windbreak', 40);
    expect(
      restarted.notices
        .list('run-1')
        .filter((n) => n.kind === 'measure-logged')
        .map((n) => n.conditionKey),
    ).toEqual(['measure:m2', 'measure:m1']);
  });
});
