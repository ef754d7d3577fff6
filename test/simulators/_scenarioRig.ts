/**
 * The real ingest for the simulator tests, started the way the ingest tests start it: an archive
 * on disk in a temp folder, the Ingestor, and the embedded broker (aedes, committing before the
 * PUBACK) on a free port, with the scenario's run.json as the one open run.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Ingestor } from '../../server/src/ingest/ingestor.ts';
import { startEmbeddedBroker } from '../../server/src/mqtt/embeddedBroker.ts';
import type { EmbeddedBroker } from '../../server/src/mqtt/embeddedBroker.ts';
import { Archive } from '../../server/src/store/archive.ts';

export interface ScenarioRig {
  archive: Archive;
  ingestor: Ingestor;
  runId: string;
  url: string;
  /** Device statuses as the archive holds them (device -> status). */
  deviceStatuses(): Map<string, string | null>;
  dispose(): Promise<void>;
}

export async function startScenarioRig(runConfigInput: unknown): Promise<ScenarioRig> {
  const dir = mkdtempSync(join(tmpdir(), 'meniscus-sim-'));
  const path = join(dir, 'archive.sqlite');
  const archive = Archive.open(path);
  const run = archive.createRun(parseRunConfig(runConfigInput), Date.now(), 'run-sim');
  const ingestor = new Ingestor(archive);
  const broker: EmbeddedBroker = await startEmbeddedBroker(
    {
      data: (topic, payload) => ingestor.data(topic, payload),
      status: (topic, payload) => ingestor.status(topic, payload),
    },
    { port: 0 },
  );
  return {
    archive,
    ingestor,
    runId: run.id,
    url: `mqtt://127.0.0.1:${broker.port}`,
    deviceStatuses() {
      const db = new Database(path, { readonly: true, fileMustExist: true });
      try {
        const rows = db
          .prepare('SELECT name, status FROM devices WHERE run_id = ?')
          .all(run.id) as { name: string; status: string | null }[];
        return new Map(rows.map((row) => [row.name, row.status]));
      } finally {
        db.close();
      }
    },
    async dispose() {
      await broker.close();
      archive.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
