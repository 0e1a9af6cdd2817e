/**
 * SQLite backend (better-sqlite3 12): one file, tropodelay.sqlite, in the data directory, created and
 * migrated on open. WAL journal with synchronous=FULL, so a write is on disk when its transaction
 * returns and survives a crash of the process or of the machine. better-sqlite3 is synchronous;
 * the methods still return promises to share the Repository interface.
 *
 * Faults: a write that finds the database locked by another process waits up to busyTimeoutMs, then
 * runs again a few times (withConflictRetry); a full disk (SQLITE_FULL), a read-only file and I/O
 * errors reach the HTTP edge as driver errors that storage/errors.ts classifies (503). Every write
 * is one transaction, so a failed one leaves nothing behind.
 *
 * Series writes are set-based: one multi-row upsert per UPSERT_BATCH_ROWS rows
 * (INSERT … ON CONFLICT DO UPDATE … WHERE a value differs), so a key costs one statement step
 * instead of an insert attempt plus an update attempt; the counts come from changes() and the number
 * of rows in the written epoch range before and after (see upsertSeries). The write still runs on
 * the event loop (better-sqlite3 is synchronous); bench/station-route.bench.ts measures what it costs.
 *
 * Only bound parameters reach SQL.
 */

import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
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
import { GuardRefusedError, type GuardStatement, type SqlExecutor, type SqlStatement } from '../sql-executor.js';
import { seriesPages } from '../paged-read.js';
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
  envelopeSql,
  epochEnvelopes,
  groupByStation,
  mergeSources,
  networkEpochReadSql,
  rangeReadSql,
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

export const SQLITE_FILE_NAME = 'tropodelay.sqlite';

/**
 * Rows per multi-row upsert statement: 256 rows × 12 bound values = 3 072 parameters, well below
 * SQLite's limit of 32 766 (SQLITE_MAX_VARIABLE_NUMBER since 3.32). Measured with 20 160 delay rows in
 * :memory: (a throw-away script, not committed; CPU time, min of 7 runs, load about 20): 59 ms to
 * insert, 58 ms to re-send, 85 ms to change them, against 85 / 133 / 177 ms for the former
 * insert-then-update per row.
 */
export const UPSERT_BATCH_ROWS = 256;

const MET_VALUE_COLUMNS = ['pressure_hpa', 'temperature_c', 'relative_humidity_pct', 'dewpoint_c', 'vapour_pressure_hpa'] as const;
const DELAY_VALUE_COLUMNS = [
  'ztd_m',
  'ztd_sigma_m',
  'zwd_m',
  'zwd_sigma_m',
  'north_gradient_m',
  'east_gradient_m',
  'north_gradient_sigma_m',
  'east_gradient_sigma_m',
  'segment_id',
] as const;

/**
 * A multi-row upsert of `rowCount` rows into a series table: a new key is inserted, an existing key
 * is overwritten only when one of its values differs (`IS NOT`: NULL-safe, exact for doubles), so
 * changes() counts inserted + updated rows and an idempotent re-send writes nothing. `table` and the
 * columns are this module's constants.
 */
function upsertSql(table: SeriesTable, valueColumns: readonly string[], rowCount: number): string {
  const columns = ['station_id', 'epoch_ms', 'source', ...valueColumns];
  const tuple = `(${columns.map(() => '?').join(', ')})`;
  return (
    `INSERT INTO ${table} (${columns.join(', ')}) VALUES ${Array<string>(rowCount).fill(tuple).join(', ')} ` +
    `ON CONFLICT (station_id, source, epoch_ms) DO UPDATE SET ${valueColumns.map((c) => `${c} = excluded.${c}`).join(', ')} ` +
    `WHERE ${valueColumns.map((c) => `${c} IS NOT excluded.${c}`).join(' OR ')}`
  );
}

/** The prepared statements of one series table's writes. */
interface SeriesWriter {
  /** Upsert of UPSERT_BATCH_ROWS rows. */
  batch: Database.Statement;
  /** Upsert of one row (the tail of a write). */
  single: Database.Statement;
  /** Rows of a station and source in an inclusive epoch range. */
  countRange: Database.Statement;
  /**
   * Widens the envelope of a (station, source[, fingerprint]) to [first, last] or creates it; returns
   * the segment id for delays (met_series has none).
   */
  envelope: Database.Statement;
  /** Bound values per row: station_id, epoch_ms, source and the value columns. */
  width: number;
}

