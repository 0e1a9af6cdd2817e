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
  AuditTrimOptions,
  ConnectionStats,
  PageReadOptions,
  SeriesPageKind,
  SeriesPageRows,
  DelayRow,
  MetRow,
  Repository,
  Station,
  StationInput,
  StationBox,
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
  AUDIT_TRIM_BATCH_ROWS,
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
import {
  coverageParams,
  coverageSql,
  foldCoverage,
  type CoverageQuery,
  type GapRow,
  type SeriesCoverage,
  type SpanRow,
} from '../coverage-query.js';
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
  stationsInBoxParams,
  stationsInBoxWhere,
  zenithDelayFromArray,
  type MetArrayRow,
  type SeriesTable,
  type StationDbRow,
  ENVELOPE_TABLE,
  envelopeSql,
  epochEnvelopes,
  groupByStation,
  mergeSources,
  networkEpochReadSql,
  rangeReadSql,
  READ_RELATION,
  sharedShortRange,
  sourcesSql,
} from '../rows.js';
import {
  SOUNDING_SELECT,
  SOUNDING_WITH_PROFILE_SELECT,
  soundingFromArray,
  soundingUpsertSql,
  soundingValues,
  storedSoundingFromArray,
} from '../sounding-rows.js';

/**
 * The advisory lock that serialises migrations is (MIGRATION_LOCK_CLASS, migrationLockKey(schema)): the
 * replicas of one schema migrate one after the other, while other schemas on the same server (other
 * deployments, test runs) do not wait for a long migration (the archive layout copies every row).
 * MIGRATION_LOCK_CLASS is an arbitrary constant of this service.
 */
export const MIGRATION_LOCK_CLASS = 742_190_331;
/** The schema's half of the migration lock: FNV-1a of its name as a signed 32-bit integer. */
export function migrationLockKey(schema: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < schema.length; i++) h = Math.imul(h ^ schema.charCodeAt(i), 0x01000193);
  return h | 0;
}
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

/**
 * FROM clause of a many-station read: the ranges bound as arrays $1 (station ids), $2 (from), $3 (to),
 * one row per station and source whose envelope meets its range: q(station_id, from_ms, to_ms, source).
 */
