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
 * Only bound parameters reach SQL.
 */

import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { MIGRATIONS, migrationSql } from '../migrations.js';
import type { ConnectionStats, DelayRow, MetRow, Repository, Station, StationInput, StoredModelSet, SurfaceMetRow, TimeRange, WriteCounts, ZenithDelayRow } from '../repository.js';
import { UnknownStationError } from '../repository.js';
import { withConflictRetry } from '../errors.js';
import {
  DELAY_SELECT,
  MET_SELECT,
  SURFACE_MET_SELECT,
  ZENITH_DELAY_SELECT,
  delayFromArray,
  delayValues,
  metFromArray,
  metValues,
  surfaceMetFromArray,
  toStation,
  zenithDelayFromArray,
  type MetArrayRow,
  type StationDbRow,
  rangeReadSql,
} from '../rows.js';

export const SQLITE_FILE_NAME = 'tropodelay.sqlite';

export interface SqliteOptions {
  /** Directory of the database file, created when missing; ':memory:' for a throw-away database. */
  dataDir: string;
  /** How long a statement waits for another process's write lock [ms] (default 5000). */
  busyTimeoutMs?: number;
}

export function migrateSqlite(db: Database.Database): number[] {
  db.exec('CREATE TABLE IF NOT EXISTS schema_migrations (version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL)');
  const applied: number[] = [];
  // IMMEDIATE takes the write lock first, so two processes opening one file migrate one after the other.
  const run = db.transaction(() => {
    const done = new Set((db.prepare('SELECT version FROM schema_migrations').all() as { version: number }[]).map((r) => r.version));
    for (const m of MIGRATIONS) {
      if (done.has(m.version)) continue;
      db.exec(migrationSql(m, 'sqlite'));
      db.prepare('INSERT INTO schema_migrations (version, name, applied_at) VALUES (?, ?, ?)').run(m.version, m.name, new Date().toISOString());
      applied.push(m.version);
    }
  });
  run.immediate();
  return applied;
}

export class SqliteRepository implements Repository {
  readonly backend = 'sqlite' as const;
  readonly path: string;
  private readonly db: Database.Database;
  private readonly stmt;

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
    migrateSqlite(this.db);

