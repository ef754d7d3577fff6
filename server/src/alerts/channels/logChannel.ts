/** The `log` channel: every notice as one structured log line (pino), for the site box's journal. */
import type { Logger } from 'pino';
import type { Notice } from '../types.ts';
import type { NoticeChannel } from './noticeChannel.ts';

/**
 * A channel that writes each notice to the server's log: `warn` for ACT NOW and CRACKING
 * LIKELY, `info` otherwise; recipient `log` for every run.
 */
export function logChannel(logger: Pick<Logger, 'info' | 'warn'>): NoticeChannel {
  return {
    name: 'log',
    recipients: () => ['log'],
    send(notice: Notice) {
      const fields = {
        noticeId: notice.id,
        runId: notice.runId,
        noticeLevel: notice.level,
        kind: notice.kind,
        raisedAtMs: notice.raisedAtMs,
      };
      if (notice.level === 'ACT NOW' || notice.level === 'CRACKING LIKELY')
        logger.warn(fields, notice.title);
      else logger.info(fields, notice.title);
      return Promise.resolve();
    },
  };
}
