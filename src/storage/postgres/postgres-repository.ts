/**
 * PostgreSQL backend (pg Pool), chosen when DATABASE_URL is set. The tables live in one schema
 * (TROPO_PG_SCHEMA, default public), created and migrated on start under a session advisory lock,
 * so replicas that start at the same moment migrate one after the other and none sees a half-made
 * schema. Bulk writes bind whole columns as arrays (unnest) in chunks, all in one transaction.
 *
 * Faults: every pooled client carries an 'error' listener for its whole life (a connection that
 * drops while checked out, e.g. pg_terminate_backend or a failover, otherwise raises an unhandled
 * 'error' event and ends the process); connections have a connect/acquire timeout, TCP keepalive, a
 * server-side statement_timeout and a client-side query timeout a second longer (a blackholed server
 * never answers the server-side one). Writes lock rows in key order and run again on a deadlock or
 * serialization failure (withConflictRetry); what still fails reaches the HTTP edge as a driver error
 * that storage/errors.ts classifies.
 *
 * Only bound parameters reach SQL; the schema name is checked against a strict identifier pattern
 * (config.ts) and quoted.
 */

import pg from 'pg';
import {
  MIGRATIONS,
  SCHEMA_MIGRATIONS_TABLE_SQL,
  checkSchemaCompatibility,
  migrationSql,
  minReaderVersionOf,
  type AppliedMigration,
  type Migration,
} from '../migrations.js';
import type {
  ConnectionStats,
  PageReadOptions,
  SeriesPageKind,
  SeriesPageRows,
  DelayRow,
  MetRow,
  Repository,
  Station,
  StationInput,
  SoundingRow,
  StationDelayRows,
  StationRange,
  StoredModelSet,
  StoredSounding,
  SurfaceMetRow,
  TimeRange,
  WriteCounts,
  ZenithDelayRow,
} from '../repository.js';
import { StationDeletedError, UnknownStationError } from '../repository.js';
import {
  AUDIT_COLUMNS,
  auditValues,
  auditWhere,
  toApiKey,
  toAuditEvent,
  type ApiKeyDbRow,
  type AuditDbRow,
  type AuditEvent,
  type AuditQuery,
  type DeletedStationMark,
  type StoredApiKey,
  type StoredAuditEvent,
} from '../access-rows.js';
import { withConflictRetry } from '../errors.js';
import { GuardRefusedError, numberedPlaceholders, type GuardStatement, type SqlExecutor, type SqlStatement } from '../sql-executor.js';
import { positionalValues, seriesPages } from '../paged-read.js';
import {
  DELAY_SELECT,
  MET_SELECT,
  SURFACE_MET_SELECT,
  ZENITH_DELAY_SELECT,
  delayFromArray,
  metFromArray,
  surfaceMetFromArray,
  toStation,
  zenithDelayFromArray,
  type MetArrayRow,
  type StationDbRow,
  rangeReadSql,
  groupByStation,
} from '../rows.js';
import {
  SOUNDING_SELECT,
  SOUNDING_WITH_PROFILE_SELECT,
  soundingFromArray,
  soundingUpsertSql,
  soundingValues,
  storedSoundingFromArray,
} from '../sounding-rows.js';

/** Key of the advisory lock that serialises migrations (an arbitrary constant of this service). */
export const MIGRATION_LOCK_KEY = 7_421_903_311;
/** Rows bound per statement in bulk writes. */
const CHUNK_ROWS = 10_000;
/**
 * The counts of an upsert wrapped as `WITH written AS (INSERT … RETURNING (xmax = 0) AS inserted)`:
 * one row back instead of one per written row (xmax = 0: the row version was inserted, not updated).
 */
const COUNT_WRITTEN = 'SELECT COUNT(*) FILTER (WHERE inserted) AS inserted, COUNT(*) AS written FROM written';
/** BIGINT counts arrive as strings. */
interface WrittenCounts {
  inserted: string;
  written: string;
}
const SCHEMA_PATTERN = /^[a-z_][a-z0-9_]{0,62}$/;

