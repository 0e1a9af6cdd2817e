/**
 * Decorates the app with `compute`, the worker-thread pool for estimations (src/workers), records
 * their run time and size in the metrics, answers 503 with Retry-After when its queue is full, and
 * closes the pool with the app.
 *
 * With `start` (server.ts) the threads start with the app and each runs TROPODELAY_WARM_UP_ESTIMATIONS
 * estimations of an invented slice first (tasks/warm-up.ts): until every thread has reported, the readiness
 * check `compute_warm_up` fails, so that a load balancer sends no traffic to a cold replica; requests that
 * come anyway are served (they wait for their thread's warm-up). A warm-up that fails (it should not) is
 * logged as an error and counts as done: the thread takes requests cold, and the replica is not kept out of
 * service for it; likewise after WARM_UP_READY_DEADLINE_MS (a thread that never reports). Without `start`
 * (the in-process apps of the tests) the threads start cold with the first task, as before.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import type { Config } from '../../config.js';
import {
  ComputePool,
  ComputePoolFullError,
  ComputeTaskError,
  type HandedInput,
  type TaskInput,
  type TaskOutput,
  type WarmUpReport,
} from '../../workers/compute-pool.js';
import { COMPUTE_TASKS, COMPUTE_WARM_UP, type ComputeTaskName, type ComputeTasks } from '../compute-tasks.js';
import { HttpProblem } from '../problem.js';
import { ownsBuffer } from '../raw-body.js';
import { NotReadyYet } from './readiness.js';
import { TASK_MEMORY_PER_BODY_BYTE } from '../../limits.js';

type ComputeTaskInput<T extends ComputeTaskName> = HandedInput<TaskInput<ComputeTasks[T]>>;
type ComputeTaskOutput<T extends ComputeTaskName> = TaskOutput<ComputeTasks[T]>;

export interface Compute {
  /** Runs a task in a worker; a full queue is a 503 problem, a task's error outcome its 4xx problem. */
  run<T extends ComputeTaskName>(task: T, input: ComputeTaskInput<T>, transfer?: ArrayBuffer[]): Promise<ComputeTaskOutput<T>>;
  /**
   * Gives back the bytes of an output the route is done with (ComputePool.release), when they are their
   * buffer whole (as moved from the worker); nothing else may use them afterwards.
   */
  release(bytes: Uint8Array): void;
  /** The threads' warm-up reports, once every thread has reported ([] at once when the app did not start them warm). */
  readonly warmUp: Promise<WarmUpReport[]>;
}

declare module 'fastify' {
  interface FastifyInstance {
    compute: Compute;
  }
}

export interface ComputePoolPluginOptions {
  config: Pick<
    Config,
    | 'ESTIMATION_WORKERS'
    | 'ESTIMATION_QUEUE_LIMIT'
    | 'TROPODELAY_COMPUTE_MEMORY_BUDGET_MB'
    | 'TROPODELAY_WARM_UP_ESTIMATIONS'
    | 'TROPODELAY_WORKER_IDLE_TRIM_S'
  >;
  /** Start the threads with the app, warmed (server.ts); absent: they start with the first task, cold. */
  start?: boolean;
}

/**
 * Longest the readiness check waits for the warm-up [ms]: a thread that never reports (it should not happen)
 * must not keep the replica out of service. 40 estimations take 1–3 s a thread on a half-speed machine.
 */
export const WARM_UP_READY_DEADLINE_MS = 120_000;

const MB = 1024 * 1024;

/**
 * What a task may take while it runs [bytes], for the pool's memory budget: its request body (JSON or
 * Arrow bytes, CSV text) times the measured cost per body byte of its form (TASK_MEMORY_PER_BODY_BYTE);
 * a task without a body (a campaign item) is not held by the budget.
 */
export function taskMemoryBytes(input: unknown): number {
  const { body, format, memoryBytes } = (input ?? {}) as { body?: unknown; format?: unknown; memoryBytes?: unknown };
  // A task without a body whose route knows its size (a network day from deposits) says so itself.
  if (typeof memoryBytes === 'number') return memoryBytes;
  const size = typeof body === 'string' ? body.length : bytesOf(body);
  const perByte = TASK_MEMORY_PER_BODY_BYTE[format as keyof typeof TASK_MEMORY_PER_BODY_BYTE] ?? TASK_MEMORY_PER_BODY_BYTE.json;
  return size * perByte;
}

