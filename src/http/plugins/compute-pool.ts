/**
 * Decorates the app with `compute`, the worker-thread pool for estimations (src/workers), records
 * their run time and size in the metrics, answers 503 with Retry-After when its queue is full, and
 * closes the pool with the app.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import type { Config } from '../../config.js';
import { ComputePool, ComputePoolFullError, ComputeTaskError, type TaskInput, type TaskOutput } from '../../workers/compute-pool.js';
import { COMPUTE_TASKS, type ComputeTaskName, type ComputeTasks } from '../compute-tasks.js';
import { HttpProblem } from '../problem.js';

type ComputeTaskInput<T extends ComputeTaskName> = TaskInput<ComputeTasks[T]>;
type ComputeTaskOutput<T extends ComputeTaskName> = TaskOutput<ComputeTasks[T]>;

export interface Compute {
  /** Runs a task in a worker; a full queue is a 503 problem, a task's error outcome its 4xx problem. */
  run<T extends ComputeTaskName>(task: T, input: ComputeTaskInput<T>, transfer?: ArrayBuffer[]): Promise<ComputeTaskOutput<T>>;
}

declare module 'fastify' {
  interface FastifyInstance {
    compute: Compute;
  }
}

export interface ComputePoolPluginOptions {
  config: Pick<Config, 'ESTIMATION_WORKERS' | 'ESTIMATION_QUEUE_LIMIT'>;
}

async function computePool(app: FastifyInstance, { config }: ComputePoolPluginOptions): Promise<void> {
  const pool = new ComputePool<ComputeTasks>({
    tasks: COMPUTE_TASKS,
    threads: config.ESTIMATION_WORKERS,
    queueLimit: config.ESTIMATION_QUEUE_LIMIT,
    onTaskDone: (task, durationS) => app.metrics.computeDuration.observe({ task }, durationS),
  });
  app.decorate('compute', {
    async run<T extends ComputeTaskName>(task: T, input: ComputeTaskInput<T>, transfer?: ArrayBuffer[]): Promise<ComputeTaskOutput<T>> {
      try {
        const output = await pool.run(task, input, transfer);
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
  });
  app.addHook('onClose', async () => pool.close());
}

export default fp(computePool, { name: 'compute-pool', dependencies: ['metrics'] });
