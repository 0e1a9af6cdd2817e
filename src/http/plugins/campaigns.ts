/**
 * Campaigns on this replica: decorates the app with `campaigns` (the CampaignService) and serves the
 * work queue (pg-boss on PostgreSQL, the in-process queue on SQLite) with `concurrency` items at a
 * time, each estimated in the worker pool (task campaign-item-estimate). On PostgreSQL it also sweeps,
 * at start and every `sweepIntervalS` (TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S), for pending items whose job
 * was never sent (a replica died between its commit and the queue send) and ready for at least
 * `sweepGraceS` (TROPODELAY_CAMPAIGN_SWEEP_GRACE_S), and queues them. Stops taking items when the app closes
 * (preClose: the items in hand finish or are redelivered).
 */

import { hostname } from 'node:os';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { DEFAULT_CAMPAIGN_SWEEP_GRACE_S, DEFAULT_CAMPAIGN_SWEEP_INTERVAL_S } from '../../config.js';
import { CampaignService } from '../../services/campaigns/campaigns.js';
import { runItem, type ItemEstimate, type ItemEstimateInput } from '../../services/campaigns/campaign-runner.js';
import { CampaignStore } from '../../storage/campaigns/campaign-store.js';
import { CampaignUploadStore } from '../../storage/campaigns/campaign-upload-store.js';
import { ResidualStore } from '../../storage/campaigns/residual-store.js';
import { InProcessQueue, PgBossQueue, type QueueSettings, type WorkQueue } from '../../storage/campaigns/work-queue.js';
import type { StorageConfig } from '../../storage/factory.js';
import { HttpProblem } from '../problem.js';
import { delayRows } from '../routes/station-zwd-estimates.js';

declare module 'fastify' {
  interface FastifyInstance {
    campaigns: CampaignService;
    /** This replica's name in campaign progress. */
    replicaName: string;
  }
}

export interface CampaignSettings {
  /** Items this replica works on at once; 0 = none (it still accepts campaigns). Default 1. */
  concurrency?: number;
  /** Redelivery after this long [s] (PostgreSQL). Default 600. */
  itemTimeoutS?: number;
  /** Default: host name and process id. */
  replica?: string | undefined;
  /** PostgreSQL: how often to look for pending items whose job was never sent [s] (TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S). */
  sweepIntervalS?: number;
  /** ... ready for at least this long [s] (a submission in progress is not swept; TROPODELAY_CAMPAIGN_SWEEP_GRACE_S). */
  sweepGraceS?: number;
}

export interface CampaignPluginOptions {
  storage: StorageConfig;
  settings: CampaignSettings;
}

/** Deliveries of one item at most: the first and four retries (a throw means the database or the pool was busy). */
const MAX_ATTEMPTS = 5;
/** Pause before the queue is started again after a failed start [ms]. */
const RESTART_DELAY_MS = 10_000;

async function campaigns(app: FastifyInstance, options: CampaignPluginOptions): Promise<void> {
  const sql = app.repository.sqlExecutor();
  const store = new CampaignStore(sql);
  const residuals = new ResidualStore(sql);
  const uploads = new CampaignUploadStore(sql);
  const settings: QueueSettings = {
    concurrency: options.settings.concurrency ?? 1,
    itemTimeoutS: options.settings.itemTimeoutS ?? 600,
    maxAttempts: MAX_ATTEMPTS,
  };
  const replica = options.settings.replica ?? `${hostname()}:${process.pid}`;
  const queue: WorkQueue =
    app.repository.backend === 'postgres' && options.storage.databaseUrl
      ? new PgBossQueue(
          {
            connectionString: options.storage.databaseUrl,
            password: options.storage.databasePassword,
            schema: options.storage.pgSchema ?? 'public',
          },
          settings,
          (err) => app.log.error({ err }, 'campaign queue (pg-boss)'),
        )
      : new InProcessQueue(settings, () => store.unfinishedItems());
  const service = new CampaignService(app.repository, store, residuals, queue, uploads);
  app.decorate('campaigns', service);
  app.decorate('replicaName', replica);

  const estimate = async (input: ItemEstimateInput): Promise<ItemEstimate> => {
    const { source, ...task } = input;
    try {
      const out = await app.compute.run('campaign-item-estimate', task);
      if (out.noInput) {
        const at = (ms: number) => new Date(ms).toISOString();
        return {
          ok: false,
          noInput: true,
          reason: `no observations from ${at(input.keepFromMs)} to ${at(input.keepToMs)} (the part this item stores)`,
        };
      }
      return {
        ok: true,
        rows: delayRows(out.delays, source, out.modelFingerprint),
        modelSet: { modelFingerprint: out.modelFingerprint, models: out.models },
      };
    } catch (err) {
      // A day the estimator refuses (4xx) fails the item; a full pool (503) or anything else is tried again.
      if (err instanceof HttpProblem && err.status < 500) return { ok: false, reason: err.message };
      throw err;
    }
  };
  const deps = { repository: app.repository, campaigns: store, residuals, uploads, estimate, replica };
  let restart: NodeJS.Timeout | undefined;
  let sweepTimer: NodeJS.Timeout | undefined;
  let closing = false;
  const sweepGraceMs = (options.settings.sweepGraceS ?? DEFAULT_CAMPAIGN_SWEEP_GRACE_S) * 1000;
  const sweepIntervalMs = (options.settings.sweepIntervalS ?? DEFAULT_CAMPAIGN_SWEEP_INTERVAL_S) * 1000;
  let sweeping: Promise<void> | undefined;
  const sweep = () => {
    sweeping ??= service
      .sweepUnqueued(sweepGraceMs)
      .then((queued) => {
        if (queued.length > 0) app.log.warn({ items: queued.length }, 'campaign items whose job was never sent were queued by the sweep');
      })
      .catch((err: unknown) => app.log.error({ err }, 'campaign sweep'))
      .finally(() => {
        sweeping = undefined;
      });
    return sweeping;
  };
  const startQueue = async () => {
    try {
      await queue.start(async (item) => {
        const outcome = await runItem(item, deps);
        app.log.debug({ item, outcome }, 'campaign item');
      });
      // The in-process queue (SQLite, one process) takes up every unfinished item at start; the sweep is for pg-boss.
      if (queue.kind === 'pg-boss' && !closing) {
        await sweep();
        sweepTimer = setInterval(() => void sweep(), sweepIntervalMs);
        sweepTimer.unref();
      }
    } catch (err) {
      app.log.error({ err }, `campaign queue did not start; trying again in ${RESTART_DELAY_MS / 1000} s`);
      if (!closing) restart = setTimeout(() => void startQueue(), RESTART_DELAY_MS);
    }
  };
  // The start is not awaited by onReady (a database that is slow to answer must not hold up the
  // service), but a close waits for it: a queue stopped while its start is still running would start
  // afterwards and keep its connections open.
  let starting: Promise<void> | undefined;
  if (settings.concurrency > 0) app.addHook('onReady', async () => void (starting = startQueue()));
  app.addHook('preClose', async () => {
    closing = true;
    clearTimeout(restart);
    clearInterval(sweepTimer);
    await starting;
    await sweeping;
    await queue.stop();
  });
}

export default fp(campaigns, { name: 'campaigns', dependencies: ['storage', 'compute-pool'] });
