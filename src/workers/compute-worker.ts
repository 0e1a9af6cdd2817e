/**
 * Worker-thread entry of the compute pool (piscina calls the default export with each task): imports
 * the task's module once (by the URL its owner registered), joins a body handed over in chunks, calls the
 * exported function, times it. The array buffers the caller released (ComputePool.release) come with the
 * request and are left to this thread's garbage collector.
 *
 * With a warm-up in its workerData (ComputePool.start, TROPODELAY_WARM_UP_ESTIMATIONS) the thread first runs
 * it, then reports to the pool (a WarmUpMessage on the parent port, which piscina passes on as the pool's
 * 'message' event): the default export is then a promise of the task function, and piscina takes no task
 * from its port before that promise is resolved (piscina's README, "Delaying availability"). Tasks handed to
 * the thread meanwhile wait for it. The promise never rejects: a failed warm-up is reported and the thread
 * takes tasks cold (a rejected handler would make piscina fail the thread at every start).
 *
 * After the warm-up and after each task the thread schedules its idle trim (idle-trim.ts): once it has had no
 * task for workerData.idleTrimMs, two full collections 6 s apart, which give its young generation back (off by
 * default: idleTrimMs 0).
 */

import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import { parentPort, threadId, workerData } from 'node:worker_threads';
import { move, transferableSymbol, valueSymbol } from 'piscina';
import type { ComputeRequest, ComputeResponse, ComputeWorkerData, TaskLocation, WarmUpMessage } from './compute-pool.js';
import { cancelIdleTrim, scheduleIdleTrim } from './idle-trim.js';

const modules = new Map<string, Promise<Record<string, unknown>>>();
const requireHere = createRequire(import.meta.url);

/**
 * dist/: a plain dynamic import. From TypeScript sources (tests, tsx) the thread runs under tsx,
 * whose require hook loaded this file; Node 20 does not apply tsx's ESM hooks to a worker's dynamic
 * import(), so a .ts task module is loaded the same way as this file.
 */
const load = (url: string): Promise<Record<string, unknown>> =>
  url.endsWith('.ts')
    ? Promise.resolve(requireHere(fileURLToPath(url)) as Record<string, unknown>)
    : (import(url) as Promise<Record<string, unknown>>);

/** The function exported at a task's location, its module loaded once. */
async function exported(location: TaskLocation): Promise<(input: unknown) => unknown> {
  let loading = modules.get(location.module);
  if (!loading) modules.set(location.module, (loading = load(location.module)));
  const run = (await loading)[location.exportName];
  if (typeof run !== 'function') throw new Error(`compute task ${location.exportName} not found in ${location.module}`);
  return run as (input: unknown) => unknown;
}

async function computeWorker(request: ComputeRequest): Promise<ComputeResponse> {
  cancelIdleTrim();
  try {
    return await computeTask(request);
  } finally {
    scheduleIdleTrim(data?.idleTrimMs ?? 0);
  }
}

async function computeTask(request: ComputeRequest): Promise<ComputeResponse> {
  const run = await exported(request);
  const started = performance.now();
  request.released.length = 0; // not held through the task
  joinBody(request.input);
  const outcome: unknown = await run(request.input);
  const response: ComputeResponse = { outcome, durationMs: performance.now() - started };
  const transfer = ownedBuffers(outcome);
  // A movable result: piscina transfers these buffers to the caller instead of copying them.
  return (transfer.length ? move({ [transferableSymbol]: transfer, [valueSymbol]: response } as never) : response) as ComputeResponse;
}

/**
 * A body handed over as chunks (HandedInput, compute-pool.ts) joined, in place, into one array that owns its
 * buffer, as the task expects: the copy the event loop used to make as the bytes arrived (src/http/raw-body.ts),
 * made here instead. In place, so that the chunks are garbage once joined (a task drops its body once read).
 */
function joinBody(input: unknown): void {
  const handed = input as { body?: unknown } | null;
  if (!Array.isArray(handed?.body)) return;
  const chunks = handed.body as Uint8Array[];
  const joined = Buffer.allocUnsafeSlow(chunks.reduce((bytes, chunk) => bytes + chunk.byteLength, 0));
  let at = 0;
  for (const chunk of chunks) {
    joined.set(chunk, at);
    at += chunk.byteLength;
  }
  handed.body = joined;
}

/**
 * Array buffers of typed arrays in the outcome's output (two levels deep) that the arrays own whole:
 * moving a buffer shared with other data (a Buffer pool slice) would detach that data too.
 */
function ownedBuffers(outcome: unknown): ArrayBuffer[] {
  const output = (outcome as { ok?: boolean; output?: unknown }).output;
  const found = new Set<ArrayBuffer>();
  const visit = (value: unknown, depth: number) => {
    if (ArrayBuffer.isView(value)) {
      if (value.buffer instanceof ArrayBuffer && value.byteOffset === 0 && value.byteLength === value.buffer.byteLength)
        found.add(value.buffer);
    } else if (depth < 2 && value !== null && typeof value === 'object' && !Array.isArray(value)) {
      for (const v of Object.values(value)) visit(v, depth + 1);
    }
  };
  visit(output, 0);
  return [...found];
}

/** Runs the warm-up of workerData, if any, and reports it to the pool; never throws. */
async function warmUp(data: ComputeWorkerData | undefined): Promise<void> {
  const warm = data?.warmUp;
  if (!warm || warm.estimations <= 0) return;
  const started = performance.now();
  let error: string | undefined;
  try {
    await (
      await exported(warm.location)
    )(warm.estimations);
  } catch (err) {
    error = err instanceof Error ? err.message : String(err);
  }
  const message: WarmUpMessage = {
    warmUpReport: { threadId, durationMs: performance.now() - started, ...(error !== undefined ? { error } : {}) },
  };
  parentPort?.postMessage(message);
}

const data = workerData as ComputeWorkerData | undefined;

/** piscina's handler: the task function, or (with a warm-up) a promise of it resolved once the thread is warm. */
export default data?.warmUp && data.warmUp.estimations > 0
  ? warmUp(data).then(() => {
      scheduleIdleTrim(data.idleTrimMs);
      return computeWorker;
    })
  : computeWorker;
