/**
 * Versioned schema migrations, shared by both backends. Each is applied once, in order, inside a
 * transaction, and recorded in schema_migrations (version, name, applied_at). Never edit a
 * migration that has shipped: add the next version.
 *
 * The SQL is written in the subset SQLite and PostgreSQL share (TEXT, BIGINT, DOUBLE PRECISION,
 * composite primary keys, ON DELETE CASCADE); a migration that needs dialect-specific SQL gives
 * `sqlite` and `postgres` separately.
 *
 * Time series are keyed by (station_id, epoch_ms, source). The primary key's index serves the
 * "one station, a time range" reads (station_id equality, then an epoch_ms range).
 *
 * Rolling updates (DEVELOPERS.md, "Migrations: expand, then contract"; docs/operations.md): during an
 * update, replicas of the previous release run on a schema the new release has migrated. A migration
 * that only expands the schema (a new table, a new nullable column, a new index) leaves the previous
 * release working and says so with `minReaderVersion`; one that contracts it (drops or renames what an
 * older release reads or writes) keeps the default, and older replicas then report not-ready with the
 * reason. Each applied migration records its `min_reader_version` in schema_migrations, so a replica
 * can judge a schema made by a release newer than itself.
 */

export interface Migration {
  version: number;
  name: string;
  sql: string | { sqlite: string; postgres: string };
  /**
   * The oldest reader this migration leaves working: a release whose newest known migration is at
   * least this version may keep serving on the migrated schema. Absent = `version` itself (only
   * releases that know this migration), the safe default for a contracting change. An expanding
   * migration (additions only) sets it to the version before it, or lower when it is known to be
   * compatible further back.
   */
  minReaderVersion?: number;
}

/** Oldest reader a migration leaves working (its declaration, or its own version by default). */
export function minReaderVersionOf(m: Migration): number {
  return m.minReaderVersion ?? m.version;
}

/** A row of schema_migrations as the readiness check reads it. */
export interface AppliedMigration {
  version: number;
  name: string;
  /** NULL in rows written before the column existed: treated as the version itself (not compatible). */
  minReaderVersion: number | null;
}

/**
 * The schema a release cannot work on: migrations of its own are missing (not migrated yet), or a
 * newer release applied a migration that does not declare this release compatible. The message is
 * public (GET /v1/ready shows it): versions and names only, no driver detail.
 */
export class SchemaMismatchError extends Error {}

/**
 * Whether a release that knows `known` (its MIGRATIONS) can serve on a database whose applied
 * migrations are `applied`: every migration it knows is applied, and every applied migration newer
 * than its newest declares a `min_reader_version` at or below that newest. Throws a
 * SchemaMismatchError saying which migration blocks it and what to do; returns otherwise.
 */
export function checkSchemaCompatibility(applied: readonly AppliedMigration[], known: readonly Migration[] = MIGRATIONS): void {
  const readerVersion = known.at(-1)?.version ?? 0;
  const appliedVersions = new Set(applied.map((a) => a.version));
  const missing = known.filter((m) => !appliedVersions.has(m.version)).map((m) => m.version);
  if (missing.length > 0) {
    throw new SchemaMismatchError(`schema lacks migration ${missing.join(', ')} of this release (not migrated yet)`);
  }
  const blocking = applied
    .filter((a) => a.version > readerVersion && (a.minReaderVersion ?? a.version) > readerVersion)
    .sort((a, b) => a.version - b.version)[0];
  if (blocking) {
    throw new SchemaMismatchError(
      `schema has migration ${blocking.version} (${blocking.name}) of a newer release, which needs a release knowing migration ` +
        `${blocking.minReaderVersion ?? blocking.version} or later; this release knows up to ${readerVersion}: ` +
        'finish the update of every replica, or restore the database from before the update to roll back',
    );
  }
}

/** The bookkeeping table of applied migrations (both dialects). */
export const SCHEMA_MIGRATIONS_TABLE_SQL =
  'CREATE TABLE IF NOT EXISTS schema_migrations (version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL, min_reader_version INTEGER)';

/**
 * Migration 4 (src/campaigns): a station-day of residuals in its compact stored form
 * (src/campaigns/residual-form.ts); a campaign (its options as the API's JSON and its fingerprint);
 * one item per station-day with its state (pending → running → done | failed | cancelled), the
 * replica and attempt token of the last claim, and the CPU time it took.
 */
