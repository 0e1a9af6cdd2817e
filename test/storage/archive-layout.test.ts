/**
 * The archive layout of migrations.ts ("archive layout": series clustered by station, source, epoch;
 * the fingerprint stored once per segment; an epoch index), on every backend:
 *  - the migration from the layout before it keeps every row: a populated database of the earlier
 *    layout (4 200 delay rows and 2 400 met rows, five stations, three sources, three fingerprints,
 *    NULLs, full-precision doubles) written with plain SQL, snapshot with plain SQL, migrated, and read
 *    back through the repository: every row identical (values, sources, fingerprints as read back);
 *  - the segments and envelopes the migration builds match the rows;
 *  - a network read at one epoch (the epoch-index path, ≥ 50 stations) gives the rows of the
 *    one-station reads.
 * The expected rows are the snapshot of the database itself (common practice for a migration test: an
 * independent read of the same data, before the change, with no repository code).
 */

import { join } from 'node:path';
import Database from 'better-sqlite3';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { provenance } from '../../src/domain/provenance.js';
import { createRepository, type StorageConfig } from '../../src/storage/factory.js';
import { MIGRATIONS, SchemaMismatchError, checkSchemaCompatibility } from '../../src/storage/migrations.js';
import type { DelayRow, MetRow, Repository } from '../../src/storage/repository.js';
import { delayFromArray, metFromArray, type MetArrayRow } from '../../src/storage/rows.js';
import { MIGRATION_LOCK_CLASS, migratePostgres, migrationLockKey } from '../../src/storage/postgres/postgres-repository.js';
import { SQLITE_FILE_NAME, migrateSqlite } from '../../src/storage/sqlite/sqlite-repository.js';
import { BACKENDS, TEST_PG_URL, ztdOnlyRow } from '../helpers/storage.js';

const LAYOUT = MIGRATIONS.find((m) => m.name.startsWith('archive layout'))!;
const BEFORE_LAYOUT = MIGRATIONS.filter((m) => m.version < LAYOUT.version);

const T0 = Date.UTC(2026, 0, 1);
const FIVE_MIN = 300_000;
const STATIONS = ['LAYA', 'LAYB', 'LAYC', 'LAYD', 'LAYE'];
const MODEL_SETS = ['first', 'second', 'third'].map((run) => provenance({ test: 'archive layout', run }));

/** Deterministic full-precision doubles (a linear congruential generator; any sequence will do). */
function doubles(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 1_103_515_245 + 12_345) % 2_147_483_648;
    return state / 2_147_483_648;
  };
}

/** Delay rows of the earlier layout: [station, epoch, source, 8 values, fingerprint]; sources and fingerprints mixed. */
function oldDelayRows(): unknown[][] {
  const next = doubles(7);
  const rows: unknown[][] = [];
  for (const [i, station] of STATIONS.entries()) {
    for (const source of ['alpha', 'beta', 'gamma']) {
      if (source === 'gamma' && i % 2 === 1) continue; // not every station has every source
      for (let k = 0; k < 350; k++) {
        // Fingerprints switch inside a series (a reprocessed stretch in the middle of "alpha").
        const fp = source === 'alpha' ? (k >= 100 && k < 200 ? 1 : 0) : source === 'beta' ? 1 : 2;
        const nullable = () => (next() < 0.2 ? null : next() * 0.01);
        rows.push([
          station,
          T0 + k * FIVE_MIN + (source === 'beta' ? 0 : i * 1000),
          source,
          2 + next(),
          nullable(),
          nullable(),
          nullable(),
          nullable(),
          nullable(),
          nullable(),
          nullable(),
          MODEL_SETS[fp]!.model_fingerprint,
        ]);
      }
    }
  }
  return rows;
}

/** Met rows of the earlier layout: [station, epoch, source, 5 values]. */
function oldMetRows(): unknown[][] {
  const next = doubles(11);
  const rows: unknown[][] = [];
  for (const station of STATIONS) {
    for (const source of ['sensor', 'model']) {
      for (let k = 0; k < 240; k++) {
        rows.push([
          station,
          T0 + k * 600_000,
          source,
          900 + 100 * next(),
          next() < 0.1 ? null : -20 + 40 * next(),
          next() < 0.5 ? null : 100 * next(),
          null,
          next() < 0.5 ? null : 30 * next(),
        ]);
      }
    }
  }
  return rows;
}

