/**
 * Types of crew notices (architecture.md `server/alerts`): the levels of vocabulary.md, the
 * conditions the rules find in a run's state, and the Notice of the JSON contract that the API,
 * socket.io and the channels carry (/work/notes/contracts.md, "Crew notices": add fields freely,
 * never rename).
 */

/** Levels of a crew notice, lowest first (vocabulary.md); always written out in words. */
export const NOTICE_LEVELS = ['NOTE', 'PREPARE', 'ACT NOW', 'CRACKING LIKELY'] as const;
export type NoticeLevel = (typeof NOTICE_LEVELS)[number];

/** Rank of a level: NOTE 0, PREPARE 1, ACT NOW 2, CRACKING LIKELY 3. */
export function levelRank(level: NoticeLevel): number {
  return NOTICE_LEVELS.indexOf(level);
}

/** What raised a notice. */
export type NoticeKind =
  | 'margin-outlook'
  | 'utilization'
  | 'evaporation-rate'
  | 'bleed-exceeded'
  | 'sensor-silent'
  | 'data-degraded'
  | 'strength-reached'
  | 'measure-logged'
  | 'eased';

/** The key figures a notice quotes (null where the state has none). */
export interface NoticeFigures {
  /** Utilization now (median over the members), stress over strength. */
  utilization: number | null;
  /** Margin now (median), strength minus stress, MPa; null in the plastic phase. */
  marginMPa: number | null;
  /** Evaporation rate now, kg/m2/h. */
  evaporationKgM2h: number | null;
  /** Expected time the margin closes (utilization crosses 1), ms since the epoch. */
  expectedClosingMs: number | null;
  /** Probability that utilization reaches 1 within the outlook's horizon, 0..1. */
  probabilityCracking: number | null;
}

/**
 * One condition the rules find in a state. Conditions of one `key` are one concern of the crew
 * (the margin, the evaporation, a silent sensor): the alert state keeps one level per key.
 */
export interface Condition {
  /** Stable identity of the concern, e.g. `margin`, `evaporation`, `sensor:probe-c7/rh-05`. */
  key: string;
  kind: Exclude<NoticeKind, 'eased'>;
  level: NoticeLevel;
  /** One short clause for the text: why the rule holds, with figures and units. */
  reason: string;
}

/** Conditions found with the thresholds as written (raise) and relaxed by the hysteresis (hold). */
export interface RuleFindings {
  /** Conditions that raise or escalate a notice. */
  raise: Condition[];
  /** Conditions that keep a raised notice from easing (thresholds relaxed by the margins). */
  hold: Condition[];
  figures: NoticeFigures;
}

/** Status of one delivery of a notice over one channel to one recipient. */
export type DeliveryStatus = 'pending' | 'sent' | 'failed';

/** One delivery of a notice (the outbox row as the API shows it). */
export interface NoticeDelivery {
  channel: string;
  recipient: string;
  /** `failed` with a later attempt pending while `nextAttemptMs` is set. */
  status: DeliveryStatus;
  attempts: number;
  /** Wall-clock time of the last attempt, ms since the epoch. */
  lastAttemptMs: number | null;
  error: string | null;
  /** Wall-clock time of the next attempt, ms; null when none is due (sent, or given up). */
  nextAttemptMs: number | null;
}

/** A crew notice (the JSON contract). */
export interface Notice {
  /** `n-<runId>-<seq>`. */
  id: string;
  runId: string;
  /** 1, 2, 3 ... per run. */
  seq: number;
  level: NoticeLevel;
  kind: NoticeKind;
  /** Key of the condition it concerns (`margin`, `evaporation`, ...). */
  conditionKey: string;
  /** Engine event time it was raised at, ms since the epoch. */
  raisedAtMs: number;
  /** One line: level, what to do, when. */
  title: string;
  /** The whole plain-language message. */
  text: string;
  figures: NoticeFigures;
  deliveries: NoticeDelivery[];
  acknowledgedAtMs: number | null;
  acknowledgedBy: string | null;
  /** True for a repeat of an unacknowledged notice. */
  repeat: boolean;
}

/** A notice decided by the alert state, before it has an id, text or deliveries. */
export interface NoticeDraft {
  level: NoticeLevel;
  kind: NoticeKind;
  conditionKey: string;
  raisedAtMs: number;
  /** The conditions behind it (for an easing: what still holds, may be empty). */
  reasons: string[];
  /** For an easing: the level it eased from, and to (null: cleared). */
  eased: { from: NoticeLevel; to: NoticeLevel | null } | null;
  repeat: boolean;
  figures: NoticeFigures;
}
