/**
 * First look at a message's bytes: size, text encoding, JSON, then the payload form (a JSON
 * array is a SenML pack, an object the simple form). Pure: no I/O, no clock but the one passed.
 */
import type { ParsedPayload } from './payloadReading.ts';
import { parseSenml } from './parseSenml.ts';
import { parseSimpleJson } from './parseSimpleJson.ts';
import { reject } from './reasons.ts';
import type { Rejection } from './reasons.ts';

/** Largest payload accepted: 64 KiB (our assumption; a pack of a few hundred records fits). */
export const MAX_PAYLOAD_BYTES = 64 * 1024;

const utf8 = new TextDecoder('utf-8', { fatal: true });

/**
 * @param bytes - the MQTT payload
 * @param receivedAtMs - receive time, ms since the epoch (origin of SenML relative times)
 * @returns readings, or a Rejection with reason `oversize`, `malformed-json` (bad UTF-8 or JSON),
 *   `not-finite` (bare NaN or Infinity tokens, or numbers beyond double range) or a form's own
 */
export function parsePayload(bytes: Uint8Array, receivedAtMs: number): ParsedPayload | Rejection {
  if (bytes.length > MAX_PAYLOAD_BYTES) {
    return reject(
      'oversize',
      `payload must be at most ${MAX_PAYLOAD_BYTES} bytes: got ${bytes.length}`,
    );
  }
  let text: string;
  try {
    text = utf8.decode(bytes);
  } catch {
    return reject('malformed-json', 'payload must be UTF-8 text: got invalid byte sequences');
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    if (parsesWithoutNonFiniteTokens(text)) {
      return reject('not-finite', 'numbers must be finite: got a bare NaN or Infinity token');
    }
    const why = error instanceof Error ? error.message.slice(0, 120) : 'unparseable';
    return reject('malformed-json', `payload must be JSON: ${why}`);
  }
  return Array.isArray(json) ? parseSenml(json, receivedAtMs) : parseSimpleJson(json);
}

/** True when `text` becomes valid JSON once bare NaN/Infinity tokens outside strings are nulled. */
function parsesWithoutNonFiniteTokens(text: string): boolean {
  let replaced = '';
  let found = false;
  let inString = false;
  for (let i = 0; i < text.length; i += 1) {
    const char = text[i];
    if (inString) {
      replaced += char;
      if (char === '\\') {
        replaced += text[i + 1] ?? '';
        i += 1;
      } else if (char === '"') inString = false;
      continue;
    }
    if (char === '"') inString = true;
    const token = /^(-?Infinity|NaN)/.exec(text.slice(i, i + 9));
    if (token !== null) {
      replaced += 'null';
      i += token[0].length - 1;
      found = true;
      continue;
    }
    replaced += char;
  }
  if (!found) return false;
  try {
    JSON.parse(replaced);
    return true;
  } catch {
    return false;
  }
}