/** Bytes of a body as handed to the pool: one array, or the chunks it arrived in (HandedInput). */
const bytesOf = (body: unknown): number =>
  body instanceof Uint8Array ? body.byteLength : Array.isArray(body) ? body.reduce((n: number, chunk) => n + bytesOf(chunk), 0) : 0;

async function computePool(app: FastifyInstance, { config, start }: ComputePoolPluginOptions): Promise<void> {
  const estimations = config.TROPODELAY_WARM_UP_ESTIMATIONS;
  const pool = new ComputePool<ComputeTasks>({
    tasks: COMPUTE_TASKS,
    threads: config.ESTIMATION_WORKERS,
    queueLimit: config.ESTIMATION_QUEUE_LIMIT,
    memoryBudgetBytes: config.TROPODELAY_COMPUTE_MEMORY_BUDGET_MB * MB,
    onTaskDone: (task, durationS) => app.metrics.computeDuration.observe({ task }, durationS),
    warmUp: { location: COMPUTE_WARM_UP, estimations },
    idleTrimMs: config.TROPODELAY_WORKER_IDLE_TRIM_S * 1000,
  });
  const warmUp = start ? warmUpAtStart(app, pool, estimations, config.ESTIMATION_WORKERS) : Promise.resolve([]);
  app.decorate('compute', {
    async run<T extends ComputeTaskName>(task: T, input: ComputeTaskInput<T>, transfer?: ArrayBuffer[]): Promise<ComputeTaskOutput<T>> {
      try {
        const output = await pool.run(task, input, transfer, taskMemoryBytes(input));
        app.metrics.computeSize.observe({ task }, output.observations);
        return output;
      } catch (err) {
        if (err instanceof ComputePoolFullError) {
          throw new HttpProblem(503, err.message, undefined, { 'retry-after': String(err.retryAfterS) });
        }
        if (err instanceof ComputeTaskError) throw new HttpProblem(err.error.status, err.error.detail, err.error.errors);
        throw err;
      } finally {
        app.metrics.workerQueue.set(pool.queued);
      }
    },
    release: (bytes: Uint8Array) => {
      if (ownsBuffer(bytes)) pool.release(bytes.buffer);
    },
    warmUp,
  });
  app.addHook('onClose', async () => pool.close());
}

/**
 * Starts the threads warm (ComputePool.start) with the readiness check that waits for them; one info line
 * when they are warm, an error line per thread whose warm-up failed.
 */
function warmUpAtStart(
  app: FastifyInstance,
  pool: ComputePool<ComputeTasks>,
  estimations: number,
  threads: number,
): Promise<WarmUpReport[]> {
  const started = performance.now();
  const reports = pool.start();
  if (estimations <= 0) return reports;
  let warm = false;
  const deadline = setTimeout(() => {
    warm = true;
    app.log.warn({ deadlineMs: WARM_UP_READY_DEADLINE_MS }, 'compute workers not warm in time; ready anyway');
  }, WARM_UP_READY_DEADLINE_MS).unref();
  const done = reports.then((all) => {
    clearTimeout(deadline);
    warm = true;
    for (const r of all.filter((r) => r.error !== undefined))
      app.log.error({ threadId: r.threadId, error: r.error }, 'compute worker warm-up failed; the thread takes requests cold');
    const threadMs = all.map((r) => Math.round(r.durationMs));
    app.log.info({ threads, estimations, durationMs: Math.round(performance.now() - started), threadMs }, 'compute workers warmed up');
    return all;
  });
  app.addReadinessCheck('compute_warm_up', async () => {
    if (!warm) throw new NotReadyYet(`the estimation workers are warming up (${estimations} estimations each)`);
  });
  app.addHook('onClose', async () => clearTimeout(deadline));
  return done;
}

export default fp(computePool, { name: 'compute-pool', dependencies: ['metrics', 'readiness'] });
