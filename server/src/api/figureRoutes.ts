/**
 * `GET /api/runs/:id/figures`: the history of a run's engine figures since placement, oldest
 * first (server/src/store/figureHistory.ts), for the dashboard's plot of surface stress against
 * strength and for a reviewer. Documented in README.md.
 */
import type { Router } from 'express';
import { z } from 'zod';
import { ValidationError, formatIssues } from '../config/formatIssues.ts';
import type { Archive } from '../store/archive.ts';
import { HttpError } from './httpError.ts';

// Unknown query parameters (a cache buster, say) are ignored.
const figuresQuery = z.object({
  /** Only points at or after this event time, ms since the Unix epoch. */
  sinceMs: z.coerce
    .number({ error: 'must be a number of ms since the Unix epoch' })
    .int({ error: 'must be a whole number of ms since the Unix epoch' })
    .optional(),
  limit: z.coerce
    .number({ error: 'must be a number' })
    .int({ error: 'must be a whole number' })
    .min(1, { error: 'must be at least 1' })
    .max(100_000, { error: 'must be at most 100000' })
    .optional(),
});

/** Adds the figure history route to `router`. */
export function addFigureRoutes(router: Router, archive: Archive): void {
  router.get('/runs/:id/figures', (request, response) => {
    const runId = String(request.params.id);
    if (archive.getRun(runId) === null) throw new HttpError(404, `run ${runId} does not exist`);
    const parsed = figuresQuery.safeParse(request.query);
    if (!parsed.success)
      throw new ValidationError('figures query', formatIssues(parsed.error.issues, request.query));
    const figures = archive.figures.list(runId, {
      ...(parsed.data.sinceMs === undefined ? {} : { sinceMs: parsed.data.sinceMs }),
      ...(parsed.data.limit === undefined ? {} : { limit: parsed.data.limit }),
    });
    response.json({ runId, figures });
  });
}
