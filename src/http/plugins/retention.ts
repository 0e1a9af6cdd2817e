/**
 * Retention of soft-deleted stations: a station marked deleted (DELETE /v1/stations/{id}) stays
 * restorable for TROPODELAY_DELETE_RETENTION_DAYS; the purge then removes it with all its series.
 * The purge runs once when the app is ready and then every PURGE_INTERVAL_MS (each replica runs it;
 * it is one idempotent DELETE, so replicas running it at the same time do no harm), and on demand
 * through POST /v1/admin/purge. A failed run is logged and tried again at the next interval.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';

export const PURGE_INTERVAL_MS = 3_600_000;
const DAY_MS = 86_400_000;

declare module 'fastify' {
  interface FastifyInstance {
    /** Days a deleted station stays restorable. */
    deleteRetentionDays: number;
    /** Purges the stations marked deleted longer than the retention period ago. */
    purgeExpired(nowMs?: number): Promise<{ purged: string[]; cutoff: string }>;
  }
}

export interface RetentionOptions {
  retentionDays: number;
  /** Run the purge at start and every hour (false in tools that build the app without serving). */
  schedule?: boolean;
}

async function retention(app: FastifyInstance, options: RetentionOptions): Promise<void> {
  app.decorate('deleteRetentionDays', options.retentionDays);
  app.decorate('purgeExpired', async (nowMs = Date.now()) => {
    const cutoff = new Date(nowMs - options.retentionDays * DAY_MS).toISOString();
    const purged = await app.repository.purgeDeletedBefore(cutoff);
    if (purged.length) app.log.info({ purged, cutoff }, `purged ${purged.length} station(s) deleted at or before ${cutoff}`);
    return { purged, cutoff };
  });
  if (options.schedule === false) return;
  const run = () =>
    app.purgeExpired().catch((err: unknown) => app.log.error({ err }, 'purging deleted stations failed; next try in an hour'));
  let timer: NodeJS.Timeout | undefined;
  app.addHook('onReady', async () => {
    void run();
    timer = setInterval(() => void run(), PURGE_INTERVAL_MS);
    timer.unref();
  });
  app.addHook('onClose', async () => clearInterval(timer));
}

export default fp(retention, { name: 'retention', dependencies: ['storage'] });