export interface PostgresOptions {
  connectionString: string;
  schema?: string;
  /** Pool size (default 10). */
  max?: number;
  /** Longest wait for a connection, new or from the pool [ms] (default 5000). */
  connectTimeoutMs?: number;
  /** statement_timeout of every session [ms]; the client gives up 1 s later (default 30 000). */
  statementTimeoutMs?: number;
  /** Told about connection errors outside a query (they are handled; this is for the log). */
  onConnectionError?: (err: Error) => void;
  /** Password, given apart from the URL (TROPODELAY_DATABASE_PASSWORD); overrides one inside the URL. */
  password?: string;
  /** The migrations this release knows (default MIGRATIONS; tests give older or newer lists). */
  migrations?: readonly Migration[];
}

/** Default timeouts [ms] (README configuration table: DB_CONNECT_TIMEOUT_MS, DB_STATEMENT_TIMEOUT_MS). */
export const DEFAULT_CONNECT_TIMEOUT_MS = 5_000;
export const DEFAULT_STATEMENT_TIMEOUT_MS = 30_000;
/** Idle time before the first TCP keepalive probe [ms]: a dead peer is noticed in about a minute, not hours. */
const KEEPALIVE_DELAY_MS = 10_000;

/** Orders rows by their key (epoch, then source) so that every writer locks them in the same order. */
function byKey<T extends { epochMs: number; source: string }>(rows: readonly T[]): T[] {
  return [...rows].sort((a, b) => a.epochMs - b.epochMs || (a.source < b.source ? -1 : a.source > b.source ? 1 : 0));
}

function quoteIdent(name: string): string {
  if (!SCHEMA_PATTERN.test(name)) throw new Error(`invalid schema name ${JSON.stringify(name)}`);
  return `"${name}"`;
}

/** Applies the pending migrations under the advisory lock; returns the versions it applied. */
export async function migratePostgres(pool: pg.Pool, schema: string, migrations: readonly Migration[] = MIGRATIONS): Promise<number[]> {
  const client = await pool.connect();
  const applied: number[] = [];
  try {
    // Waiting for another replica's migration, or a migration of a big table, may take longer than
    // the statement timeout meant for requests.
    await client.query('SET statement_timeout = 0');
    await client.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK_KEY]);
    try {
      await client.query(`CREATE SCHEMA IF NOT EXISTS ${quoteIdent(schema)}`);
      await client.query(`SET search_path TO ${quoteIdent(schema)}`);
      await client.query(SCHEMA_MIGRATIONS_TABLE_SQL);
      // Databases made before rolling updates were supported lack the column (expand: added, never dropped).
      await client.query('ALTER TABLE schema_migrations ADD COLUMN IF NOT EXISTS min_reader_version INTEGER');
      const done = new Set((await client.query<{ version: number }>('SELECT version FROM schema_migrations')).rows.map((r) => r.version));
      for (const m of migrations) {
        if (done.has(m.version)) continue;
        await client.query('BEGIN');
        try {
          await client.query(migrationSql(m, 'postgres'));
          await client.query('INSERT INTO schema_migrations (version, name, applied_at, min_reader_version) VALUES ($1, $2, $3, $4)', [
            m.version,
            m.name,
            new Date().toISOString(),
            minReaderVersionOf(m),
          ]);
          await client.query('COMMIT');
        } catch (err) {
          await client.query('ROLLBACK');
          throw err;
        }
        applied.push(m.version);
      }
    } finally {
      await client.query('SELECT pg_advisory_unlock($1)', [MIGRATION_LOCK_KEY]);
      await client.query('RESET search_path');
      await client.query('RESET statement_timeout');
    }
  } finally {
    client.release();
  }
  return applied;
}

export class PostgresRepository implements Repository {
  readonly backend = 'postgres' as const;
  readonly schema: string;
  private readonly pool: pg.Pool;

  private readonly migrations: readonly Migration[];

  private constructor(pool: pg.Pool, schema: string, migrations: readonly Migration[]) {
    this.pool = pool;
    this.schema = schema;
    this.migrations = migrations;
  }