export interface SqliteOptions {
  /** Directory of the database file, created when missing; ':memory:' for a throw-away database. */
  dataDir: string;
  /** How long a statement waits for another process's write lock [ms] (default 5000). */
  busyTimeoutMs?: number;
  /** The migrations this release knows (default MIGRATIONS; tests give older or newer lists). */
  migrations?: readonly Migration[];
}

export function migrateSqlite(db: Database.Database, migrations: readonly Migration[] = MIGRATIONS): number[] {
  db.exec(SCHEMA_MIGRATIONS_TABLE_SQL);
  // Databases made before rolling updates were supported lack the column (expand: added, never dropped).
  const columns = db.prepare('PRAGMA table_info(schema_migrations)').all() as { name: string }[];
  if (!columns.some((c) => c.name === 'min_reader_version')) db.exec('ALTER TABLE schema_migrations ADD COLUMN min_reader_version INTEGER');
  const applied: number[] = [];
  // IMMEDIATE takes the write lock first, so two processes opening one file migrate one after the other.
  const run = db.transaction(() => {
    const done = new Set((db.prepare('SELECT version FROM schema_migrations').all() as { version: number }[]).map((r) => r.version));
    for (const m of migrations) {
      if (done.has(m.version)) continue;
      db.exec(migrationSql(m, 'sqlite'));
      db.prepare('INSERT INTO schema_migrations (version, name, applied_at, min_reader_version) VALUES (?, ?, ?, ?)').run(
        m.version,
        m.name,
        new Date().toISOString(),
        minReaderVersionOf(m),
      );
      applied.push(m.version);
    }
  });
  run.immediate();
  return applied;
}

/** A met row's values in the order of MET_VALUE_COLUMNS. */
function putMetValues(r: MetRow, values: unknown[], o: number): void {
  values[o] = r.pressureHpa;
  values[o + 1] = r.temperatureC;
  values[o + 2] = r.relativeHumidityPct;
  values[o + 3] = r.dewpointC;
  values[o + 4] = r.vapourPressureHpa;
}

/** A delay row's values in the order of DELAY_VALUE_COLUMNS; `segments`: source → segment id of this write. */
const putDelayValues =
  (segments: ReadonlyMap<string, number>) =>
  (r: DelayRow, values: unknown[], o: number): void => {
    values[o] = r.ztdM;
    values[o + 1] = r.ztdSigmaM;
    values[o + 2] = r.zwdM;
    values[o + 3] = r.zwdSigmaM;
    values[o + 4] = r.northGradientM;
    values[o + 5] = r.eastGradientM;
    values[o + 6] = r.northGradientSigmaM;
    values[o + 7] = r.eastGradientSigmaM;
    values[o + 8] = segments.get(r.source);
  };

export class SqliteRepository implements Repository {
  readonly backend = 'sqlite' as const;
  readonly path: string;
  private readonly db: Database.Database;
  private readonly stmt;
  private readonly migrations: readonly Migration[];

