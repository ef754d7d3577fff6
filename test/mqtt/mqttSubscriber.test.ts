/**
 * The external-broker client against a real Mosquitto with user names and passwords: it logs
 * in, keeps its persistent session while it is away (MQTT 5 session expiry), and reports a
 * refused login in its state instead of crashing.
 */
import { readFileSync } from 'node:fs';
import mqtt from 'mqtt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { startMqttSubscriber } from '../../server/src/mqtt/mqttSubscriber.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { exampleRunInput } from '../helpers/exampleRun.ts';
import { waitUntil } from '../helpers/ingestRig.ts';
import { startMosquitto } from '../helpers/mosquitto.ts';
import type { Mosquitto } from '../helpers/mosquitto.ts';

let mosquitto: Mosquitto;
beforeAll(async () => {
  mosquitto = await startMosquitto({
    users: { ingest: 'ingest-secret', 'probe-a': 'probe-secret' },
  });
});
afterAll(async () => {
  await mosquitto.dispose();
});

describe('startMqttSubscriber()', () => {
  it(
    'logs in, and receives what was published while it was away (persistent session)',
    { timeout: 30_000 },
    async () => {
      const archive = Archive.open(':memory:');
      archive.createRun(
        parseRunConfig(
          exampleRunInput({ placedAt: new Date(Date.now() - 3_600_000).toISOString() }),
        ),
        Date.now(),
        'run-1',
      );
      const ingestor = new Ingestor(archive);
      const options = {
        url: mosquitto.url,
        clientId: 'meniscus-session-test',
        username: 'ingest',
        password: 'ingest-secret',
        reconnectPeriodMs: 100,
      };
      const first = startMqttSubscriber(ingestor, options);
      await first.ready;
      await first.close(); // a clean DISCONNECT: the session stays for its expiry interval

      const device = await mqtt.connectAsync(mosquitto.url, {
        username: 'probe-a',
        password: 'probe-secret',
        protocolVersion: 4,
      });
      const t0 = Math.floor(Date.now() / 1000) - 100;
      for (let i = 0; i < 50; i += 1) {
        await device.publishAsync(
          'meniscus/harbour-deck/probe-a/data',
          JSON.stringify([{ n: 'rh-10', v: 95, t: t0 + i }]),
          { qos: 1 },
        );
      }
      await device.endAsync();

      const second = startMqttSubscriber(ingestor, options);
      await waitUntil(
        () => archive.totals().readings === 50,
        10_000,
        'the 50 readings queued while away',
      );
      expect(second.state()).toMatchObject({ kind: 'external', connected: true, lastError: null });
      await second.close();
      archive.close();
    },
  );

  it('reports a refused login in its state and keeps trying', { timeout: 30_000 }, async () => {
    const archive = Archive.open(':memory:');
    const subscriber = startMqttSubscriber(new Ingestor(archive), {
      url: mosquitto.url,
      clientId: 'meniscus-wrong-password',
      username: 'ingest',
      password: 'wrong',
      reconnectPeriodMs: 100,
    });
    await waitUntil(() => subscriber.state().lastError !== null, 10_000, 'the refusal');
    expect(subscriber.state()).toMatchObject({ connected: false });
    expect(subscriber.state().lastError).toMatch(/not authorized|bad user name or password/i);
    await subscriber.close();
    archive.close();
  });
});

describe('startMqttSubscriber() over TLS', () => {
  it(
    'connects with the configured CA file and refuses a broker it cannot verify',
    { timeout: 30_000 },
    async () => {
      const tlsBroker = await startMosquitto({ tls: true });
      const archive = Archive.open(':memory:');
      archive.createRun(
        parseRunConfig(
          exampleRunInput({ placedAt: new Date(Date.now() - 3_600_000).toISOString() }),
        ),
        Date.now(),
        'run-1',
      );
      const ingestor = new Ingestor(archive);
      const caFile = tlsBroker.certificates?.caFile ?? '';
      const trusted = startMqttSubscriber(ingestor, {
        url: tlsBroker.url,
        clientId: 'meniscus-tls',
        caFile,
        reconnectPeriodMs: 100,
      });
      const untrusted = startMqttSubscriber(ingestor, {
        url: tlsBroker.url,
        clientId: 'meniscus-tls-no-ca',
        reconnectPeriodMs: 100,
      });
      try {
        await trusted.ready;
        const device = await mqtt.connectAsync(tlsBroker.url, {
          ca: readFileSync(caFile),
          protocolVersion: 4,
        });
        await device.publishAsync(
          'meniscus/harbour-deck/probe-a/data',
          JSON.stringify([{ n: 'rh-10', v: 95, t: -1 }]),
          { qos: 1 },
        );
        await device.endAsync();
        await waitUntil(() => archive.totals().readings === 1, 10_000, 'the reading over TLS');
        await waitUntil(
          () => untrusted.state().lastError !== null,
          10_000,
          'the certificate refusal',
        );
        expect(untrusted.state()).toMatchObject({ connected: false });
        expect(untrusted.state().lastError).toMatch(/certificate/i);
      } finally {
        await untrusted.close();
        await trusted.close();
        archive.close();
        await tlsBroker.dispose();
      }
    },
  );
});