const DELAY_COLUMNS =
  'station_id, epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint';
const MET_COLUMNS = 'station_id, epoch_ms, source, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa';

/** Plain-SQL access to a backend's database (no repository code): run statements, read rows as arrays. */
interface RawDb {
  run(sql: string, rows?: unknown[][]): Promise<void>;
  all(sql: string): Promise<unknown[][]>;
  close(): Promise<void>;
}

/** Plain-SQL access to a new database of the layout before the archive layout (its migrations applied). */
async function rawDb(config: StorageConfig): Promise<RawDb> {
  if (config.databaseUrl) {
    const pool = new pg.Pool({ connectionString: TEST_PG_URL, max: 1 });
    await migratePostgres(pool, config.pgSchema!, BEFORE_LAYOUT);
    await pool.end();
    const client = new pg.Client({ connectionString: TEST_PG_URL, options: `-c search_path=${config.pgSchema}` });
    await client.connect();
    return {
      async run(sql, rows) {
        let n = 0;
        const text = sql.replace(/\?/g, () => `$${++n}`);
        await client.query('BEGIN');
        for (const r of rows ?? [[]]) await client.query(text, r);
        await client.query('COMMIT');
      },
      all: async (sql) => (await client.query<unknown[]>({ text: sql, rowMode: 'array' })).rows.map((r) => r.map(normalise)),
      close: () => client.end(),
    };
  }
  const db = new Database(join(config.dataDir, SQLITE_FILE_NAME));
  migrateSqlite(db, BEFORE_LAYOUT);
  return {
    async run(sql, rows) {
      const statement = db.prepare(sql);
      db.transaction(() => {
        for (const r of rows ?? [[]]) statement.run(r);
      })();
    },
    all: async (sql) => db.prepare(sql).raw(true).all() as unknown[][],
    close: async () => {
      db.close();
    },
  };
}
/** PostgreSQL returns BIGINT as a string: epochs back to numbers, as the repository does. */
const normalise = (v: unknown) => (typeof v === 'string' && /^\d{10,}$/.test(v) ? Number(v) : v);

/** Snapshot rows (station_id first, then the columns of DELAY_SELECT / MET_SELECT) as the repository types. */
const toDelayRow = (r: unknown[]): DelayRow => delayFromArray(r.slice(1));
const toMetRow = (r: unknown[]): MetRow => metFromArray(r.slice(1) as MetArrayRow);

describe('the archive layout migration is contracting (expand/contract, common practice)', () => {
  it('a release that does not know it reports not-ready on the migrated schema, naming the migration', () => {
    const applied = MIGRATIONS.map((m) => ({ version: m.version, name: m.name, minReaderVersion: m.minReaderVersion ?? m.version }));
    expect(() => checkSchemaCompatibility(applied, BEFORE_LAYOUT)).toThrow(SchemaMismatchError);
    expect(() => checkSchemaCompatibility(applied, BEFORE_LAYOUT)).toThrow(`migration ${LAYOUT.version} (${LAYOUT.name})`);
  });
});

const WHOLE = { fromMs: T0 - 86_400_000, toMs: T0 + 30 * 86_400_000 };

