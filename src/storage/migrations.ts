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
 */

export interface Migration {
  version: number;
  name: string;
  sql: string | { sqlite: string; postgres: string };
}

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
];

export function migrationSql(m: Migration, dialect: 'sqlite' | 'postgres'): string {
  return typeof m.sql === 'string' ? m.sql : m.sql[dialect];
}
