/**
 * The outbox forwarder against a real server of the InfluxDB v2 write protocol
 * (victoria-metrics): what arrives is compared reading by reading (count, tags, field,
 * timestamps), then the database is stopped while readings keep coming, and after it returns
 * the outbox drains with nothing lost and nothing written twice.
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { Archive } from '../../server/src/store/archive.ts';
import { INFLUX_MEASUREMENT, InfluxForwarder } from '../../server/src/store/influxForwarder.ts';
import type { StoredReading } from '../../server/src/store/types.ts';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';
import { waitUntil } from '../helpers/ingestRig.ts';
import { startVictoriaMetrics } from '../helpers/victoriaMetrics.ts';
import type { ExportedSeries, VictoriaMetrics } from '../helpers/victoriaMetrics.ts';

let vm: VictoriaMetrics;
beforeAll(async () => {
  vm = await startVictoriaMetrics();
});
afterAll(async () => {
  await vm.dispose();
});

const quiet = { error: () => {}, warn: () => {} };

async function ingestPacks(ingestor: Ingestor, from: number, count: number): Promise<void> {
  const t0 = EXAMPLE_PLACED_AT_MS / 1000;
  await Promise.all(
    Array.from({ length: count }, (_, k) => {
      const i = from + k;
      return Promise.all([
        ingestor.data(
          'meniscus/harbour-deck/probe-a/data',
          Buffer.from(
            JSON.stringify([
              { bn: 'probe-a/', bt: t0 + i * 60, n: 'rh-10', v: 99 - i / 100 },
              { n: 't-10', u: 'Cel', v: 20 + i / 50 },
            ]),
          ),
        ),
        ingestor.data(
          'meniscus/harbour-deck/mast-1/data',
          Buffer.from(
            JSON.stringify([{ n: 'wind', u: 'km/h', v: 3.6 * (i % 7), t: t0 + i * 60 + 30 }]),
          ),
        ),
      ]);
    }),
  );
}

/** Each archive reading as `series key -> timestamp -> value`, and the same for the export. */
function keyOf(tags: Record<string, string | number | null>): string {
  return ['site', 'run', 'device', 'sensor', 'quantity', 'unit', 'depth_mm']
    .map((k) => `${k}=${tags[k] ?? ''}`)
    .join(',');
}
function expectedSamples(readings: StoredReading[]): Map<string, number> {
  const samples = new Map<string, number>();
  for (const r of readings) {
    const key = keyOf({
      site: r.site,
      run: r.runId,
      device: r.device,
      sensor: r.sensor,
      quantity: r.quantity,
      unit: r.unit,
      depth_mm: r.depthMm === null ? null : String(r.depthMm),
    });
    samples.set(`${key}@${r.eventAtMs}`, r.value);
  }
  return samples;
}
function exportedSamples(series: ExportedSeries[]): {
  samples: Map<string, number>;
  total: number;
  names: Set<string>;
} {
  const samples = new Map<string, number>();
  const names = new Set<string>();
  let total = 0;
  for (const s of series) {
    names.add(s.metric.__name__ ?? '');
    const key = keyOf(s.metric);
    s.timestamps.forEach((t, i) => {
      samples.set(`${key}@${t}`, s.values[i] ?? Number.NaN);
      total += 1;
    });
  }
  return { samples, total, names };
}

/**
 * Same keys, values equal to 1e-9 relative: victoria-metrics keeps about 12 significant digits
 * (22.240000000000002 comes back as 22.24).
 */
function expectSameSamples(actual: Map<string, number>, expected: Map<string, number>): void {
  expect([...actual.keys()].sort()).toEqual([...expected.keys()].sort());
  const off = [...expected].filter(
    ([key, value]) =>
      !(Math.abs((actual.get(key) ?? Number.NaN) - value) <= 1e-9 * Math.max(1, Math.abs(value))),
  );
  expect(off).toEqual([]);
}

it(
  'forwards every reading with its tags, field and event time, and drains after an outage with nothing lost or doubled',
  { timeout: 90_000 },
  async () => {
    const archive = Archive.open(':memory:');
    archive.createRun(parseRunConfig(exampleRunInput()), EXAMPLE_PLACED_AT_MS, 'run-1');
    const ingestor = new Ingestor(archive, { clock: () => EXAMPLE_PLACED_AT_MS + 86_400_000 });
    const forwarder = new InfluxForwarder(
      archive,
      { url: vm.url, token: 'site-token', org: 'meniscus', bucket: 'readings' },
      { batchSize: 500, pollIntervalMs: 50, maxBackoffMs: 300, timeoutMs: 2000, logger: quiet },
    );
    try {
      await ingestPacks(ingestor, 0, 400); // 1200 readings
      forwarder.start();
      await waitUntil(() => forwarder.state().backlog === 0, 20_000, 'the outbox to drain');
      let exported = exportedSamples(await vm.exportSeries());
      const readings = archive.readings('run-1');
      expect(readings).toHaveLength(1200);
      expect(exported.names).toEqual(new Set([`${INFLUX_MEASUREMENT}_value`]));
      expect(exported.total).toBe(1200);
      expectSameSamples(exported.samples, expectedSamples(readings));

      // Outage: the database goes away while readings keep arriving.
      await vm.stop();
      await ingestPacks(ingestor, 400, 300);
      await waitUntil(
        () => forwarder.state().failures >= 2,
        20_000,
        'failed writes during the outage',
      );
      expect(forwarder.state()).toMatchObject({ ok: false, backlog: 900 });
      await vm.start();
      await waitUntil(
        () => forwarder.state().backlog === 0,
        30_000,
        'the outbox to drain after the outage',
      );
      expect(forwarder.state().ok).toBe(true);
      exported = exportedSamples(await vm.exportSeries());
      const all = archive.readings('run-1');
      expect(all).toHaveLength(2100);
      expect(exported.total).toBe(2100); // nothing doubled
      expectSameSamples(exported.samples, expectedSamples(all)); // nothing lost
    } finally {
      await forwarder.close();
      archive.close();
    }
  },
);