  /** Connects, migrates and returns a ready repository. */
  static async open(options: PostgresOptions): Promise<PostgresRepository> {
    const schema = options.schema ?? 'public';
    quoteIdent(schema);
    const statementTimeoutMs = options.statementTimeoutMs ?? DEFAULT_STATEMENT_TIMEOUT_MS;
    const onConnectionError = options.onConnectionError ?? (() => undefined);
    const migrations = options.migrations ?? MIGRATIONS;
    const pool = new pg.Pool({
      connectionString: options.connectionString,
      ...(options.password !== undefined ? { password: options.password } : {}),
      max: options.max ?? 10,
      // Every connection resolves the archive's table names in its schema.
      options: `-c search_path=${schema}`,
      connectionTimeoutMillis: options.connectTimeoutMs ?? DEFAULT_CONNECT_TIMEOUT_MS,
      keepAlive: true,
      keepAliveInitialDelayMillis: KEEPALIVE_DELAY_MS,
      statement_timeout: statementTimeoutMs,
      // A session that died inside a transaction frees its locks after this long.
      idle_in_transaction_session_timeout: statementTimeoutMs,
      query_timeout: statementTimeoutMs + 1_000,
    });
    // An idle client lost its connection; the pool drops it and opens a new one when needed.
    pool.on('error', onConnectionError);
    // The pool listens for errors only while a client is idle. A client checked out by a request
    // whose connection drops between two queries (or under a query: pg emits 'error' as well as
    // failing the query) would raise an unhandled 'error' event; this listener stays for its life.
    pool.on('connect', (client) => client.on('error', onConnectionError));
    try {
      await migratePostgres(pool, schema, migrations);
    } catch (err) {
      await pool.end();
      throw err;
    }
    return new PostgresRepository(pool, schema, migrations);
  }

  /**
   * Runs `work` in one transaction, and all of it again on a deadlock or serialization failure
   * (withConflictRetry; the failed attempt was rolled back whole). A client whose ROLLBACK fails
   * (its connection is gone) is destroyed instead of going back to the pool.
   */
  private async transaction<T>(work: (client: pg.PoolClient) => Promise<T>): Promise<T> {
    return withConflictRetry(async () => {
      const client = await this.pool.connect();
      let broken: Error | undefined;
      try {
        await client.query('BEGIN');
        const result = await work(client);
        await client.query('COMMIT');
        return result;
      } catch (err) {
        await client.query('ROLLBACK').catch((rollbackErr: unknown) => {
          broken = rollbackErr instanceof Error ? rollbackErr : new Error(String(rollbackErr));
        });
        throw err;
      } finally {
        client.release(broken);
      }
    });
  }

  async putStation(stationId: string, s: StationInput): Promise<{ station: Station; created: boolean }> {
    const now = new Date().toISOString();
    // A station marked deleted is left alone (the WHERE of DO UPDATE): no row comes back.
    const result = await this.pool.query<StationDbRow & { inserted: boolean }>(
      `INSERT INTO stations (station_id, name, latitude_deg, longitude_deg, height_m, met_height_m, description, created_at, updated_at)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $8)
       ON CONFLICT (station_id) DO UPDATE SET name = EXCLUDED.name, latitude_deg = EXCLUDED.latitude_deg,
         longitude_deg = EXCLUDED.longitude_deg, height_m = EXCLUDED.height_m, met_height_m = EXCLUDED.met_height_m,
         description = EXCLUDED.description, updated_at = EXCLUDED.updated_at
       WHERE stations.deleted_at IS NULL
       RETURNING *, (xmax = 0) AS inserted`,
      [stationId, s.name, s.latitudeDeg, s.longitudeDeg, s.heightM, s.metHeightM, s.description, now],
    );
    const row = result.rows[0];
    if (!row) {
      const mark = await this.pool.query<{ deleted_at: string }>('SELECT deleted_at FROM stations WHERE station_id = $1', [stationId]);
      throw new StationDeletedError(stationId, mark.rows[0]?.deleted_at ?? 'an unknown time');
    }
    return { station: toStation(row), created: row.inserted };
  }

