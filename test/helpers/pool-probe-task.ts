/** Compute tasks for the pool's own tests. */

import { createHash } from 'node:crypto';
import { getHeapSpaceStatistics } from 'node:v8';
import { threadId } from 'node:worker_threads';
import { idleTrimCounts } from '../../src/workers/idle-trim.js';

/** Answers the worker thread's id (after `waitMs`). */
export async function threadIdTask(input: { waitMs?: number }): Promise<{ ok: true; output: { threadId: number; observations: number } }> {
  if (input.waitMs) await new Promise((r) => setTimeout(r, input.waitMs));
  return { ok: true, output: { threadId, observations: 0 } };
}

/** What the task sees of its body (one array: its length, its SHA-256, whether it owns its buffer), and `size` bytes back. */
export async function bodyProbeTask(input: { body: Uint8Array; size: number }): Promise<{
  ok: true;
  output: { length: number; sha256: string; ownsBuffer: boolean; json: Uint8Array; observations: number };
}> {
  const { body } = input;
  return {
    ok: true,
    output: {
      length: body.byteLength,
      sha256: createHash('sha256').update(body).digest('hex'),
      ownsBuffer: body instanceof Uint8Array && body.byteOffset === 0 && body.byteLength === body.buffer.byteLength,
      json: new Uint8Array(input.size).fill(7),
      observations: 0,
    },
  };
}

/**
 * Runs until the test opens its gate (Atomics.store(gate, 0, 1) and Atomics.notify on the shared array): a task
 * held on its thread for exactly as long as the test needs, whatever the machine's load.
 */
export async function gatedTask(input: { gate: Int32Array }): Promise<{ ok: true; output: { threadId: number; observations: number } }> {
  Atomics.wait(input.gate, 0, 0);
  return { ok: true, output: { threadId, observations: 0 } };
}

/** Where this thread's warm-up probe left its mark (globalThis: the same thread, whatever module instance reads it). */
const warmMark = globalThis as { warmUpProbeRan?: { estimations: number; atMs: number } };

/** A warm-up for the pool's tests: waits 300 ms (so that tasks handed over meanwhile must wait), then marks the thread. */
export async function warmUpProbe(estimations: number): Promise<void> {
  await new Promise((r) => setTimeout(r, 300));
  warmMark.warmUpProbeRan = { estimations, atMs: performance.now() };
}

/** A warm-up that fails. */
export async function failingWarmUp(estimations: number): Promise<void> {
  await Promise.resolve();
  throw new Error(`invented failure of a warm-up of ${estimations}`);
}

/** The thread's id and what its warm-up probe left (undefined when none ran before this task). */
export async function warmMarkTask(input: { waitMs?: number }): Promise<{
  ok: true;
  output: { threadId: number; warmedUpWith: number | undefined; observations: number };
}> {
  const warmedUpWith = warmMark.warmUpProbeRan?.estimations;
  if (input.waitMs) await new Promise((r) => setTimeout(r, input.waitMs));
  return { ok: true, output: { threadId, warmedUpWith, observations: 0 } };
}

/**
 * The thread's young generation (V8's new space: its resident bytes, physical_space_size) and its idle trims so far
 * (src/workers/idle-trim.ts); with `grow`, first allocates objects that survive a few scavenges each (a window
 * of 200 000 small objects renewed 15 times), which makes V8 grow the young generation, as a request does.
 */
export async function youngGenerationTask(input: { grow?: boolean }): Promise<{
  ok: true;
  output: { threadId: number; newSpaceBytes: number; idleCollections: number; idleTrims: number; observations: number };
}> {
  if (input.grow) {
    let kept: { i: number; a: number[] }[] = [];
    for (let i = 0; i < 3_000_000; i++) {
      kept.push({ i, a: [i] });
      if (kept.length > 200_000) kept = [];
    }
  }
  const idle = idleTrimCounts();
  const newSpace = getHeapSpaceStatistics().find((s) => s.space_name === 'new_space')!;
  return {
    ok: true,
    output: {
      threadId,
      newSpaceBytes: newSpace.physical_space_size,
      idleCollections: idle.collections,
      idleTrims: idle.trims,
      observations: 0,
    },
  };
}
