/**
 * The alert state of one run: which concern is raised at which level, so that notices follow
 * the rules without flickering or repeating. Driven by the engine's EVENT time only, so a replay
 * of the archive decides the same notices; its snapshot is kept in the archive beside the
 * notices, so a restart neither forgets nor repeats them.
 *
 * Per concern (a condition key, e.g. `margin`):
 * - raise: a condition at a level above the one notified sends a notice at once (a new concern,
 *   or an escalation);
 * - de-duplication: the same concern at the same or a lower level sends nothing while its hold
 *   conditions (thresholds relaxed by the hysteresis) keep it at that level;
 * - easing: when the hold conditions stay below the notified level for `dwellMin` of event time,
 *   a NOTE of kind `eased` says so, and the concern drops to the level still held (or clears);
 * - repeat: an unacknowledged ACT NOW or CRACKING LIKELY is sent again after `renotifyMin` of
 *   event time while it holds, each further repeat `renotifyGrowth` times later than the one
 *   before (30, 60, 120 min...; our assumption: a phone notice can be missed on a noisy deck,
 *   and one nobody answers should not flood the phone).
 * States at or before the last event time seen are ignored: a replay after a restart feeds the
 * states since the engine's last snapshot again, and they must not raise anything twice.
 */
import type { AlertOptions } from './alertOptions.ts';
import { levelRank } from './types.ts';
import type { Condition, NoticeDraft, NoticeLevel, RuleFindings } from './types.ts';

/** What the state keeps of one raised concern. */
export interface RaisedConcern {
  level: NoticeLevel;
  kind: Condition['kind'];
  /** Event time of the last notice of this concern (raise, escalation, repeat or easing), ms. */
  notifiedAtMs: number;
  /** Ids of the notices sent at `level`, the first and its repeats (acknowledging any stops the repeats). */
  noticeIds: string[];
  /** Event time since which the hold conditions are below `level`, ms; null while they hold. */
  belowSinceMs: number | null;
}

/** JSON snapshot of an alert state (kept in the archive). */
export interface AlertStateSnapshot {
  version: 1;
  /** Event time of the last state taken, ms; null before the first. */
  lastEventTimeMs: number | null;
  concerns: Record<string, RaisedConcern>;
}

/** The alert state of one run; see the file comment. */
export class AlertState {
  readonly #options: AlertOptions;
  #lastEventTimeMs: number | null;
  readonly #concerns: Map<string, RaisedConcern>;

  /** A fresh state, or one resumed from its snapshot. */
  constructor(options: AlertOptions, snapshot?: AlertStateSnapshot | null) {
    this.#options = options;
    this.#lastEventTimeMs = snapshot?.lastEventTimeMs ?? null;
    this.#concerns = new Map(Object.entries(snapshot?.concerns ?? {}));
  }

  /** Event time of the last state taken, ms (null before the first). */
  get lastEventTimeMs(): number | null {
    return this.#lastEventTimeMs;
  }

