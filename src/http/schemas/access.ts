/**
 * Access resources: API keys (/v1/admin/keys), the audit trail (/v1/audit), and soft-deleted stations
 * (restore, purge, the list of deleted stations).
 */

import { z } from 'zod';
import { strictObject } from './common.js';
import { rangeBoundSchema } from './range-bounds.js';
import { stationIdSchema } from './stations.js';

const KEY_NAME_MESSAGE = 'must be 1-64 letters, digits, . _ - (starting with a letter or digit)';
export const keyNameSchema = z
  .string({ error: KEY_NAME_MESSAGE })
  .regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,63}$/, { error: KEY_NAME_MESSAGE })
  .describe('Name of a key: shown in the audit trail and the request log');
export const roleSchema = z
  .enum(['read', 'write', 'admin'], { error: 'must be read, write or admin' })
  .describe('read: the archive reads; write: also uploads and station changes; admin: also deletes, keys, audit, restore and purge');

export const keyCreateBody = strictObject({ name: keyNameSchema, role: roleSchema });
export const keyParams = strictObject({ key_name: keyNameSchema });

const keyFields = {
  name: z.string(),
  role: roleSchema,
  origin: z
    .enum(['configuration', 'database'])
    .describe('configuration: TROPODELAY_API_KEYS (or its file); database: created through the API'),
  created_at: z.string().nullable().describe('ISO 8601 UTC; null for configured keys'),
  created_by: z.string().nullable().describe('Name of the key that created it; null for configured keys and the first admin key'),
  revoked_at: z.string().nullable().describe('ISO 8601 UTC; null while valid'),
};
export const keyListResponse = z.object({ keys: z.array(z.object(keyFields)).describe('Every key by name; secrets are never shown') });
export const keyCreatedResponse = z.object({
  ...keyFields,
  secret: z.string().describe('The bearer secret: shown in this answer only, stored as a SHA-256 digest'),
});

export const AUDIT_DEFAULT_LIMIT = 100;
export const AUDIT_MAX_LIMIT = 10_000;
export const auditQuery = strictObject({
  from: rangeBoundSchema.optional().describe('Earliest event time (inclusive); ISO 8601 date-time or a date'),
  to: rangeBoundSchema.optional().describe('Latest event time (inclusive); ISO 8601 date-time or a date (its whole day)'),
  station: stationIdSchema.optional().describe('Only events of this station'),
  key_name: keyNameSchema.optional().describe('Only events made with this key'),
  limit: z.coerce
    .number({ error: `must be a whole number in 1..${AUDIT_MAX_LIMIT}` })
    .int({ error: `must be a whole number in 1..${AUDIT_MAX_LIMIT}` })
    .min(1, { error: `must be a whole number in 1..${AUDIT_MAX_LIMIT}` })
    .max(AUDIT_MAX_LIMIT, { error: `must be a whole number in 1..${AUDIT_MAX_LIMIT}` })
    .default(AUDIT_DEFAULT_LIMIT)
    .describe(`Most events returned, newest first (default ${AUDIT_DEFAULT_LIMIT})`),
});

const count = z.number().int().nullable();
export const auditResponse = z.object({
  events: z.array(
    z.object({
      event_id: z.number().int(),
      at: z.string().describe('ISO 8601 UTC time of the answer'),
      key_name: z.string().nullable().describe('Name of the key presented (accepted keys only)'),
      client_address: z.string().describe('Client address as seen through the trusted proxies (TRUST_PROXY)'),
      method: z.string(),
      route: z.string().describe('Route pattern, e.g. /v1/stations/:station_id/met'),
      path: z.string(),
      station_id: z.string().nullable(),
      source: z.string().nullable(),
      records: count.describe('Records received (stored and rejected)'),
      inserted: count,
      updated: count,
      unchanged: count,
      status: z.number().int().describe('HTTP status of the answer'),
      request_id: z.string(),
    }),
  ),
});

export const deleteStationQuery = strictObject({
  purge: z
    .enum(['true', 'false'], { error: 'must be true or false' })
    .optional()
    .describe('true: remove the station and its series for good now, instead of marking it deleted'),
});

export const deletedStationsResponse = z.object({
  retention_days: z.number().describe('Days a deleted station stays restorable (TROPODELAY_DELETE_RETENTION_DAYS)'),
  stations: z.array(
    z.object({
      station_id: z.string(),
      name: z.string(),
      deleted_at: z.string().describe('ISO 8601 UTC'),
      purge_after: z.string().describe('ISO 8601 UTC: the purge removes it at its first run after this time'),
    }),
  ),
});

export const purgeResponse = z.object({
  purged: z.array(z.string()).describe('Ids of the stations removed for good with their series'),
  cutoff: z.string().describe('Stations marked deleted at or before this time (ISO 8601 UTC) were purged'),
  audit_events_trimmed: z
    .number()
    .int()
    .nonnegative()
    .describe('Audit events deleted by this run (older than TROPODELAY_AUDIT_RETENTION_DAYS)'),
  audit_events_cutoff: z
    .string()
    .nullable()
    .describe('Audit events stored before this time (ISO 8601 UTC) were deleted; null when the audit trail is kept forever (0 days)'),
  audit_retention_days: z.number().int().describe('Days an audit event is kept (TROPODELAY_AUDIT_RETENTION_DAYS); 0 = forever'),
});
