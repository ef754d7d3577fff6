/**
 * Fuzz through the embedded broker: 2,000 hostile and valid payloads published at QoS 1 by one
 * device connection. The broker stays up and acknowledges every one; each bad payload is
 * quarantined with its reason and each valid one stored.
 */
import mqtt from 'mqtt';
import { expect, it } from 'vitest';
import { matchesDataFilter } from '../../server/src/ingest/topics.ts';
import { startEmbeddedBroker } from '../../server/src/mqtt/embeddedBroker.ts';
import { hostileCases, openFuzzTarget } from '../helpers/hostilePayloads.ts';

/** Topics MQTT itself forbids in PUBLISH (wildcards, empty, NUL) would end the connection, not reach ingest. */
const publishable = (topic: string) =>
  topic.length > 0 &&
  !topic.includes('+') &&
  !topic.includes('#') &&
  !topic.includes(String.fromCharCode(0));

function tally(reasons: readonly string[]): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const reason of reasons) counts[reason] = (counts[reason] ?? 0) + 1;
  return counts;
}

it(
  'keeps the embedded broker up and acknowledges 2,000 fuzzed payloads, each stored or quarantined as expected',
  { timeout: 60_000 },
  async () => {
    const { archive, ingestor } = openFuzzTarget();
    const broker = await startEmbeddedBroker(ingestor, { port: 0 });
    const device = await mqtt.connectAsync(`mqtt://127.0.0.1:${broker.port}`, {
      protocolVersion: 4,
      clientId: 'fuzzing-device',
    });
    try {
      const cases = hostileCases(2000, 7).filter((c) => publishable(c.topic));
      for (let start = 0; start < cases.length; start += 200) {
        await Promise.all(
          cases
            .slice(start, start + 200)
            .map((c) => device.publishAsync(c.topic, c.bytes, { qos: 1 })),
        );
      }
      // Like any subscriber of meniscus/+/+/data, ingest never sees topics outside that filter.
      const expectedBad = cases
        .filter(
          (c) =>
            c.expected !== 'stored' && (c.expected !== 'bad-topic' || matchesDataFilter(c.topic)),
        )
        .map((c) => c.expected);
      const quarantined = [
        ...archive.quarantine(null, 10_000),
        ...archive.quarantine('run-1', 10_000),
      ].map((q) => q.reason);
      expect(tally(quarantined)).toEqual(tally(expectedBad));
      expect(archive.totals().readings).toBe(cases.filter((c) => c.expected === 'stored').length);
      expect(broker.state()).toMatchObject({ connected: true, lastError: null });
      expect(archive.integrityCheck()).toEqual(['ok']);
    } finally {
      await device.endAsync(true);
      await broker.close();
      archive.close();
    }
  },
);