  async getStation(stationId: string): Promise<Station | null> {
    const result = await this.pool.query<StationDbRow>('SELECT * FROM stations WHERE station_id = $1 AND deleted_at IS NULL', [stationId]);
    return result.rows[0] ? toStation(result.rows[0]) : null;
  }

  async listStations(): Promise<Station[]> {
    return (await this.pool.query<StationDbRow>('SELECT * FROM stations WHERE deleted_at IS NULL ORDER BY station_id')).rows.map(toStation);
  }

  async deleteStation(stationId: string, deletedAt: string): Promise<boolean> {
    const result = await this.pool.query('UPDATE stations SET deleted_at = $2 WHERE station_id = $1 AND deleted_at IS NULL', [
      stationId,
      deletedAt,
    ]);
    return (result.rowCount ?? 0) > 0;
  }

  async restoreStation(stationId: string): Promise<boolean> {
    const result = await this.pool.query('UPDATE stations SET deleted_at = NULL WHERE station_id = $1 AND deleted_at IS NOT NULL', [
      stationId,
    ]);
    return (result.rowCount ?? 0) > 0;
  }

  async purgeStation(stationId: string): Promise<boolean> {
    const result = await this.pool.query('DELETE FROM stations WHERE station_id = $1', [stationId]);
    return (result.rowCount ?? 0) > 0;
  }

  async purgeDeletedBefore(cutoff: string): Promise<string[]> {
    const result = await this.pool.query<{ station_id: string }>(
      'DELETE FROM stations WHERE deleted_at IS NOT NULL AND deleted_at <= $1 RETURNING station_id',
      [cutoff],
    );
    return result.rows.map((r) => r.station_id).sort();
  }

  async listDeletedStations(): Promise<DeletedStationMark[]> {
    const result = await this.pool.query<{ station_id: string; name: string; deleted_at: string }>(
      'SELECT station_id, name, deleted_at FROM stations WHERE deleted_at IS NOT NULL ORDER BY deleted_at, station_id',
    );
    return result.rows.map((r) => ({ stationId: r.station_id, name: r.name, deletedAt: r.deleted_at }));
  }

  async createApiKey(k: StoredApiKey): Promise<boolean> {
    const result = await this.pool.query(
      `INSERT INTO api_keys (name, role, secret_sha256, created_at, created_by, revoked_at) VALUES ($1, $2, $3, $4, $5, $6)
       ON CONFLICT DO NOTHING`,
      [k.name, k.role, k.secretSha256, k.createdAt, k.createdBy, k.revokedAt],
    );
    return (result.rowCount ?? 0) > 0;
  }

  async listApiKeys(): Promise<StoredApiKey[]> {
    return (await this.pool.query<ApiKeyDbRow>('SELECT * FROM api_keys ORDER BY name')).rows.map(toApiKey);
  }

  async revokeApiKey(name: string, revokedAt: string): Promise<boolean> {
    const result = await this.pool.query('UPDATE api_keys SET revoked_at = $2 WHERE name = $1 AND revoked_at IS NULL', [name, revokedAt]);
    return (result.rowCount ?? 0) > 0;
  }

  async appendAuditEvent(event: AuditEvent): Promise<void> {
    await this.pool.query(
      `INSERT INTO audit_events (${AUDIT_COLUMNS.join(', ')}) VALUES (${AUDIT_COLUMNS.map((_, i) => `$${i + 1}`).join(', ')})`,
      auditValues(event),
    );
  }

  async listAuditEvents(query: AuditQuery): Promise<StoredAuditEvent[]> {
    const { where, values } = auditWhere(query, (i) => `$${i}`);
    const result = await this.pool.query<AuditDbRow>(
      `SELECT * FROM audit_events ${where} ORDER BY at_ms DESC, event_id DESC LIMIT $${values.length + 1}`,
      [...values, query.limit],
    );
    return result.rows.map(toAuditEvent);
  }

