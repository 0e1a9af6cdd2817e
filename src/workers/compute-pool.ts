/**
 * A pool of worker threads (piscina) for the heavy computations, so that health checks, metrics and
 * light requests never wait behind an estimation. The queue in front of the workers is bounded;
 * when it is full a request is refused with 503 and a Retry-After header instead of piling up.
 *
 * The pool knows no task itself: the layer that owns a task registers it by module and export name
 * (src/http/compute-tasks.ts for the request tasks), and the worker thread imports that module
 * (compute-worker.ts). So nothing here imports the layers above.
 *
 * A warm-up (ComputePoolOptions.warmUp, start()) is registered the same way: every thread of the first
 * set runs it once in its entry, before piscina hands it a task, and reports to this side when done.
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

/**
 * A task's input as a caller hands it over: a `body` of bytes may come as the chunks it arrived in, moved to
 * the worker instead of joined on the calling thread; the worker joins them before the task runs
 * (compute-worker.ts), so the task sees one array as before.
 */
export type HandedInput<I> = I extends { body: infer B } ? Omit<I, 'body'> & { body: B | Uint8Array[] } : I;
export type TaskOutput<F extends ComputeTask> = Extract<Awaited<ReturnType<F>>, { ok: true }>['output'];

export interface ComputePoolOptions<Tasks extends Record<string, ComputeTask>> {
  /** Worker threads (default: the machine's cores). */
  threads: number;
  /** Tasks that may wait for a worker before new ones are refused. */
  queueLimit: number;
  /** The tasks by name. */
  tasks: { [K in keyof Tasks]: TaskLocation };
  /**
   * Memory the running tasks may take together [bytes] (each task's own estimate, `run`'s `memoryBytes`);
   * 0 or absent: no budget. A task that does not fit waits, and the tasks after it wait behind it (first
   * come, first served, so a large task is not starved by a stream of small ones); a task larger than the
   * whole budget runs alone. Tasks that declare no memory are not held.
   */
  memoryBudgetBytes?: number;
  /** Called after each task with its name and run time [s]. */
  onTaskDone?: (task: keyof Tasks & string, durationS: number) => void;
  /**
   * What each thread started by start() runs once before its first task (compute-worker.ts): the function
   * exported at `location`, called with `estimations`; 0 or absent = none. The threads of a recycle()
   * start cold (they replace threads after a task over the memory budget, which itself takes seconds).
   */
  warmUp?: { location: TaskLocation; estimations: number };
  /**
   * Quiet time after which an idle thread collects its garbage and gives back its young generation [ms]
   * (idle-trim.ts); 0 or absent = never. The service: TROPODELAY_WORKER_IDLE_TRIM_S.
   */
  idleTrimMs?: number;
}

/** What a thread's entry gets as piscina's workerData. */
export interface ComputeWorkerData {
  warmUp?: { location: TaskLocation; estimations: number };
  /** ComputePoolOptions.idleTrimMs. */
  idleTrimMs: number;
}

/** A thread's report of its warm-up, posted to the pool when it is done (or has failed). */
export interface WarmUpReport {
  threadId: number;
  /** Wall time of the warm-up in the thread [ms]. */
  durationMs: number;
  /** Why it failed; absent when it ran through. The thread takes tasks either way. */
  error?: string;
}

/** The message a thread posts with its report (beside piscina's own messages). */
export interface WarmUpMessage {
  warmUpReport: WarmUpReport;
}

const isWarmUpMessage = (message: unknown): message is WarmUpMessage =>
  typeof message === 'object' && message !== null && 'warmUpReport' in message;

