import Database from 'better-sqlite3';
import { MIGRATIONS } from './_migrations.ts';

export interface OpenDatabaseOptions {
  /**
   * SQLite `synchronous` in WAL mode. FULL (default) syncs the WAL on every commit, so a
   * committed transaction survives power loss; NORMAL survives a crash of the process but may
   * lose the last commits on power loss (SQLite documentation, "PRAGMA synchronous").
   */
  synchronous?: 'FULL' | 'NORMAL';
}

/**
 * Opens (creating if needed) an archive database: WAL journal, the chosen `synchronous`,
 * foreign keys on, a busy timeout of 5 s (our assumption), and every pending migration applied
 * in one transaction each, counted in `PRAGMA user_version`.
 *
 * @param path - file path, or `:memory:` for tests
 * @throws Error when the file was written by a newer schema than this code knows
 */
export function openDatabase(path: string, options: OpenDatabaseOptions = {}): Database.Database {
  const db = new Database(path);
  try {
    db.pragma('journal_mode = WAL');
    db.pragma(`synchronous = ${options.synchronous ?? 'FULL'}`);
    db.pragma('foreign_keys = ON');
    db.pragma('busy_timeout = 5000');
    migrate(db);
  } catch (error) {
    db.close();
    throw error;
  }
  return db;
}

/** Applies the migrations past `user_version`; returns the version reached. */
export function migrate(db: Database.Database): number {
  const current = db.pragma('user_version', { simple: true }) as number;
  if (current > MIGRATIONS.length) {
    throw new Error(
      `archive schema version ${current} is newer than this server knows (${MIGRATIONS.length})`,
    );
  }
  for (let version = current; version < MIGRATIONS.length; version += 1) {
    const sql = MIGRATIONS[version] ?? '';
    db.transaction(() => {
      db.exec(sql);
      db.pragma(`user_version = ${version + 1}`);
    })();
  }
  return MIGRATIONS.length;
}
