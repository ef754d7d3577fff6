/**
 * One ingest suite over every broker connection: the embedded broker, Mosquitto through MQTT.js
 * on MQTT 5, and a separate aedes through MQTT.js on MQTT 3.1.1.
 */
import mqtt from 'mqtt';
import type { MqttClient } from 'mqtt';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { BROKER_KINDS, startIngestRig, waitUntil } from '../helpers/ingestRig.ts';
import type { IngestRig } from '../helpers/ingestRig.ts';

const DATA = 'meniscus/harbour-deck/probe-a/data';
const STATUS = 'meniscus/harbour-deck/probe-a/status';

describe.each(BROKER_KINDS)('ingest over %s', (kind) => {
  let rig: IngestRig;
  let device: MqttClient;

  beforeEach(async () => {
    rig = await startIngestRig(kind);
    device = await mqtt.connectAsync(rig.url, {
      clientId: `probe-a-${Date.now()}`,
      protocolVersion: 4,
      reconnectPeriod: 100,
    });
  });
  afterEach(async () => {
    await device.endAsync(true);
    await rig.dispose();
  });

  it('stores a valid pack and quarantines a bad one without stopping the flow', async () => {
    const nowS = Date.now() / 1000;
    await device.publishAsync(DATA, '[{"n":"rh-10","u":"%RH","v":98.1,"t":-1}]', { qos: 1 });
    await device.publishAsync(DATA, '[{"n":"rh-10","v":NaN}]', { qos: 1 });
    await device.publishAsync(DATA, '{"nonsense', { qos: 1 });
    await device.publishAsync(DATA, JSON.stringify({ time: nowS, readings: { 'rh-40': 96.4 } }), {
      qos: 1,
    });
    await waitUntil(
      () => rig.archive.totals().readings === 2 && rig.archive.totals().quarantine === 2,
      10_000,
      'two readings and two quarantined',
    );
    expect(rig.archive.readings('run-1').map((r) => [r.sensor, r.value])).toEqual([
      ['rh-10', 98.1],
      ['rh-40', 96.4],
    ]);
    expect(rig.archive.quarantineCounts('run-1')).toEqual({ 'not-finite': 1, 'malformed-json': 1 });
  });

  it('stores 300 numbered readings from a QoS 1 publisher exactly once each', async () => {
    const startS = Math.floor(Date.now() / 1000) - 600;
    await Promise.all(
      Array.from({ length: 300 }, (_, i) =>
        device.publishAsync(
          DATA,
          JSON.stringify([{ n: 'rh-10', v: 90 + (i % 10) / 10, t: startS + i }]),
          { qos: 1 },
        ),
      ),
    );
    await waitUntil(() => rig.archive.totals().readings === 300, 15_000, '300 readings');
    const times = rig.archive.readings('run-1').map((r) => r.eventAtMs / 1000 - startS);
    expect(times).toEqual(Array.from({ length: 300 }, (_, i) => i));
    expect(rig.archive.integrityCheck()).toEqual(['ok']);
  });

  // Only the embedded broker acknowledges the device itself; with an external broker the
  // subscriber's PUBACK after commit is checked by the commit-failure case below.
  it.runIf(kind === BROKER_KINDS[0])(
    'acknowledges the device only after the reading is committed',
    async () => {
      const startS = Math.floor(Date.now() / 1000) - 60;
      for (let i = 0; i < 20; i += 1) {
        await device.publishAsync(
          DATA,
          JSON.stringify([{ n: 't-10', v: 20 + i / 10, t: startS + i }]),
          { qos: 1 },
        );
        expect(rig.archive.totals().readings).toBe(i + 1);
      }
    },
  );

  it('records the retained status and the last will of a device', async () => {
    const probe = await mqtt.connectAsync(rig.url, {
      clientId: `probe-a-status-${Date.now()}`,
      protocolVersion: 4,
      will: { topic: STATUS, payload: Buffer.from('offline'), qos: 1, retain: true },
    });
    await probe.publishAsync(STATUS, 'online', { qos: 1, retain: true });
    await waitUntil(() => deviceStatus(rig) === 'online', 10_000, 'status online');
    probe.stream.destroy(); // dies without DISCONNECT: the broker publishes the will
    await waitUntil(() => deviceStatus(rig) === 'offline', 10_000, 'last will offline');
    await probe.endAsync(true);
  });

  it('does not lose a message whose commit failed: it comes again and is stored once', async () => {
    rig.failNextCommits(1);
    const t = Math.floor(Date.now() / 1000) - 5;
    await device.publishAsync(DATA, JSON.stringify([{ n: 'rh-40', v: 95, t }]), { qos: 1 });
    await waitUntil(() => rig.archive.totals().readings === 1, 15_000, 'the redelivered reading');
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(rig.archive.totals()).toMatchObject({ readings: 1, quarantine: 0 });
  });
});

function deviceStatus(rig: IngestRig): string | null {
  const db = (rig.archive as unknown as { db: import('better-sqlite3').Database }).db;
  const row = db
    .prepare("SELECT status FROM devices WHERE run_id = 'run-1' AND name = 'probe-a'")
    .get() as { status: string | null } | undefined;
  return row?.status ?? null;
}
