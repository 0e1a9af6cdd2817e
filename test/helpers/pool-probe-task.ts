/** A compute task for the pool's own tests: answers the worker thread's id (after `waitMs`). */

import { threadId } from 'node:worker_threads';

export async function threadIdTask(input: { waitMs?: number }): Promise<{ ok: true; output: { threadId: number; observations: number } }> {
  if (input.waitMs) await new Promise((r) => setTimeout(r, input.waitMs));
  return { ok: true, output: { threadId, observations: 0 } };
}
