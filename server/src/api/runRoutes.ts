/**
 * Routes of a run's life and live figures (issue 6), mounted by apiRouter under /api:
 * close, the measure log, the supplied forecast, and the live state. Documented in README.md.
 */
import type { Request, Router } from 'express';
import { z } from 'zod';
import { ValidationError, formatIssues } from '../config/formatIssues.ts';
import type { RunState } from '../live/types.ts';
import { parseForecast } from '../runs/forecastInput.ts';
import { parseMeasureEnd, parseMeasureStart } from '../runs/measureInput.ts';
import type { MeasureRecord } from '../runs/measureLog.ts';
import type { RunLifecycle } from '../runs/runLifecycle.ts';
import { HttpError } from './httpError.ts';

/** What the state route reads: the live host (null state: unknown run). */
export interface LiveStates {
  state(runId: string): RunState | null;
}

const closeSchema = z.strictObject({
  closedBy: z.string().trim().min(1).max(100).optional(),
  note: z.string().max(500, { error: 'must be at most 500 characters' }).optional(),
});

/** Adds the run lifecycle, measure, forecast and state routes to `router`. */
export function addRunRoutes(
  router: Router,
  lifecycle: RunLifecycle,
  live: LiveStates | null,
): void {
  router.post('/runs/:id/close', (request, response) => {
    const body = jsonBody(request, true);
    const parsed = closeSchema.safeParse(body);
    if (!parsed.success)
      throw new ValidationError('close request', formatIssues(parsed.error.issues, body));
    const run = lifecycle.close(
      runId(request),
      parsed.data.closedBy ?? null,
      parsed.data.note ?? null,
    );
    response.json({
      id: run.id,
      status: 'closed',
      closedAt: new Date(run.closedAtMs ?? 0).toISOString(),
    });
  });

  router.get('/runs/:id/measures', (request, response) => {
    const id = runId(request);
    response.json({ runId: id, measures: lifecycle.measureLog(id).map(measureJson) });
  });

  router.post('/runs/:id/measures', (request, response) => {
    const id = runId(request);
    lifecycle.get(id);
    const start = parseMeasureStart(jsonBody(request), lifecycle.now());
    const entry = lifecycle.startMeasure(id, start);
    response
      .status(201)
      .location(`/api/runs/${id}/measures/${entry.id}`)
      .json(measureJson({ ...entry, endedBy: null }));
  });

  router.post('/runs/:id/measures/:measureId/end', (request, response) => {
    const id = runId(request);
    lifecycle.get(id);
    const end = parseMeasureEnd(jsonBody(request), lifecycle.now());
    const entry = lifecycle.endMeasure(
      id,
      String(request.params.measureId),
      end.endMs,
      end.endedBy,
    );
    response.json(measureJson(entry));
  });

  router.get('/runs/:id/forecast', (request, response) => {
    const id = runId(request);
    const points = lifecycle.forecast(id);
    response.json({
      runId: id,
      source: points.length === 0 ? 'persistence' : 'supplied',
      points: points.map(({ timeMs, ...values }) => ({
        time: new Date(timeMs).toISOString(),
        ...values,
      })),
    });
  });

  router.post('/runs/:id/forecast', (request, response) => {
    const id = runId(request);
    lifecycle.get(id);
    const points = parseForecast(jsonBody(request));
    lifecycle.setForecast(id, points, 'api');
    response.json({
      runId: id,
      source: points.length === 0 ? 'persistence' : 'supplied',
      points: points.length,
    });
  });

  router.get('/runs/:id/state', (request, response) => {
    const id = runId(request);
    lifecycle.get(id);
    if (live === null) throw new HttpError(503, 'the live engine is not running in this server');
    let state;
    try {
      state = live.state(id);
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      throw new HttpError(503, `the live engine of run ${id} failed: ${message}`, {
        cause: error,
      });
    }
    if (state === null) throw new HttpError(404, `run ${id} has no state`);
    response.json(state);
  });
}

function runId(request: Request): string {
  return String(request.params.id);
}

/** The parsed JSON body; `{}` for an empty body when `optional`. */
function jsonBody(request: Request, optional = false): unknown {
  const body: unknown = request.body;
  if (body === undefined || body === null || typeof body !== 'object') {
    if (optional && (body === undefined || request.headers['content-length'] === '0')) return {};
    throw new HttpError(
      400,
      'request body must be a JSON object with Content-Type application/json',
    );
  }
  return body;
}

function measureJson(entry: MeasureRecord) {
  const { startMs, endMs, ...rest } = entry;
  return {
    ...rest,
    startAt: new Date(startMs).toISOString(),
    endAt: endMs === null ? null : new Date(endMs).toISOString(),
    applied: endMs === null,
  };
}