/** What the worker thread gets and answers (compute-worker.ts). */
export interface ComputeRequest extends TaskLocation {
  input: unknown;
  /** Array buffers the caller is done with (ComputePool.release), moved along to be dropped by the worker. */
  released: ArrayBuffer[];
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

/**
 * Retry-After for a refused task [s]: the work ahead of it spread over the threads. Every task ahead
 * (queued or running) takes about the mean run time; the threads work through them in parallel, so
 * the queue has room again after about (queued + running) × mean / threads. At least 1 s (the
 * header's unit), rounded up. With no task measured yet the mean is taken as 1 s.
 */
export function retryAfterEstimateS(load: { queued: number; running: number; threads: number; meanRunS: number | null }): number {
  const meanS = load.meanRunS !== null && load.meanRunS > 0 ? load.meanRunS : 1;
  return Math.max(1, Math.ceil(((load.queued + load.running) * meanS) / Math.max(1, load.threads)));
}

/** Weight of the newest run time in the moving mean: about the last 10 tasks count. */
const MEAN_WEIGHT = 0.2;

/** A task ahead of a refused one: its estimated run time [s] and its memory estimate [bytes] (0 = not held by the budget). */
export interface TaskAhead {
  runS: number;
  bytes: number;
}

/**
 * Retry-After for a refused task when the pool has a memory budget [s]: when the tasks ahead of it will have
 * run, found by replaying the pool's own rules over them. `handed`: the tasks given to the threads (their
 * bytes admitted), in the order they were given, so the first `threads` of them are running; `waiting`: the
 * tasks waiting for memory, first come first served. Each task takes its estimated run time from now (a
 * running one too, as in retryAfterEstimateS); the threads take the handed tasks in order; when a task ends,
 * its bytes go back and the waiting tasks are admitted in order while they fit beside those admitted (one
 * larger than the whole budget when nothing else is admitted), then handed to the threads. The answer is the
 * time the last one ends, rounded up, at least 1 s. Without memory waits, and with every task of the same run
 * time, this is the queue part's (queued + running) × mean ÷ threads, rounded up per wave of `threads` tasks.
 * Work: (tasks) × (threads) steps; the tasks are at most ESTIMATION_QUEUE_LIMIT + threads.
 */
export function memoryAwareRetryAfterS(load: {
  threads: number;
  budgetBytes: number;
  handed: readonly TaskAhead[];
  waiting: readonly TaskAhead[];
}): number {
  const threads = Math.max(1, load.threads);
  const ready = [...load.handed];
  let next = 0; // the next of `ready` to take a thread
  let waitingNext = 0; // the next of load.waiting to be admitted
  let inUse = 0;
  let admitted = 0;
  for (const t of load.handed) {
    if (t.bytes <= 0) continue;
    inUse += t.bytes;
    admitted++;
  }
  const admit = () => {
    for (; waitingNext < load.waiting.length; waitingNext++) {
      const t = load.waiting[waitingNext]!;
      if (admitted > 0 && inUse + t.bytes > load.budgetBytes) return;
      inUse += t.bytes;
      admitted++;
      ready.push(t);
    }
  };
  admit();
  const running: { endS: number; bytes: number }[] = [];
  let nowS = 0;
  for (;;) {
    while (running.length < threads && next < ready.length) {
      const t = ready[next++]!;
      running.push({ endS: nowS + t.runS, bytes: t.bytes });
    }
    if (running.length === 0) break;
    let first = 0;
    for (let i = 1; i < running.length; i++) if (running[i]!.endS < running[first]!.endS) first = i;
    const done = running[first]!;
    running[first] = running[running.length - 1]!;
    running.pop();
    nowS = done.endS;
    if (done.bytes > 0) {
      inUse -= done.bytes;
      admitted--;
    }
    admit();
  }
  return Math.max(1, Math.ceil(nowS));
}

/** Moving means of the run time and memory estimate of one task's runs held by the budget. */
interface HeldRuns {
  meanRunS: number;
  meanBytes: number;
}

/**
 * Admission by memory (ComputePoolOptions.memoryBudgetBytes): a first-come, first-served semaphore
 * counted in bytes. `admit` resolves when the task's bytes fit beside those already admitted and no
 * task waits before it; a task larger than the whole budget is admitted when nothing else is.
 */
export class MemoryBudget {
  private inUse = 0;
  private admitted = 0;
  private readonly waiting: { bytes: number; go: () => void }[] = [];