  constructor(options: SqliteOptions) {
    if (options.dataDir === ':memory:') {
      this.path = ':memory:';
    } else {
      mkdirSync(options.dataDir, { recursive: true });
      this.path = join(options.dataDir, SQLITE_FILE_NAME);
    }
    this.db = new Database(this.path);
    this.db.pragma('journal_mode = WAL');
    this.db.pragma('synchronous = FULL');
    this.db.pragma('foreign_keys = ON');
    this.db.pragma(`busy_timeout = ${Math.round(options.busyTimeoutMs ?? 5000)}`);
    this.migrations = options.migrations ?? MIGRATIONS;
    migrateSqlite(this.db, this.migrations);

    this.stmt = {
      getStation: this.db.prepare('SELECT * FROM stations WHERE station_id = ? AND deleted_at IS NULL'),
      anyStation: this.db.prepare('SELECT station_id, deleted_at FROM stations WHERE station_id = ?'),
      listStations: this.db.prepare('SELECT * FROM stations WHERE deleted_at IS NULL ORDER BY station_id'),
      // The ids as one JSON array (json_each): one statement for any number of ids, each a primary-key lookup.
      getStations: this.db.prepare('SELECT * FROM stations WHERE station_id IN (SELECT value FROM json_each(?)) AND deleted_at IS NULL'),
      // The two forms of the box test (within [west, east], or across 180°), prepared once each.
      stationsInBox: this.db.prepare(
        `SELECT * FROM stations WHERE ${stationsInBoxWhere((n) => `?${n}`, { westDeg: 0, southDeg: 0, eastDeg: 1, northDeg: 0 })} ORDER BY station_id`,
      ),
      stationsInBoxCrossing: this.db.prepare(
        `SELECT * FROM stations WHERE ${stationsInBoxWhere((n) => `?${n}`, { westDeg: 1, southDeg: 0, eastDeg: 0, northDeg: 0 })} ORDER BY station_id`,
      ),
      insertStation: this.db.prepare(
        `INSERT INTO stations (station_id, name, latitude_deg, longitude_deg, height_m, met_height_m, description, created_at, updated_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      ),
      updateStation: this.db.prepare(
        `UPDATE stations SET name = ?, latitude_deg = ?, longitude_deg = ?, height_m = ?, met_height_m = ?, description = ?, updated_at = ?
         WHERE station_id = ?`,
      ),
      markDeleted: this.db.prepare('UPDATE stations SET deleted_at = ? WHERE station_id = ? AND deleted_at IS NULL'),
      restoreStation: this.db.prepare('UPDATE stations SET deleted_at = NULL WHERE station_id = ? AND deleted_at IS NOT NULL'),
      purgeStation: this.db.prepare('DELETE FROM stations WHERE station_id = ?'),
      purgeBefore: this.db.prepare('DELETE FROM stations WHERE deleted_at IS NOT NULL AND deleted_at <= ? RETURNING station_id').pluck(),
      listDeleted: this.db.prepare(
        'SELECT station_id, name, deleted_at FROM stations WHERE deleted_at IS NOT NULL ORDER BY deleted_at, station_id',
      ),
      createKey: this.db.prepare(
        `INSERT INTO api_keys (name, role, secret_sha256, created_at, created_by, revoked_at) VALUES (?, ?, ?, ?, ?, ?)
         ON CONFLICT DO NOTHING`,
      ),
      listKeys: this.db.prepare('SELECT * FROM api_keys ORDER BY name'),
      revokeKey: this.db.prepare('UPDATE api_keys SET revoked_at = ? WHERE name = ? AND revoked_at IS NULL'),
      appendAudit: this.db.prepare(
        `INSERT INTO audit_events (${AUDIT_COLUMNS.join(', ')}) VALUES (${AUDIT_COLUMNS.map(() => '?').join(', ')})`,
      ),
      // The inner SELECT walks the index audit_events_at; SQLite has no DELETE … LIMIT by default.
      trimAudit: this.db.prepare('DELETE FROM audit_events WHERE event_id IN (SELECT event_id FROM audit_events WHERE at_ms < ? LIMIT ?)'),
      insertModelSet: this.db.prepare(
        'INSERT INTO model_sets (model_fingerprint, models_json) VALUES (?, ?) ON CONFLICT (model_fingerprint) DO NOTHING',
      ),
      // The envelopes cover every stored row (migration 4), so their maximum is the latest epoch.
      latestMet: this.db.prepare('SELECT MAX(last_epoch_ms) AS latest FROM met_series WHERE station_id = ?'),
      latestDelays: this.db.prepare('SELECT MAX(last_epoch_ms) AS latest FROM delay_segments WHERE station_id = ?'),
    };
    this.metWriter = this.seriesWriter('met_records', MET_VALUE_COLUMNS);
    this.delayWriter = this.seriesWriter('delay_records', DELAY_VALUE_COLUMNS);
  }

  private readonly metWriter: SeriesWriter;
  private readonly delayWriter: SeriesWriter;

  private seriesWriter(table: SeriesTable, valueColumns: readonly string[]): SeriesWriter {
    return {
      batch: this.db.prepare(upsertSql(table, valueColumns, UPSERT_BATCH_ROWS)),
      single: this.db.prepare(upsertSql(table, valueColumns, 1)),
      countRange: this.db.prepare(`SELECT COUNT(*) FROM ${table} WHERE station_id = ? AND source = ? AND epoch_ms BETWEEN ? AND ?`).pluck(),
      envelope: this.db.prepare(envelopeSql(table, 'sqlite')),
      width: 3 + valueColumns.length,
    };
  }

  /**
   * Widens the envelopes of the sources of `rows` (call inside the write transaction); for delays,
   * returns source → segment id of `fingerprint`.
   */
  private widenEnvelopes(
    writer: SeriesWriter,
    stationId: string,
    rows: readonly { epochMs: number; source: string }[],
    fingerprint?: string,
  ): Map<string, number> {
    const segments = new Map<string, number>();
    for (const [source, [firstMs, lastMs]] of epochEnvelopes(rows)) {
      const values = fingerprint === undefined ? [stationId, source, firstMs, lastMs] : [stationId, source, fingerprint, firstMs, lastMs];
      if (fingerprint === undefined) writer.envelope.run(values);
      else segments.set(source, (writer.envelope.get(values) as { segment_id: number }).segment_id);
    }
    return segments;
  }

  /**
   * Upserts `rows` (call inside the write transaction). `put(row, values, offset)` writes a row's
   * value columns into `values` from `offset` on, in the order of the writer's value columns.
   *
   * Counts: changes() of the upserts = inserted + updated. The transaction holds the write lock, so
   * the only rows that appear in each source's [first, last] epoch of `rows` meanwhile are this
   * write's inserts: inserted = rows in those ranges after − before (an update adds none). Each count
   * is one walk of the primary key (station, source, epoch) over the range.
   */
  private upsertSeries<R extends { epochMs: number; source: string }>(
    writer: SeriesWriter,
    stationId: string,
    rows: readonly R[],
    put: (row: R, values: unknown[], offset: number) => void,
  ): WriteCounts {
    if (rows.length === 0) return { inserted: 0, updated: 0, unchanged: 0 };
    const envelopes = epochEnvelopes(rows);
    const countRows = () => {
      let n = 0;
      for (const [source, [firstMs, lastMs]] of envelopes) n += Number(writer.countRange.get(stationId, source, firstMs, lastMs));
      return n;
    };
    const before = countRows();
    const { width } = writer;
    const values = new Array<unknown>(UPSERT_BATCH_ROWS * width);
    let changed = 0;
    let k = 0;
    for (; k + UPSERT_BATCH_ROWS <= rows.length; k += UPSERT_BATCH_ROWS) {
      for (let j = 0; j < UPSERT_BATCH_ROWS; j++) {
        const r = rows[k + j]!;
        const o = j * width;
        values[o] = stationId;
        values[o + 1] = r.epochMs;
        values[o + 2] = r.source;
        put(r, values, o + 3);
      }
      changed += writer.batch.run(values).changes;
    }
    const one = new Array<unknown>(width);
    for (; k < rows.length; k++) {
      const r = rows[k]!;
      one[0] = stationId;
      one[1] = r.epochMs;
      one[2] = r.source;
      put(r, one, 3);
      changed += writer.single.run(one).changes;
    }
    const inserted = countRows() - before;
    return { inserted, updated: changed - inserted, unchanged: rows.length - changed };
  }

  async putStation(stationId: string, s: StationInput): Promise<{ station: Station; created: boolean }> {
    const now = new Date().toISOString();
    const tx = this.db.transaction(() => {
      const existing = this.stmt.anyStation.get(stationId) as { deleted_at: string | null } | undefined;
      if (existing?.deleted_at) throw new StationDeletedError(stationId, existing.deleted_at);
      if (existing) {
        this.stmt.updateStation.run(s.name, s.latitudeDeg, s.longitudeDeg, s.heightM, s.metHeightM, s.description, now, stationId);
      } else {
        this.stmt.insertStation.run(stationId, s.name, s.latitudeDeg, s.longitudeDeg, s.heightM, s.metHeightM, s.description, now, now);
      }
      return { station: toStation(this.stmt.getStation.get(stationId) as StationDbRow), created: !existing };
    });
    return withConflictRetry(async () => tx.immediate());
  }

  async getStation(stationId: string): Promise<Station | null> {
    const row = this.stmt.getStation.get(stationId) as StationDbRow | undefined;
    return row ? toStation(row) : null;
  }

  async getStations(stationIds: readonly string[]): Promise<Map<string, Station>> {
    const out = new Map<string, Station>();
    if (stationIds.length === 0) return out;
    for (const row of this.stmt.getStations.all(JSON.stringify(stationIds)) as StationDbRow[]) out.set(row.station_id, toStation(row));
    return out;
  }

  async listStations(): Promise<Station[]> {
    return (this.stmt.listStations.all() as StationDbRow[]).map(toStation);
  }

  async listStationsInBox(box: StationBox): Promise<Station[]> {
    const statement = box.westDeg <= box.eastDeg ? this.stmt.stationsInBox : this.stmt.stationsInBoxCrossing;
    // Numbered placeholders (?1 …) take their values by number.
    const params = Object.fromEntries(stationsInBoxParams(box).map((v, i) => [i + 1, v]));
    return (statement.all(params) as StationDbRow[]).map(toStation);
  }

  async deleteStation(stationId: string, deletedAt: string): Promise<boolean> {
    const tx = this.db.transaction(() => this.stmt.markDeleted.run(deletedAt, stationId).changes > 0);
    return withConflictRetry(async () => tx.immediate());
  }

  async restoreStation(stationId: string): Promise<boolean> {
    const tx = this.db.transaction(() => this.stmt.restoreStation.run(stationId).changes > 0);
    return withConflictRetry(async () => tx.immediate());
  }

  async purgeStation(stationId: string): Promise<boolean> {
    const tx = this.db.transaction(() => this.stmt.purgeStation.run(stationId).changes > 0);
    return withConflictRetry(async () => tx.immediate());
  }

  async purgeDeletedBefore(cutoff: string): Promise<string[]> {
    const tx = this.db.transaction(() => (this.stmt.purgeBefore.all(cutoff) as string[]).sort());
    return withConflictRetry(async () => tx.immediate());
  }

  async listDeletedStations(): Promise<DeletedStationMark[]> {
    const rows = this.stmt.listDeleted.all() as { station_id: string; name: string; deleted_at: string }[];
    return rows.map((r) => ({ stationId: r.station_id, name: r.name, deletedAt: r.deleted_at }));
  }

  async createApiKey(k: StoredApiKey): Promise<boolean> {
    const tx = this.db.transaction(
      () => this.stmt.createKey.run(k.name, k.role, k.secretSha256, k.createdAt, k.createdBy, k.revokedAt).changes > 0,
    );
    return withConflictRetry(async () => tx.immediate());
  }

  async listApiKeys(): Promise<StoredApiKey[]> {
    return (this.stmt.listKeys.all() as ApiKeyDbRow[]).map(toApiKey);
  }

  async revokeApiKey(name: string, revokedAt: string): Promise<boolean> {
    const tx = this.db.transaction(() => this.stmt.revokeKey.run(revokedAt, name).changes > 0);
    return withConflictRetry(async () => tx.immediate());
  }

  async appendAuditEvent(event: AuditEvent): Promise<void> {
    const tx = this.db.transaction(() => {
      this.stmt.appendAudit.run(auditValues(event));
    });
    return withConflictRetry(async () => tx.immediate());
  }

  async trimAuditEventsBefore(cutoffMs: number, { batchRows = AUDIT_TRIM_BATCH_ROWS, signal }: AuditTrimOptions = {}): Promise<number> {
    const tx = this.db.transaction(() => this.stmt.trimAudit.run(cutoffMs, batchRows).changes);
    let total = 0;
    for (;;) {
      const deleted = await withConflictRetry(async () => tx.immediate());
      total += deleted;
      if (deleted < batchRows || signal?.aborted) return total;
      // better-sqlite3 runs on the event loop: give it back between batches.
      await new Promise((resolve) => setImmediate(resolve));
    }
  }

  async listAuditEvents(query: AuditQuery): Promise<StoredAuditEvent[]> {
    const { where, values } = auditWhere(query, () => '?');
    const rows = this.db
      .prepare(`SELECT * FROM audit_events ${where} ORDER BY at_ms DESC, event_id DESC LIMIT ?`)
      .all(...values, query.limit) as AuditDbRow[];
    return rows.map(toAuditEvent);
  }

  async writeMet(stationId: string, rows: readonly MetRow[]): Promise<WriteCounts> {
    const tx = this.db.transaction(() => {
      if (!this.stmt.getStation.get(stationId)) throw new UnknownStationError(stationId);
      this.widenEnvelopes(this.metWriter, stationId, rows);
      return this.upsertSeries(this.metWriter, stationId, rows, putMetValues);
    });
    return withConflictRetry(async () => tx.immediate());
  }

  async readMet(stationId: string, range: TimeRange, source?: string): Promise<MetRow[]> {
    return this.readRange('met_records', MET_SELECT, stationId, range, source).map((row) => metFromArray(row as MetArrayRow));
  }

  async readSurfaceMet(stationId: string, range: TimeRange, source?: string): Promise<SurfaceMetRow[]> {
    return this.readRange('met_records', SURFACE_MET_SELECT, stationId, range, source).map(surfaceMetFromArray);
  }

  async writeDelays(stationId: string, rows: readonly DelayRow[], modelSet: StoredModelSet, guard?: GuardStatement): Promise<WriteCounts> {
    for (const r of rows)
      if (r.modelFingerprint !== modelSet.modelFingerprint) throw new Error('delay row fingerprint differs from its model set');
    const tx = this.db.transaction(() => {
      if (!this.stmt.getStation.get(stationId)) throw new UnknownStationError(stationId);
      if (guard && this.db.prepare(guard.sql).run(...guard.params).changes === 0) throw new GuardRefusedError();
      this.stmt.insertModelSet.run(modelSet.modelFingerprint, JSON.stringify(modelSet.models));
      return this.upsertDelays(stationId, rows, modelSet.modelFingerprint);
    });
    return withConflictRetry(async () => tx.immediate());
  }

  async writeDelaysMany(writes: readonly StationDelayRows[], modelSet: StoredModelSet): Promise<WriteCounts[]> {
    for (const w of writes)
      for (const r of w.rows)
        if (r.modelFingerprint !== modelSet.modelFingerprint) throw new Error('delay row fingerprint differs from its model set');
    const tx = this.db.transaction(() => {
      for (const w of writes) if (!this.stmt.getStation.get(w.stationId)) throw new UnknownStationError(w.stationId);
      this.stmt.insertModelSet.run(modelSet.modelFingerprint, JSON.stringify(modelSet.models));
      return writes.map((w) => this.upsertDelays(w.stationId, w.rows, modelSet.modelFingerprint));
    });
    return withConflictRetry(async () => tx.immediate());
  }

  /** Upserts one station's delay rows under their segments (call inside the write transaction). */
  private upsertDelays(stationId: string, rows: readonly DelayRow[], fingerprint: string): WriteCounts {
    const segments = this.widenEnvelopes(this.delayWriter, stationId, rows, fingerprint);
    return this.upsertSeries(this.delayWriter, stationId, rows, putDelayValues(segments));
  }

  sqlExecutor(): SqlExecutor {
    const db = this.db;
    return {
      dialect: 'sqlite',
      all: async <T>(sql: string, params: readonly unknown[] = []) => db.prepare(sql).all(...params) as T[],
      batch: async (statements: readonly SqlStatement[]) => {
        const tx = db.transaction(() => statements.map((s) => db.prepare(s.sql).run(...s.params).changes));
        return withConflictRetry(async () => tx.immediate());
      },
    };
  }

  async readDelays(stationId: string, range: TimeRange, source?: string): Promise<DelayRow[]> {
    return this.readRange('delay_records', DELAY_SELECT, stationId, range, source).map(delayFromArray);
  }

  async readZenithDelays(stationId: string, range: TimeRange, source?: string): Promise<ZenithDelayRow[]> {
    return this.readRange('delay_records', ZENITH_DELAY_SELECT, stationId, range, source).map(zenithDelayFromArray);
  }

  readPages<K extends SeriesPageKind>(
    kind: K,
    stationId: string,
    range: TimeRange,
    options: PageReadOptions,
  ): AsyncGenerator<SeriesPageRows[K][], void, undefined> {
    return seriesPages(kind, stationId, range, options, 'sqlite', {
      sources: (table, id, r) => this.sourcesOf(table, id, r),
      fetchPage: (sql, values) => this.statement(sql).all(values) as unknown[][],
    });
  }

  async readModelSets(fingerprints: readonly string[]): Promise<StoredModelSet[]> {
    if (fingerprints.length === 0) return [];
    const placeholders = fingerprints.map(() => '?').join(', ');
    const rows = this.db
      .prepare(
        `SELECT model_fingerprint, models_json FROM model_sets WHERE model_fingerprint IN (${placeholders}) ORDER BY model_fingerprint`,
      )
      .all(...fingerprints) as { model_fingerprint: string; models_json: string }[];
    return rows.map((r) => ({ modelFingerprint: r.model_fingerprint, models: JSON.parse(r.models_json) }));
  }

  async readZenithDelaysMany(ranges: readonly StationRange[], source?: string): Promise<Map<string, ZenithDelayRow[]>> {
    return groupByStation(this.readRanges('delay_records', ZENITH_DELAY_SELECT, ranges, source), zenithDelayFromArray);
  }

  async readSurfaceMetMany(ranges: readonly StationRange[]): Promise<Map<string, SurfaceMetRow[]>> {
    return groupByStation(this.readRanges('met_records', SURFACE_MET_SELECT, ranges), surfaceMetFromArray);
  }

  async countDelaySources(ranges: readonly StationRange[]): Promise<Map<string, Map<string, number>>> {
    const count = this.delayWriter.countRange;
    const out = new Map<string, Map<string, number>>();
    for (const r of ranges) {
      const counts = new Map<string, number>();
      for (const source of this.sourcesOf('delay_records', r.stationId, r)) {
        const n = Number(count.get(r.stationId, source, r.fromMs, r.toMs));
        if (n > 0) counts.set(source, n);
      }
      if (counts.size) out.set(r.stationId, counts);
    }
    return out;
  }

  async readDelayCoverage(query: CoverageQuery): Promise<Map<string, SeriesCoverage[]>> {
    const sql = coverageSql((n) => `?${n}`, 'station_id IN (SELECT value FROM json_each(?1))');
    const params = Object.fromEntries(coverageParams(query, JSON.stringify(query.stationIds)).map((v, i) => [i + 1, v]));
    // One read transaction: both statements see the same rows.
    return this.db.transaction(() =>
      foldCoverage(
        this.db.prepare(sql.spans).raw(true).all(params) as SpanRow[],
        this.db.prepare(sql.gaps).raw(true).all(params) as GapRow[],
      ),
    )();
  }

  async latestEpochsMs(stationIds: readonly string[], series: 'met' | 'delays'): Promise<Map<string, number>> {
    const statement = series === 'met' ? this.stmt.latestMet : this.stmt.latestDelays;
    const out = new Map<string, number>();
    for (const id of stationIds) {
      const row = statement.get(id) as { latest: number | null };
      if (row.latest !== null) out.set(id, Number(row.latest));
    }
    return out;
  }

  /**
   * Raw rows (station_id first) of many one-station range reads. A network read at one epoch or one
   * hour (every station the same range, at most NETWORK_EPOCH_READ_MAX_MS long) of delays is one walk
   * of the epoch index (delay_records_epoch); otherwise one indexed statement per station and source,
   * run back to back (better-sqlite3 is in-process, so a loop costs no round trips).
   */
  private readRanges(table: SeriesTable, columns: string, ranges: readonly StationRange[], source?: string): unknown[][] {
    if (table === 'delay_records' && sharedShortRange(ranges)) return this.readAtEpochs(columns, ranges, source);
    const out: unknown[][] = [];
    const withId = `station_id, ${columns}`;
    for (const r of ranges) {
      for (const row of this.readRange(table, withId, r.stationId, r, source, 1)) out.push(row);
    }
    return out;
  }

  /** readRanges through the epoch index: the rows of every station in the shared range, kept for the asked ones. */
  private readAtEpochs(columns: string, ranges: readonly StationRange[], source?: string): unknown[][] {
    const wanted = new Set(ranges.map((r) => r.stationId));
    const rows = this.statement(networkEpochReadSql(columns, source !== undefined, 'sqlite')).all(
      ...(source === undefined ? [ranges[0]!.fromMs, ranges[0]!.toMs] : [ranges[0]!.fromMs, ranges[0]!.toMs, source]),
    ) as unknown[][];
    return rows.filter((r) => wanted.has(r[0] as string));
  }

  /** The sources of a station whose envelope meets the range, ascending. */
  private sourcesOf(table: SeriesTable, stationId: string, range: TimeRange): string[] {
    return this.statement(sourcesSql(table, 'sqlite')).pluck().all(stationId, range.fromMs, range.toMs) as string[];
  }

  async putSounding(stationId: string, sounding: StoredSounding, modelSet: StoredModelSet): Promise<{ created: boolean }> {
    if (sounding.modelFingerprint !== modelSet.modelFingerprint) throw new Error('sounding fingerprint differs from its model set');
    const tx = this.db.transaction(() => {
      if (!this.stmt.getStation.get(stationId)) throw new UnknownStationError(stationId);
      this.stmt.insertModelSet.run(modelSet.modelFingerprint, JSON.stringify(modelSet.models));
      const existed = this.db.prepare('SELECT 1 FROM soundings WHERE station_id = ? AND epoch_ms = ?').get(stationId, sounding.epochMs);
      this.db.prepare(soundingUpsertSql(() => '?')).run(soundingValues(stationId, sounding));
      return { created: !existed };
    });
    return withConflictRetry(async () => tx.immediate());
  }

  async readSoundings(stationId: string, range: TimeRange): Promise<SoundingRow[]> {
    const rows = this.db
      .prepare(`SELECT ${SOUNDING_SELECT} FROM soundings WHERE station_id = ? AND epoch_ms BETWEEN ? AND ? ORDER BY epoch_ms`)
      .raw(true)
      .all(stationId, range.fromMs, range.toMs) as unknown[][];
    return rows.map(soundingFromArray);
  }

  async getSounding(stationId: string, epochMs: number): Promise<StoredSounding | null> {
    const row = this.db
      .prepare(`SELECT ${SOUNDING_WITH_PROFILE_SELECT} FROM soundings WHERE station_id = ? AND epoch_ms = ?`)
      .raw(true)
      .get(stationId, epochMs) as unknown[] | undefined;
    return row ? storedSoundingFromArray(row) : null;
  }

  async deleteSounding(stationId: string, epochMs: number): Promise<boolean> {
    const tx = this.db.transaction(
      () => this.db.prepare('DELETE FROM soundings WHERE station_id = ? AND epoch_ms = ?').run(stationId, epochMs).changes > 0,
    );
    return withConflictRetry(async () => tx.immediate());
  }

  async latestEpochMs(stationId: string, series: 'met' | 'delays'): Promise<number | null> {
    const row = (series === 'met' ? this.stmt.latestMet : this.stmt.latestDelays).get(stationId) as { latest: number | null };
    return row.latest === null ? null : Number(row.latest);
  }

  /** One synchronous connection, never waited for (better-sqlite3 runs each statement to completion). */
  connectionStats(): ConnectionStats {
    return { total: 1, idle: 1, waiting: 0 };
  }

  private readonly statements = new Map<string, Database.Statement>();

  /** A raw-mode statement of this module's SQL, prepared once per text. */
  private statement(sql: string): Database.Statement {
    let statement = this.statements.get(sql);
    if (!statement) this.statements.set(sql, (statement = this.db.prepare(sql).raw(true)));
    return statement;
  }

  /**
   * Raw rows of a one-station time-range read ordered by (epoch, source): one primary-key range per
   * source, merged. `epochAt`: the column of epoch_ms in `columns`.
   */
  private readRange(table: SeriesTable, columns: string, stationId: string, range: TimeRange, source?: string, epochAt = 0): unknown[][] {
    const statement = this.statement(rangeReadSql(table, columns, 'sqlite'));
    const sources = source === undefined ? this.sourcesOf(table, stationId, range) : [source];
    return mergeSources(
      sources.map((s) => statement.all(stationId, s, range.fromMs, range.toMs) as unknown[][]),
      epochAt,
    );
  }

  async ping(): Promise<void> {
    const rows = this.db
      .prepare('SELECT version, name, min_reader_version AS minReaderVersion FROM schema_migrations')
      .all() as AppliedMigration[];
    checkSchemaCompatibility(rows, this.migrations);
  }

  async close(): Promise<void> {
    if (this.db.open) this.db.close();
  }
}
