/**
 * The simulators on a site box's kind of broker: Debian's Mosquitto with a password per device
 * (anonymous clients refused), the ingest subscribed as its own user over MQTT 5, the archive
 * on disk. Each device logs in with its id as user name from a passwords file, as the
 * docker-compose deployment expects.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { startMqttSubscriber } from '../../server/src/mqtt/mqttSubscriber.ts';
import type { MqttSubscriber } from '../../server/src/mqtt/mqttSubscriber.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { simulateMain } from '../../simulators/src/simulateCommand.ts';
import { waitUntil } from '../helpers/ingestRig.ts';
import { startMosquitto } from '../helpers/mosquitto.ts';
import type { Mosquitto } from '../helpers/mosquitto.ts';

const { runConfigInput } = loadScenarioFolder('level3-topping');
const PASSWORDS: Record<string, string> = {
  'meniscus-server': 'server-secret',
  'probe-c5': 'c5-secret',
  'probe-c7': 'c7-secret',
  'mast-l3': 'mast-secret',
};

describe('simulators against Mosquitto with device passwords', () => {
  let dir: string;
  let mosquitto: Mosquitto;
  let archive: Archive;
  let ingestor: Ingestor;
  let subscriber: MqttSubscriber;
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'meniscus-sim-mosquitto-'));
    mosquitto = await startMosquitto({ users: PASSWORDS });
    archive = Archive.open(join(dir, 'archive.sqlite'));
    archive.createRun(parseRunConfig(runConfigInput), Date.now(), 'run-mosquitto');
    ingestor = new Ingestor(archive);
    subscriber = startMqttSubscriber(ingestor, {
      url: mosquitto.url,
      clientId: 'meniscus-ingest-sim',
      username: 'meniscus-server',
      password: PASSWORDS['meniscus-server'] as string,
      protocolVersion: 5,
      reconnectPeriodMs: 100,
    });
    await subscriber.ready;
  });
  afterAll(async () => {
    await subscriber.close();
    archive.close();
    await mosquitto.dispose();
    rmSync(dir, { recursive: true, force: true });
  });

  it('every device logs in with its own password and its readings are committed', async () => {
    const file = join(dir, 'devices.txt');
    writeFileSync(
      file,
      ['probe-c5', 'probe-c7', 'mast-l3'].map((d) => `${d}:${PASSWORDS[d]}`).join('\n'),
    );
    const code = await simulateMain([
      '--url',
      mosquitto.url,
      '--passwords',
      file,
      '--speed',
      '120',
      '--duration-h',
      '0.3',
      '--stand-in-truth',
    ]);
    expect(code).toBe(0);
    // 11:00 to 11:18 at 120x (9 s): 19 station packs, and 4 from each probe string after the 11:15 pour
    await waitUntil(
      () => ingestor.counters.messages >= 19 + 2 * 3,
      5000,
      'messages through Mosquitto',
    );
    const devices = new Set(archive.readings('run-mosquitto').map((reading) => reading.device));
    expect(devices).toEqual(new Set(['probe-c5', 'probe-c7', 'mast-l3']));
  });

  it('a device with a wrong password is refused and the command exits 1', async () => {
    const file = join(dir, 'wrong.txt');
    writeFileSync(file, 'mast-l3:not-the-password\n');
    expect(
      await simulateMain([
        '--url',
        mosquitto.url,
        '--passwords',
        file,
        '--speed',
        '120',
        '--duration-h',
        '0.1',
        '--stand-in-truth',
      ]),
    ).toBe(1);
  });
});
