/**
 * A pool of worker threads (piscina) for the heavy computations, so that health checks, metrics and
 * light requests never wait behind an estimation. The queue in front of the workers is bounded;
 * when it is full a request is refused with 503 and a Retry-After header instead of piling up.
 *
 * The pool knows no task itself: the layer that owns a task registers it by module and export name
 * (src/http/compute-tasks.ts for the request tasks), and the worker thread imports that module
 * (compute-worker.ts). So nothing here imports the layers above.
 */

import { Piscina } from 'piscina';
import type { TaskError, TaskOutcome } from './task-outcome.js';

/** A task: plain, structured-cloneable data in, a TaskOutcome out. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type ComputeTask = (input: any) => Promise<TaskOutcome<unknown>>;

/** Where a task lives: the module's URL and the name of its exported function. */
export interface TaskLocation {
  module: string;
  exportName: string;
}

export type TaskInput<F extends ComputeTask> = Parameters<F>[0];
export type TaskOutput<F extends ComputeTask> = Extract<Awaited<ReturnType<F>>, { ok: true }>['output'];

export interface ComputePoolOptions<Tasks extends Record<string, ComputeTask>> {
  /** Worker threads (default: the machine's cores). */
  threads: number;
  /** Tasks that may wait for a worker before new ones are refused. */
  queueLimit: number;
  /** The tasks by name. */
  tasks: { [K in keyof Tasks]: TaskLocation };
  /** Called after each task with its name and run time [s]. */
  onTaskDone?: (task: keyof Tasks & string, durationS: number) => void;
}

/** What the worker thread gets and answers (compute-worker.ts). */
export interface ComputeRequest extends TaskLocation {
  input: unknown;
}

export interface ComputeResponse {
  outcome: unknown;
  /** Run time inside the worker [ms]. */
  durationMs: number;
}

export class ComputePoolFullError extends Error {
  constructor(readonly retryAfterS: number) {
    super(`all computation workers are busy and the queue is full; retry in ${retryAfterS} s`);
  }
}

/** A task's error outcome (a 4xx of the caller's making), rethrown on the calling side. */
export class ComputeTaskError extends Error {
  constructor(readonly error: TaskError) {
    super(error.detail);
  }
}

/** Running from TypeScript sources (tests, `tsx`), the worker loads them through tsx as well. */
function workerLocation(): { filename: string; execArgv: string[] } {
  const fromSource = import.meta.url.endsWith('.ts');
  return {
    filename: new URL(`./compute-worker.${fromSource ? 'ts' : 'js'}`, import.meta.url).href,
    execArgv: fromSource ? ['--import', 'tsx'] : [],
  };
}

export class ComputePool<Tasks extends Record<string, ComputeTask>> {
  private pool: Piscina | undefined;

  constructor(private readonly options: ComputePoolOptions<Tasks>) {}

  /** Tasks waiting for a worker. */
  get queued(): number {
    return this.pool?.queueSize ?? 0;
  }

  /**
   * Runs a task in a worker. `transfer`: array buffers of the input moved to the worker instead of
   * copied (they are detached here afterwards); the worker moves the typed arrays of its output back
   * the same way (compute-worker.ts).
   *
   * @throws ComputePoolFullError when the queue is full
   * @throws ComputeTaskError when the task answers with an error outcome
   */
  async run<K extends keyof Tasks & string>(task: K, input: TaskInput<Tasks[K]>, transfer: ArrayBuffer[] = []): Promise<TaskOutput<Tasks[K]>> {
    const pool = (this.pool ??= new Piscina({
      ...workerLocation(),
      minThreads: this.options.threads, // all started at once: no thread is spawned in the middle of a load
      maxThreads: this.options.threads,
      maxQueue: this.options.queueLimit,
      idleTimeout: 60_000,
    }));
    const location = this.options.tasks[task];
    let response: ComputeResponse;
    try {
      response = (await pool.run({ ...location, input } satisfies ComputeRequest, { transferList: transfer })) as ComputeResponse;
    } catch (err) {
      if (err instanceof Error && /queue is at limit/i.test(err.message)) throw new ComputePoolFullError(this.retryAfterS());
      throw err;
    }
    this.options.onTaskDone?.(task, response.durationMs / 1000);
    const outcome = response.outcome as TaskOutcome<TaskOutput<Tasks[K]>>;
    if (!outcome.ok) throw new ComputeTaskError(outcome.error);
    return outcome.output;
  }

  /** A hint for Retry-After [s]: the mean run time times the tasks ahead, at least 1 s. */
  private retryAfterS(): number {
    const meanMs = this.pool?.histogram.runTime.mean ?? 0;
    const meanS = meanMs > 0 ? meanMs / 1000 : 1;
    return Math.max(1, Math.ceil((meanS * (this.queued + 1)) / this.options.threads));
  }

  async close(): Promise<void> {
    await this.pool?.destroy();
    this.pool = undefined;
  }
}