  private async lockStation(client: pg.PoolClient, stationId: string): Promise<void> {
    // FOR SHARE: the station cannot be deleted while its series is being written.
    const found = await client.query('SELECT 1 FROM stations WHERE station_id = $1 AND deleted_at IS NULL FOR SHARE', [stationId]);
    if (found.rowCount === 0) throw new UnknownStationError(stationId);
  }

  async writeMet(stationId: string, rows: readonly MetRow[]): Promise<WriteCounts> {
    return this.transaction(async (client) => {
      await this.lockStation(client, stationId);
      let returned = 0;
      let inserted = 0;
      const sorted = byKey(rows);
      for (let start = 0; start < sorted.length; start += CHUNK_ROWS) {
        const chunk = sorted.slice(start, start + CHUNK_ROWS);
        const result = await client.query<WrittenCounts>(
          `WITH written AS (INSERT INTO met_records (station_id, epoch_ms, source, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa)
           SELECT $1, * FROM unnest($2::bigint[], $3::text[], $4::float8[], $5::float8[], $6::float8[], $7::float8[], $8::float8[])
           ON CONFLICT (station_id, epoch_ms, source) DO UPDATE SET
             pressure_hpa = EXCLUDED.pressure_hpa, temperature_c = EXCLUDED.temperature_c,
             relative_humidity_pct = EXCLUDED.relative_humidity_pct, dewpoint_c = EXCLUDED.dewpoint_c,
             vapour_pressure_hpa = EXCLUDED.vapour_pressure_hpa
           WHERE (met_records.pressure_hpa, met_records.temperature_c, met_records.relative_humidity_pct, met_records.dewpoint_c, met_records.vapour_pressure_hpa)
             IS DISTINCT FROM (EXCLUDED.pressure_hpa, EXCLUDED.temperature_c, EXCLUDED.relative_humidity_pct, EXCLUDED.dewpoint_c, EXCLUDED.vapour_pressure_hpa)
           RETURNING (xmax = 0) AS inserted)
           ${COUNT_WRITTEN}`,
          [
            stationId,
            chunk.map((r) => r.epochMs),
            chunk.map((r) => r.source),
            chunk.map((r) => r.pressureHpa),
            chunk.map((r) => r.temperatureC),
            chunk.map((r) => r.relativeHumidityPct),
            chunk.map((r) => r.dewpointC),
            chunk.map((r) => r.vapourPressureHpa),
          ],
        );
        returned += Number(result.rows[0]!.written);
        inserted += Number(result.rows[0]!.inserted);
      }
      return { inserted, updated: returned - inserted, unchanged: rows.length - returned };
    });
  }

  async readMet(stationId: string, range: TimeRange, source?: string): Promise<MetRow[]> {
    return (await this.readRange('met_records', MET_SELECT, stationId, range, source)).map((row) => metFromArray(row as MetArrayRow));
  }

  async readSurfaceMet(stationId: string, range: TimeRange, source?: string): Promise<SurfaceMetRow[]> {
    return (await this.readRange('met_records', SURFACE_MET_SELECT, stationId, range, source)).map(surfaceMetFromArray);
  }

  async writeDelays(stationId: string, rows: readonly DelayRow[], modelSet: StoredModelSet, guard?: GuardStatement): Promise<WriteCounts> {
    return (await this.writeDelaysMany([{ stationId, rows }], modelSet, guard))[0]!;
  }

  async writeDelaysMany(writes: readonly StationDelayRows[], modelSet: StoredModelSet, guard?: GuardStatement): Promise<WriteCounts[]> {
    for (const w of writes)
      for (const r of w.rows)
        if (r.modelFingerprint !== modelSet.modelFingerprint) throw new Error('delay row fingerprint differs from its model set');
    return this.transaction(async (client) => {
      // Stations locked in id order, so that two writes of overlapping networks cannot deadlock.
      for (const id of [...new Set(writes.map((w) => w.stationId))].sort()) await this.lockStation(client, id);
      if (guard && !(await client.query(numberedPlaceholders(guard.sql), [...guard.params])).rowCount) throw new GuardRefusedError();
      await client.query(
        'INSERT INTO model_sets (model_fingerprint, models_json) VALUES ($1, $2) ON CONFLICT (model_fingerprint) DO NOTHING',
        [modelSet.modelFingerprint, JSON.stringify(modelSet.models)],
      );
      const counts: WriteCounts[] = [];
      for (const w of writes) counts.push(await this.upsertDelays(client, w.stationId, w.rows, modelSet.modelFingerprint));
      return counts;
    });
  }

