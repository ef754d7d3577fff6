/**
 * The `webhook` channel: each notice's JSON sent by HTTP POST to one URL (a chat or paging
 * service's incoming hook, or the company's own). Any 2xx answer counts as delivered; anything
 * else, a network error or a timeout is a failed attempt that the outbox retries with backoff.
 */
import type { Notice } from '../types.ts';
import type { NoticeChannel } from './noticeChannel.ts';

/**
 * A channel posting to `url`; recipient: the URL, for every run.
 *
 * @param timeoutMs - longest wait for an answer, ms [10,000, our assumption]
 */
export function webhookChannel(url: string, timeoutMs = 10_000): NoticeChannel {
  return {
    name: 'webhook',
    recipients: () => [url],
    async send(notice: Notice, recipient: string) {
      let response: Response;
      try {
        response = await fetch(recipient, {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify(notice),
          signal: AbortSignal.timeout(timeoutMs),
        });
      } catch (error) {
        const cause = (error as { cause?: { message?: string } }).cause?.message;
        throw new Error(`POST ${recipient} failed: ${cause ?? (error as Error).message}`, {
          cause: error,
        });
      }
      await response.body?.cancel();
      if (!response.ok) throw new Error(`POST ${recipient} answered ${response.status}`);
    },
  };
}
