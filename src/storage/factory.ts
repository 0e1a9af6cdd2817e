/**
 * Picks the storage backend from the configuration: PostgreSQL when DATABASE_URL is set, else
 * SQLite in TROPO_DATA_DIR. Both are created and migrated before the promise resolves.
 */

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
}

export async function createRepository(config: StorageConfig): Promise<Repository> {
  if (config.databaseUrl) {
    return PostgresRepository.open({ connectionString: config.databaseUrl, schema: config.pgSchema ?? 'public' });
  }
  return new SqliteRepository({ dataDir: config.dataDir });
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
