/**
 * Why a message was quarantined. Stable codes: they are stored, counted and shown; add new ones,
 * never rename. Described for contributors in server/src/ingest/README.md.
 */
export const REASON_CODES = [
  'oversize',
  'malformed-json',
  'wrong-type',
  'not-finite',
  'unsupported-field',
  'bad-topic',
  'unknown-device',
  'unknown-sensor',
  'unit-mismatch',
  'impossible-value',
  'time-in-future',
  'time-before-run',
  'duplicate',
  /** The device belongs only to closed runs (set by the archive at commit: server/src/store/archive.ts). */
  'run-closed',
  /** Validation itself failed (a bug): the message is kept so nothing is lost. */
  'internal-error',
] as const;

export type ReasonCode = (typeof REASON_CODES)[number];

/** A rejected payload: the reason code and a one-line detail naming field, rule and value. */
export interface Rejection {
  ok: false;
  reason: ReasonCode;
  detail: string;
}

/** Builds a Rejection. */
export function reject(reason: ReasonCode, detail: string): Rejection {
  return { ok: false, reason, detail };
}

/** Quotes a received value for a detail line, cut to 60 characters so hostile input stays short. */
export function shown(value: unknown): string {
  let text: string;
  if (typeof value === 'string') text = JSON.stringify(value);
  else if (typeof value === 'number' || typeof value === 'boolean' || value === null)
    text = String(value);
  else if (Array.isArray(value)) text = `a list of ${value.length}`;
  else text = typeof value;
  return text.length > 60 ? `${text.slice(0, 57)}...` : text;
}
