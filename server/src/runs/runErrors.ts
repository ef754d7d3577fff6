/** Errors of the run lifecycle that a client can act on; errorToHttp answers with `status`. */
export class RunError extends Error {
  /** HTTP status: 404 unknown run or measure, 409 a change refused in the run's current state. */
  readonly status: 404 | 409;

  constructor(status: 404 | 409, message: string) {
    super(message);
    this.name = 'RunError';
    this.status = status;
  }
}

/** 404 for a run id that is not in the archive (the id is quoted, cut to 80 characters). */
export function runNotFound(runId: string): RunError {
  return new RunError(404, `run ${JSON.stringify(runId.slice(0, 80))} does not exist`);
}

/** 409 for a change to a closed run. */
export function runClosed(runId: string, closedAtMs: number, what: string): RunError {
  return new RunError(
    409,
    `run ${runId} was closed at ${new Date(closedAtMs).toISOString()}: a closed run is read-only, ${what} refused`,
  );
}
