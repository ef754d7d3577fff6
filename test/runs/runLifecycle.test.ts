import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { RunError } from '../../server/src/runs/runErrors.ts';
import { RunLifecycle } from '../../server/src/runs/runLifecycle.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';

const HOUR_MS = 3_600_000;
let archive: Archive;
let nowMs: number;
let lifecycle: RunLifecycle;

beforeEach(() => {
  archive = Archive.open(':memory:');
  nowMs = EXAMPLE_PLACED_AT_MS;
  lifecycle = new RunLifecycle(archive, () => nowMs);
});
afterEach(() => archive.close());

const create = () => lifecycle.create(parseRunConfig(exampleRunInput()), 'run-1');
const wetCovering = (startMs: number) => ({
  kind: 'wet-covering' as const,
  startMs,
  endMs: null,
  loggedBy: 'crew lead',
});

function publish(ingestor: Ingestor, eventMs: number, value: number) {
  return ingestor.data(
    'meniscus/harbour-deck/probe-a/data',
    Buffer.from(JSON.stringify([{ bn: 'probe-a/', bt: eventMs / 1000, n: 'rh-10', v: value }])),
  );
}

function refusal(action: () => unknown): RunError {
  try {
    action();
  } catch (error) {
    if (error instanceof RunError) return error;
    throw error;
  }
  throw new Error('expected a RunError');
}

