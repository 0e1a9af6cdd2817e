/**
 * The station archive's storage interface. Two implementations share it and one contract test
 * suite (test/storage/repository.contract.ts): SQLite (src/storage/sqlite/, the default) and
 * PostgreSQL (src/storage/postgres/, when DATABASE_URL is set).
 *
 * Epochs cross this interface as milliseconds since 1970-01-01T00:00:00Z (UTC). Series rows are
 * keyed by (station_id, epoch, source): writing the same key again replaces the values, so re-sending
 * the same data is idempotent. Every write method runs in one transaction: it is stored whole or not
 * at all, and is durable when the promise resolves.
 */

import type { CoverageQuery, SeriesCoverage } from './coverage-query.js';
import type { ModelSet } from '../domain/provenance.js';
import type { GuardStatement, SqlExecutor } from './sql-executor.js';
import type { AuditEvent, AuditQuery, DeletedStationMark, StoredApiKey, StoredAuditEvent } from './access-rows.js';

export interface StationInput {
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  heightM: number;
  /** Height of the met sensor, same datum as heightM [m]; null = at the antenna height. */
  metHeightM: number | null;
  description: string | null;
}

/**
 * A latitude/longitude box [deg]: latitude within [southDeg, northDeg]; longitude (a stored one above 180
 * taken as lon − 360) within [westDeg, eastDeg], or, when westDeg > eastDeg (the box crosses 180°), at or
 * east of westDeg or at or west of eastDeg. Bounds included.
 */
export interface StationBox {
  westDeg: number;
  southDeg: number;
  eastDeg: number;
  northDeg: number;
}

export interface Station extends StationInput {
  stationId: string;
  /** ISO 8601 UTC. */
  createdAt: string;
  updatedAt: string;
}

export interface MetRow {
  epochMs: number;
  source: string;
  pressureHpa: number | null;
  temperatureC: number | null;
  relativeHumidityPct: number | null;
  dewpointC: number | null;
  vapourPressureHpa: number | null;
}

export interface DelayRow {
  epochMs: number;
  source: string;
  ztdM: number;
  ztdSigmaM: number | null;
  zwdM: number | null;
  zwdSigmaM: number | null;
  northGradientM: number | null;
  eastGradientM: number | null;
  northGradientSigmaM: number | null;
  eastGradientSigmaM: number | null;
  /** Fingerprint of the model set that produced the row (src/domain/provenance.ts). */
  modelFingerprint: string;
}

/** The columns of a delay row that a PWV retrieval needs (readZenithDelays). */
export type ZenithDelayRow = Pick<DelayRow, 'epochMs' | 'source' | 'ztdM' | 'ztdSigmaM' | 'modelFingerprint'>;

/** The columns of a met row that a PWV retrieval needs (readSurfaceMet). */
export type SurfaceMetRow = Pick<MetRow, 'epochMs' | 'source' | 'pressureHpa' | 'temperatureC'>;

/** A model set as stored once per fingerprint; delay rows refer to it. */
export interface StoredModelSet {
  modelFingerprint: string;
  models: ModelSet;
}

/**
 * A sounding of a station (a vertical profile, e.g. a radiosonde ascent) with what was computed from it
 * (src/domain/profile/profile-delays.ts). One per station and epoch: storing another replaces it.
 */
export interface SoundingRow {
  /** Launch (nominal) epoch [ms]. */
  epochMs: number;
  zhdM: number;
  zwdM: number;
  ztdM: number;
  pwvMm: number;
  /** Weighted mean temperature [K]; null for a dry column. */
  tmK: number | null;
  /** Pressure of the last level with measured humidity [hPa]; null when every level carries humidity. */
  lastHumidityPressureHpa: number | null;
  /** Levels of the stored profile. */
  levels: number;
  warnings: string[];
  modelFingerprint: string;
  /** ISO 8601 UTC of the last write. */
  storedAt: string;
}

/** A sounding with the profile as it was sent (JSON text of the profile-delays request). */
export interface StoredSounding extends SoundingRow {
  profileJson: string;
}

export interface WriteCounts {
  /** Keys that did not exist before. */
  inserted: number;
  /** Keys that existed with different values, now replaced. */
  updated: number;
  /** Keys that existed with the same values (an idempotent re-send). */
  unchanged: number;
}

export interface TimeRange {
  /** Inclusive [ms]. */
  fromMs: number;
  /** Inclusive [ms]. */
  toMs: number;
}

/** One station's time range in a many-station read (readZenithDelaysMany, readSurfaceMetMany). */
export interface StationRange extends TimeRange {
  stationId: string;
}

/** What a paged read (Repository.readPages) returns, by kind: the rows of the matching whole-range read. */
export interface SeriesPageRows {
  met: MetRow;
  'surface-met': SurfaceMetRow;
  delays: DelayRow;
  'zenith-delays': ZenithDelayRow;
}
export type SeriesPageKind = keyof SeriesPageRows;

