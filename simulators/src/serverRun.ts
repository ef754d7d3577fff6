/**
 * The scenario's run on a Meniscus server, over its HTTP API: created from run.json with
 * `POST /api/runs`, or found among `GET /api/runs` when the archive already holds it (open, same
 * site, name and placement time), and the crew's measures logged on it with
 * `POST /api/runs/:id/measures` as the play reaches them. Shared by `npm run demo` and the
 * simulators' `--server` flag.
 */
import type { RunConfig } from '../../server/src/config/index.ts';
import type { ScenarioMeasure } from './scenarioSchema.ts';

/** Who the simulators log measures as. */
export const DEMO_CREW = 'Crew lead, level 3 (demo)';

/** The run the play goes into. */
export interface ServerRun {
  runId: string;
  /** True when the archive already held the run (the play goes into it; readings stored once). */
  existing: boolean;
}

export interface FindOrCreateOptions {
  /**
   * How long to keep retrying while the server cannot be reached (connection refused, e.g. a
   * container still starting), ms: 0, one attempt (our assumption: the demo starts the server
   * itself). HTTP errors are not retried.
   */
  waitMs?: number;
  /** Called once, when the first attempt could not reach the server and retries begin. */
  onWaiting?: (why: string) => void;
}

/** Calls the server's API at `${baseUrl}/api${path}` with JSON headers. */
export async function api(
  baseUrl: string,
  path: string,
  init: RequestInit = {},
): Promise<Response> {
  return fetch(`${baseUrl}/api${path}`, {
    ...init,
    headers: { 'content-type': 'application/json', accept: 'application/json' },
  });
}

/** A scenario measure as the body of POST /api/runs/:id/measures, logged by `loggedBy`. */
export function measureBody(
  measure: ScenarioMeasure,
  loggedBy: string = DEMO_CREW,
): Record<string, unknown> {
  return {
    kind: measure.kind,
    startAt: measure.startAt,
    ...(measure.endAt === undefined ? {} : { endAt: measure.endAt }),
    ...(measure.kind === 'curing-compound' && measure.efficiency !== undefined
      ? { efficiency: measure.efficiency }
      : {}),
    ...(measure.kind === 'fogging' && measure.relativeHumidity !== undefined
      ? { relativeHumidity: measure.relativeHumidity }
      : {}),
    ...(measure.kind === 'windbreak' && measure.windFactor !== undefined
      ? { windFactor: measure.windFactor }
      : {}),
    loggedBy,
    ...(measure.note === undefined ? {} : { note: measure.note }),
  };
}

/** GET /api/runs, retrying unreachable servers for `waitMs`. */
async function listRuns(baseUrl: string, options: FindOrCreateOptions): Promise<Response> {
  const deadline = Date.now() + (options.waitMs ?? 0);
  let waiting = false;
  for (;;) {
    try {
      return await api(baseUrl, '/runs');
    } catch (error) {
      const why = (error as Error & { cause?: Error }).cause?.message ?? (error as Error).message;
      if (Date.now() >= deadline) {
        throw new Error(`the server at ${baseUrl} cannot be reached: ${why}`, { cause: error });
      }
      if (!waiting) options.onWaiting?.(why);
      waiting = true;
      await new Promise((resolve) => setTimeout(resolve, Math.min(1000, options.waitMs ?? 0)));
    }
  }
}

/**
 * Finds the open run of this run configuration on the server (same site, name and placement
 * time), or creates it from `runConfigInput` (run.json as read).
 *
 * @throws Error naming the HTTP status and body when listing or creating fails, or the server
 *   when it stays unreachable past `waitMs`
 */
export async function findOrCreateRun(
  baseUrl: string,
  runConfig: RunConfig,
  runConfigInput: unknown,
  options: FindOrCreateOptions = {},
): Promise<ServerRun> {
  const listing = await listRuns(baseUrl, options);
  if (listing.status !== 200) {
    throw new Error(
      `listing the runs failed: HTTP ${listing.status} ${(await listing.text()).slice(0, 200)}`,
    );
  }
  const listed = (await listing.json()) as {
    runs: { id: string; site: string; name: string; placedAt: string; closedAt: string | null }[];
  };
  const existing = listed.runs.find(
    (run) =>
      run.site === runConfig.site &&
      run.name === runConfig.name &&
      Date.parse(run.placedAt) === Date.parse(runConfig.placedAt) &&
      run.closedAt === null,
  );
  if (existing !== undefined) return { runId: existing.id, existing: true };
  const created = await api(baseUrl, '/runs', {
    method: 'POST',
    body: JSON.stringify(runConfigInput),
  });
  const body = (await created.json().catch(() => ({}))) as { id?: string; error?: unknown };
  if (created.status !== 201 || body.id === undefined) {
    throw new Error(`creating the run failed: HTTP ${created.status} ${JSON.stringify(body)}`);
  }
  return { runId: body.id, existing: false };
}

/**
 * Closes a run (`POST /api/runs/:id/close`, closed by the demo crew) with `note`.
 *
 * @throws Error naming the HTTP status and body when the server refuses
 */
export async function closeRun(baseUrl: string, runId: string, note: string): Promise<void> {
  const response = await api(baseUrl, `/runs/${runId}/close`, {
    method: 'POST',
    body: JSON.stringify({ closedBy: DEMO_CREW, note }),
  });
  if (response.status !== 200) {
    throw new Error(
      `closing run ${runId} failed: HTTP ${response.status} ${(await response.text()).slice(0, 200)}`,
    );
  }
}

/**
 * A measure logger for onMeasureStart: posts each measure to the run. A failure does not stop
 * the play; the first one is reported through `report` as "(the server did not log the
 * measure: <why>)", later ones silently.
 */
export function measureLogger(
  baseUrl: string,
  runId: string,
  report: (line: string) => void,
): (measure: ScenarioMeasure) => Promise<void> {
  let problemShown = false;
  return async (measure) => {
    const response = await api(baseUrl, `/runs/${runId}/measures`, {
      method: 'POST',
      body: JSON.stringify(measureBody(measure)),
    }).catch((error: unknown) => `${(error as Error).message}`);
    if (typeof response === 'string' || response.status !== 201) {
      const why =
        typeof response === 'string'
          ? response
          : `HTTP ${response.status} ${(await response.text()).slice(0, 200)}`;
      if (!problemShown) report(`(the server did not log the measure: ${why})`);
      problemShown = true;
    }
  };
}