  private async upsertDelays(
    client: pg.PoolClient,
    stationId: string,
    rows: readonly DelayRow[],
    modelFingerprint: string,
  ): Promise<WriteCounts> {
    {
      let returned = 0;
      let inserted = 0;
      const cols = [
        'ztd_m',
        'ztd_sigma_m',
        'zwd_m',
        'zwd_sigma_m',
        'north_gradient_m',
        'east_gradient_m',
        'north_gradient_sigma_m',
        'east_gradient_sigma_m',
      ];
      const current = cols.map((c) => `delay_records.${c}`).join(', ') + ', delay_records.model_fingerprint';
      const excluded = cols.map((c) => `EXCLUDED.${c}`).join(', ') + ', EXCLUDED.model_fingerprint';
      const sorted = byKey(rows);
      for (let start = 0; start < sorted.length; start += CHUNK_ROWS) {
        const chunk = sorted.slice(start, start + CHUNK_ROWS);
        const result = await client.query<WrittenCounts>(
          `WITH written AS (INSERT INTO delay_records (station_id, epoch_ms, source, ${cols.join(', ')}, model_fingerprint)
           SELECT $1, e, s, v1, v2, v3, v4, v5, v6, v7, v8, $12
           FROM unnest($2::bigint[], $3::text[], $4::float8[], $5::float8[], $6::float8[], $7::float8[], $8::float8[], $9::float8[], $10::float8[], $11::float8[])
             AS t (e, s, v1, v2, v3, v4, v5, v6, v7, v8)
           ON CONFLICT (station_id, epoch_ms, source) DO UPDATE SET
             ${cols.map((c) => `${c} = EXCLUDED.${c}`).join(', ')}, model_fingerprint = EXCLUDED.model_fingerprint
           WHERE (${current}) IS DISTINCT FROM (${excluded})
           RETURNING (xmax = 0) AS inserted)
           ${COUNT_WRITTEN}`,
          [
            stationId,
            chunk.map((r) => r.epochMs),
            chunk.map((r) => r.source),
            chunk.map((r) => r.ztdM),
            chunk.map((r) => r.ztdSigmaM),
            chunk.map((r) => r.zwdM),
            chunk.map((r) => r.zwdSigmaM),
            chunk.map((r) => r.northGradientM),
            chunk.map((r) => r.eastGradientM),
            chunk.map((r) => r.northGradientSigmaM),
            chunk.map((r) => r.eastGradientSigmaM),
            modelFingerprint,
          ],
        );
        returned += Number(result.rows[0]!.written);
        inserted += Number(result.rows[0]!.inserted);
      }
      return { inserted, updated: returned - inserted, unchanged: rows.length - returned };
    }
  }

  sqlExecutor(): SqlExecutor {
    return {
      dialect: 'postgres',
      all: async <T>(sql: string, params: readonly unknown[] = []) =>
        (await this.pool.query(numberedPlaceholders(sql), [...params])).rows as T[],
      batch: (statements: readonly SqlStatement[]) =>
        this.transaction(async (client) => {
          const changed: number[] = [];
          for (const s of statements) changed.push((await client.query(numberedPlaceholders(s.sql), [...s.params])).rowCount ?? 0);
          return changed;
        }),
    };
  }

  async readDelays(stationId: string, range: TimeRange, source?: string): Promise<DelayRow[]> {
    return (await this.readRange('delay_records', DELAY_SELECT, stationId, range, source)).map(delayFromArray);
  }

  async readZenithDelays(stationId: string, range: TimeRange, source?: string): Promise<ZenithDelayRow[]> {
    return (await this.readRange('delay_records', ZENITH_DELAY_SELECT, stationId, range, source)).map(zenithDelayFromArray);
  }