describe('RunLifecycle', () => {
  it('create() opens the run at once and tells its listeners', () => {
    const created: string[] = [];
    lifecycle.listen({ runCreated: (run) => created.push(run.id) });
    const run = create();
    expect(run.closedAtMs).toBeNull();
    expect(created).toEqual(['run-1']);
    expect(archive.bindingsFor('harbour-deck', 'probe-a').map((b) => b.runId)).toEqual(['run-1']);
  });

  it('close() records who closed it, then refuses a second close with 409', () => {
    create();
    nowMs += 24 * HOUR_MS;
    const closed = lifecycle.close('run-1', 'site engineer', 'end of the watch');
    expect(closed.closedAtMs).toBe(nowMs);
    expect(archive.events('run-1', ['run-closed'])).toEqual([
      {
        id: expect.any(Number),
        atMs: nowMs,
        kind: 'run-closed',
        detail: { closedBy: 'site engineer', note: 'end of the watch' },
      },
    ]);
    const again = refusal(() => lifecycle.close('run-1', null, null));
    expect(again.status).toBe(409);
    expect(again.message).toMatch(/closed at .* read-only, closing again refused/);
  });

  it('an unknown run is a 404 for every operation', () => {
    for (const action of [
      () => lifecycle.get('nope'),
      () => lifecycle.close('nope', null, null),
      () => lifecycle.measures('nope'),
      () => lifecycle.startMeasure('nope', wetCovering(nowMs)),
      () => lifecycle.forecast('nope'),
    ]) {
      expect(refusal(action).status).toBe(404);
    }
  });

  it('the measure log numbers measures m1, m2 and keeps who ended each', () => {
    create();
    const changes: number[] = [];
    lifecycle.listen({ measuresChanged: (_id, measures) => changes.push(measures.length) });
    lifecycle.startMeasure('run-1', wetCovering(nowMs + HOUR_MS));
    lifecycle.startMeasure('run-1', { ...wetCovering(nowMs + 2 * HOUR_MS), kind: 'windbreak' });
    const ended = lifecycle.endMeasure('run-1', 'm1', nowMs + 3 * HOUR_MS, 'foreman');
    expect(ended).toMatchObject({ id: 'm1', endMs: nowMs + 3 * HOUR_MS, endedBy: 'foreman' });
    expect(lifecycle.measureLog('run-1').map((m) => [m.id, m.kind, m.endMs, m.endedBy])).toEqual([
      ['m1', 'wet-covering', nowMs + 3 * HOUR_MS, 'foreman'],
      ['m2', 'windbreak', null, null],
    ]);
    // The engine's entries carry no endedBy.
    expect(Object.keys(lifecycle.measures('run-1')[0] ?? {})).not.toContain('endedBy');
    expect(changes).toEqual([1, 2, 2]);
  });

  it('ending a measure twice, before its start, or an unknown one is refused', () => {
    create();
    lifecycle.startMeasure('run-1', wetCovering(nowMs + HOUR_MS));
    expect(refusal(() => lifecycle.endMeasure('run-1', 'm1', nowMs, 'x')).status).toBe(409);
    lifecycle.endMeasure('run-1', 'm1', nowMs + 2 * HOUR_MS, 'x');
    const twice = refusal(() => lifecycle.endMeasure('run-1', 'm1', nowMs + 3 * HOUR_MS, 'x'));
    expect(twice.status).toBe(409);
    expect(twice.message).toMatch(/measure m1 already ended at/);
    expect(refusal(() => lifecycle.endMeasure('run-1', 'm9', nowMs, 'x')).status).toBe(404);
  });

  it("measures and forecasts are events in the run's append-only record order", () => {
    create();
    lifecycle.startMeasure('run-1', wetCovering(nowMs));
    lifecycle.setForecast('run-1', [{ timeMs: nowMs + HOUR_MS, windSpeedMs: 3 }], 'api');
    const kinds = archive.records('run-1').map((r) => r.kind);
    expect(kinds).toEqual(['config', 'event', 'event']);
    expect(archive.events('run-1').map((e) => e.kind)).toEqual(['measure-started', 'forecast']);
    expect(lifecycle.forecast('run-1')).toEqual([{ timeMs: nowMs + HOUR_MS, windSpeedMs: 3 }]);
  });

  it('a closed run refuses measures, measure ends and forecasts with 409', () => {
    create();
    lifecycle.startMeasure('run-1', wetCovering(nowMs));
    lifecycle.close('run-1', null, null);
    const refused = [
      refusal(() => lifecycle.startMeasure('run-1', wetCovering(nowMs))),
      refusal(() => lifecycle.endMeasure('run-1', 'm1', nowMs + HOUR_MS, 'x')),
      refusal(() => lifecycle.setForecast('run-1', [], 'api')),
    ];
    expect(refused.map((e) => e.status)).toEqual([409, 409, 409]);
    expect(refused[0]?.message).toMatch(/run run-1 was closed at .*logging a measure refused/);
  });

  it('readings for a closed run are quarantined as run-closed, outside its frozen record order', async () => {
    create();
    const ingestor = new Ingestor(archive, { clock: () => EXAMPLE_PLACED_AT_MS + 2 * HOUR_MS });
    await publish(ingestor, EXAMPLE_PLACED_AT_MS + HOUR_MS, 97);
    lifecycle.close('run-1', null, null);
    const recordsAtClose = archive.records('run-1').length;
    await publish(ingestor, EXAMPLE_PLACED_AT_MS + HOUR_MS + 60_000, 96);
    expect(ingestor.counters.quarantined).toEqual({ 'run-closed': 1 });
    const [kept] = archive.quarantine('run-1');
    expect(kept?.reason).toBe('run-closed');
    expect(kept?.detail).toMatch(
      /^device probe-a on site harbour-deck is in no open run: its run run-1 was closed at .* a closed run takes no readings$/,
    );
    expect(archive.counts('run-1').readings).toBe(1);
    expect(archive.records('run-1')).toHaveLength(recordsAtClose);
  });

  it('a device in no run at all stays unknown-device', async () => {
    const ingestor = new Ingestor(archive, { clock: () => EXAMPLE_PLACED_AT_MS });
    await publish(ingestor, EXAMPLE_PLACED_AT_MS, 97);
    expect(ingestor.counters.quarantined).toEqual({ 'unknown-device': 1 });
  });
});
