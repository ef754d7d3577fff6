/**
 * One interface for every way a crew notice goes out (log, MQTT, webhook, e-mail). A channel
 * names its recipients for a run and sends one notice to one recipient; it throws when the
 * sending failed, and the outbox (noticeOutbox.ts) records the failure and tries again later.
 * A channel never retries by itself, so every attempt is recorded in the archive.
 */
import type { RunConfig } from '../../config/runConfig.ts';
import type { Notice } from '../types.ts';

/** What a channel knows of the run a notice belongs to. */
export interface NoticeRun {
  id: string;
  site: string;
  config: RunConfig;
}

/** A way a crew notice goes out. */
export interface NoticeChannel {
  /** Channel name as deliveries record it: `log`, `mqtt`, `webhook`, `email`. */
  readonly name: string;
  /** The recipients of a run's notices on this channel (may be none). */
  recipients(run: NoticeRun): string[];
  /**
   * Sends one notice to one recipient.
   *
   * @throws Error with a message for the delivery record when it was not delivered
   */
  send(notice: Notice, recipient: string): Promise<void>;
  /** Releases connections (optional). */
  close?(): Promise<void>;
}
