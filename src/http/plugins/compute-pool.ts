/**
 * Decorates the app with `compute`, the worker-thread pool for estimations (src/workers), records
 * their run time and size in the metrics, answers 503 with Retry-After when its queue is full, and
 * closes the pool with the app.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import type { Config } from '../../config.js';
import { ComputePool, ComputePoolFullError } from '../../workers/compute-pool.js';
import { HttpProblem } from '../problem.js';
import type { ComputeTaskInput, ComputeTaskName } from '../../workers/tasks.js';

export interface Compute {
  run<T extends ComputeTaskName, O>(task: T, input: ComputeTaskInput<T>, size: number): Promise<O>;
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
  const pool = new ComputePool({
    threads: config.ESTIMATION_WORKERS,
    queueLimit: config.ESTIMATION_QUEUE_LIMIT,
    onTaskDone: (task, durationS) => app.metrics.computeDuration.observe({ task }, durationS),
  });
  app.decorate('compute', {
    async run<T extends ComputeTaskName, O>(task: T, input: ComputeTaskInput<T>, size: number): Promise<O> {
      app.metrics.computeSize.observe({ task }, size);
      try {
        return await pool.run<T, O>(task, input);
      } catch (err) {
        if (err instanceof ComputePoolFullError) {
          throw new HttpProblem(503, err.message, undefined, { 'retry-after': String(err.retryAfterS) });
        }
        throw err;
      } finally {
        app.metrics.workerQueue.set(pool.queued);
      }
    },
  });
  app.addHook('onClose', async () => pool.close());
}

export default fp(computePool, { name: 'compute-pool', dependencies: ['metrics'] });