const RANGES_WITH_SOURCES = (table: SeriesTable) =>
  `(SELECT DISTINCT r.station_id, r.from_ms, r.to_ms, e.source FROM unnest($1::text[], $2::bigint[], $3::bigint[]) AS r(station_id, from_ms, to_ms) ` +
  `JOIN ${ENVELOPE_TABLE[table]} e ON e.station_id = r.station_id AND e.last_epoch_ms >= r.from_ms AND e.first_epoch_ms <= r.to_ms) AS q`;

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
    const lock = [MIGRATION_LOCK_CLASS, migrationLockKey(schema)];
    await client.query('SELECT pg_advisory_lock($1, $2)', lock);
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
      await client.query('SELECT pg_advisory_unlock($1, $2)', lock);
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

  async getStations(stationIds: readonly string[]): Promise<Map<string, Station>> {
    const out = new Map<string, Station>();
    if (stationIds.length === 0) return out;
    // The ids as one text[] parameter: one round trip for any number of ids, each a primary-key lookup.
    const result = await this.pool.query<StationDbRow>('SELECT * FROM stations WHERE station_id = ANY($1::text[]) AND deleted_at IS NULL', [
      [...new Set(stationIds)],
    ]);
    for (const row of result.rows) out.set(row.station_id, toStation(row));
    return out;
  }

  async listStations(): Promise<Station[]> {
    return (await this.pool.query<StationDbRow>('SELECT * FROM stations WHERE deleted_at IS NULL ORDER BY station_id')).rows.map(toStation);
  }

  async listStationsInBox(box: StationBox): Promise<Station[]> {
    const sql = `SELECT * FROM stations WHERE ${stationsInBoxWhere((n) => `$${n}::float8`, box)} ORDER BY station_id`;
    return (await this.pool.query<StationDbRow>(sql, stationsInBoxParams(box))).rows.map(toStation);
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

  async trimAuditEventsBefore(cutoffMs: number, { batchRows = AUDIT_TRIM_BATCH_ROWS, signal }: AuditTrimOptions = {}): Promise<number> {
    // One autocommitted statement per batch: row locks on that batch only (inserts and reads go on), and
    // SKIP LOCKED lets replicas trimming at the same moment take different batches instead of waiting.
    let total = 0;
    for (;;) {
      const result = await this.pool.query(
        `DELETE FROM audit_events WHERE event_id IN
           (SELECT event_id FROM audit_events WHERE at_ms < $1 LIMIT $2 FOR UPDATE SKIP LOCKED)`,
        [cutoffMs, batchRows],
      );
      const deleted = result.rowCount ?? 0;
      total += deleted;
      if (deleted === 0 || signal?.aborted) return total;
    }
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

  /**
   * Widens the envelopes of the sources of `rows` in source order (call inside the write transaction);
   * for delays, returns source → segment id of `fingerprint`.
   */
  private async widenEnvelopes(
    client: pg.PoolClient,
    table: SeriesTable,
    stationId: string,
    rows: readonly { epochMs: number; source: string }[],
    fingerprint?: string,
  ): Promise<Map<string, number>> {
    const segments = new Map<string, number>();
    for (const [source, [firstMs, lastMs]] of epochEnvelopes(rows)) {
      const values = fingerprint === undefined ? [stationId, source, firstMs, lastMs] : [stationId, source, fingerprint, firstMs, lastMs];
      const result = await client.query<{ segment_id: number }>(envelopeSql(table, 'postgres'), values);
      if (fingerprint !== undefined) segments.set(source, result.rows[0]!.segment_id);
    }
    return segments;
  }

  async writeMet(stationId: string, rows: readonly MetRow[]): Promise<WriteCounts> {
    return this.transaction(async (client) => {
      await this.lockStation(client, stationId);
      await this.widenEnvelopes(client, 'met_records', stationId, rows);
      let returned = 0;
      let inserted = 0;
      const sorted = byKey(rows);
      for (let start = 0; start < sorted.length; start += CHUNK_ROWS) {
        const chunk = sorted.slice(start, start + CHUNK_ROWS);
        const result = await client.query<WrittenCounts>(
          `WITH written AS (INSERT INTO met_records (station_id, epoch_ms, source, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa)
           SELECT $1, * FROM unnest($2::bigint[], $3::text[], $4::float8[], $5::float8[], $6::float8[], $7::float8[], $8::float8[])
           ON CONFLICT (station_id, source, epoch_ms) DO UPDATE SET
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
      const current = cols.map((c) => `delay_records.${c}`).join(', ') + ', delay_records.segment_id';
      const excluded = cols.map((c) => `EXCLUDED.${c}`).join(', ') + ', EXCLUDED.segment_id';
      const segments = await this.widenEnvelopes(client, 'delay_records', stationId, rows, modelFingerprint);
      const sorted = byKey(rows);
      for (let start = 0; start < sorted.length; start += CHUNK_ROWS) {
        const chunk = sorted.slice(start, start + CHUNK_ROWS);
        const result = await client.query<WrittenCounts>(
          `WITH written AS (INSERT INTO delay_records (station_id, epoch_ms, source, ${cols.join(', ')}, segment_id)
           SELECT $1, e, s, v1, v2, v3, v4, v5, v6, v7, v8, g
           FROM unnest($2::bigint[], $3::text[], $4::float8[], $5::float8[], $6::float8[], $7::float8[], $8::float8[], $9::float8[], $10::float8[], $11::float8[], $12::int[])
             AS t (e, s, v1, v2, v3, v4, v5, v6, v7, v8, g)
           ON CONFLICT (station_id, source, epoch_ms) DO UPDATE SET
             ${cols.map((c) => `${c} = EXCLUDED.${c}`).join(', ')}, segment_id = EXCLUDED.segment_id
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
            chunk.map((r) => segments.get(r.source)),
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
    return seriesPages(kind, stationId, range, options, 'postgres', {
      sources: (table, id, r) => this.sourcesOf(table, id, r),
      fetchPage: async (text, values) => {
        const result = await this.pool.query<unknown[]>({ text, values: positionalValues(values), rowMode: 'array' });
        return result.rows;
      },
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
    return (await this.latestEpochsMs([stationId], series)).get(stationId) ?? null;
  }

  async readZenithDelaysMany(ranges: readonly StationRange[], source?: string): Promise<Map<string, ZenithDelayRow[]>> {
    return groupByStation(await this.readRanges('delay_records', ZENITH_DELAY_SELECT, ranges, source), zenithDelayFromArray);
  }

  async readSurfaceMetMany(ranges: readonly StationRange[]): Promise<Map<string, SurfaceMetRow[]>> {
    return groupByStation(await this.readRanges('met_records', SURFACE_MET_SELECT, ranges), surfaceMetFromArray);
  }

  async readDelayCoverage(query: CoverageQuery): Promise<Map<string, SeriesCoverage[]>> {
    const sql = coverageSql((n) => `$${n}`, 'station_id = ANY($1::text[])');
    const values = coverageParams(query, query.stationIds);
    const spans = await this.pool.query<SpanRow>({ text: sql.spans, values: values.slice(0, 3), rowMode: 'array' });
    const gaps = await this.pool.query<GapRow>({ text: sql.gaps, values, rowMode: 'array' });
    return foldCoverage(spans.rows, gaps.rows);
  }

  async countDelaySources(ranges: readonly StationRange[]): Promise<Map<string, Map<string, number>>> {
    const out = new Map<string, Map<string, number>>();
    if (ranges.length === 0) return out;
    const result = await this.pool.query<[string, string, string]>({
      text:
        `SELECT t.station_id, t.source, COUNT(*) FROM ${RANGES_WITH_SOURCES('delay_records')} ` +
        'JOIN delay_records t ON t.station_id = q.station_id AND t.source = q.source AND t.epoch_ms BETWEEN q.from_ms AND q.to_ms ' +
        'GROUP BY t.station_id, t.source',
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
    const table = ENVELOPE_TABLE[series === 'met' ? 'met_records' : 'delay_records'];
    if (stationIds.length === 0) return new Map();
    // The envelopes cover every stored row (migration 4), so their maximum is the latest epoch.
    const result = await this.pool.query<[string, string | null]>({
      text: `SELECT q.id, (SELECT MAX(last_epoch_ms) FROM ${table} t WHERE t.station_id = q.id) FROM unnest($1::text[]) AS q(id)`,
      values: [stationIds],
      rowMode: 'array',
    });
    const out = new Map<string, number>();
    for (const [id, latest] of result.rows) if (latest !== null) out.set(id, Number(latest));
    return out;
  }

  /**
   * Raw rows (station_id first) of many one-station range reads in one statement. A network read at
   * one epoch or one hour (every station the same short range) of delays walks the epoch index
   * delay_records_epoch; otherwise the ranges are bound as three arrays, joined with each station's
   * sources (the envelope table) and then with the primary key (station_id, source, epoch_ms).
   */
  private async readRanges(table: SeriesTable, columns: string, ranges: readonly StationRange[], source?: string): Promise<unknown[][]> {
    if (ranges.length === 0) return [];
    if (table === 'delay_records' && sharedShortRange(ranges)) {
      const wanted = new Set(ranges.map((r) => r.stationId));
      const result = await this.pool.query<unknown[]>({
        text: networkEpochReadSql(columns, source !== undefined, 'postgres'),
        values: source === undefined ? [ranges[0]!.fromMs, ranges[0]!.toMs] : [ranges[0]!.fromMs, ranges[0]!.toMs, source],
        rowMode: 'array',
      });
      return result.rows.filter((r) => wanted.has(r[0] as string));
    }
    const qualified = columns
      .split(', ')
      .map((c) => `t.${c}`)
      .join(', ');
    const bySource = source === undefined ? '' : ' AND q.source = $4';
    const values: unknown[] = [ranges.map((r) => r.stationId), ranges.map((r) => r.fromMs), ranges.map((r) => r.toMs)];
    if (source !== undefined) values.push(source);
    const result = await this.pool.query<unknown[]>({
      text:
        `SELECT t.station_id, ${qualified} FROM ${RANGES_WITH_SOURCES(table)} ` +
        `JOIN ${READ_RELATION[table]} t ON t.station_id = q.station_id AND t.source = q.source AND t.epoch_ms BETWEEN q.from_ms AND q.to_ms${bySource} ` +
        'ORDER BY t.station_id, t.epoch_ms, t.source',
      values,
      rowMode: 'array',
    });
    return result.rows;
  }

  /** The sources of a station whose envelope meets the range, ascending. */
  private async sourcesOf(table: SeriesTable, stationId: string, range: TimeRange): Promise<string[]> {
    const result = await this.pool.query<[string]>({
      text: sourcesSql(table, 'postgres'),
      values: [stationId, range.fromMs, range.toMs],
      rowMode: 'array',
    });
    return result.rows.map((r) => r[0]);
  }

  /** Raw rows of a one-station time-range read ordered by (epoch, source): one primary-key range per source, merged. */
  private async readRange(table: SeriesTable, columns: string, stationId: string, range: TimeRange, source?: string): Promise<unknown[][]> {
    const sources = source === undefined ? await this.sourcesOf(table, stationId, range) : [source];
    const lists: unknown[][][] = [];
    for (const s of sources) {
      const result = await this.pool.query<unknown[]>({
        text: rangeReadSql(table, columns, 'postgres'),
        values: [stationId, s, range.fromMs, range.toMs],
        rowMode: 'array',
      });
      lists.push(result.rows);
    }
    return mergeSources(lists, 0);
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
