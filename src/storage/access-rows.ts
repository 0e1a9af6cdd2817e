/**
 * The access records of the archive, shared by both backends: API keys (secrets stored as SHA-256
 * digests only), audit events of writes, and the deletion mark of a soft-deleted station.
 */

export type KeyRole = 'read' | 'write' | 'admin';

export interface StoredApiKey {
  name: string;
  role: KeyRole;
  /** Hex SHA-256 of the secret; the secret itself is never stored. */
  secretSha256: string;
  /** ISO 8601 UTC. */
  createdAt: string;
  /** Name of the key that created it; null for the key a replica created at first start. */
  createdBy: string | null;
  /** ISO 8601 UTC; null while the key is valid. */
  revokedAt: string | null;
}

export interface AuditEvent {
  /** Milliseconds since 1970-01-01T00:00:00Z. */
  atMs: number;
  /** Name of the key presented; null when no accepted key was presented. */
  keyName: string | null;
  /** Client address as seen through the trusted proxies (TRUST_PROXY). */
  clientAddress: string;
  method: string;
  /** Route pattern, e.g. /v1/stations/:station_id/met. */
  route: string;
  /** Path as requested, without the query string. */
  path: string;
  stationId: string | null;
  source: string | null;
  /** Records received in the upload (stored plus rejected), null for writes without records. */
  records: number | null;
  inserted: number | null;
  updated: number | null;
  unchanged: number | null;
  /** HTTP status of the answer. */
  status: number;
  requestId: string;
}

export interface StoredAuditEvent extends AuditEvent {
  eventId: number;
}

export interface AuditQuery {
  /** Inclusive [ms]. */
  fromMs?: number | undefined;
  /** Inclusive [ms]. */
  toMs?: number | undefined;
  stationId?: string | undefined;
  keyName?: string | undefined;
  /** Newest first, at most this many. */
  limit: number;
}

export interface ApiKeyDbRow {
  name: string;
  role: string;
  secret_sha256: string;
  created_at: string;
  created_by: string | null;
  revoked_at: string | null;
}

export const toApiKey = (r: ApiKeyDbRow): StoredApiKey => ({
  name: r.name,
  role: r.role as KeyRole,
  secretSha256: r.secret_sha256,
  createdAt: r.created_at,
  createdBy: r.created_by,
  revokedAt: r.revoked_at,
});

export interface AuditDbRow {
  event_id: number | string;
  at_ms: number | string;
  key_name: string | null;
  client_address: string;
  method: string;
  route: string;
  path: string;
  station_id: string | null;
  source: string | null;
  records: number | string | null;
  inserted: number | string | null;
  updated: number | string | null;
  unchanged: number | string | null;
  status: number;
  request_id: string;
}

const count = (v: number | string | null): number | null => (v === null ? null : Number(v));

/** PostgreSQL returns BIGINT as a string; Number() is exact below 2^53. */
export const toAuditEvent = (r: AuditDbRow): StoredAuditEvent => ({
  eventId: Number(r.event_id),
  atMs: Number(r.at_ms),
  keyName: r.key_name,
  clientAddress: r.client_address,
  method: r.method,
  route: r.route,
  path: r.path,
  stationId: r.station_id,
  source: r.source,
  records: count(r.records),
  inserted: count(r.inserted),
  updated: count(r.updated),
  unchanged: count(r.unchanged),
  status: Number(r.status),
  requestId: r.request_id,
});

/**
 * Rows one batch of the audit trim deletes (Repository.trimAuditEventsBefore): each batch is its own
 * transaction, so no lock is held longer than one batch takes, and on SQLite the event loop is given back
 * between batches. Measured with 1 M rows of a year (bench/audit-trim.bench.ts): see DEVELOPERS.md "Audit
 * retention".
 */
export const AUDIT_TRIM_BATCH_ROWS = 5_000;

/** Column order of an audit insert (both backends bind the values in this order). */
export const AUDIT_COLUMNS = [
  'at_ms',
  'key_name',
  'client_address',
  'method',
  'route',
  'path',
  'station_id',
  'source',
  'records',
  'inserted',
  'updated',
  'unchanged',
  'status',
  'request_id',
] as const;

export const auditValues = (e: AuditEvent): unknown[] => [
  e.atMs,
  e.keyName,
  e.clientAddress,
  e.method,
  e.route,
  e.path,
  e.stationId,
  e.source,
  e.records,
  e.inserted,
  e.updated,
  e.unchanged,
  e.status,
  e.requestId,
];

/**
 * WHERE clause and values of an audit query; `placeholder(i)` writes the i-th (1-based) bound
 * parameter of the dialect. Only bound parameters reach SQL.
 */
export function auditWhere(q: AuditQuery, placeholder: (i: number) => string): { where: string; values: unknown[] } {
  const parts: string[] = [];
  const values: unknown[] = [];
  const add = (sql: string, value: unknown) => {
    values.push(value);
    parts.push(sql.replace('?', placeholder(values.length)));
  };
  if (q.fromMs !== undefined) add('at_ms >= ?', q.fromMs);
  if (q.toMs !== undefined) add('at_ms <= ?', q.toMs);
  if (q.stationId !== undefined) add('station_id = ?', q.stationId);
  if (q.keyName !== undefined) add('key_name = ?', q.keyName);
  return { where: parts.length ? `WHERE ${parts.join(' AND ')}` : '', values };
}

/** A station marked deleted: hidden from reads, its id reserved until purged or restored. */
export interface DeletedStationMark {
  stationId: string;
  name: string;
  /** ISO 8601 UTC. */
  deletedAt: string;
}
