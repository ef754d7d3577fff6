/**
 * The site-box Mosquitto configuration (deploy/mosquitto/) run for real: Debian's mosquitto is
 * started with the committed mosquitto.conf and acl (paths and port moved to a temp folder), and
 * MQTT 5 clients check authentication and the per-device ACL by the reason codes the broker sends.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { chownSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import mqtt, { type MqttClient } from 'mqtt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../helpers/freePort.ts';

const deployDir = new URL('../../deploy/mosquitto/', import.meta.url);
const users = {
  server: 'meniscus-server',
  forecast: 'meniscus-forecast',
  probe: 'probe-a',
  otherProbe: 'probe-b',
} as const;
const password = 'test-only-password';

let workDir = '';
let port = 0;
let broker: ChildProcess | undefined;

/** The committed config with the container paths and port replaced by the test's own. */
function testConfig(): string {
  return readFileSync(new URL('mosquitto.conf', deployDir), 'utf8')
    .replace('/mosquitto/data/', `${workDir}/`)
    .replace('/mosquitto/config/passwd', join(workDir, 'passwd'))
    .replace('/mosquitto/config/acl', join(workDir, 'acl'))
    .replace(/^listener 1883$/m, `listener ${port} 127.0.0.1`);
}

async function connect(username: string | undefined): Promise<MqttClient> {
  const client = mqtt.connect(`mqtt://127.0.0.1:${port}`, {
    protocolVersion: 5,
    reconnectPeriod: 0,
    connectTimeout: 5000,
    ...(username === undefined ? {} : { username, password }),
  });
  return new Promise((resolve, reject) => {
    client.once('connect', () => resolve(client));
    client.once('error', (error) => {
      client.end(true);
      reject(error);
    });
  });
}

/**
 * PUBACK reason code of a QoS 1 publish (0 = accepted, 135 = not authorized). MQTT.js rejects a
 * publish whose PUBACK carries an error code and puts the code on the error.
 */
async function publishReasonCode(client: MqttClient, topic: string): Promise<number> {
  try {
    await client.publishAsync(topic, '{"v":1}', { qos: 1 });
    return 0;
  } catch (error) {
    return (error as { code?: number }).code ?? -1;
  }
}

beforeAll(async () => {
  workDir = mkdtempSync(join(tmpdir(), 'meniscus-mosquitto-'));
  port = await freePort();
  writeFileSync(join(workDir, 'acl'), readFileSync(new URL('acl', deployDir)));
  const makePasswords = new URL('make-passwords.sh', deployDir).pathname;
  execFileSync(
    'sh',
    [makePasswords, ...Object.values(users).map((user) => `${user}:${password}`)],
    {
      env: { ...process.env, MOSQUITTO_PASSWD_FILE: join(workDir, 'passwd') },
    },
  );
  writeFileSync(join(workDir, 'mosquitto.conf'), testConfig());
  // Started as root, mosquitto drops to the mosquitto user: let it read and write its folder.
  if (process.getuid?.() === 0) {
    const uid = Number(execFileSync('id', ['-u', 'mosquitto']).toString());
    const gid = Number(execFileSync('id', ['-g', 'mosquitto']).toString());
    for (const name of ['', 'acl', 'passwd', 'mosquitto.conf'])
      chownSync(join(workDir, name), uid, gid);
  }
  broker = spawn('/usr/sbin/mosquitto', ['-c', join(workDir, 'mosquitto.conf')], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const deadline = Date.now() + 10_000;
  for (;;) {
    try {
      (await connect(users.server)).end(true);
      return;
    } catch (error) {
      if (Date.now() > deadline) throw error;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
  }
});

afterAll(() => {
  broker?.kill('SIGTERM');
  if (workDir !== '') rmSync(workDir, { recursive: true, force: true });
});

describe('deploy/mosquitto configuration', () => {
  it('refuses a client without credentials', async () => {
    await expect(connect(undefined)).rejects.toThrow(/Not authorized|Bad User Name or Password/i);
  });

  it('lets a device publish its own readings and status, and the server read them', async () => {
    const server = await connect(users.server);
    const device = await connect(users.probe);
    const received: string[] = [];
    server.on('message', (topic) => received.push(topic));
    await server.subscribeAsync('meniscus/#', { qos: 1 });
    expect(await publishReasonCode(device, 'meniscus/deck-b/probe-a/data')).toBe(0);
    expect(await publishReasonCode(device, 'meniscus/deck-b/probe-a/status')).toBe(0);
    await expect.poll(() => received.length).toBe(2);
    expect(received).toEqual(['meniscus/deck-b/probe-a/data', 'meniscus/deck-b/probe-a/status']);
    server.end(true);
    device.end(true);
  });

  it('lets the forecast feed publish a site forecast, which the server reads', async () => {
    const server = await connect(users.server);
    const feed = await connect(users.forecast);
    const received: string[] = [];
    server.on('message', (topic) => received.push(topic));
    await server.subscribeAsync('meniscus/#', { qos: 1 });
    expect(await publishReasonCode(feed, 'meniscus/deck-b/forecast')).toBe(0);
    await expect.poll(() => received).toEqual(['meniscus/deck-b/forecast']);
    server.end(true);
    feed.end(true);
  });

  it('lets the server publish crew notices of a site, which it reads back', async () => {
    const server = await connect(users.server);
    const received: string[] = [];
    server.on('message', (topic) => received.push(topic));
    await server.subscribeAsync('meniscus/#', { qos: 1 });
    expect(await publishReasonCode(server, 'meniscus/deck-b/notices')).toBe(0);
    await expect.poll(() => received).toEqual(['meniscus/deck-b/notices']);
    server.end(true);
  });

  it.each([
    ['a device publishing crew notices', users.probe, 'meniscus/deck-b/notices'],
    ['a device publishing a forecast', users.probe, 'meniscus/deck-b/forecast'],
    ['the forecast feed publishing readings', users.forecast, 'meniscus/deck-b/probe-a/data'],
    ['another device', users.probe, 'meniscus/deck-b/probe-b/data'],
    ['a topic outside meniscus/', users.probe, 'other/probe-a/data'],
    ['the read-only server account', users.server, 'meniscus/deck-b/probe-a/data'],
  ])('denies publishing as %s (%s to %s)', async (_case, username, topic) => {
    const client = await connect(username);
    expect(await publishReasonCode(client, topic)).toBe(135);
    client.end(true);
  });
});