const RESIDUALS_AND_CAMPAIGNS_SQL = `
CREATE TABLE residual_days (
  station_id         TEXT NOT NULL REFERENCES stations (station_id) ON DELETE CASCADE,
  day                TEXT NOT NULL,
  observation_count  BIGINT NOT NULL,
  sha256             TEXT NOT NULL,
  stored_bytes       BIGINT NOT NULL,
  stored_at          TEXT NOT NULL,
  data               {blob} NOT NULL,
  PRIMARY KEY (station_id, day)
);

CREATE TABLE campaigns (
  campaign_id        TEXT PRIMARY KEY,
  name               TEXT,
  state              TEXT NOT NULL,
  start_date         TEXT NOT NULL,
  end_date           TEXT NOT NULL,
  options_json       TEXT NOT NULL,
  model_fingerprint  TEXT NOT NULL,
  source             TEXT NOT NULL,
  created_at         TEXT NOT NULL,
  started_at         TEXT,
  finished_at        TEXT
);

CREATE TABLE campaign_items (
  campaign_id        TEXT NOT NULL REFERENCES campaigns (campaign_id) ON DELETE CASCADE,
  station_id         TEXT NOT NULL,
  day                TEXT NOT NULL,
  state              TEXT NOT NULL,
  attempts           BIGINT NOT NULL DEFAULT 0,
  claim_token        TEXT,
  replica            TEXT,
  residual_sha256    TEXT,
  model_fingerprint  TEXT,
  reason             TEXT,
  cpu_ms             DOUBLE PRECISION,
  finished_at_ms     BIGINT,
  PRIMARY KEY (campaign_id, station_id, day)
);

CREATE INDEX campaign_items_state ON campaign_items (campaign_id, state);
`;

/**
 * Migration 6 (docs/campaigns.md): campaigns whose residuals are uploaded with them and campaigns of
 * station-windows. campaigns gains the input kind ('deposits' | 'upload'), the window length and step
 * (NULL = station-days) and when its uploads were closed; campaign_items gains when an item became
 * pending (ready_at_ms) and when its job was queued (queued_at_ms; NULL = not known to be queued, which
 * the sweep of src/services/campaigns repairs); campaign_residual_days holds the station-days uploaded
 * to a campaign, in the stored form of residual_days.
 */
const CAMPAIGN_UPLOADS_AND_WINDOWS_SQL = `
ALTER TABLE campaigns ADD COLUMN input_kind TEXT NOT NULL DEFAULT 'deposits';
ALTER TABLE campaigns ADD COLUMN window_length_ms BIGINT;
ALTER TABLE campaigns ADD COLUMN window_step_ms BIGINT;
ALTER TABLE campaigns ADD COLUMN uploads_closed_at TEXT;
ALTER TABLE campaign_items ADD COLUMN ready_at_ms BIGINT;
ALTER TABLE campaign_items ADD COLUMN queued_at_ms BIGINT;

CREATE TABLE campaign_residual_days (
  campaign_id        TEXT NOT NULL REFERENCES campaigns (campaign_id) ON DELETE CASCADE,
  station_id         TEXT NOT NULL,
  day                TEXT NOT NULL,
  observation_count  BIGINT NOT NULL,
  sha256             TEXT NOT NULL,
  stored_bytes       BIGINT NOT NULL,
  stored_at          TEXT NOT NULL,
  data               {blob} NOT NULL,
  PRIMARY KEY (campaign_id, station_id, day)
);

CREATE INDEX campaign_items_unqueued ON campaign_items (state, queued_at_ms);
`;