  readPages<K extends SeriesPageKind>(
    kind: K,
    stationId: string,
    range: TimeRange,
    options: PageReadOptions,
  ): AsyncGenerator<SeriesPageRows[K][], void, undefined> {
    return seriesPages(kind, stationId, range, options, 'postgres', async (text, values) => {
      const result = await this.pool.query<unknown[]>({ text, values: positionalValues(values), rowMode: 'array' });
      return result.rows;
    });
  }

  async readModelSets(fingerprints: readonly string[]): Promise<StoredModelSet[]> {
    if (fingerprints.length === 0) return [];
    const result = await this.pool.query<{ model_fingerprint: string; models_json: string }>(
      'SELECT model_fingerprint, models_json FROM model_sets WHERE model_fingerprint = ANY($1::text[]) ORDER BY model_fingerprint',
      [fingerprints],
    );
    return result.rows.map((r) => ({ modelFingerprint: r.model_fingerprint, models: JSON.parse(r.models_json) }));
  }

  async putSounding(stationId: string, sounding: StoredSounding, modelSet: StoredModelSet): Promise<{ created: boolean }> {
    if (sounding.modelFingerprint !== modelSet.modelFingerprint) throw new Error('sounding fingerprint differs from its model set');
    return this.transaction(async (client) => {
      await this.lockStation(client, stationId);
      await client.query(
        'INSERT INTO model_sets (model_fingerprint, models_json) VALUES ($1, $2) ON CONFLICT (model_fingerprint) DO NOTHING',
        [modelSet.modelFingerprint, JSON.stringify(modelSet.models)],
      );
      const result = await client.query<{ inserted: boolean }>(
        `${soundingUpsertSql((n) => `$${n}`)} RETURNING (xmax = 0) AS inserted`,
        soundingValues(stationId, sounding),
      );
      return { created: result.rows[0]!.inserted };
    });
  }

  async readSoundings(stationId: string, range: TimeRange): Promise<SoundingRow[]> {
    const result = await this.pool.query<unknown[]>({
      text: `SELECT ${SOUNDING_SELECT} FROM soundings WHERE station_id = $1 AND epoch_ms BETWEEN $2 AND $3 ORDER BY epoch_ms`,
      values: [stationId, range.fromMs, range.toMs],
      rowMode: 'array',
    });
    return result.rows.map(soundingFromArray);
  }

  async getSounding(stationId: string, epochMs: number): Promise<StoredSounding | null> {
    const result = await this.pool.query<unknown[]>({
      text: `SELECT ${SOUNDING_WITH_PROFILE_SELECT} FROM soundings WHERE station_id = $1 AND epoch_ms = $2`,
      values: [stationId, epochMs],
      rowMode: 'array',
    });
    return result.rows[0] ? storedSoundingFromArray(result.rows[0]) : null;
  }

  async deleteSounding(stationId: string, epochMs: number): Promise<boolean> {
    const result = await this.pool.query('DELETE FROM soundings WHERE station_id = $1 AND epoch_ms = $2', [stationId, epochMs]);
    return (result.rowCount ?? 0) > 0;
  }

  async latestEpochMs(stationId: string, series: 'met' | 'delays'): Promise<number | null> {
    const table = series === 'met' ? 'met_records' : 'delay_records';
    const result = await this.pool.query<{ latest: string | null }>(`SELECT MAX(epoch_ms) AS latest FROM ${table} WHERE station_id = $1`, [
      stationId,
    ]);
    const latest = result.rows[0]?.latest ?? null;
    return latest === null ? null : Number(latest);
  }

  async readZenithDelaysMany(ranges: readonly StationRange[], source?: string): Promise<Map<string, ZenithDelayRow[]>> {
    return groupByStation(await this.readRanges('delay_records', ZENITH_DELAY_SELECT, ranges, source), zenithDelayFromArray);
  }

  async readSurfaceMetMany(ranges: readonly StationRange[]): Promise<Map<string, SurfaceMetRow[]>> {
    return groupByStation(await this.readRanges('met_records', SURFACE_MET_SELECT, ranges), surfaceMetFromArray);
  }

