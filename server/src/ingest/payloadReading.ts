/** One reading as a payload states it, before it is matched to a run's sensor. */
export interface PayloadReading {
  /** Sensor name: the SenML resolved name (bn + n) or the simple form's key. */
  name: string;
  /** Event time, ms since the Unix epoch. */
  eventAtMs: number;
  value: number;
  /** Unit as sent, null when the payload gave none. */
  unit: string | null;
  /** SenML `ut` (max seconds until the next report), null when not sent. */
  updateIntervalS: number | null;
}

/** A payload parsed into readings. */
export interface ParsedPayload {
  ok: true;
  form: 'senml' | 'simple';
  readings: PayloadReading[];
}