export interface PageReadOptions {
  /** Only this source (all sources when absent). */
  source?: string | undefined;
  /** Most rows in one page (an integer ≥ 1). */
  pageRows: number;
}

/** Options of Repository.trimAuditEventsBefore. */
export interface AuditTrimOptions {
  /** Rows per batch (default AUDIT_TRIM_BATCH_ROWS). */
  batchRows?: number;
  /** Stops between batches once aborted. */
  signal?: AbortSignal;
}

export interface Repository {
  readonly backend: 'sqlite' | 'postgres';

  /**
   * Creates or replaces a station; `created` tells which. A station marked deleted keeps its id:
   * StationDeletedError until it is restored or purged.
   */
  putStation(stationId: string, station: StationInput): Promise<{ station: Station; created: boolean }>;
  /** The station, or null when there is none or it is marked deleted. */
  getStation(stationId: string): Promise<Station | null>;
  /**
   * The stations among `stationIds` that exist and are not marked deleted, by id, in one query whatever the
   * number of ids (a bound array: no placeholder per id); unknown and deleted ids are absent, an id given twice
   * is read once. For a request that names its stations: reads only those, where listStations reads the
   * whole table (issue 14: 4–6 ms of the event loop at 1 000 stations, ~50 ms at 10 000).
   */
  getStations(stationIds: readonly string[]): Promise<Map<string, Station>>;
  /** The stations not marked deleted (the whole table: for answers that list every station). */
  listStations(): Promise<Station[]>;
  /**
   * The stations not marked deleted inside `box`, by id: filtered in the database (src/storage/rows.ts
   * stationsInBoxWhere), so that a network read of a region does not turn the whole table into objects.
   */
  listStationsInBox(box: StationBox): Promise<Station[]>;
  /**
   * Soft delete: marks the station deleted at `deletedAt` (ISO 8601 UTC). Its series stay stored
   * but every read and write treats the station as absent. False when there is no such live station.
   */
  deleteStation(stationId: string, deletedAt: string): Promise<boolean>;
  /** Clears the deletion mark; false when the station is not marked deleted. */
  restoreStation(stationId: string): Promise<boolean>;
  /** Removes the station and all its series for good (live or marked); false when there is none. */
  purgeStation(stationId: string): Promise<boolean>;
  /** Purges every station marked deleted at or before `cutoff` (ISO 8601 UTC); returns their ids. */
  purgeDeletedBefore(cutoff: string): Promise<string[]>;
  /** The stations marked deleted, oldest mark first. */
  listDeletedStations(): Promise<DeletedStationMark[]>;

  /** Stores a key; false when its name (or secret digest) is taken. */
  createApiKey(key: StoredApiKey): Promise<boolean>;
  /** Every stored key, revoked ones included, by name. */
  listApiKeys(): Promise<StoredApiKey[]>;
  /** Marks the key revoked at `revokedAt`; false when there is no such valid key. */
  revokeApiKey(name: string, revokedAt: string): Promise<boolean>;

  /** Appends one audit event. */
  appendAuditEvent(event: AuditEvent): Promise<void>;
  /** Audit events matching the query, newest first. */
  listAuditEvents(query: AuditQuery): Promise<StoredAuditEvent[]>;
  /**
   * Deletes the audit events stored before `cutoffMs` (at_ms < cutoffMs, ms since 1970 UTC) in batches of at
   * most `batchRows` rows, each its own short transaction (no long lock; SQLite yields the event loop between
   * batches). Idempotent, and safe on several replicas at once (PostgreSQL: each batch skips the rows another
   * replica is deleting). `signal`: stops between batches when aborted (the app closing); the next run goes on
   * where it stopped. Returns the rows this call deleted.
   */
  trimAuditEventsBefore(cutoffMs: number, options?: AuditTrimOptions): Promise<number>;

  /** Upserts met rows of one station in one transaction. Keys must be unique within `rows`. */
  writeMet(stationId: string, rows: readonly MetRow[]): Promise<WriteCounts>;
  /** Met rows of one station in [fromMs, toMs], ordered by epoch then source. */
  readMet(stationId: string, range: TimeRange, source?: string): Promise<MetRow[]>;
  /** The same rows as readMet with pressure and temperature only (half the columns: a station-year is 100 000 rows). */
  readSurfaceMet(stationId: string, range: TimeRange, source?: string): Promise<SurfaceMetRow[]>;

