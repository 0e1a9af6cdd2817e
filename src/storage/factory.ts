/**
 * Picks the storage backend from the configuration: PostgreSQL when DATABASE_URL is set, else
 * SQLite in TROPO_DATA_DIR. Both are created and migrated before the promise resolves.
 */

import type { Migration } from './migrations.js';
import type { Repository } from './repository.js';
import { PostgresRepository } from './postgres/postgres-repository.js';
import { SqliteRepository } from './sqlite/sqlite-repository.js';

export interface StorageConfig {
  /** SQLite data directory; ':memory:' for a throw-away database. */
  dataDir: string;
  /** PostgreSQL URL; when set, dataDir holds only the generated key file. */
  databaseUrl?: string | undefined;
  /** PostgreSQL schema (default public). */
  pgSchema?: string | undefined;
  /** PostgreSQL: longest wait for a connection [ms] (DB_CONNECT_TIMEOUT_MS). */
  connectTimeoutMs?: number | undefined;
  /** PostgreSQL statement timeout [ms] (DB_STATEMENT_TIMEOUT_MS); SQLite's busy wait is the smaller of it and 5 s. */
  statementTimeoutMs?: number | undefined;
  /** Free space of dataDir below which readiness fails [bytes] (TROPO_MIN_FREE_DISK_MB); 0 or unset = no floor. */
  minFreeDiskBytes?: number | undefined;
  /** PostgreSQL password apart from the URL (TROPODELAY_DATABASE_PASSWORD or its _FILE form). */
  databasePassword?: string | undefined;
  /** The migrations this release knows (default MIGRATIONS; the rolling-update tests give others). */
  migrations?: readonly Migration[] | undefined;
}

export interface RepositoryHooks {
  /** Told about a connection error outside a query (already handled; for the log). */
  onConnectionError?: (err: Error) => void;
}

/** Longest wait of a SQLite write for another process's lock [ms]. */
const SQLITE_BUSY_TIMEOUT_MS = 5_000;

export async function createRepository(config: StorageConfig, hooks: RepositoryHooks = {}): Promise<Repository> {
  if (config.databaseUrl) {
    return PostgresRepository.open({
      connectionString: config.databaseUrl,
      schema: config.pgSchema ?? 'public',
      ...(config.connectTimeoutMs !== undefined ? { connectTimeoutMs: config.connectTimeoutMs } : {}),
      ...(config.statementTimeoutMs !== undefined ? { statementTimeoutMs: config.statementTimeoutMs } : {}),
      ...(hooks.onConnectionError ? { onConnectionError: hooks.onConnectionError } : {}),
      ...(config.databasePassword !== undefined ? { password: config.databasePassword } : {}),
      ...(config.migrations ? { migrations: config.migrations } : {}),
    });
  }
  return new SqliteRepository({
    dataDir: config.dataDir,
    // A write waits for another process's lock at most this long (then a few retries, then 503).
    busyTimeoutMs: Math.min(config.statementTimeoutMs ?? SQLITE_BUSY_TIMEOUT_MS, SQLITE_BUSY_TIMEOUT_MS),
    ...(config.migrations ? { migrations: config.migrations } : {}),
  });
}

/** Where the data of a configuration lives, for the start-up log line (never the password). */
export function describeStorage(config: StorageConfig): string {
  if (config.databaseUrl) {
    try {
      const url = new URL(config.databaseUrl);
      return `postgresql ${url.hostname}:${url.port || 5432}${url.pathname}, schema ${config.pgSchema ?? 'public'}`;
    } catch {
      return 'postgresql (DATABASE_URL)';
    }
  }
  return config.dataDir === ':memory:' ? 'sqlite in memory' : `sqlite in ${config.dataDir}`;
}
