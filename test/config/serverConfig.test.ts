import { describe, expect, it } from 'vitest';
import { ValidationError } from '../../server/src/config/formatIssues.ts';
import { serverConfigFromEnv } from '../../server/src/config/serverConfig.ts';

describe('serverConfigFromEnv()', () => {
  it('defaults to HTTP 8080, the embedded broker on 1883, ./data, synchronous FULL, no InfluxDB, snapshots every 30 min', () => {
    expect(serverConfigFromEnv({})).toEqual({
      httpPort: 8080,
      httpHost: '127.0.0.1',
      dataDir: './data',
      mqtt: { mode: 'embedded', port: 1883, host: '127.0.0.1' },
      synchronous: 'FULL',
      influx: null,
      logLevel: 'info',
      snapshotEveryS: 1800,
    });
  });

  it('uses an external broker with credentials and TLS files when MENISCUS_MQTT_URL is set', () => {
    const config = serverConfigFromEnv({
      MENISCUS_MQTT_URL: 'mqtts://broker.site.test:8883',
      MENISCUS_MQTT_USERNAME: 'ingest',
      MENISCUS_MQTT_PASSWORD: 'pw',
      MENISCUS_MQTT_CA: '/etc/ca.pem',
      MENISCUS_HTTP_PORT: '9090',
    });
    expect(config.httpPort).toBe(9090);
    expect(config.mqtt).toEqual({
      mode: 'external',
      url: 'mqtts://broker.site.test:8883',
      clientId: 'meniscus-ingest',
      connections: 1,
      username: 'ingest',
      password: 'pw',
      tls: { caFile: '/etc/ca.pem' },
    });
  });

  const bad = [
    {
      env: { MENISCUS_HTTP_PORT: '70000' },
      message: 'MENISCUS_HTTP_PORT must be between 0 and 65535: got "70000"',
    },
    {
      env: { MENISCUS_HTTP_PORT: 'eighty' },
      message: 'MENISCUS_HTTP_PORT must be a port number: got "eighty"',
    },
    {
      env: { MENISCUS_MQTT_URL: 'broker:1883' },
      message: 'MENISCUS_MQTT_URL must be a URL like mqtt://host:1883: got "broker:1883"',
    },
    {
      env: { MENISCUS_SQLITE_SYNCHRONOUS: 'OFF' },
      message: 'MENISCUS_SQLITE_SYNCHRONOUS must be FULL or NORMAL: got "OFF"',
    },
    {
      env: { MENISCUS_INFLUX_URL: 'http://127.0.0.1:8086' },
      message:
        'MENISCUS_INFLUX_TOKEN, MENISCUS_INFLUX_ORG and MENISCUS_INFLUX_BUCKET must all be set when MENISCUS_INFLUX_URL is set',
    },
  ];
  it.each(bad)('rejects $env naming the variable', ({ env, message }) => {
    let issues: readonly string[] = [];
    try {
      serverConfigFromEnv(env);
    } catch (error) {
      if (error instanceof ValidationError) issues = error.issues;
    }
    expect(issues).toContain(message);
  });
});
