/**
 * REST under /api (architecture.md): health, runs, readings (JSON or CSV), quarantine. Handlers
 * throw; errorToHttp answers.
 */
import express from 'express';
import type { Request, Response, Router } from 'express';
import { parseRunConfig } from '../config/runConfig.ts';
import { RunLifecycle } from '../runs/runLifecycle.ts';
import type { Archive } from '../store/archive.ts';
import type { RunRecord, StoredReading } from '../store/types.ts';
import { stringify } from 'csv-stringify/sync';
import { addFigureRoutes } from './figureRoutes.ts';
import { addNoticeRoutes } from './noticeRoutes.ts';
import type { NoticeAcknowledger } from './noticeRoutes.ts';
import { HttpError } from './httpError.ts';
import { parseReadingsQuery } from './readingsQuery.ts';
import { addRunRoutes } from './runRoutes.ts';
import type { LiveStates } from './runRoutes.ts';

export interface ApiContext {
  archive: Archive;
  /** What GET /api/health reports besides the archive. */
  health: () => Record<string, unknown>;
  /** Clock for creation times, ms since the epoch. */
  clock?: () => number;
  /** Run lifecycle (creation, closing, measures, forecasts); one over `archive` and `clock` by default. */
  lifecycle?: RunLifecycle;
  /** The live host for GET /api/runs/:id/state; without it that route answers 503. */
  live?: LiveStates;
  /** Crew notices: acknowledgements are announced through it (archive only without it). */
  notices?: NoticeAcknowledger;
}

/** Builds the /api router. Bodies up to 256 KiB of JSON (our assumption: a run configuration is a few KiB). */
export function apiRouter(context: ApiContext): Router {
  const { archive } = context;
  const clock = context.clock ?? Date.now;
  const lifecycle = context.lifecycle ?? new RunLifecycle(archive, clock);
  const router = express.Router();
  router.use(express.json({ limit: '256kb' }));

  // A full integrity check reads the whole file: run it once here, not on every health call.
  const integrity = archive.integrityCheck();
  router.get('/health', (_request, response) => {
    const extra = context.health();
    const degraded = Object.values(extra).some(
      (part) =>
        typeof part === 'object' && part !== null && (part as { ok?: unknown }).ok === false,
    );
    response.json({
      status: integrity[0] === 'ok' && !degraded ? 'ok' : 'degraded',
      archive: { ok: integrity[0] === 'ok', integrityAtStart: integrity, counts: archive.totals() },
      quarantine: archive.quarantineCounts(),
      ...extra,
    });
  });

  router.get('/runs', (_request, response) => {
    response.json({ runs: archive.listRuns().map(runSummary) });
  });

  router.post('/runs', (request, response) => {
    if (request.body === undefined || typeof request.body !== 'object') {
      throw new HttpError(
        400,
        'request body must be a JSON run configuration with Content-Type application/json',
      );
    }
    const config = parseRunConfig(request.body);
    const run = lifecycle.create(config);
    response.status(201).location(`/api/runs/${run.id}`).json(runDetail(run, archive));
  });

  router.get('/runs/:id', (request, response) => {
    response.json(runDetail(findRun(archive, request), archive));
  });

  router.get('/runs/:id/readings', (request, response) => {
    const run = findRun(archive, request);
    const readings = archive.readings(run.id, parseReadingsQuery(request.query));
    if (request.accepts(['application/json', 'text/csv']) === 'text/csv')
      sendCsv(response, run, readings);
    else
      response.json({ runId: run.id, count: readings.length, readings: readings.map(readingJson) });
  });

  router.get('/runs/:id/quarantine', (request, response) => {
    const run = findRun(archive, request);
    const messages = archive.quarantine(run.id).map((message) => ({
      id: message.id,
      reason: message.reason,
      detail: message.detail,
      topic: message.topic,
      receivedAt: new Date(message.receivedAtMs).toISOString(),
      byteLength: message.byteLength,
      sha256: message.sha256,
      bytesBase64: message.bytes.toString('base64'),
    }));
    response.json({ runId: run.id, counts: archive.quarantineCounts(run.id), messages });
  });

  addRunRoutes(router, lifecycle, context.live ?? null);
  addFigureRoutes(router, archive);
  addNoticeRoutes(router, archive, context.notices ?? null, clock);

  router.use((_request: Request) => {
    throw new HttpError(404, 'no such API route');
  });
  return router;
}

function findRun(archive: Archive, request: Request): RunRecord {
  const id = String(request.params.id);
  const run = archive.getRun(id);
  if (run === null)
    throw new HttpError(404, `run ${JSON.stringify(id.slice(0, 80))} does not exist`);
  return run;
}

function runSummary(run: RunRecord) {
  return {
    id: run.id,
    site: run.site,
    name: run.config.name ?? `${run.config.element.kind} placed ${run.config.placedAt}`,
    placedAt: run.config.placedAt,
    status: run.closedAtMs === null ? 'open' : 'closed',
    createdAt: new Date(run.createdAtMs).toISOString(),
    closedAt: run.closedAtMs === null ? null : new Date(run.closedAtMs).toISOString(),
  };
}

function runDetail(run: RunRecord, archive: Archive) {
  const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
  const sensors = archive
    .sensorSummaries(run.id)
    .map(({ deviceStatusAtMs, lastEventAtMs, ...rest }) => ({
      ...rest,
      deviceStatusAt: iso(deviceStatusAtMs),
      lastEventAt: iso(lastEventAtMs),
    }));
  return { ...runSummary(run), config: run.config, counts: archive.counts(run.id), sensors };
}

function readingJson(reading: StoredReading) {
  return {
    eventAt: new Date(reading.eventAtMs).toISOString(),
    device: reading.device,
    sensor: reading.sensor,
    quantity: reading.quantity,
    depthMm: reading.depthMm,
    value: reading.value,
    unit: reading.unit,
    receivedAt: new Date(reading.receivedAtMs).toISOString(),
    updateIntervalS: reading.updateIntervalS,
    messageId: reading.messageId,
  };
}

const CSV_HEADER = [
  'event_time',
  'device',
  'sensor',
  'quantity',
  'depth_mm',
  'value',
  'unit',
  'received_time',
  'update_interval_s',
  'message_id',
];

/** Readings as CSV (RFC 4180, CRLF line ends, a header row; null fields empty). */
function sendCsv(response: Response, run: RunRecord, readings: readonly StoredReading[]): void {
  const rows = readings.map((r) => [
    new Date(r.eventAtMs).toISOString(),
    r.device,
    r.sensor,
    r.quantity,
    r.depthMm,
    r.value,
    r.unit,
    new Date(r.receivedAtMs).toISOString(),
    r.updateIntervalS,
    r.messageId,
  ]);
  const body = stringify(rows, { header: true, columns: CSV_HEADER, record_delimiter: 'windows' });
  response.type('text/csv; charset=utf-8').attachment(`readings-${run.id}.csv`).send(body);
}