  /**
   * Upserts delay rows of one station and their model set in one transaction. Every row's
   * modelFingerprint must equal modelSet.modelFingerprint. Keys must be unique within `rows`.
   * `guard` (a campaign item's "mark done"): run first in the same transaction; when it changes no
   * row, nothing is written and GuardRefusedError is thrown (src/storage/sql-executor.ts).
   */
  writeDelays(stationId: string, rows: readonly DelayRow[], modelSet: StoredModelSet, guard?: GuardStatement): Promise<WriteCounts>;
  /**
   * writeDelays for several stations under one model set in ONE transaction: every station's rows
   * are stored, or none (a network estimation). UnknownStationError when any station does not exist.
   */
  writeDelaysMany(writes: readonly StationDelayRows[], modelSet: StoredModelSet): Promise<WriteCounts[]>;
  /** Delay rows of one station in [fromMs, toMs], ordered by epoch then source. */
  readDelays(stationId: string, range: TimeRange, source?: string): Promise<DelayRow[]>;
  /** The same rows as readDelays with the zenith total delay only (ZenithDelayRow). */
  readZenithDelays(stationId: string, range: TimeRange, source?: string): Promise<ZenithDelayRow[]>;
  /**
   * The rows of readMet ('met'), readSurfaceMet ('surface-met'), readDelays ('delays') or
   * readZenithDelays ('zenith-delays') in pages of at most options.pageRows, ordered by epoch then
   * source (keyset pagination, src/storage/paged-read.ts): a station-year read never holds the event
   * loop in one piece when the caller yields between pages.
   */
  readPages<K extends SeriesPageKind>(
    kind: K,
    stationId: string,
    range: TimeRange,
    options: PageReadOptions,
  ): AsyncGenerator<SeriesPageRows[K][], void, undefined>;
  /** The model sets of the given fingerprints (unknown ones are left out). */
  readModelSets(fingerprints: readonly string[]): Promise<StoredModelSet[]>;

  /**
   * Network reads: the rows of readZenithDelays / readSurfaceMet for many stations in one round trip,
   * by station id (stations without rows are absent), each list ordered by epoch then source.
   */
  readZenithDelaysMany(ranges: readonly StationRange[], source?: string): Promise<Map<string, ZenithDelayRow[]>>;
  readSurfaceMetMany(ranges: readonly StationRange[]): Promise<Map<string, SurfaceMetRow[]>>;
  /** Delay rows per source within each station's range: station id → source → count (empty stations absent). */
  countDelaySources(ranges: readonly StationRange[]): Promise<Map<string, Map<string, number>>>;
  /**
   * Coverage of the delay series per station and source, computed in the database
   * (src/storage/coverage-query.ts): station id → its sources' first/last epoch, count and gaps.
   */
  readDelayCoverage(query: CoverageQuery): Promise<Map<string, SeriesCoverage[]>>;
  /** Latest epoch of the series per station [ms] (stations with an empty series are absent). */
  latestEpochsMs(stationIds: readonly string[], series: 'met' | 'delays'): Promise<Map<string, number>>;

  /**
   * Stores a sounding and its model set in one transaction, replacing one of the same station and epoch;
   * `created` tells which. sounding.modelFingerprint must equal modelSet.modelFingerprint.
   */
  putSounding(stationId: string, sounding: StoredSounding, modelSet: StoredModelSet): Promise<{ created: boolean }>;
  /** Soundings of one station in [fromMs, toMs] without their profiles, ordered by epoch. */
  readSoundings(stationId: string, range: TimeRange): Promise<SoundingRow[]>;
  /** One sounding with its profile, or null. */
  getSounding(stationId: string, epochMs: number): Promise<StoredSounding | null>;
  /** Deletes one sounding; false when there was none. */
  deleteSounding(stationId: string, epochMs: number): Promise<boolean>;

  /** Latest epoch stored for the station in the series [ms], or null when it is empty. */
  latestEpochMs(stationId: string, series: 'met' | 'delays'): Promise<number | null>;

  /** Reads and transactional statement lists on this database, for stores with tables of their own (src/campaigns). */
  sqlExecutor(): SqlExecutor;

  /** Answers when the database is reachable and its schema is at the latest migration; throws otherwise. */
  ping(): Promise<void>;

  /** Connections of the backend, for the metrics: open, idle, and requests waiting for one. */
  connectionStats(): ConnectionStats;

  close(): Promise<void>;
}

export interface ConnectionStats {
  total: number;
  idle: number;
  waiting: number;
}

/** One station's delay rows of a writeDelaysMany. */
export interface StationDelayRows {
  stationId: string;
  rows: readonly DelayRow[];
}

/** Raised when a station id is reserved by a station marked deleted. */
export class StationDeletedError extends Error {
  constructor(
    readonly stationId: string,
    readonly deletedAt: string,
  ) {
    super(`station ${stationId} was deleted at ${deletedAt}`);
  }
}

/** Raised for a write that names a station that does not exist. */
export class UnknownStationError extends Error {
  constructor(readonly stationId: string) {
    super(`no station ${stationId}`);
  }
}