    const metSet = 'pressure_hpa = ?, temperature_c = ?, relative_humidity_pct = ?, dewpoint_c = ?, vapour_pressure_hpa = ?';
    const metDiffers =
      'pressure_hpa IS NOT ? OR temperature_c IS NOT ? OR relative_humidity_pct IS NOT ? OR dewpoint_c IS NOT ? OR vapour_pressure_hpa IS NOT ?';
    const delaySet =
      'ztd_m = ?, ztd_sigma_m = ?, zwd_m = ?, zwd_sigma_m = ?, north_gradient_m = ?, east_gradient_m = ?, north_gradient_sigma_m = ?, east_gradient_sigma_m = ?, model_fingerprint = ?';
    const delayDiffers =
      'ztd_m IS NOT ? OR ztd_sigma_m IS NOT ? OR zwd_m IS NOT ? OR zwd_sigma_m IS NOT ? OR north_gradient_m IS NOT ? OR east_gradient_m IS NOT ? OR north_gradient_sigma_m IS NOT ? OR east_gradient_sigma_m IS NOT ? OR model_fingerprint IS NOT ?';
    this.stmt = {
      getStation: this.db.prepare('SELECT * FROM stations WHERE station_id = ?'),
      listStations: this.db.prepare('SELECT * FROM stations ORDER BY station_id'),
      insertStation: this.db.prepare(
        `INSERT INTO stations (station_id, name, latitude_deg, longitude_deg, height_m, met_height_m, description, created_at, updated_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      ),
      updateStation: this.db.prepare(
        `UPDATE stations SET name = ?, latitude_deg = ?, longitude_deg = ?, height_m = ?, met_height_m = ?, description = ?, updated_at = ?
         WHERE station_id = ?`,
      ),
      deleteStation: this.db.prepare('DELETE FROM stations WHERE station_id = ?'),
      insertMet: this.db.prepare(
        `INSERT INTO met_records (station_id, epoch_ms, source, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?) ON CONFLICT (station_id, epoch_ms, source) DO NOTHING`,
      ),
      updateMet: this.db.prepare(`UPDATE met_records SET ${metSet} WHERE station_id = ? AND epoch_ms = ? AND source = ? AND (${metDiffers})`),
      insertModelSet: this.db.prepare('INSERT INTO model_sets (model_fingerprint, models_json) VALUES (?, ?) ON CONFLICT (model_fingerprint) DO NOTHING'),
      insertDelay: this.db.prepare(
        `INSERT INTO delay_records (station_id, epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m,
           north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?) ON CONFLICT (station_id, epoch_ms, source) DO NOTHING`,
      ),
      updateDelay: this.db.prepare(
        `UPDATE delay_records SET ${delaySet} WHERE station_id = ? AND epoch_ms = ? AND source = ? AND (${delayDiffers})`,
      ),
      latestMet: this.db.prepare('SELECT MAX(epoch_ms) AS latest FROM met_records WHERE station_id = ?'),
      latestDelays: this.db.prepare('SELECT MAX(epoch_ms) AS latest FROM delay_records WHERE station_id = ?'),
    };
  }

  async putStation(stationId: string, s: StationInput): Promise<{ station: Station; created: boolean }> {
    const now = new Date().toISOString();
    const tx = this.db.transaction(() => {
      const existing = this.stmt.getStation.get(stationId) as StationDbRow | undefined;
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

  async listStations(): Promise<Station[]> {
    return (this.stmt.listStations.all() as StationDbRow[]).map(toStation);
  }

  async deleteStation(stationId: string): Promise<boolean> {
    const tx = this.db.transaction(() => this.stmt.deleteStation.run(stationId).changes > 0);
    return withConflictRetry(async () => tx.immediate());
  }

  async writeMet(stationId: string, rows: readonly MetRow[]): Promise<WriteCounts> {
    const tx = this.db.transaction(() => {
      if (!this.stmt.getStation.get(stationId)) throw new UnknownStationError(stationId);
      const counts: WriteCounts = { inserted: 0, updated: 0, unchanged: 0 };
      for (const r of rows) {
        const values = metValues(r);
        if (this.stmt.insertMet.run(stationId, r.epochMs, r.source, ...values).changes > 0) counts.inserted++;
        else if (this.stmt.updateMet.run(...values, stationId, r.epochMs, r.source, ...values).changes > 0) counts.updated++;
        else counts.unchanged++;
      }
      return counts;
    });
    return withConflictRetry(async () => tx.immediate());
  }

  async readMet(stationId: string, range: TimeRange, source?: string): Promise<MetRow[]> {
    return this.readRange('met_records', MET_SELECT, stationId, range, source).map((row) => metFromArray(row as MetArrayRow));
  }

  async readSurfaceMet(stationId: string, range: TimeRange, source?: string): Promise<SurfaceMetRow[]> {
    return this.readRange('met_records', SURFACE_MET_SELECT, stationId, range, source).map(surfaceMetFromArray);
  }

  async writeDelays(stationId: string, rows: readonly DelayRow[], modelSet: StoredModelSet): Promise<WriteCounts> {
    const tx = this.db.transaction(() => {
      if (!this.stmt.getStation.get(stationId)) throw new UnknownStationError(stationId);
      this.stmt.insertModelSet.run(modelSet.modelFingerprint, JSON.stringify(modelSet.models));
      const counts: WriteCounts = { inserted: 0, updated: 0, unchanged: 0 };
      for (const r of rows) {
        if (r.modelFingerprint !== modelSet.modelFingerprint) throw new Error('delay row fingerprint differs from its model set');
        const values = delayValues(r);
        if (this.stmt.insertDelay.run(stationId, r.epochMs, r.source, ...values).changes > 0) counts.inserted++;
        else if (this.stmt.updateDelay.run(...values, stationId, r.epochMs, r.source, ...values).changes > 0) counts.updated++;
        else counts.unchanged++;
      }
      return counts;
    });
    return withConflictRetry(async () => tx.immediate());
  }

  async readDelays(stationId: string, range: TimeRange, source?: string): Promise<DelayRow[]> {
    return this.readRange('delay_records', DELAY_SELECT, stationId, range, source).map(delayFromArray);
  }

  async readZenithDelays(stationId: string, range: TimeRange, source?: string): Promise<ZenithDelayRow[]> {
    return this.readRange('delay_records', ZENITH_DELAY_SELECT, stationId, range, source).map(zenithDelayFromArray);
  }

  async readModelSets(fingerprints: readonly string[]): Promise<StoredModelSet[]> {
    if (fingerprints.length === 0) return [];
    const placeholders = fingerprints.map(() => '?').join(', ');
    const rows = this.db
      .prepare(`SELECT model_fingerprint, models_json FROM model_sets WHERE model_fingerprint IN (${placeholders}) ORDER BY model_fingerprint`)
      .all(...fingerprints) as { model_fingerprint: string; models_json: string }[];
    return rows.map((r) => ({ modelFingerprint: r.model_fingerprint, models: JSON.parse(r.models_json) }));
  }

  async latestEpochMs(stationId: string, series: 'met' | 'delays'): Promise<number | null> {
    const row = (series === 'met' ? this.stmt.latestMet : this.stmt.latestDelays).get(stationId) as { latest: number | null };
    return row.latest === null ? null : Number(row.latest);
  }

  /** One synchronous connection, never waited for (better-sqlite3 runs each statement to completion). */
  connectionStats(): ConnectionStats {
    return { total: 1, idle: 1, waiting: 0 };
  }

  private readonly rangeStatements = new Map<string, Database.Statement>();

  /** Raw rows of a one-station time-range read; statements prepared once per shape. */
  private readRange(table: 'met_records' | 'delay_records', columns: string, stationId: string, range: TimeRange, source?: string): unknown[][] {
    const sql = rangeReadSql(table, columns, source !== undefined, 'sqlite');
    let statement = this.rangeStatements.get(sql);
    if (!statement) this.rangeStatements.set(sql, (statement = this.db.prepare(sql).raw(true)));
    const values = source === undefined ? [stationId, range.fromMs, range.toMs] : [stationId, range.fromMs, range.toMs, source];
    return statement.all(...values) as unknown[][];
  }

  async ping(): Promise<void> {
    const row = this.db.prepare('SELECT MAX(version) AS version FROM schema_migrations').get() as { version: number | null };
    const latest = MIGRATIONS[MIGRATIONS.length - 1]!.version;
    if (row.version !== latest) throw new Error(`schema at migration ${row.version}, expected ${latest}`);
  }

  async close(): Promise<void> {
    if (this.db.open) this.db.close();
  }
}
