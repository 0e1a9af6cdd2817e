import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import type { StorageConfig } from '../../src/storage/factory.js';
import type { DelayRow } from '../../src/storage/repository.js';

/** PostgreSQL for tests: TEST_DATABASE_URL, else DATABASE_URL; unset = SQLite only. */
export const TEST_PG_URL = process.env.TEST_DATABASE_URL || process.env.DATABASE_URL || undefined;

export interface BackendUnderTest {
  name: 'sqlite' | 'postgres';
  /** A fresh, empty storage location; call `cleanup` when done. */
  fresh(): Promise<{ config: StorageConfig; cleanup(): Promise<void> }>;
}

export const sqliteBackend: BackendUnderTest = {
  name: 'sqlite',
  async fresh() {
    const dir = mkdtempSync(join(tmpdir(), 'tropodelay-test-'));
    return { config: { dataDir: dir }, cleanup: async () => rmSync(dir, { recursive: true, force: true }) };
  },
};

/** Each call gets its own schema in the test database, dropped by cleanup, so test files do not collide. */
export const postgresBackend: BackendUnderTest = {
  name: 'postgres',
  async fresh() {
    const schema = `t_${randomBytes(6).toString('hex')}`;
    const dir = mkdtempSync(join(tmpdir(), 'tropodelay-test-'));
    return {
      config: { dataDir: dir, databaseUrl: TEST_PG_URL!, pgSchema: schema },
      cleanup: async () => {
        rmSync(dir, { recursive: true, force: true });
        const client = new pg.Client({ connectionString: TEST_PG_URL });
        await client.connect();
        try {
          await client.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
        } finally {
          await client.end();
        }
      },
    };
  },
};

/** The backends the storage suites run on: SQLite always, PostgreSQL when a URL is set. */
export const BACKENDS: BackendUnderTest[] = TEST_PG_URL ? [sqliteBackend, postgresBackend] : [sqliteBackend];

/**
 * A delay row with a ZTD and its σ only (no ZWD, no gradients): the row the storage, network-read and
 * campaign tests write when the stored values themselves are not the point.
 */
export function ztdOnlyRow(epochMs: number, source: string, ztdM: number, modelFingerprint: string, ztdSigmaM = 0.004): DelayRow {
  return {
    epochMs,
    source,
    ztdM,
    ztdSigmaM,
    zwdM: null,
    zwdSigmaM: null,
    northGradientM: null,
    eastGradientM: null,
    northGradientSigmaM: null,
    eastGradientSigmaM: null,
    modelFingerprint,
  };
}
