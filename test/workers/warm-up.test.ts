/**
 * The pool's warm-up at start (ComputePool.start, compute-worker.ts): every thread runs it once before it
 * takes a task, and reports it; a failure is reported and the thread still serves; none without a count.
 * Real worker threads with the probe tasks of test/helpers/pool-probe-task.ts (the warm-up there marks its
 * thread after 300 ms, so a task that ran before it would see no mark).
 */

import { describe, expect, it } from 'vitest';
import { ComputePool, type TaskLocation } from '../../src/workers/compute-pool.js';

const probeModule = new URL('../helpers/pool-probe-task.ts', import.meta.url).href;
const mark = { module: probeModule, exportName: 'warmMarkTask' };
type Tasks = {
  mark: (input: {
    waitMs?: number;
  }) => Promise<{ ok: true; output: { threadId: number; warmedUpWith: number | undefined; observations: number } }>;
};

function pool(threads: number, warmUp: TaskLocation | undefined, estimations: number): ComputePool<Tasks> {
  return new ComputePool<Tasks>({
    threads,
    queueLimit: 64,
    tasks: { mark },
    ...(warmUp ? { warmUp: { location: warmUp, estimations } } : {}),
  });
}

describe('ComputePool.start: the warm-up of every thread', () => {
  it('reaches each of 3 threads, each before its first task, even for tasks handed over at once', async () => {
    const p = pool(3, { module: probeModule, exportName: 'warmUpProbe' }, 7);
    try {
      const reports = p.start();
      // Handed over while the threads warm: each must wait for its own thread's warm-up.
      const early = await Promise.all(Array.from({ length: 12 }, () => p.run('mark', { waitMs: 40 })));
      const all = await reports;
      expect(all).toHaveLength(3);
      const warmed = new Set(all.map((r) => r.threadId));
      expect(warmed.size).toBe(3); // three distinct threads reported
      for (const r of all) {
        expect(r.error).toBeUndefined();
        expect(r.durationMs).toBeGreaterThanOrEqual(250); // the probe waits 300 ms (timer slack: common practice)
      }
      for (const out of early) {
        expect(out.warmedUpWith).toBe(7); // the count reached the thread, and its warm-up ran before this task
        expect(warmed.has(out.threadId)).toBe(true);
      }
      expect(new Set(early.map((o) => o.threadId)).size).toBeGreaterThan(1); // the tasks were spread, not one warm thread
    } finally {
      await p.close();
    }
  });

  it('a failed warm-up is reported with its reason, and the thread still takes tasks', async () => {
    const p = pool(2, { module: probeModule, exportName: 'failingWarmUp' }, 3);
    try {
      const all = await p.start();
      expect(all).toHaveLength(2);
      for (const r of all) expect(r.error).toBe('invented failure of a warm-up of 3');
      const out = await p.run('mark', {});
      expect(out.warmedUpWith).toBeUndefined();
    } finally {
      await p.close();
    }
  });

  it('0 estimations: no warm-up runs, the threads start at once', async () => {
    const p = pool(2, { module: probeModule, exportName: 'warmUpProbe' }, 0);
    try {
      expect(await p.start()).toEqual([]);
      const outs = await Promise.all([1, 2, 3, 4].map(() => p.run('mark', { waitMs: 20 })));
      for (const out of outs) expect(out.warmedUpWith).toBeUndefined();
    } finally {
      await p.close();
    }
  });

  it('without start() the threads start cold with the first task (the in-process apps of the tests)', async () => {
    const p = pool(1, { module: probeModule, exportName: 'warmUpProbe' }, 5);
    try {
      expect((await p.run('mark', {})).warmedUpWith).toBeUndefined();
    } finally {
      await p.close();
    }
  });
});