  /** The concerns raised now, by key (copies). */
  concerns(): Record<string, RaisedConcern> {
    return Object.fromEntries(
      [...this.#concerns].map(([key, value]) => [
        key,
        { ...value, noticeIds: [...value.noticeIds] },
      ]),
    );
  }

  /**
   * Takes the rules' findings of the state at `eventTimeMs` and returns the notices to send, in
   * a stable order (by concern key). Record each sent notice's id with noticeSent().
   *
   * @param isAcknowledged - whether a notice id has been acknowledged (stops its repeats)
   * @returns nothing for a state at or before the last event time taken
   */
  update(
    findings: RuleFindings,
    eventTimeMs: number,
    isAcknowledged: (noticeId: string) => boolean = () => false,
  ): NoticeDraft[] {
    if (this.#lastEventTimeMs !== null && eventTimeMs <= this.#lastEventTimeMs) return [];
    this.#lastEventTimeMs = eventTimeMs;
    const raise = byKey(findings.raise);
    const hold = byKey(findings.hold);
    const keys = [...new Set([...raise.keys(), ...hold.keys(), ...this.#concerns.keys()])].sort();
    const drafts: NoticeDraft[] = [];
    const draft = (fields: Omit<NoticeDraft, 'raisedAtMs' | 'figures'>): void => {
      drafts.push({ ...fields, raisedAtMs: eventTimeMs, figures: findings.figures });
    };
    for (const key of keys) {
      const top = topOf(raise.get(key));
      const held = topOf([...(hold.get(key) ?? []), ...(raise.get(key) ?? [])]);
      const concern = this.#concerns.get(key);
      if (concern === undefined || (top !== null && rankOf(top) > levelRank(concern.level))) {
        if (top === null) continue;
        this.#concerns.set(key, {
          level: top.level,
          kind: top.kind,
          notifiedAtMs: eventTimeMs,
          noticeIds: [],
          belowSinceMs: null,
        });
        draft({
          ...fields(top, raise.get(key) ?? []),
          conditionKey: key,
          eased: null,
          repeat: false,
        });
      } else if (held !== null && rankOf(held) >= levelRank(concern.level)) {
        concern.belowSinceMs = null;
        // noticeIds holds the first notice at this level and its repeats.
        const repeatsSent = Math.max(0, concern.noticeIds.length - 1);
        const repeatMs =
          this.#options.renotifyMin * 60_000 * this.#options.renotifyGrowth ** repeatsSent;
        const repeats = levelRank(concern.level) >= levelRank('ACT NOW') && repeatMs > 0;
        const acknowledged = concern.noticeIds.some((id) => isAcknowledged(id));
        if (repeats && !acknowledged && eventTimeMs - concern.notifiedAtMs >= repeatMs) {
          concern.notifiedAtMs = eventTimeMs;
          const current = [...(raise.get(key) ?? []), ...(hold.get(key) ?? [])]
            .filter((c) => levelRank(c.level) >= levelRank(concern.level))
            .sort((a, b) => rankOf(b) - rankOf(a));
          draft({
            level: concern.level,
            kind: current[0]?.kind ?? concern.kind,
            conditionKey: key,
            reasons: unique(current.map((c) => c.reason)),
            eased: null,
            repeat: true,
          });
        }
      } else {
        concern.belowSinceMs ??= eventTimeMs;
        if (eventTimeMs - concern.belowSinceMs < this.#options.dwellMin * 60_000) continue;
        const to = held?.level ?? null;
        draft({
          level: 'NOTE',
          kind: 'eased',
          conditionKey: key,
          reasons: unique((hold.get(key) ?? []).filter((c) => c.level === to).map((c) => c.reason)),
          eased: { from: concern.level, to },
          repeat: false,
        });
        if (held === null) this.#concerns.delete(key);
        else {
          concern.level = held.level;
          concern.kind = held.kind;
          concern.noticeIds = [];
          concern.notifiedAtMs = eventTimeMs;
          concern.belowSinceMs = null;
        }
      }
    }
    return drafts;
  }

  /** Records the id of a sent notice of a concern, for its acknowledgement (an easing starts afresh). */
  noticeSent(conditionKey: string, noticeId: string, kind: NoticeDraft['kind']): void {
    const concern = this.#concerns.get(conditionKey);
    if (concern === undefined) return;
    if (kind === 'eased') concern.noticeIds = [];
    else concern.noticeIds.push(noticeId);
  }

  /** The JSON snapshot. */
  snapshot(): AlertStateSnapshot {
    return { version: 1, lastEventTimeMs: this.#lastEventTimeMs, concerns: this.concerns() };
  }
}

function byKey(conditions: readonly Condition[]): Map<string, Condition[]> {
  const map = new Map<string, Condition[]>();
  for (const condition of conditions) {
    const list = map.get(condition.key) ?? [];
    list.push(condition);
    map.set(condition.key, list);
  }
  return map;
}

/** The condition of the highest level (the first listed among equals), or null. */
function topOf(conditions: readonly Condition[] | undefined): Condition | null {
  let top: Condition | null = null;
  for (const condition of conditions ?? []) {
    if (top === null || rankOf(condition) > rankOf(top)) top = condition;
  }
  return top;
}

function rankOf(condition: Condition): number {
  return levelRank(condition.level);
}

function fields(top: Condition, all: readonly Condition[]) {
  return {
    level: top.level,
    kind: top.kind,
    reasons: unique(all.filter((c) => c.level === top.level).map((c) => c.reason)),
  };
}

function unique(texts: readonly string[]): string[] {
  return [...new Set(texts)];
}
