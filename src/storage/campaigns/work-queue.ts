/**
 * The queue that spreads a campaign's items (station-days) over the replicas. Two implementations
 * with one interface:
 *
 * - PostgreSQL: pg-boss (npm, its tables in the archive's schema). Delivery is at least once: a job
 *   whose replica dies (kill -9) expires after `itemTimeoutS` and is delivered again, to any replica.
 *   Exactly once in the archive is the campaign store's business (a claim token and the guard that
 *   marks an item done in the transaction that stores its results), not the queue's.
 * - SQLite (one process): an in-memory FIFO served by `concurrency` loops; on start it takes up the
 *   unfinished items of active campaigns again (a restart loses the memory, not the items).
 */

import PgBoss from 'pg-boss';

export interface WorkItem {
  campaignId: string;
  stationId: string;
  day: string;
}

/** Processes one item; a throw means "try again later" (e.g. the database or the worker pool was busy). */
export type WorkHandler = (item: WorkItem) => Promise<void>;

export interface WorkQueue {
  readonly kind: 'pg-boss' | 'in-process';
  /** Starts serving items with `concurrency` at a time on this replica. */
  start(handler: WorkHandler): Promise<void>;
  enqueue(items: readonly WorkItem[]): Promise<void>;
  /** Stops taking items; waits for those in hand (at most `timeoutMs`). */
  stop(timeoutMs?: number): Promise<void>;
}

export interface QueueSettings {
  /** Items one replica works on at once. */
  concurrency: number;
  /** A job not finished after this long is delivered again [s] (pg-boss's expiry; longer than any item takes). */
  itemTimeoutS: number;
  /** Deliveries of one item at most (the first and the retries). */
  maxAttempts: number;
}

const QUEUE_NAME = 'tropodelay-campaign-items';
/**
 * Jobs one pg-boss worker fetches at a time and runs one after the other. pg-boss waits out its polling
 * interval (0.5 s at least) after every fetch, so one job per fetch capped a replica at 2 items/s
 * (measured: 2.6 station-days/s for two replicas whose items took about 10 ms of CPU each).
 */
const PG_BOSS_BATCH = 10;
/** Pause before an item that threw is offered again [ms]. */
const RETRY_DELAY_MS = 1000;

export class InProcessQueue implements WorkQueue {
  readonly kind = 'in-process' as const;
  private readonly pending: { item: WorkItem; attempt: number }[] = [];
  private readonly waiting: (() => void)[] = [];
  private loops: Promise<void>[] = [];
  private stopped = false;
  private timers = new Set<NodeJS.Timeout>();

  constructor(
    private readonly settings: QueueSettings,
    private readonly recover: () => Promise<WorkItem[]>,
  ) {}

  async start(handler: WorkHandler): Promise<void> {
    for (const item of await this.recover()) this.pending.push({ item, attempt: 1 });
    this.loops = Array.from({ length: this.settings.concurrency }, () => this.serve(handler));
  }

  async enqueue(items: readonly WorkItem[]): Promise<void> {
    for (const item of items) this.pending.push({ item, attempt: 1 });
    this.wake();
  }

  async stop(timeoutMs = 10_000): Promise<void> {
    this.stopped = true;
    for (const t of this.timers) clearTimeout(t);
    this.wake();
    await Promise.race([Promise.all(this.loops), new Promise((r) => setTimeout(r, timeoutMs).unref())]);
  }

  private wake(): void {
    for (const w of this.waiting.splice(0)) w();
  }

  private async serve(handler: WorkHandler): Promise<void> {
    while (!this.stopped) {
      const next = this.pending.shift();
      if (!next) {
        await new Promise<void>((resolve) => this.waiting.push(resolve));
        continue;
      }
      try {
        await handler(next.item);
      } catch {
        if (next.attempt < this.settings.maxAttempts) {
          const timer = setTimeout(() => {
            this.timers.delete(timer);
            this.pending.push({ item: next.item, attempt: next.attempt + 1 });
            this.wake();
          }, RETRY_DELAY_MS);
          this.timers.add(timer);
        }
      }
    }
  }
}

export interface PgBossConnection {
  connectionString: string;
  password?: string | undefined;
  /** The archive's schema: pg-boss keeps its tables there too. */
  schema: string;
}

export class PgBossQueue implements WorkQueue {
  readonly kind = 'pg-boss' as const;
  private readonly boss: PgBoss;
  private started = false;

  constructor(
    connection: PgBossConnection,
    private readonly settings: QueueSettings,
    onError: (err: Error) => void,
  ) {
    this.boss = new PgBoss({
      connectionString: connection.connectionString,
      ...(connection.password !== undefined ? { password: connection.password } : {}),
      schema: connection.schema,
      max: settings.concurrency + 2,
      // Expired jobs are found by the maintenance run; a quarter of the timeout keeps redelivery prompt.
      maintenanceIntervalSeconds: Math.max(1, Math.min(60, Math.floor(settings.itemTimeoutS / 4))),
      application_name: 'tropodelay-campaigns',
    });
    this.boss.on('error', onError);
  }

  private async ensureStarted(): Promise<void> {
    if (this.started) return;
    await this.boss.start();
    await this.boss.createQueue(QUEUE_NAME, {
      name: QUEUE_NAME,
      retryLimit: this.settings.maxAttempts - 1,
      retryDelay: 1,
      expireInSeconds: this.settings.itemTimeoutS,
    });
    this.started = true;
  }

  async start(handler: WorkHandler): Promise<void> {
    await this.ensureStarted();
    for (let k = 0; k < this.settings.concurrency; k++) {
      await this.boss.work<WorkItem>(QUEUE_NAME, { batchSize: PG_BOSS_BATCH, pollingIntervalSeconds: 0.5 }, async (jobs) => {
        for (const job of jobs) {
          try {
            await handler(job.data);
          } catch (err) {
            // This job alone goes back for a retry; pg-boss completes the others of the batch (only active jobs).
            await this.boss.fail(QUEUE_NAME, job.id, { message: err instanceof Error ? err.message : String(err) });
          }
        }
      });
    }
  }

  async enqueue(items: readonly WorkItem[]): Promise<void> {
    await this.ensureStarted();
    const jobs = items.map((data) => ({ name: QUEUE_NAME, data: { ...data } }));
    for (let at = 0; at < jobs.length; at += 1000) await this.boss.insert(jobs.slice(at, at + 1000));
  }

  async stop(timeoutMs = 10_000): Promise<void> {
    if (!this.started) return;
    await this.boss.stop({ graceful: true, wait: true, timeout: timeoutMs });
  }
}