  constructor(readonly budgetBytes: number) {}

  /** Tasks waiting for memory. */
  get queued(): number {
    return this.waiting.length;
  }

  /** Bytes of the tasks admitted and not yet released. */
  get bytesInUse(): number {
    return this.inUse;
  }

  /** Whether a task of `bytes` would wait (for memory, or behind a task waiting for it). */
  mustWait(bytes: number): boolean {
    return this.waiting.length > 0 || !this.fits(bytes);
  }

  private fits(bytes: number): boolean {
    return this.admitted === 0 || this.inUse + bytes <= this.budgetBytes;
  }

  /**
   * Waits until `bytes` may run; the caller calls the returned release once, when the task has ended.
   * `onAdmitted` is called at the moment the bytes are taken (before the returned promise settles).
   */
  async admit(bytes: number, onAdmitted?: () => void): Promise<() => void> {
    if (!this.mustWait(bytes)) {
      this.take(bytes);
      onAdmitted?.();
    } else {
      // wake() takes the bytes for it
      await new Promise<void>((go) =>
        this.waiting.push({
          bytes,
          go: () => {
            onAdmitted?.();
            go();
          },
        }),
      );
    }
    let released = false;
    return () => {
      if (released) return;
      released = true;
      this.inUse -= bytes;
      this.admitted--;
      this.wake();
    };
  }

  private take(bytes: number): void {
    this.inUse += bytes;
    this.admitted++;
  }

  /** Admits the waiting tasks in order, as many as fit. */
  private wake(): void {
    while (this.waiting.length > 0 && this.fits(this.waiting[0]!.bytes)) {
      const next = this.waiting.shift()!;
      this.take(next.bytes);
      next.go();
    }
  }
}

export class ComputePool<Tasks extends Record<string, ComputeTask>> {
  private pool: Piscina | undefined;
  private running = 0;
  private readonly budget: MemoryBudget | undefined;
  /** Tasks handed to piscina and not yet answered (queued there or running). */
  private onThreads = 0;
  /** Worker sets replaced after a task over the memory budget (recycle()). */
  recycled = 0;
  /** Exponentially weighted mean run time of recent tasks [s]; null before the first. */
  private meanRunS: number | null = null;
  /** Array buffers given back by the caller (release()), moved with the next task (a set: a transfer list takes each once). */
  private released = new Set<ArrayBuffer>();
  /** Per task: moving means of the runs held by the memory budget (their run time per byte, for Retry-After). */
  private readonly heldRuns = new Map<string, HeldRuns>();
  /**
   * The tasks admitted (by the memory budget, or not held by it) and not yet answered, in the order they were
   * admitted: on the threads, in piscina's queue, or about to be handed to it (Retry-After).
   */
  private readonly handed = new Set<{ task: string; bytes: number }>();
  /** The tasks waiting for memory, first come first served (Retry-After). */
  private readonly waitingForMemory = new Set<{ task: string; bytes: number }>();

  constructor(private readonly options: ComputePoolOptions<Tasks>) {
    if (options.memoryBudgetBytes) this.budget = new MemoryBudget(options.memoryBudgetBytes);
  }

  /**
   * Starts the threads now (instead of with the first task), each running the warm-up (options.warmUp)
   * before its first task. Resolves with one report per thread once every thread has reported (at once
   * when there is no warm-up); it never rejects (a thread's failure is in its report). Tasks may be run
   * meanwhile: they wait for their thread's warm-up.
   */
  start(): Promise<WarmUpReport[]> {
    const warmUp = this.options.warmUp;
    if (this.pool || !warmUp || warmUp.estimations <= 0) {
      this.threads();
      return Promise.resolve([]);
    }
    const pool = this.threads(warmUp);
    const reports = new Map<number, WarmUpReport>();
    return new Promise((resolve) => {
      const listen = (message: unknown) => {
        if (!isWarmUpMessage(message)) return;
        // A thread that died while warming is replaced by one that warms too: reports count per thread.
        reports.set(message.warmUpReport.threadId, message.warmUpReport);
        if (reports.size < this.options.threads) return;
        pool.off('message', listen);
        resolve([...reports.values()]);
      };
      pool.on('message', listen);
    });
  }

