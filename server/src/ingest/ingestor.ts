/**
 * Ingest: turns MQTT messages into archive commits. `data()` resolves only after the message's
 * transaction has committed, so the broker connection can acknowledge then and not before.
 * Messages that arrive together (several broker connections, or a socket chunk the embedded
 * broker hands over at once) are grouped into one transaction: group commit.
 */
import type { Archive } from '../store/archive.ts';
import type { CommitItem } from '../store/types.ts';
import { classifyMessage } from './classifyMessage.ts';
import { DEFAULT_TIME_LIMITS } from './matchReadings.ts';
import type { TimeLimits } from './matchReadings.ts';
import { parseDeviceTopic } from './topics.ts';

export interface IngestorOptions {
  /** Clock for receive times, ms since the epoch: `Date.now` by default. */
  clock?: () => number;
  /** Time tolerances: DEFAULT_TIME_LIMITS (5 min ahead, 1 h before placement). */
  limits?: TimeLimits;
  /** Most messages in one transaction: 1000 (our assumption; bounds the time a batch holds the file). */
  maxBatch?: number;
  /** Called when a commit fails (the messages are then not acknowledged and come again). */
  onCommitError?: (error: unknown) => void;
}

/** Counts since start; the archive holds the lasting ones. */
export interface IngestCounters {
  messages: number;
  readingsStored: number;
  readingsDuplicate: number;
  quarantined: Record<string, number>;
  commits: number;
  commitFailures: number;
  statusMessages: number;
}

interface Pending {
  items: CommitItem[];
  resolve: () => void;
  reject: (error: unknown) => void;
}

/** Classifies messages and commits them in groups; see the file comment. */
export class Ingestor {
  readonly #archive: Archive;
  readonly #clock: () => number;
  readonly #limits: TimeLimits;
  readonly #maxBatch: number;
  readonly #onCommitError: (error: unknown) => void;
  #pending: Pending[] = [];
  #scheduled = false;
  readonly counters: IngestCounters = {
    messages: 0,
    readingsStored: 0,
    readingsDuplicate: 0,
    quarantined: {},
    commits: 0,
    commitFailures: 0,
    statusMessages: 0,
  };

  constructor(archive: Archive, options: IngestorOptions = {}) {
    this.#archive = archive;
    this.#clock = options.clock ?? Date.now;
    this.#limits = options.limits ?? DEFAULT_TIME_LIMITS;
    this.#maxBatch = options.maxBatch ?? 1000;
    this.#onCommitError = options.onCommitError ?? (() => {});
  }

  /**
   * Takes a data message. Never rejects for bad input (that is quarantined and committed);
   * rejects only when the archive cannot commit, and then nothing of it was stored.
   */
  data(topic: string, payload: Uint8Array): Promise<void> {
    this.counters.messages += 1;
    const receivedAtMs = this.#clock();
    let items: CommitItem[];
    try {
      items = classifyMessage(
        topic,
        payload,
        receivedAtMs,
        (site, device) => this.#archive.bindingsFor(site, device),
        this.#limits,
      );
    } catch (error) {
      // A bug in validation must not stop the flow: keep the message for a person to look at.
      const detail = `validation failed: ${error instanceof Error ? error.message : String(error)}`;
      items = [
        {
          kind: 'quarantine',
          runId: null,
          reason: 'internal-error',
          detail,
          topic,
          receivedAtMs,
          bytes: payload,
        },
      ];
    }
    return new Promise((resolve, reject) => {
      this.#pending.push({ items, resolve, reject });
      if (this.#pending.length >= this.#maxBatch) this.#flush();
      else if (!this.#scheduled) {
        this.#scheduled = true;
        setImmediate(() => this.#flush());
      }
    });
  }

  /**
   * Takes a device status message (retained status or last will): the payload's text, or the
   * `status` field of a JSON object, cut to 64 characters. Unknown devices are ignored.
   */
  status(topic: string, payload: Uint8Array): void {
    const parts = parseDeviceTopic(topic);
    if (parts === null || parts.channel !== 'status') return;
    this.counters.statusMessages += 1;
    const text = Buffer.from(payload).toString('utf8').trim();
    let status = text;
    try {
      const json: unknown = JSON.parse(text);
      if (
        json !== null &&
        typeof json === 'object' &&
        typeof (json as { status?: unknown }).status === 'string'
      ) {
        status = (json as { status: string }).status;
      }
    } catch {
      // plain text status
    }
    this.#archive.recordDeviceStatus(
      parts.site,
      parts.device,
      status.slice(0, 64) || '(empty)',
      this.#clock(),
    );
  }

  /** Commits whatever is waiting now. */
  #flush(): void {
    this.#scheduled = false;
    const batch = this.#pending;
    this.#pending = [];
    if (batch.length === 0) return;
    try {
      this.#commit(batch);
    } catch {
      // One bad item must not hold back the others: commit one message at a time.
      for (const pending of batch) {
        try {
          this.#commit([pending]);
        } catch (error) {
          this.counters.commitFailures += 1;
          this.#onCommitError(error);
          pending.reject(error);
        }
      }
    }
  }

  #commit(batch: Pending[]): void {
    const outcomes = this.#archive.commit(batch.flatMap((pending) => pending.items));
    this.counters.commits += 1;
    for (const outcome of outcomes) {
      this.counters.readingsStored += outcome.stored;
      this.counters.readingsDuplicate += outcome.duplicates;
      if (outcome.quarantined !== null) {
        this.counters.quarantined[outcome.quarantined] =
          (this.counters.quarantined[outcome.quarantined] ?? 0) + 1;
      }
    }
    for (const pending of batch) pending.resolve();
  }
}
