/**
 * Starts Debian's victoria-metrics, a real server of the InfluxDB v2 write protocol
 * (`/api/v2/write`), on a free port with its own data folder; reads back through its export API.
 * Ingestion is asynchronous: `exportSeries` forces a flush and polls until the count settles
 * (dependencies.md).
 */
import { spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort, waitForPort } from './freePort.ts';
import { killOnExit, terminate } from './killOnExit.ts';

export const VICTORIA_METRICS_BINARY = '/usr/bin/victoria-metrics';

export interface ExportedSeries {
  metric: Record<string, string>;
  values: number[];
  timestamps: number[];
}

export interface VictoriaMetrics {
  url: string;
  stop(): Promise<void>;
  start(): Promise<void>;
  /** Every series, once the sample count has stopped changing. */
  exportSeries(): Promise<ExportedSeries[]>;
  dispose(): Promise<void>;
}

export async function startVictoriaMetrics(): Promise<VictoriaMetrics> {
  const dir = mkdtempSync(join(tmpdir(), 'meniscus-vm-'));
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  let child: ChildProcess | null = null;
  const start = async () => {
    child = spawn(
      VICTORIA_METRICS_BINARY,
      [
        `-httpListenAddr=127.0.0.1:${port}`,
        `-storageDataPath=${dir}`,
        '-retentionPeriod=100y',
        '-loggerLevel=ERROR',
      ],
      { stdio: 'ignore' },
    );
    killOnExit(child);
    await waitForPort(port, 20_000);
  };
  const stop = async () => {
    const running = child;
    child = null;
    await terminate(running);
  };
  const exportOnce = async (): Promise<ExportedSeries[]> => {
    await fetch(`${url}/internal/force_flush`);
    const query = new URLSearchParams({ 'match[]': '{__name__=~".+"}', start: '0' });
    const text = await (await fetch(`${url}/api/v1/export?${query}`)).text();
    return text
      .split('\n')
      .filter((line) => line.trim() !== '')
      .map((line) => JSON.parse(line) as ExportedSeries);
  };
  await start();
  return {
    url,
    start,
    stop,
    async exportSeries() {
      let previous = -1;
      for (let attempt = 0; attempt < 100; attempt += 1) {
        const series = await exportOnce();
        const count = series.reduce((sum, s) => sum + s.values.length, 0);
        if (count === previous && count > 0) return series;
        previous = count;
        await new Promise((resolve) => setTimeout(resolve, 150));
      }
      return exportOnce();
    },
    async dispose() {
      await stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