  /** The piscina pool, started with the first task (and again after recycle()); a warm-up only by start(). */
  private threads(warmUp?: ComputeWorkerData['warmUp']): Piscina {
    const idleTrimMs = this.options.idleTrimMs ?? 0;
    const workerData: ComputeWorkerData = { idleTrimMs, ...(warmUp ? { warmUp } : {}) };
    return (this.pool ??= new Piscina({
      ...workerLocation(),
      workerData,
      // With an idle trim, an idle thread waits for tasks with its event loop running (Atomics.waitAsync), not
      // blocked in Atomics.wait ('sync', piscina's default), so that the trim's timer can fire (idle-trim.ts).
      atomics: idleTrimMs > 0 ? 'async' : 'sync',
      minThreads: this.options.threads, // all started at once: no thread is spawned in the middle of a load
      maxThreads: this.options.threads,
      maxQueue: this.options.queueLimit,
      idleTimeout: 60_000,
      recordTiming: false, // piscina's run and wait histograms: unread here (the plugin keeps its own metrics)
    }));
  }

  /** Tasks waiting for a worker or for memory (ComputePoolOptions.memoryBudgetBytes). */
  get queued(): number {
    return (this.pool?.queueSize ?? 0) + (this.budget?.queued ?? 0);
  }

  /**
   * Runs a task in a worker. `transfer`: array buffers of the input moved to the worker instead of
   * copied (they are detached here afterwards); the worker moves the typed arrays of its output back
   * the same way (compute-worker.ts). `memoryBytes`: what the task may take while it runs (an
   * estimate, see memoryBudgetBytes); 0 = not held by the budget.
   *
   * @throws ComputePoolFullError when the queue is full
   * @throws ComputeTaskError when the task answers with an error outcome
   */
  async run<K extends keyof Tasks & string>(
    task: K,
    input: HandedInput<TaskInput<Tasks[K]>>,
    transfer: ArrayBuffer[] = [],
    memoryBytes = 0,
  ): Promise<TaskOutput<Tasks[K]>> {
    const location = this.options.tasks[task];
    let response: ComputeResponse;
    const held = this.budget !== undefined && memoryBytes > 0;
    const entry = { task, bytes: held ? memoryBytes : 0 };
    this.running++;
    let release: (() => void) | undefined;
    try {
      if (this.budget && held) {
        // Waiting for memory counts against the same queue limit as waiting for a thread.
        if (this.budget.mustWait(memoryBytes) && this.queued >= this.options.queueLimit) {
          this.running--; // the refused task is not ahead of itself
          throw new ComputePoolFullError(this.retryAfterS());
        }
        this.waitingForMemory.add(entry);
        release = await this.budget.admit(memoryBytes, () => {
          this.waitingForMemory.delete(entry);
          this.handed.add(entry);
        });
        // A task over the whole budget runs alone: it starts on new threads, so that the heaps the earlier
        // tasks grew (V8 keeps a thread's heap at its high-water mark) are not held beside its own.
        if (memoryBytes > this.budget.budgetBytes && this.onThreads === 0 && this.pool) await this.recycle();
      }
      this.onThreads++;
      this.handed.add(entry); // (already there when the budget admitted it)
      const released = [...this.released];
      this.released.clear();
      try {
        response = (await this.threads().run({ ...location, input, released } satisfies ComputeRequest, {
          transferList: [...transfer, ...released],
        })) as ComputeResponse;
      } finally {
        this.onThreads--;
        this.handed.delete(entry);
      }
      // And it ends on new threads too: the heap it grew goes with its thread before the next task is admitted.
      if (this.budget && memoryBytes > this.budget.budgetBytes && this.onThreads === 0) await this.recycle();
    } catch (err) {
      if (err instanceof ComputePoolFullError) throw err; // refused before it was counted ahead of anything
      this.running--;
      if (err instanceof Error && /queue is at limit/i.test(err.message)) throw new ComputePoolFullError(this.retryAfterS());
      throw err;
    } finally {
      this.handed.delete(entry);
      release?.();
    }
    this.running--;
    const durationS = response.durationMs / 1000;
    this.meanRunS = this.meanRunS === null ? durationS : this.meanRunS + MEAN_WEIGHT * (durationS - this.meanRunS);
    if (held) {
      const runs = this.heldRuns.get(task);
      if (!runs) this.heldRuns.set(task, { meanRunS: durationS, meanBytes: memoryBytes });
      else {
        runs.meanRunS += MEAN_WEIGHT * (durationS - runs.meanRunS);
        runs.meanBytes += MEAN_WEIGHT * (memoryBytes - runs.meanBytes);
      }
    }
    this.options.onTaskDone?.(task, durationS);
    const outcome = response.outcome as TaskOutcome<TaskOutput<Tasks[K]>>;
    if (!outcome.ok) throw new ComputeTaskError(outcome.error);
    return outcome.output;
  }