  async countDelaySources(ranges: readonly StationRange[]): Promise<Map<string, Map<string, number>>> {
    const out = new Map<string, Map<string, number>>();
    if (ranges.length === 0) return out;
    const result = await this.pool.query<[string, string, string]>({
      text:
        'SELECT t.station_id, t.source, COUNT(*) FROM unnest($1::text[], $2::bigint[], $3::bigint[]) AS q(station_id, from_ms, to_ms) ' +
        'JOIN delay_records t ON t.station_id = q.station_id AND t.epoch_ms BETWEEN q.from_ms AND q.to_ms GROUP BY t.station_id, t.source',
      values: [ranges.map((r) => r.stationId), ranges.map((r) => r.fromMs), ranges.map((r) => r.toMs)],
      rowMode: 'array',
    });
    for (const [id, source, n] of result.rows) {
      let m = out.get(id);
      if (!m) out.set(id, (m = new Map()));
      m.set(source, Number(n));
    }
    return out;
  }

  async latestEpochsMs(stationIds: readonly string[], series: 'met' | 'delays'): Promise<Map<string, number>> {
    const table = series === 'met' ? 'met_records' : 'delay_records';
    if (stationIds.length === 0) return new Map();
    // One index probe per station (max of the primary key's epoch within the station).
    const result = await this.pool.query<[string, string | null]>({
      text: `SELECT q.id, (SELECT MAX(epoch_ms) FROM ${table} t WHERE t.station_id = q.id) FROM unnest($1::text[]) AS q(id)`,
      values: [stationIds],
      rowMode: 'array',
    });
    const out = new Map<string, number>();
    for (const [id, latest] of result.rows) if (latest !== null) out.set(id, Number(latest));
    return out;
  }

  /**
   * Raw rows (station_id first) of many one-station range reads in one statement: the ranges are
   * bound as three arrays and joined on the primary key (station_id, epoch_ms).
   */
  private async readRanges(
    table: 'met_records' | 'delay_records',
    columns: string,
    ranges: readonly StationRange[],
    source?: string,
  ): Promise<unknown[][]> {
    if (ranges.length === 0) return [];
    const qualified = columns
      .split(', ')
      .map((c) => `t.${c}`)
      .join(', ');
    const bySource = source === undefined ? '' : ' AND t.source = $4';
    const values: unknown[] = [ranges.map((r) => r.stationId), ranges.map((r) => r.fromMs), ranges.map((r) => r.toMs)];
    if (source !== undefined) values.push(source);
    const result = await this.pool.query<unknown[]>({
      text:
        `SELECT t.station_id, ${qualified} FROM unnest($1::text[], $2::bigint[], $3::bigint[]) AS q(station_id, from_ms, to_ms) ` +
        `JOIN ${table} t ON t.station_id = q.station_id AND t.epoch_ms BETWEEN q.from_ms AND q.to_ms${bySource} ` +
        'ORDER BY t.station_id, t.epoch_ms, t.source',
      values,
      rowMode: 'array',
    });
    return result.rows;
  }

  /** Raw rows of a one-station time-range read. */
  private async readRange(
    table: 'met_records' | 'delay_records',
    columns: string,
    stationId: string,
    range: TimeRange,
    source?: string,
  ): Promise<unknown[][]> {
    const result = await this.pool.query<unknown[]>({
      text: rangeReadSql(table, columns, source !== undefined, 'postgres'),
      values: source === undefined ? [stationId, range.fromMs, range.toMs] : [stationId, range.fromMs, range.toMs, source],
      rowMode: 'array',
    });
    return result.rows;
  }

  connectionStats(): ConnectionStats {
    return { total: this.pool.totalCount, idle: this.pool.idleCount, waiting: this.pool.waitingCount };
  }

  async ping(): Promise<void> {
    const result = await this.pool.query<AppliedMigration>(
      'SELECT version, name, min_reader_version AS "minReaderVersion" FROM schema_migrations',
    );
    checkSchemaCompatibility(result.rows, this.migrations);
  }

  async close(): Promise<void> {
    await this.pool.end();
  }
}
