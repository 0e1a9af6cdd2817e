/**
 * Retention: what the archive keeps for a limited time.
 *
 * - Soft-deleted stations: a station marked deleted (DELETE /v1/stations/{id}) stays restorable for
 *   TROPODELAY_DELETE_RETENTION_DAYS; the purge then removes it with all its series.
 * - The audit trail (plugins/audit.ts): an event older than TROPODELAY_AUDIT_RETENTION_DAYS is deleted
 *   (0 = kept forever). An agency writing hourly from 1 000 stations adds ~24 000 events a day, so without
 *   this the table grows without bound. The trim deletes in batches (AUDIT_TRIM_BATCH_ROWS), each its own
 *   short transaction: no long lock on PostgreSQL, the event loop given back between batches on SQLite.
 *
 * Both run once when the app is ready and then every PURGE_INTERVAL_MS (each replica runs them; each is
 * an idempotent DELETE, so replicas running them at the same time do no harm: on PostgreSQL the trim's
 * batches skip the rows another replica is deleting), and on demand through POST /v1/admin/purge. They
 * run one after the other and fail apart: a failed one is logged and tried again at the next interval,
 * without keeping the other from running.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';

export const PURGE_INTERVAL_MS = 3_600_000;
const DAY_MS = 86_400_000;

/** What one run of the audit trim did. */
export interface AuditTrim {
  /** Events deleted by this run. */
  trimmed: number;
  /** Events stored before this time (ISO 8601 UTC) were deleted; null when the trail is kept forever. */
  cutoff: string | null;
}

declare module 'fastify' {
  interface FastifyInstance {
    /** Days a deleted station stays restorable. */
    deleteRetentionDays: number;
    /** Days an audit event is kept; 0 = forever. */
    auditRetentionDays: number;
    /** Purges the stations marked deleted longer than the retention period ago. */
    purgeDeletedStations(nowMs?: number): Promise<{ purged: string[]; cutoff: string }>;
    /** Deletes the audit events older than the audit retention period (none when it is 0). */
    trimAuditTrail(nowMs?: number): Promise<AuditTrim>;
    /** Both, one after the other (the hourly run and POST /v1/admin/purge). */
    purgeExpired(nowMs?: number): Promise<{ purged: string[]; cutoff: string; audit: AuditTrim }>;
  }
}

export interface RetentionOptions {
  retentionDays: number;
  /** Days an audit event is kept; 0 = forever. */
  auditRetentionDays: number;
  /** Run the purge at start and every hour (false in tools that build the app without serving). */
  schedule?: boolean;
}

/** The audit cutoff [ms since 1970] of a run at `nowMs`; null when the trail is kept forever (0 days). */
export function auditCutoffMs(nowMs: number, auditRetentionDays: number): number | null {
  return auditRetentionDays > 0 ? nowMs - auditRetentionDays * DAY_MS : null;
}

async function retention(app: FastifyInstance, options: RetentionOptions): Promise<void> {
  // Aborted when the app closes: a trim in progress stops after its current batch (the next run goes on).
  const closing = new AbortController();
  app.decorate('deleteRetentionDays', options.retentionDays);
  app.decorate('auditRetentionDays', options.auditRetentionDays);
  app.decorate('purgeDeletedStations', async (nowMs = Date.now()) => {
    const cutoff = new Date(nowMs - options.retentionDays * DAY_MS).toISOString();
    const purged = await app.repository.purgeDeletedBefore(cutoff);
    if (purged.length) app.log.info({ purged, cutoff }, `purged ${purged.length} station(s) deleted at or before ${cutoff}`);
    return { purged, cutoff };
  });
  app.decorate('trimAuditTrail', async (nowMs = Date.now()): Promise<AuditTrim> => {
    const cutoffMs = auditCutoffMs(nowMs, options.auditRetentionDays);
    if (cutoffMs === null) return { trimmed: 0, cutoff: null };
    const cutoff = new Date(cutoffMs).toISOString();
    const startedMs = performance.now();
    const trimmed = await app.repository.trimAuditEventsBefore(cutoffMs, { signal: closing.signal });
    if (trimmed) {
      const durationMs = Math.round(performance.now() - startedMs);
      app.log.info({ trimmed, cutoff, durationMs }, `deleted ${trimmed} audit event(s) stored before ${cutoff}`);
    }
    return { trimmed, cutoff };
  });
  app.decorate('purgeExpired', async (nowMs = Date.now()) => {
    const stations = await app.purgeDeletedStations(nowMs);
    return { ...stations, audit: await app.trimAuditTrail(nowMs) };
  });
  if (options.schedule === false) {
    app.addHook('onClose', async () => closing.abort());
    return;
  }
  const run = async () => {
    await app
      .purgeDeletedStations()
      .catch((err: unknown) => app.log.error({ err }, 'purging deleted stations failed; next try in an hour'));
    await app.trimAuditTrail().catch((err: unknown) => app.log.error({ err }, 'trimming the audit trail failed; next try in an hour'));
  };
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<void> | undefined;
  const start = () => {
    running ??= run().finally(() => (running = undefined));
  };
  app.addHook('onReady', async () => {
    start();
    timer = setInterval(start, PURGE_INTERVAL_MS);
    timer.unref();
  });
  // A close stops a trim in progress after its current batch and waits for it, so that the database is not
  // closed under it.
  app.addHook('onClose', async () => {
    clearInterval(timer);
    closing.abort();
    await running;
  });
}

export default fp(retention, { name: 'retention', dependencies: ['storage'] });
