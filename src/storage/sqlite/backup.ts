/**
 * Online backup of the SQLite archive while the service runs (docs/operations.md, "Backups"), with
 * SQLite's backup API (better-sqlite3 `db.backup()`, SQLite documentation "Online Backup API"): it copies
 * the database pages through a second connection, so what is still in the write-ahead log (-wal file) is
 * included, which copying the .sqlite file alone would lose. In WAL mode the copy reads a snapshot and
 * does not block the service's writes; a step that sees the source changed by another connection
 * restarts, so after the first step the rest is copied in one step (one consistent snapshot).
 *
 * The copy is written beside the destination as `<dest>.partial`, verified (PRAGMA integrity_check,
 * PRAGMA foreign_key_check, the schema_migrations table, a row count per table), and only then renamed
 * to the destination: a backup file that exists has passed its checks. An existing destination is
 * never overwritten.
 */

import { existsSync, renameSync, rmSync, statSync } from 'node:fs';
import Database from 'better-sqlite3';

export interface SqliteBackupReport {
  /** The verified backup file. */
  path: string;
  bytes: number;
  /** PRAGMA integrity_check's answer: always 'ok' in a returned report. */
  integrity: 'ok';
  /** Newest applied migration in the copy. */
  schemaVersion: number;
  /** Rows per table of the copy. */
  rowCounts: Record<string, number>;
  durationMs: number;
}

export class BackupError extends Error {}

/** Pages copied per step after the first: everything left, in one snapshot. */
const ALL_REMAINING_PAGES = 2 ** 30;

/** Checks a SQLite archive file; throws a BackupError saying what is wrong. */
export function verifySqliteArchive(path: string): Omit<SqliteBackupReport, 'path' | 'bytes' | 'durationMs'> {
  const db = new Database(path, { readonly: true, fileMustExist: true });
  try {
    const integrity = db.pragma('integrity_check', { simple: false }) as { integrity_check: string }[];
    if (integrity.length !== 1 || integrity[0]!.integrity_check !== 'ok') {
      throw new BackupError(`integrity_check failed: ${integrity.map((r) => r.integrity_check).join('; ')}`);
    }
    const orphans = db.pragma('foreign_key_check') as unknown[];
    if (orphans.length > 0) throw new BackupError(`foreign_key_check found ${orphans.length} rows without their parent`);
    const tables = (
      db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name").all() as {
        name: string;
      }[]
    ).map((t) => t.name);
    if (!tables.includes('schema_migrations')) throw new BackupError('not a tropodelay archive: no schema_migrations table');
    const rowCounts: Record<string, number> = {};
    for (const t of tables) rowCounts[t] = (db.prepare(`SELECT COUNT(*) AS n FROM "${t}"`).get() as { n: number }).n;
    const version = (db.prepare('SELECT MAX(version) AS v FROM schema_migrations').get() as { v: number | null }).v;
    if (version === null) throw new BackupError('the archive has no applied migration');
    return { integrity: 'ok', schemaVersion: version, rowCounts };
  } finally {
    db.close();
  }
}

/**
 * Backs up the live archive at `sourcePath` into `destPath` and verifies the copy. Safe while the
 * service writes: the source is opened read-write only to share its WAL, and nothing is changed in it.
 */
export async function backupSqliteArchive(sourcePath: string, destPath: string): Promise<SqliteBackupReport> {
  const started = performance.now();
  if (!existsSync(sourcePath)) throw new BackupError(`no archive at ${sourcePath}`);
  if (existsSync(destPath)) throw new BackupError(`${destPath} exists already: choose a new file name`);
  const partial = `${destPath}.partial`;
  rmSync(partial, { force: true });
  const source = new Database(sourcePath, { fileMustExist: true });
  try {
    source.pragma('busy_timeout = 10000');
    await source.backup(partial, { progress: () => ALL_REMAINING_PAGES });
  } catch (err) {
    rmSync(partial, { force: true });
    throw new BackupError(`backup failed: ${err instanceof Error ? err.message : String(err)}`);
  } finally {
    source.close();
  }
  try {
    const checked = verifySqliteArchive(partial);
    // The copy keeps the source's WAL journal mode; a reader on a read-only medium would need its -shm.
    rmSync(`${partial}-wal`, { force: true });
    rmSync(`${partial}-shm`, { force: true });
    renameSync(partial, destPath);
    return { path: destPath, bytes: statSync(destPath).size, ...checked, durationMs: Math.round(performance.now() - started) };
  } catch (err) {
    rmSync(partial, { force: true });
    throw err;
  }
}
