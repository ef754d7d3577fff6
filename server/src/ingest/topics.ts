/**
 * MQTT topics (architecture.md): `meniscus/<site>/<device>/data` carries readings,
 * `meniscus/<site>/<device>/status` a device's retained status and its last will.
 */

/** The ingest subscriptions. */
export const DATA_TOPIC_FILTER = 'meniscus/+/+/data';
export const STATUS_TOPIC_FILTER = 'meniscus/+/+/status';

export interface DeviceTopic {
  site: string;
  device: string;
  channel: 'data' | 'status';
}

const LEVEL = /^[A-Za-z0-9._-]{1,64}$/;

/**
 * Splits a topic into site, device and channel.
 *
 * @returns null when the topic is not `meniscus/<site>/<device>/(data|status)` with levels of
 *   1-64 letters, digits, `.`, `_` or `-`
 */
export function parseDeviceTopic(topic: string): DeviceTopic | null {
  const levels = topic.split('/');
  if (levels.length !== 4 || levels[0] !== 'meniscus') return null;
  const [, site = '', device = '', channel] = levels;
  if (!LEVEL.test(site) || !LEVEL.test(device)) return null;
  if (channel !== 'data' && channel !== 'status') return null;
  return { site, device, channel };
}

/** True when `topic` matches the subscription filter `meniscus/+/+/data` (levels not checked). */
export function matchesDataFilter(topic: string): boolean {
  const levels = topic.split('/');
  return levels.length === 4 && levels[0] === 'meniscus' && levels[3] === 'data';
}

/** The data topic of a device. */
export function dataTopic(site: string, device: string): string {
  return `meniscus/${site}/${device}/data`;
}

/** The status topic of a device. */
export function statusTopic(site: string, device: string): string {
  return `meniscus/${site}/${device}/status`;
}
