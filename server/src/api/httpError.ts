import type { ErrorRequestHandler } from 'express';
import { ValidationError } from '../config/formatIssues.ts';
import { RunError } from '../runs/runErrors.ts';

/** An error with an HTTP status and a message safe to show to the client. */
export class HttpError extends Error {
  readonly status: number;

  constructor(status: number, message: string, options?: ErrorOptions) {
    super(message, options);
    this.name = 'HttpError';
    this.status = status;
  }
}

export interface ErrorLogger {
  error(details: object, message: string): void;
}

/**
 * The one place errors become HTTP answers: ValidationError -> 400 with its issues, HttpError ->
 * its status and message (so does a RunError: 404 unknown run, 409 change to a closed run), a malformed or oversize JSON body -> 400/413, anything else is logged
 * in full and answered with a plain 500 that shows no internals.
 */
export function errorToHttp(logger: ErrorLogger): ErrorRequestHandler {
  return (error: unknown, request, response, next) => {
    if (response.headersSent) {
      next(error);
      return;
    }
    if (error instanceof ValidationError) {
      response.status(400).json({ error: error.message, issues: error.issues });
      return;
    }
    if (error instanceof HttpError || error instanceof RunError) {
      response.status(error.status).json({ error: error.message });
      return;
    }
    const bodyError = error as { type?: unknown; status?: unknown };
    if (bodyError.type === 'entity.parse.failed') {
      response.status(400).json({ error: 'request body must be JSON: it could not be parsed' });
      return;
    }
    if (bodyError.type === 'entity.too.large') {
      response.status(413).json({ error: 'request body is too large' });
      return;
    }
    logger.error(
      { err: error, method: request.method, url: request.originalUrl },
      'unhandled error in HTTP request',
    );
    response.status(500).type('text/plain').send('Internal Server Error');
  };
}
