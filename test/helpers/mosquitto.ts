/**
 * Starts Debian's Mosquitto on a free port with its own config in a temporary folder
 * (dependencies.md: `max_queued_messages 0`, since the default of 1000 drops QoS 1 messages to a
 * slow subscriber). Started as root it drops to the `mosquitto` user, so the folder is made
 * world-readable and, with persistence, world-writable.
 */
import { execFileSync, spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort, waitForPort } from './freePort.ts';
import { killOnExit, terminate } from './killOnExit.ts';
import { makeTestCertificates } from './testCertificates.ts';
import type { TestCertificates } from './testCertificates.ts';

export const MOSQUITTO_BINARY = '/usr/sbin/mosquitto';

export interface Mosquitto {
  port: number;
  /** `mqtt://` or, with TLS, `mqtts://` and the port. */
  url: string;
  /** The CA and server certificate, when started with TLS. */
  certificates: TestCertificates | null;
  /** Stops it (SIGTERM, which also saves persistence) and waits for the exit. */
  stop(): Promise<void>;
  /** Starts it again on the same port with the same files. */
  start(): Promise<void>;
  /** Stops it and removes its folder. */
  dispose(): Promise<void>;
}

/**
 * @param options.persistence - keep sessions and queued messages across restarts (saved on stop)
 * @param options.users - user name to password; when given, anonymous clients are refused
 * @param options.tls - listen with TLS only, with a certificate from a throw-away CA
 */
export async function startMosquitto(
  options: { persistence?: boolean; users?: Record<string, string>; tls?: boolean } = {},
): Promise<Mosquitto> {
  const dir = mkdtempSync(join(tmpdir(), 'meniscus-mosquitto-'));
  chmodSync(dir, 0o777);
  const port = await freePort();
  const lines = [
    `listener ${port} 127.0.0.1`,
    'max_queued_messages 0',
    'log_dest stdout',
    'log_type error',
    'log_type warning',
  ];
  const certificates = options.tls === true ? makeTestCertificates(dir) : null;
  if (certificates !== null) {
    lines.push(
      `cafile ${certificates.caFile}`,
      `certfile ${certificates.certFile}`,
      `keyfile ${certificates.keyFile}`,
    );
  }
  if (options.users === undefined) lines.push('allow_anonymous true');
  else {
    const passwordFile = join(dir, 'passwd');
    for (const [user, password] of Object.entries(options.users)) {
      const create = Object.keys(options.users)[0] === user ? ['-c'] : [];
      execFileSync('/usr/bin/mosquitto_passwd', ['-b', ...create, passwordFile, user, password]);
    }
    chmodSync(passwordFile, 0o644);
    lines.push('allow_anonymous false', `password_file ${passwordFile}`);
  }
  if (options.persistence === true) {
    lines.push('persistence true', `persistence_location ${dir}/`, 'autosave_interval 1');
  } else lines.push('persistence false');
  const configFile = join(dir, 'mosquitto.conf');
  writeFileSync(configFile, `${lines.join('\n')}\n`);
  chmodSync(configFile, 0o644);
  let child: ChildProcess | null = null;
  const start = async () => {
    child = spawn(MOSQUITTO_BINARY, ['-c', configFile], { stdio: ['ignore', 'ignore', 'inherit'] });
    killOnExit(child);
    await waitForPort(port);
  };
  const stop = async () => {
    const running = child;
    child = null;
    await terminate(running);
  };
  await start();
  return {
    port,
    url: `${certificates === null ? 'mqtt' : 'mqtts'}://127.0.0.1:${port}`,
    certificates,
    start,
    stop,
    async dispose() {
      await stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
