/**
 * Gives back the young generation of an idle worker thread (issue 14, memory per replica).
 *
 * The service runs with `--max-semi-space-size=32` (package.json `start`, the container's command): a thread's
 * young generation grows to two 32 MB semi-spaces under load (the warm-up alone grows it there) and V8 keeps it
 * at that size while nothing collects: an idle estimation thread held ~34 MB of young generation resident and
 * 64 MB committed (v8.getHeapSpaceStatistics, --trace-gc-verbose), two threads ~65 MB of a replica's idle 295 MB.
 * V8 shrinks the young generation (to 1 MB) and uncommits the spare semi-space at a collection after which the
 * allocation rate of the last ~5 s is low (heap.cc `ShouldResizeNewSpace`); its own memory reducer, which would
 * do so, did not run in idle workers (measured: still 64 MB after 20 s idle, with piscina's event loop free or
 * not). So a thread that has had no task for a while (TROPODELAY_WORKER_IDLE_TRIM_S, src/config.ts;
 * ComputePoolOptions.idleTrimMs) makes two full collections, TRIM_RATE_WINDOW_MS apart (below), 15–26 ms each on
 * the idle thread; the young generation then grows again with the next tasks, slowly (the GPS-like day cost ~3 ms
 * more CPU a request for hundreds of requests after a trim), hence off by default (src/config.ts DEFAULT_WORKER_IDLE_TRIM_S).
 *
 * The timer needs the thread's event loop to run while it waits for tasks: with a trim the pool sets piscina's
 * `atomics` to 'async' (compute-pool.ts; with 'sync', piscina blocks an idle thread in Atomics.wait and no timer
 * fires; by turns through HTTP, 'async' cost nothing measurable: new ÷ old 1.00 on both GPS-like workloads).
 *
 * The collection is V8's `gc` function, which a thread gets without starting node with --expose-gc: the flag is
 * set for a moment, a new context made (V8 installs `gc` in contexts made while it is set) and the flag cleared
 * (the technique of jest's leak detector). That context holds nothing else; the thread's own global has no `gc`.
 */

import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

let collect: (() => void) | undefined;

/** V8's full collection, obtained once per thread. */
function fullCollection(): () => void {
  if (!collect) {
    setFlagsFromString('--expose-gc');
    try {
      collect = runInNewContext('gc') as () => void;
    } finally {
      setFlagsFromString('--no-expose-gc');
    }
  }
  return collect;
}

/**
 * The quiet between the trim's two collections [ms]. V8 gives the young generation back at a collection when the
 * allocation rate of about the last 5 s is low, and it counts what was allocated since the collection before over
 * the time since: a thread that ended its last task with half a young generation allocated still "allocated"
 * at 20 MB / 6 s, too fast. So the first collection closes that account, and the second, this much later,
 * sees the quiet (measured: one collection 6 s after a task shrank nothing when the task's last scavenge was
 * long before its end; two did, every time).
 */
export const TRIM_RATE_WINDOW_MS = 6_000;

let collections = 0;
let trims = 0;

/** Idle collections (the first of the two) and trims (both done) of this thread so far (tests). */
export const idleTrimCounts = (): { collections: number; trims: number } => ({ collections, trims });

let timer: NodeJS.Timeout | undefined;

/** A task starts: no trim while it runs. */
export function cancelIdleTrim(): void {
  if (timer !== undefined) clearTimeout(timer);
  timer = undefined;
}

/**
 * The thread has become idle (after its warm-up, after each task): if it stays so for `quietMs`, it collects,
 * and TRIM_RATE_WINDOW_MS later collects again, which gives the young generation back; 0 = never.
 */
export function scheduleIdleTrim(quietMs: number): void {
  cancelIdleTrim();
  if (quietMs <= 0) return;
  timer = setTimeout(() => {
    fullCollection()();
    collections++;
    timer = setTimeout(() => {
      timer = undefined;
      fullCollection()();
      trims++;
    }, TRIM_RATE_WINDOW_MS);
    timer.unref();
  }, quietMs);
  timer.unref(); // never keeps a thread alive that piscina is ending
}
