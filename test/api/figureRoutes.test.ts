import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { RunState } from '../../server/src/live/types.ts';
import { exampleRunInput } from '../helpers/exampleRun.ts';
import { startLiveApiRig } from './_liveApiRig.ts';
import type { LiveApiRig } from './_liveApiRig.ts';

let rig: LiveApiRig;
let runId: string;

const get = async (path: string) => {
  const response = await fetch(`${rig.base}/api${path}`);
  return { status: response.status, body: (await response.json()) as Record<string, unknown> };
};

beforeEach(async () => {
  rig = await startLiveApiRig();
  const response = await fetch(`${rig.base}/api/runs`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(exampleRunInput()),
  });
  runId = String(((await response.json()) as { id: string }).id);
});
afterEach(() => rig.close());

const state = (eventTimeMs: number) =>
  ({ runId, eventTimeMs, phase: 'plastic', surfaceStressMPa: eventTimeMs / 1e6 }) as RunState;

describe('GET /api/runs/:id/figures', () => {
  it("answers the run's history oldest first, from sinceMs when given", async () => {
    for (const t of [3_000, 1_000, 2_000]) rig.archive.figures.record(runId, state(t));
    const all = await get(`/runs/${runId}/figures`);
    expect(all.status).toBe(200);
    expect(all.body.runId).toBe(runId);
    const times = (body: Record<string, unknown>) =>
      (body.figures as { eventTimeMs: number }[]).map((point) => point.eventTimeMs);
    expect(times(all.body)).toEqual([1_000, 2_000, 3_000]);
    expect(times((await get(`/runs/${runId}/figures?sinceMs=2000&limit=1`)).body)).toEqual([2_000]);
  });

  it('answers an empty history for a run without figures yet', async () => {
    expect((await get(`/runs/${runId}/figures`)).body.figures).toEqual([]);
  });

  it('answers 404 for an unknown run and 400 naming the parameter for a bad one', async () => {
    expect((await get('/runs/nope/figures')).status).toBe(404);
    const bad = await get(`/runs/${runId}/figures?sinceMs=yesterday`);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toMatch(/sinceMs/);
    const tooMany = await get(`/runs/${runId}/figures?limit=0`);
    expect(tooMany.status).toBe(400);
    expect(JSON.stringify(tooMany.body)).toMatch(/limit.*at least 1/);
  });
});
