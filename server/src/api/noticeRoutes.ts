/**
 * Crew notice routes (contract "Crew notices"), mounted by apiRouter under /api:
 * `GET /api/runs/:id/notices` (newest first, with deliveries and acknowledgements) and
 * `POST /api/runs/:id/notices/:noticeId/ack` with `{ "by": "name" }`. Acknowledgements stay
 * allowed on a closed run. Documented in README.md.
 */
import type { Request, Router } from 'express';
import { z } from 'zod';
import type { Notice } from '../alerts/types.ts';
import { ValidationError, formatIssues } from '../config/formatIssues.ts';
import type { Archive } from '../store/archive.ts';
import { HttpError } from './httpError.ts';

/** Who acknowledges (and announces the acknowledgement): the server's CrewNotices. */
export interface NoticeAcknowledger {
  acknowledge(runId: string, noticeId: string, by: string): Notice | null;
}

const ackSchema = z.strictObject({
  by: z
    .string({ error: 'must be the name of who acknowledges (text)' })
    .trim()
    .min(1, { error: 'must be 1 to 100 characters' })
    .max(100, { error: 'must be 1 to 100 characters' }),
});

/**
 * Adds the notice routes to `router`.
 *
 * @param acknowledger - announces acknowledgements; null: written to the archive only
 * @param clock - server clock for acknowledgements without an acknowledger, ms
 */
export function addNoticeRoutes(
  router: Router,
  archive: Archive,
  acknowledger: NoticeAcknowledger | null,
  clock: () => number,
): void {
  router.get('/runs/:id/notices', (request, response) => {
    const runId = existingRun(archive, request);
    response.json({ runId, notices: archive.notices.list(runId) });
  });

  router.post('/runs/:id/notices/:noticeId/ack', (request, response) => {
    const runId = existingRun(archive, request);
    const noticeId = String(request.params.noticeId);
    if (archive.notices.get(runId, noticeId) === null)
      throw new HttpError(
        404,
        `notice ${JSON.stringify(noticeId.slice(0, 80))} does not exist in run ${runId}`,
      );
    const body: unknown = request.body;
    const parsed = ackSchema.safeParse(body);
    if (!parsed.success)
      throw new ValidationError('acknowledgement', formatIssues(parsed.error.issues, body));
    const notice =
      acknowledger === null
        ? archive.notices.acknowledge(runId, noticeId, parsed.data.by, clock())
        : acknowledger.acknowledge(runId, noticeId, parsed.data.by);
    response.json(notice);
  });
}

function existingRun(archive: Archive, request: Request): string {
  const runId = String(request.params.id);
  if (archive.getRun(runId) === null)
    throw new HttpError(404, `run ${JSON.stringify(runId.slice(0, 80))} does not exist`);
  return runId;
}
