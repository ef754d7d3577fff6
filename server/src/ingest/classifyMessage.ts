/**
 * Decides what a data message becomes in the archive: for each open run that listens to the
 * device, either an accepted item with its readings or a quarantine item with the reason. A
 * message that no run listens to, or that cannot be read at all, is one quarantine item.
 * Pure apart from the `bindingsFor` lookup passed in.
 *
 * Order of checks: topic, size, encoding, JSON, form, device, then per run: sensor, unit, value,
 * time. Duplicates are found at commit (the archive knows what it holds).
 */
import type { CommitItem, DeviceBinding } from '../store/types.ts';
import { DEFAULT_TIME_LIMITS, matchReadings } from './matchReadings.ts';
import type { TimeLimits } from './matchReadings.ts';
import { parsePayload } from './parsePayload.ts';
import { parseDeviceTopic } from './topics.ts';

export type BindingLookup = (site: string, device: string) => readonly DeviceBinding[];

/**
 * @param topic - MQTT topic of the message
 * @param bytes - payload
 * @param receivedAtMs - receive time, ms since the epoch
 * @param bindingsFor - the open runs listening to a device (Archive.bindingsFor)
 * @returns one commit item per listening run, or one quarantine item
 */
export function classifyMessage(
  topic: string,
  bytes: Uint8Array,
  receivedAtMs: number,
  bindingsFor: BindingLookup,
  limits: TimeLimits = DEFAULT_TIME_LIMITS,
): CommitItem[] {
  const quarantine = (runId: string | null, reason: string, detail: string): CommitItem => ({
    kind: 'quarantine',
    runId,
    reason,
    detail,
    topic,
    receivedAtMs,
    bytes,
  });
  const parts = parseDeviceTopic(topic);
  if (parts === null || parts.channel !== 'data') {
    return [
      quarantine(
        null,
        'bad-topic',
        `topic must be meniscus/<site>/<device>/data: got ${JSON.stringify(topic.slice(0, 120))}`,
      ),
    ];
  }
  const parsed = parsePayload(bytes, receivedAtMs);
  const bindings = bindingsFor(parts.site, parts.device);
  const runIds = bindings.length === 0 ? [null] : bindings.map((binding) => binding.runId);
  if (!parsed.ok) return runIds.map((runId) => quarantine(runId, parsed.reason, parsed.detail));
  if (bindings.length === 0) {
    return [
      quarantine(
        null,
        'unknown-device',
        `device ${parts.device} on site ${parts.site} is in no open run`,
      ),
    ];
  }
  return bindings.map((binding) => {
    const matched = matchReadings(parsed.readings, parts.device, binding, receivedAtMs, limits);
    if (!matched.ok) return quarantine(binding.runId, matched.reason, matched.detail);
    return {
      kind: 'accepted',
      runId: binding.runId,
      topic,
      receivedAtMs,
      bytes,
      readings: matched.readings,
    };
  });
}
