/**
 * Checks of the deployment files that can be made without a Docker engine (none runs on this
 * machine kind, and Debian's client has no `compose` command): the compose file parses, every
 * file it mounts exists or is made by a committed script, the server's environment passes the
 * server's own validation, and the Dockerfile and systemd unit point at files that exist.
 */
import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';
import { parseSimulateFlags } from '../../simulators/src/simulateCommand.ts';

const repo = new URL('../../', import.meta.url);
const read = (path: string) => readFileSync(new URL(path, repo), 'utf8');

interface ComposeService {
  image?: string;
  build?: string;
  command?: string[];
  depends_on?: string[];
  volumes?: string[];
  environment?: Record<string, string | number>;
  profiles?: string[];
}
const compose = parse(read('docker-compose.yml')) as { services: Record<string, ComposeService> };

/** Files the compose file mounts that are made on the box, never committed (see its header). */
const GENERATED = ['./deploy/mosquitto/passwd', './deploy/demo-devices.txt'];

/** Substitutes `${NAME:-default}` and `${NAME:?message}` the way compose does, from `values`. */
function interpolate(text: string, values: Record<string, string>): string {
  return text.replace(
    /\$\{(\w+)(?::([-?])([^}]*))?\}/g,
    (_match, name: string, op, rest: string) => {
      const value = values[name];
      if (value !== undefined && value !== '') return value;
      if (op === '-') return rest;
      throw new Error(`compose would stop: ${name} is unset (${rest})`);
    },
  );
}

describe('docker-compose.yml', () => {
  it('has the broker, the database and the server', () => {
    expect(Object.keys(compose.services)).toEqual(
      expect.arrayContaining(['mosquitto', 'influxdb', 'meniscus']),
    );
    expect(compose.services.meniscus?.build).toBe('.');
  });

  it('mounts only files that exist or that are made on the box (make-passwords.sh, the demo devices)', () => {
    const generated = new Set(GENERATED);
    const binds = Object.values(compose.services)
      .flatMap((service) => service.volumes ?? [])
      .map((volume) => volume.split(':')[0] ?? '')
      .filter((source) => source.startsWith('./'));
    expect(binds.length).toBeGreaterThan(0);
    for (const source of binds) {
      expect(generated.has(source) || existsSync(new URL(source, repo)), source).toBe(true);
    }
  });

  it('gives the server an environment its own validation accepts', () => {
    const secrets = { MENISCUS_MQTT_PASSWORD: 'x', MENISCUS_INFLUX_TOKEN: 'y' };
    const environment = Object.fromEntries(
      Object.entries(compose.services.meniscus?.environment ?? {}).map(([key, value]) => [
        key,
        interpolate(String(value), secrets),
      ]),
    );
    const config = serverConfigFromEnv(environment);
    expect(config.mqtt.mode).toBe('external');
    expect(config.influx?.url).toBe('http://influxdb:8086');
    expect(config.httpHost).toBe('0.0.0.0');
  });

  it('ignores the files made on the box in git', () => {
    const ignored = read('.gitignore').split('\n');
    for (const file of GENERATED) expect(ignored, file).toContain(file.slice(2));
  });

  it('stops with a message when a required secret is missing', () => {
    const value = String(compose.services.meniscus?.environment?.MENISCUS_MQTT_PASSWORD);
    expect(() => interpolate(value, {})).toThrow(/MENISCUS_MQTT_PASSWORD/);
  });
});

describe('docker-compose.yml, demo profile', () => {
  const simulators = compose.services.simulators;
  const argv = simulators?.command ?? [];
  const flags = parseSimulateFlags(argv.slice(2));

  it('runs the simulators from the server image only under the demo profile', () => {
    expect(simulators?.profiles).toEqual(['demo']);
    expect(simulators?.build).toBe(compose.services.meniscus?.build);
    expect(simulators?.depends_on).toEqual(expect.arrayContaining(['mosquitto', 'meniscus']));
    for (const [name, service] of Object.entries(compose.services))
      if (name !== 'simulators') expect(service.profiles, name).toBeUndefined();
  });

  it("starts the simulators' entry point with flags their own parser accepts", () => {
    expect(argv.slice(0, 2)).toEqual(['node', 'simulators/bin/simulate.js']);
    expect(existsSync(new URL(argv[1] ?? '', repo))).toBe(true);
    expect(flags).toMatchObject({
      url: 'mqtt://mosquitto:1883',
      server: 'http://meniscus:8080',
      passwords: '/run/demo-devices.txt',
    });
  });

  it('points the simulators at the broker and server services, and the server port they serve', () => {
    const names = Object.keys(compose.services);
    expect(names).toContain(new URL(flags.url).hostname);
    const server = new URL(flags.server ?? '');
    expect(server.hostname).toBe('meniscus');
    expect(server.port).toBe(String(compose.services.meniscus?.environment?.MENISCUS_HTTP_PORT));
  });

  it('mounts the generated passwords file where --passwords reads it', () => {
    expect(simulators?.volumes).toContain(`./deploy/demo-devices.txt:${flags.passwords}:ro`);
  });
});

describe('deployment files', () => {
  it('Dockerfile copies paths that exist and starts the server entry point', () => {
    const dockerfile = read('Dockerfile');
    const copies = [...dockerfile.matchAll(/^COPY (.+) \S+$/gm)].flatMap(
      (m) => m[1]?.split(' ') ?? [],
    );
    expect(copies).toEqual(
      expect.arrayContaining(['package.json', 'package-lock.json', 'server', 'simulators']),
    );
    for (const source of copies) expect(existsSync(new URL(source, repo)), source).toBe(true);
    const command = /^CMD \["node", "([^"]+)"\]$/m.exec(dockerfile)?.[1];
    expect(command).toBe('server/bin/meniscus-server.js');
    expect(existsSync(new URL(command ?? '', repo))).toBe(true);
  });

  it('systemd unit starts the same entry point', () => {
    const unit = read('deploy/systemd/meniscus.service');
    expect(unit).toMatch(
      /^ExecStart=\/usr\/bin\/node \/opt\/meniscus\/server\/bin\/meniscus-server\.js$/m,
    );
    expect(unit).toMatch(/^EnvironmentFile=\/etc\/meniscus\/meniscus\.env$/m);
  });

  it('example settings are all accepted by the server', () => {
    const lines = read('deploy/meniscus.env.example')
      .split('\n')
      .filter((line) => /^MENISCUS_\w+=/.test(line));
    const environment = Object.fromEntries(lines.map((line) => line.split(/=(.*)/s).slice(0, 2)));
    expect(() => serverConfigFromEnv(environment)).not.toThrow();
  });
});