for (const backend of BACKENDS) {
  describe(`archive layout migration on ${backend.name}: every row kept`, () => {
    let cleanup: () => Promise<void>;
    let repo: Repository;
    let delaysBefore: unknown[][];
    let metBefore: unknown[][];
    let raw: RawDb;

    beforeAll(async () => {
      const fresh = await backend.fresh();
      cleanup = fresh.cleanup;
      // A database of the earlier layout, filled with plain SQL as the earlier release stored it.
      raw = await rawDb(fresh.config);
      await raw.run(
        'INSERT INTO stations (station_id, name, latitude_deg, longitude_deg, height_m, created_at, updated_at) VALUES (?, ?, 50, 10, 100, ?, ?)',
        STATIONS.map((id) => [id, id, '2026-01-01T00:00:00Z', '2026-01-01T00:00:00Z']),
      );
      await raw.run(
        'INSERT INTO model_sets (model_fingerprint, models_json) VALUES (?, ?)',
        MODEL_SETS.map((m) => [m.model_fingerprint, JSON.stringify(m.models)]),
      );
      await raw.run(`INSERT INTO delay_records (${DELAY_COLUMNS}) VALUES (${DELAY_COLUMNS.split(', ').map(() => '?')})`, oldDelayRows());
      await raw.run(`INSERT INTO met_records (${MET_COLUMNS}) VALUES (${MET_COLUMNS.split(', ').map(() => '?')})`, oldMetRows());
      delaysBefore = await raw.all(`SELECT ${DELAY_COLUMNS} FROM delay_records ORDER BY station_id, epoch_ms, source`);
      metBefore = await raw.all(`SELECT ${MET_COLUMNS} FROM met_records ORDER BY station_id, epoch_ms, source`);
      // The release with the layout migrates on open.
      repo = await createRepository(fresh.config);
    }, 120_000);

    afterAll(async () => {
      await repo?.close();
      await raw?.close();
      await cleanup?.();
    });

    it('the populated database is what the test meant to build (thousands of rows, three fingerprints)', () => {
      expect(delaysBefore).toHaveLength((2 * 5 + 3) * 350); // alpha and beta at five stations, gamma at three
      expect(metBefore).toHaveLength(2 * 240 * 5);
      expect(new Set(delaysBefore.map((r) => r[11])).size).toBe(3);
    });

    it('reads back every delay row identically, fingerprint per row, per station and through pages', async () => {
      for (const id of STATIONS) {
        const expected = delaysBefore.filter((r) => r[0] === id).map(toDelayRow);
        expect(await repo.readDelays(id, WHOLE)).toEqual(expected);
        const paged: DelayRow[] = [];
        for await (const page of repo.readPages('delays', id, WHOLE, { pageRows: 97 })) paged.push(...page);
        expect(paged).toEqual(expected);
        expect(await repo.readDelays(id, WHOLE, 'alpha')).toEqual(expected.filter((r) => r.source === 'alpha'));
      }
    });

    it('reads back every met row identically', async () => {
      for (const id of STATIONS) {
        expect(await repo.readMet(id, WHOLE)).toEqual(metBefore.filter((r) => r[0] === id).map(toMetRow));
      }
    });

    it('keeps the model sets: every fingerprint leads back to its models', async () => {
      const sets = await repo.readModelSets(MODEL_SETS.map((m) => m.model_fingerprint));
      expect(sets).toHaveLength(3);
      for (const m of MODEL_SETS) expect(sets.find((s) => s.modelFingerprint === m.model_fingerprint)?.models).toEqual(m.models);
    });

    it('stores each fingerprint once per (station, source, fingerprint) segment, with the epoch envelope of its rows', async () => {
      const segments = await raw.all(
        'SELECT station_id, source, model_fingerprint, first_epoch_ms, last_epoch_ms FROM delay_segments ORDER BY station_id, source, model_fingerprint',
      );
      const expected = new Map<string, [number, number]>();
      for (const r of delaysBefore) {
        const key = `${r[0]}|${r[2]}|${r[11]}`;
        const e = expected.get(key);
        const t = r[1] as number;
        expected.set(key, e ? [Math.min(e[0], t), Math.max(e[1], t)] : [t, t]);
      }
      expect(segments).toHaveLength(expected.size);
      for (const s of segments) expect([s[3], s[4]]).toEqual(expected.get(`${s[0]}|${s[1]}|${s[2]}`));
      const columns = await raw.all(
        backend.name === 'sqlite'
          ? "SELECT name FROM pragma_table_info('delay_records')"
          : "SELECT column_name FROM information_schema.columns WHERE table_name = 'delay_records' AND table_schema = current_schema()",
      );
      expect(columns.flat()).not.toContain('model_fingerprint');
    });

    it('latest epochs come from the envelopes and equal the latest stored row', async () => {
      for (const id of STATIONS) {
        const last = Math.max(...delaysBefore.filter((r) => r[0] === id).map((r) => r[1] as number));
        expect(await repo.latestEpochMs(id, 'delays')).toBe(last);
      }
    });
  });

  describe(`network reads through the epoch index on ${backend.name}`, () => {
    let cleanup: () => Promise<void>;
    let repo: Repository;
    const ids = Array.from({ length: 60 }, (_, i) => `NET${String(i).padStart(2, '0')}`);
    const model = MODEL_SETS[0]!;
    const modelSet = { modelFingerprint: model.model_fingerprint, models: model.models };

    beforeAll(async () => {
      const fresh = await backend.fresh();
      cleanup = fresh.cleanup;
      repo = await createRepository(fresh.config);
      // Hourly ingest order: every station's hour, then the next hour; two sources at some stations.
      for (const id of ids) {
        await repo.putStation(id, { name: id, latitudeDeg: 45, longitudeDeg: 5, heightM: 10, metHeightM: null, description: null });
      }
      for (let hour = 0; hour < 3; hour++) {
        await repo.writeDelaysMany(
          ids.map((id, i) => ({
            stationId: id,
            rows: Array.from({ length: 12 }, (_, k) => k).flatMap((k) => {
              const epochMs = T0 + hour * 3_600_000 + k * FIVE_MIN;
              const row = (source: string, ztdM: number): DelayRow => ztdOnlyRow(epochMs, source, ztdM, model.model_fingerprint);
              return i % 3 === 0 ? [row('b', 2.4 + i * 1e-3), row('a', 2.3 + k * 1e-4)] : [row('a', 2.3 + k * 1e-4)];
            }),
          })),
          modelSet,
        );
      }
    }, 120_000);

    afterAll(async () => {
      await repo?.close();
      await cleanup?.();
    });

    const asked = () => ids.filter((_, i) => i !== 7); // one station left out: its rows must not appear

    it('one epoch: the rows of the one-station reads, per station, in (epoch, source) order', async () => {
      const epochMs = T0 + 3_600_000 + 6 * FIVE_MIN;
      const many = await repo.readZenithDelaysMany(asked().map((stationId) => ({ stationId, fromMs: epochMs, toMs: epochMs })));
      expect([...many.keys()].sort()).toEqual(asked());
      for (const id of asked()) expect(many.get(id)).toEqual(await repo.readZenithDelays(id, { fromMs: epochMs, toMs: epochMs }));
      expect(many.get('NET00')!.map((r) => r.source)).toEqual(['a', 'b']);
    });

    it('one hour of one source: the same rows as the one-station reads', async () => {
      const range = { fromMs: T0 + 3_600_000, toMs: T0 + 2 * 3_600_000 - 1 };
      const many = await repo.readZenithDelaysMany(
        asked().map((stationId) => ({ stationId, ...range })),
        'b',
      );
      expect([...many.keys()].sort()).toEqual(asked().filter((id) => Number(id.slice(3)) % 3 === 0));
      for (const [id, rows] of many) expect(rows).toEqual(await repo.readZenithDelays(id, range, 'b'));
    });
  });
}