  /**
   * Gives back an array buffer of a task's output that the caller is done with (an answer's bytes once the
   * socket has taken them): it is moved to a worker thread with the next task and dropped there. Until the
   * garbage collector frees it, an array buffer counts toward its thread's external memory, and on the event
   * loop, which allocates little else, that pressure is what made V8 mark the loop's whole old generation
   * every few GPS-like requests (DEVELOPERS.md, "What the hand-over costs"); the worker threads collect their
   * young garbage after every task anyway. The buffer must be the output's alone (nothing else on this thread
   * may use it afterwards).
   */
  release(buffer: ArrayBuffer): void {
    this.released.add(buffer);
  }

  /**
   * The run time a task of `bytes` is expected to take [s], from the pool's own measurements: for a task held
   * by the memory budget, its bytes × the mean run time per byte of that task's recent held runs (the ratio of
   * the moving means: a task's time grows with its body as its memory estimate does, so a 30-day request ahead
   * counts for 30 one-day ones); otherwise, or before such a run, the moving mean run time of every task (1 s
   * before any).
   */
  estimatedRunS(task: keyof Tasks & string, bytes: number): number {
    const runs = bytes > 0 ? this.heldRuns.get(task) : undefined;
    if (runs && runs.meanBytes > 0) return (bytes / runs.meanBytes) * runs.meanRunS;
    return this.meanRunS !== null && this.meanRunS > 0 ? this.meanRunS : 1;
  }

  /**
   * A hint for Retry-After [s]. With a memory budget: memoryAwareRetryAfterS over the tasks on the threads
   * and those waiting for memory, each of its estimated run time (estimatedRunS). Without one, from the real
   * queue (retryAfterEstimateS): `running` counts the tasks handed to piscina and not yet answered, queued
   * ones included, so the tasks on the threads are running − queued.
   */
  private retryAfterS(): number {
    if (this.budget) {
      const ahead = (t: { task: string; bytes: number }): TaskAhead => ({
        runS: this.estimatedRunS(t.task as keyof Tasks & string, t.bytes),
        bytes: t.bytes,
      });
      return memoryAwareRetryAfterS({
        threads: this.options.threads,
        budgetBytes: this.budget.budgetBytes,
        handed: [...this.handed].map(ahead),
        waiting: [...this.waitingForMemory].map(ahead),
      });
    }
    const queued = this.queued;
    return retryAfterEstimateS({
      queued,
      running: Math.max(0, Math.min(this.options.threads, this.running - queued)),
      threads: this.options.threads,
      meanRunS: this.meanRunS,
    });
  }

  /**
   * Replaces the worker threads (the next task starts new ones): the old threads end with their heaps.
   * Only when no task is on them.
   */
  private async recycle(): Promise<void> {
    const old = this.pool;
    this.pool = undefined;
    this.recycled++;
    await old?.destroy();
  }

  async close(): Promise<void> {
    this.released.clear();
    await this.pool?.destroy();
    this.pool = undefined;
  }
}
