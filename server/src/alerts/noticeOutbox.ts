/**
 * The outbox of crew notices: works through the archive's due deliveries, sends each over its
 * channel, and records every attempt (status, attempts, last error). A failed attempt is tried
 * again after a backoff that doubles up to a cap, at most `maxAttempts` times; a channel that
 * fails or hangs never holds up the others (each delivery is sent on its own, never twice at
 * once) nor the engine (sending runs on the event loop after the notice is committed). Times are
 * wall-clock (deliveries happen in the real world); the clock is injected so retries are tested
 * without waiting.
 */
import type { DueDelivery, NoticeStore } from '../store/noticeStore.ts';
import type { NoticeChannel } from './channels/noticeChannel.ts';

export interface NoticeOutboxOptions {
  /** Wall clock, ms since the epoch [Date.now]. */
  clock?: () => number;
  /** Attempts per delivery before it is given up [5, our assumption]. */
  maxAttempts?: number;
  /** Wait before the second attempt, s; doubled for each further one [30, our assumption]. */
  backoffS?: number;
  /** Longest wait between attempts, s [600, our assumption]. */
  maxBackoffS?: number;
  /** Wall time between looks for due deliveries when started, ms [1000, our assumption]. */
  pollMs?: number;
  /** Told of each failed attempt (the server logs it). */
  onFailure?: (details: {
    channel: string;
    recipient: string;
    noticeId: string;
    error: string;
  }) => void;
}

/**
 * Wait after the `attempts`-th failed attempt, ms: backoffS * 2^(attempts-1), at most maxBackoffS.
 */
export function backoffMs(attempts: number, backoffS: number, maxBackoffS: number): number {
  return Math.min(maxBackoffS, backoffS * 2 ** Math.max(0, attempts - 1)) * 1000;
}

/** See the file comment. */
export class NoticeOutbox {
  readonly #store: NoticeStore;
  readonly #channels: Map<string, NoticeChannel>;
  readonly #options: Required<NoticeOutboxOptions>;
  #timer: NodeJS.Timeout | null = null;
  /** Deliveries being sent, by id: each is sent on its own and never twice at once. */
  readonly #inFlight = new Map<number, Promise<void>>();
  /** Counters for /api/health. */
  readonly counters = { sent: 0, failedAttempts: 0, givenUp: 0 };

  constructor(
    store: NoticeStore,
    channels: readonly NoticeChannel[],
    options: NoticeOutboxOptions = {},
  ) {
    this.#store = store;
    this.#channels = new Map(channels.map((channel) => [channel.name, channel]));
    this.#options = {
      clock: options.clock ?? Date.now,
      maxAttempts: options.maxAttempts ?? 5,
      backoffS: options.backoffS ?? 30,
      maxBackoffS: options.maxBackoffS ?? 600,
      pollMs: options.pollMs ?? 1000,
      onFailure: options.onFailure ?? (() => {}),
    };
  }

  /** Adds a channel (the server's MQTT channel, once its broker is up); replaces one of the same name. */
  addChannel(channel: NoticeChannel): void {
    this.#channels.set(channel.name, channel);
  }

  /** The channels by name. */
  get channels(): readonly NoticeChannel[] {
    return [...this.#channels.values()];
  }

  /**
   * Starts every delivery due now that is not already being sent, each on its own (a slow
   * receiver holds up nothing else); resolves with how many it started once they, and any
   * started before, have settled.
   */
  async flush(): Promise<number> {
    const due = this.#store
      .due(this.#options.clock())
      .filter((delivery) => !this.#inFlight.has(delivery.deliveryId));
    for (const delivery of due) {
      const sending = this.#deliver(delivery).finally(() =>
        this.#inFlight.delete(delivery.deliveryId),
      );
      this.#inFlight.set(delivery.deliveryId, sending);
    }
    await Promise.all(this.#inFlight.values());
    return due.length;
  }

  /** Looks for due deliveries every `pollMs` of wall time. */
  start(): void {
    if (this.#timer !== null) return;
    this.#timer = setInterval(() => {
      this.flush().catch((error: unknown) =>
        this.#options.onFailure({
          channel: '(outbox)',
          recipient: '',
          noticeId: '',
          error: error instanceof Error ? error.message : String(error),
        }),
      );
    }, this.#options.pollMs);
    this.#timer.unref();
  }

  /** Stops polling, waits for a running flush and closes the channels. */
  async close(): Promise<void> {
    if (this.#timer !== null) clearInterval(this.#timer);
    this.#timer = null;
    await Promise.all(this.#inFlight.values());
    await Promise.allSettled([...this.#channels.values()].map((channel) => channel.close?.()));
  }

  async #deliver(delivery: DueDelivery): Promise<void> {
    const channel = this.#channels.get(delivery.channel);
    let error: string | null = null;
    try {
      if (channel === undefined)
        throw new Error(`channel ${delivery.channel} is not configured on this server`);
      await channel.send(delivery.notice, delivery.recipient);
    } catch (caught) {
      error = caught instanceof Error ? caught.message : String(caught);
    }
    const atMs = this.#options.clock();
    const attempts = delivery.attempts + 1;
    const retry = error !== null && channel !== undefined && attempts < this.#options.maxAttempts;
    this.#store.recordAttempt(delivery.deliveryId, {
      atMs,
      error,
      nextAttemptMs: retry
        ? atMs + backoffMs(attempts, this.#options.backoffS, this.#options.maxBackoffS)
        : null,
    });
    if (error === null) {
      this.counters.sent += 1;
      return;
    }
    this.counters.failedAttempts += 1;
    if (!retry) this.counters.givenUp += 1;
    this.#options.onFailure({
      channel: delivery.channel,
      recipient: delivery.recipient,
      noticeId: delivery.notice.id,
      error,
    });
  }
}
