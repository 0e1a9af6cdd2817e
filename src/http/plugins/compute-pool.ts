/**
 * Decorates the app with `compute`, the worker-thread pool for estimations (src/workers), records
 * their run time and size in the metrics, answers 503 with Retry-After when its queue is full, and
 * closes the pool with the app.
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
} from '../../workers/compute-pool.js';
import { COMPUTE_TASKS, type ComputeTaskName, type ComputeTasks } from '../compute-tasks.js';
import { HttpProblem } from '../problem.js';
import { ownsBuffer } from '../raw-body.js';
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
}

declare module 'fastify' {
  interface FastifyInstance {
    compute: Compute;
  }
}

export interface ComputePoolPluginOptions {
  config: Pick<Config, 'ESTIMATION_WORKERS' | 'ESTIMATION_QUEUE_LIMIT' | 'TROPODELAY_COMPUTE_MEMORY_BUDGET_MB'>;
}

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

async function computePool(app: FastifyInstance, { config }: ComputePoolPluginOptions): Promise<void> {
  const pool = new ComputePool<ComputeTasks>({
    tasks: COMPUTE_TASKS,
    threads: config.ESTIMATION_WORKERS,
    queueLimit: config.ESTIMATION_QUEUE_LIMIT,
    memoryBudgetBytes: config.TROPODELAY_COMPUTE_MEMORY_BUDGET_MB * MB,
    onTaskDone: (task, durationS) => app.metrics.computeDuration.observe({ task }, durationS),
  });
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
  });
  app.addHook('onClose', async () => pool.close());
}

export default fp(computePool, { name: 'compute-pool', dependencies: ['metrics'] });