export const MIGRATIONS: readonly Migration[] = [
  {
    version: 1,
    name: 'stations, met series, model sets and delay series',
    sql: `
CREATE TABLE stations (
  station_id     TEXT PRIMARY KEY,
  name           TEXT NOT NULL,
  latitude_deg   DOUBLE PRECISION NOT NULL,
  longitude_deg  DOUBLE PRECISION NOT NULL,
  height_m       DOUBLE PRECISION NOT NULL,
  met_height_m   DOUBLE PRECISION,
  description    TEXT,
  created_at     TEXT NOT NULL,
  updated_at     TEXT NOT NULL
);

CREATE TABLE met_records (
  station_id             TEXT NOT NULL REFERENCES stations (station_id) ON DELETE CASCADE,
  epoch_ms               BIGINT NOT NULL,
  source                 TEXT NOT NULL,
  pressure_hpa           DOUBLE PRECISION,
  temperature_c          DOUBLE PRECISION,
  relative_humidity_pct  DOUBLE PRECISION,
  dewpoint_c             DOUBLE PRECISION,
  vapour_pressure_hpa    DOUBLE PRECISION,
  PRIMARY KEY (station_id, epoch_ms, source)
);

CREATE TABLE model_sets (
  model_fingerprint  TEXT PRIMARY KEY,
  models_json        TEXT NOT NULL
);

CREATE TABLE delay_records (
  station_id              TEXT NOT NULL REFERENCES stations (station_id) ON DELETE CASCADE,
  epoch_ms                BIGINT NOT NULL,
  source                  TEXT NOT NULL,
  ztd_m                   DOUBLE PRECISION NOT NULL,
  ztd_sigma_m             DOUBLE PRECISION,
  zwd_m                   DOUBLE PRECISION,
  zwd_sigma_m             DOUBLE PRECISION,
  north_gradient_m        DOUBLE PRECISION,
  east_gradient_m         DOUBLE PRECISION,
  north_gradient_sigma_m  DOUBLE PRECISION,
  east_gradient_sigma_m   DOUBLE PRECISION,
  model_fingerprint       TEXT NOT NULL REFERENCES model_sets (model_fingerprint),
  PRIMARY KEY (station_id, epoch_ms, source)
);

CREATE INDEX delay_records_fingerprint ON delay_records (model_fingerprint);
`,
  },
  {
    version: 2,
    name: 'soundings: profiles per station with their ZWD, PWV and Tm',
    minReaderVersion: 1, // expand-only: a new table, which a release of schema 1 never reads
    sql: `
CREATE TABLE soundings (
  station_id                  TEXT NOT NULL REFERENCES stations (station_id) ON DELETE CASCADE,
  epoch_ms                    BIGINT NOT NULL,
  zhd_m                       DOUBLE PRECISION NOT NULL,
  zwd_m                       DOUBLE PRECISION NOT NULL,
  ztd_m                       DOUBLE PRECISION NOT NULL,
  pwv_mm                      DOUBLE PRECISION NOT NULL,
  tm_k                        DOUBLE PRECISION,
  last_humidity_pressure_hpa  DOUBLE PRECISION,
  levels                      BIGINT NOT NULL,
  warnings_json               TEXT NOT NULL,
  model_fingerprint           TEXT NOT NULL REFERENCES model_sets (model_fingerprint),
  stored_at                   TEXT NOT NULL,
  profile_json                TEXT NOT NULL,
  PRIMARY KEY (station_id, epoch_ms)
);
`,
  },
  {
    // Expand-only: a nullable column and two new tables; a replica of the previous release keeps working
    // (it does not see deleted_at, so it would still show a soft-deleted station until upgraded).
    version: 3,
    name: 'API keys with roles, audit trail of writes, soft delete of stations',
    minReaderVersion: 1, // expand-only; a release before it still shows soft-deleted stations until it is upgraded
    sql: {
      sqlite: `
ALTER TABLE stations ADD COLUMN deleted_at TEXT;

CREATE TABLE api_keys (
  name           TEXT PRIMARY KEY,
  role           TEXT NOT NULL,
  secret_sha256  TEXT NOT NULL UNIQUE,
  created_at     TEXT NOT NULL,
  created_by     TEXT,
  revoked_at     TEXT
);

CREATE TABLE audit_events (
  event_id        INTEGER PRIMARY KEY AUTOINCREMENT,
  at_ms           BIGINT NOT NULL,
  key_name        TEXT,
  client_address  TEXT NOT NULL,
  method          TEXT NOT NULL,
  route           TEXT NOT NULL,
  path            TEXT NOT NULL,
  station_id      TEXT,
  source          TEXT,
  records         BIGINT,
  inserted        BIGINT,
  updated         BIGINT,
  unchanged       BIGINT,
  status          INTEGER NOT NULL,
  request_id      TEXT NOT NULL
);

CREATE INDEX audit_events_at ON audit_events (at_ms);
CREATE INDEX audit_events_station ON audit_events (station_id, at_ms);
`,
      postgres: `
ALTER TABLE stations ADD COLUMN deleted_at TEXT;

CREATE TABLE api_keys (
  name           TEXT PRIMARY KEY,
  role           TEXT NOT NULL,
  secret_sha256  TEXT NOT NULL UNIQUE,
  created_at     TEXT NOT NULL,
  created_by     TEXT,
  revoked_at     TEXT
);

CREATE TABLE audit_events (
  event_id        BIGINT GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
  at_ms           BIGINT NOT NULL,
  key_name        TEXT,
  client_address  TEXT NOT NULL,
  method          TEXT NOT NULL,
  route           TEXT NOT NULL,
  path            TEXT NOT NULL,
  station_id      TEXT,
  source          TEXT,
  records         BIGINT,
  inserted        BIGINT,
  updated         BIGINT,
  unchanged       BIGINT,
  status          INTEGER NOT NULL,
  request_id      TEXT NOT NULL
);

CREATE INDEX audit_events_at ON audit_events (at_ms);
CREATE INDEX audit_events_station ON audit_events (station_id, at_ms);
`,
    },
  },
  {
    // Contracting: rebuilds met_records and delay_records in a new layout (the fingerprint column of
    // delay_records is gone), which a release of schema 3 can neither read nor write. Every row is
    // copied (test/storage/archive-layout-migration.test.ts); docs/operations.md says what a rolling
    // update does with it (the older replicas report not-ready until they are replaced).
    version: 4,
    name: 'archive layout: series clustered by (station, source, epoch), fingerprint once per segment, epoch index',
    sql: { sqlite: archiveLayoutSql('sqlite'), postgres: archiveLayoutSql('postgres') },
  },
  {
    // Expand-only: three new tables, which a release of schema 4 never reads.
    version: 5,
    name: 'residual deposits per station-day, reprocessing campaigns and their items',
    minReaderVersion: 4,
    sql: {
      sqlite: RESIDUALS_AND_CAMPAIGNS_SQL.replace('{blob}', 'BLOB'),
      postgres: RESIDUALS_AND_CAMPAIGNS_SQL.replace('{blob}', 'BYTEA'),
    },
  },
  {
    // New nullable or defaulted columns and a new table, but not readable by a release of schema 5: its
    // check for a finished campaign does not know the state awaiting_residuals and could end an upload
    // campaign whose items still wait; so a schema-5 release refuses to serve on it (rolling updates:
    // replace the old replicas rather than running both).
    version: 6,
    name: 'campaign uploads, station-windows and queued marks of campaign items',
    minReaderVersion: 6,
    sql: {
      sqlite: CAMPAIGN_UPLOADS_AND_WINDOWS_SQL.replace('{blob}', 'BLOB'),
      postgres: CAMPAIGN_UPLOADS_AND_WINDOWS_SQL.replace('{blob}', 'BYTEA'),
    },
  },
];