describe.skipIf(!TEST_PG_URL)('the PostgreSQL migration lock is per schema (a long layout migration holds it)', () => {
  it('a schema migrates while another schema’s migration lock is held; the held schema’s start waits', async () => {
    const schemas = ['held', 'free'].map((n) => `t_lock_${n}_${Date.now().toString(36)}`);
    const holder = new pg.Client({ connectionString: TEST_PG_URL });
    await holder.connect();
    const cleanup = async () => {
      for (const s of schemas) await holder.query(`DROP SCHEMA IF EXISTS "${s}" CASCADE`);
      await holder.end();
    };
    try {
      await holder.query('SELECT pg_advisory_lock($1, $2)', [MIGRATION_LOCK_CLASS, migrationLockKey(schemas[0]!)]);
      const free = await createRepository({ dataDir: ':memory:', databaseUrl: TEST_PG_URL, pgSchema: schemas[1] });
      await free.ping();
      await free.close();
      let heldOpened = false;
      const held = createRepository({ dataDir: ':memory:', databaseUrl: TEST_PG_URL, pgSchema: schemas[0] }).then((r) => {
        heldOpened = true;
        return r;
      });
      await new Promise((resolve) => setTimeout(resolve, 500));
      expect(heldOpened).toBe(false);
      await holder.query('SELECT pg_advisory_unlock($1, $2)', [MIGRATION_LOCK_CLASS, migrationLockKey(schemas[0]!)]);
      await (await held).close();
      expect(heldOpened).toBe(true);
    } finally {
      await cleanup();
    }
  }, 60_000);
});