/**
 * Migration 4 (docs/archive.md, "Layout"): the series tables rebuilt clustered by
 * (station_id, source, epoch_ms) — WITHOUT ROWID on SQLite (the primary key's b-tree holds the rows),
 * rows copied in key order on PostgreSQL — plus
 *  - met_series: one row per (station, source) with the envelope of its epochs: the sources a read
 *    without a source probes, and the latest epoch, without scanning the rows;
 *  - delay_segments: one row per (station, source, model fingerprint) with the envelope of its epochs;
 *    each delay row refers to its segment by a small integer instead of carrying the 16-character
 *    fingerprint; the view delay_rows joins them back, so reads still see model_fingerprint per row;
 *  - delay_records_epoch: an index on epoch_ms for network-wide reads at one epoch.
 * Rows are only ever upserted or removed with their station, so an envelope (first, last) always
 * covers every row of its segment; after a reprocessing under another fingerprint it can be wider.
 * segment_id has no foreign key: a purge removes a station's rows and segments by station_id, and a
 * foreign key would make every segment delete scan delay_records (no index on segment_id).
 */
function archiveLayoutSql(dialect: 'sqlite' | 'postgres'): string {
  const withoutRowid = dialect === 'sqlite' ? ' WITHOUT ROWID' : '';
  const segmentId = dialect === 'sqlite' ? 'INTEGER PRIMARY KEY' : 'INTEGER GENERATED BY DEFAULT AS IDENTITY PRIMARY KEY';
  const renamePk = (from: string, to: string) =>
    dialect === 'postgres' ? `ALTER TABLE ${to} RENAME CONSTRAINT ${from}_pkey TO ${to}_pkey;\n` : '';
  return `
CREATE TABLE met_series (
  station_id      TEXT NOT NULL REFERENCES stations (station_id) ON DELETE CASCADE,
  source          TEXT NOT NULL,
  first_epoch_ms  BIGINT NOT NULL,
  last_epoch_ms   BIGINT NOT NULL,
  PRIMARY KEY (station_id, source)
)${withoutRowid};
INSERT INTO met_series (station_id, source, first_epoch_ms, last_epoch_ms)
  SELECT station_id, source, MIN(epoch_ms), MAX(epoch_ms) FROM met_records GROUP BY station_id, source;

CREATE TABLE met_records_clustered (
  station_id             TEXT NOT NULL REFERENCES stations (station_id) ON DELETE CASCADE,
  source                 TEXT NOT NULL,
  epoch_ms               BIGINT NOT NULL,
  pressure_hpa           DOUBLE PRECISION,
  temperature_c          DOUBLE PRECISION,
  relative_humidity_pct  DOUBLE PRECISION,
  dewpoint_c             DOUBLE PRECISION,
  vapour_pressure_hpa    DOUBLE PRECISION,
  PRIMARY KEY (station_id, source, epoch_ms)
)${withoutRowid};
INSERT INTO met_records_clustered
  SELECT station_id, source, epoch_ms, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa
  FROM met_records ORDER BY station_id, source, epoch_ms;
DROP TABLE met_records;
ALTER TABLE met_records_clustered RENAME TO met_records;
${renamePk('met_records_clustered', 'met_records')}
CREATE TABLE delay_segments (
  segment_id         ${segmentId},
  station_id         TEXT NOT NULL REFERENCES stations (station_id) ON DELETE CASCADE,
  source             TEXT NOT NULL,
  model_fingerprint  TEXT NOT NULL REFERENCES model_sets (model_fingerprint),
  first_epoch_ms     BIGINT NOT NULL,
  last_epoch_ms      BIGINT NOT NULL,
  UNIQUE (station_id, source, model_fingerprint)
);
INSERT INTO delay_segments (station_id, source, model_fingerprint, first_epoch_ms, last_epoch_ms)
  SELECT station_id, source, model_fingerprint, MIN(epoch_ms), MAX(epoch_ms) FROM delay_records
  GROUP BY station_id, source, model_fingerprint ORDER BY station_id, source, MIN(epoch_ms);

CREATE TABLE delay_records_clustered (
  station_id              TEXT NOT NULL REFERENCES stations (station_id) ON DELETE CASCADE,
  source                  TEXT NOT NULL,
  epoch_ms                BIGINT NOT NULL,
  ztd_m                   DOUBLE PRECISION NOT NULL,
  ztd_sigma_m             DOUBLE PRECISION,
  zwd_m                   DOUBLE PRECISION,
  zwd_sigma_m             DOUBLE PRECISION,
  north_gradient_m        DOUBLE PRECISION,
  east_gradient_m         DOUBLE PRECISION,
  north_gradient_sigma_m  DOUBLE PRECISION,
  east_gradient_sigma_m   DOUBLE PRECISION,
  segment_id              INTEGER NOT NULL,
  PRIMARY KEY (station_id, source, epoch_ms)
)${withoutRowid};
INSERT INTO delay_records_clustered
  SELECT r.station_id, r.source, r.epoch_ms, r.ztd_m, r.ztd_sigma_m, r.zwd_m, r.zwd_sigma_m, r.north_gradient_m,
         r.east_gradient_m, r.north_gradient_sigma_m, r.east_gradient_sigma_m, g.segment_id
  FROM delay_records r
  JOIN delay_segments g ON g.station_id = r.station_id AND g.source = r.source AND g.model_fingerprint = r.model_fingerprint
  ORDER BY r.station_id, r.source, r.epoch_ms;
DROP TABLE delay_records;
ALTER TABLE delay_records_clustered RENAME TO delay_records;
${renamePk('delay_records_clustered', 'delay_records')}CREATE INDEX delay_records_epoch ON delay_records (epoch_ms);

CREATE VIEW delay_rows AS
  SELECT d.station_id, d.source, d.epoch_ms, d.ztd_m, d.ztd_sigma_m, d.zwd_m, d.zwd_sigma_m, d.north_gradient_m, d.east_gradient_m,
         d.north_gradient_sigma_m, d.east_gradient_sigma_m, g.model_fingerprint
  FROM delay_records d JOIN delay_segments g ON g.segment_id = d.segment_id;
${dialect === 'postgres' ? 'ANALYZE met_series, met_records, delay_segments, delay_records;\n' : ''}`;
}

export function migrationSql(m: Migration, dialect: 'sqlite' | 'postgres'): string {
  return typeof m.sql === 'string' ? m.sql : m.sql[dialect];
}
