/**
 * Retry-After counts the tasks waiting for memory (TROPODELAY_COMPUTE_MEMORY_BUDGET_MB): a refused request's
 * hint is when the tasks ahead of it will have run, replaying the pool's own rules (threads taking tasks in
 * order, the memory budget admitting them first come first served as bytes come back) with each task's run
 * time estimated from the pool's measurements (src/workers/compute-pool.ts memoryAwareRetryAfterS,
 * estimatedRunS). Expected values: list scheduling worked by hand for each case (queueing arithmetic, common
 * practice); the pool test holds its tasks on their threads with a gate the test opens, and takes the run
 * time from the pool's own statistics, so nothing depends on how fast the machine is.
 */

import { describe, expect, it } from 'vitest';
import {
  ComputePool,
  ComputePoolFullError,
  MemoryBudget,
  memoryAwareRetryAfterS,
  retryAfterEstimateS,
} from '../../src/workers/compute-pool.js';

const t = (runS: number, bytes: number) => ({ runS, bytes });

describe('memoryAwareRetryAfterS: when the tasks ahead will have run, by the pool rules', () => {
  it.each([
    // label, threads, budget, handed (on the threads first), waiting for memory, expected [s]
    ['nothing waits for memory: two waves of two on two threads', 2, 1000, [t(1.5, 100), t(1.5, 100), t(1.5, 100)], [], 3],
    ['two waiting 600-byte tasks of 1 s run one after the other (600 + 600 > 1000)', 2, 1000, [t(1, 600)], [t(1, 600), t(1, 600)], 3],
    ['the same tasks of 400 bytes run two at a time', 2, 1000, [t(1, 400)], [t(1, 400), t(1, 400)], 2],
    ['a task over the whole budget runs alone after the running ones', 4, 1000, [t(0.5, 100), t(0.25, 0)], [t(6, 5000), t(0.5, 100)], 7],
    ['a 30-day task waiting behind a day: its own run time counts, not the mean', 2, 1000, [t(0.5, 50)], [t(12.5, 2000)], 13],
    ['tasks not held by the budget only wait for a thread', 1, 1000, [t(0.25, 0), t(0.25, 0), t(0.25, 0)], [], 1],
  ] as const)('%s', (_label, threads, budgetBytes, handed, waiting, expected) => {
    expect(memoryAwareRetryAfterS({ threads, budgetBytes, handed, waiting })).toBe(expected);
  });

  it('without memory waits and with one run time it agrees with the queue part, (queued + running) × mean ÷ threads', () => {
    for (const [tasks, threads] of [
      [7, 1],
      [8, 2],
      [1, 4],
      [32, 1],
      [12, 4],
    ] as const) {
      const handed = Array.from({ length: tasks }, () => t(0.9, 10));
      expect(memoryAwareRetryAfterS({ threads, budgetBytes: 1000, handed, waiting: [] })).toBe(
        retryAfterEstimateS({ queued: tasks - Math.min(tasks, threads), running: Math.min(tasks, threads), threads, meanRunS: 0.9 }),
      );
    }
  });

  it('at least 1 s when nothing is ahead', () => {
    expect(memoryAwareRetryAfterS({ threads: 2, budgetBytes: 1000, handed: [], waiting: [] })).toBe(1);
  });
});

describe('MemoryBudget.admit tells the moment a task is admitted (so a task admitted and not yet on a thread is not counted as waiting)', () => {
  it('at once when the bytes fit, and at the release that lets a waiting task in, before its promise settles', async () => {
    const budget = new MemoryBudget(1000);
    const seen: string[] = [];
    const first = budget.admit(600, () => seen.push('first'));
    expect(seen).toEqual(['first']); // synchronously
    const second = budget.admit(600, () => seen.push('second'));
    expect(seen).toEqual(['first']);
    (await first)();
    expect(seen).toEqual(['first', 'second']); // in the release itself
    (await second)();
  });
});

describe('ComputePool: a refusal with tasks held by the memory budget (real worker threads)', () => {
  const tasks = {
    probe: { module: new URL('../helpers/pool-probe-task.ts', import.meta.url).href, exportName: 'threadIdTask' },
    gated: { module: new URL('../helpers/pool-probe-task.ts', import.meta.url).href, exportName: 'gatedTask' },
  };
  type Out = Promise<{ ok: true; output: { threadId: number; observations: number } }>;
  type Tasks = { probe: (input: { waitMs?: number }) => Out; gated: (input: { gate: Int32Array }) => Out };

  // Two threads and a budget of 1000 bytes: tasks of 600 bytes run one at a time although a thread is free.
  it.each([1, 3])(
    'with %i task(s) waiting for memory behind a running one, Retry-After = (1 + waiting) × their run time, not ÷ 2 threads',
    async (waitingTasks) => {
      const pool = new ComputePool<Tasks>({ threads: 2, queueLimit: waitingTasks, tasks, memoryBudgetBytes: 1000 });
      const gate = new Int32Array(new SharedArrayBuffer(4));
      try {
        // Calibration: the pool measures a 600-byte run of 0.8 s (its statistics, not this test's clock, count).
        await pool.run('probe', { waitMs: 800 }, [], 600);
        // The gated task's own runs have not been measured; a 600-byte one is estimated from the pool's statistics.
        const runS = pool.estimatedRunS('gated', 600);
        expect(runS).toBeGreaterThanOrEqual(0.79);
        const running = pool.run('gated', { gate }, [], 600);
        const waiting = Array.from({ length: waitingTasks }, () => pool.run('gated', { gate }, [], 600));
        const refused = await pool.run('gated', { gate }, [], 600).catch((err: unknown) => err);
        expect(refused).toBeInstanceOf(ComputePoolFullError);
        const retryAfterS = (refused as ComputePoolFullError).retryAfterS;
        expect(retryAfterS).toBe(Math.ceil((1 + waitingTasks) * runS));
        // The queue part alone spreads the same tasks over the two threads: a shorter, wrong hint.
        expect(retryAfterS).toBeGreaterThan(retryAfterEstimateS({ queued: waitingTasks, running: 1, threads: 2, meanRunS: runS }));
        Atomics.store(gate, 0, 1);
        Atomics.notify(gate, 0);
        await Promise.all([running, ...waiting]);
      } finally {
        Atomics.store(gate, 0, 1);
        Atomics.notify(gate, 0);
        await pool.close();
      }
    },
    60_000,
  );

  it('a 30-day-like task ahead counts by its size: estimatedRunS scales the measured run time per byte', async () => {
    const pool = new ComputePool<Tasks>({ threads: 1, queueLimit: 4, tasks, memoryBudgetBytes: 10_000 });
    try {
      await pool.run('probe', { waitMs: 50 }, [], 100);
      const perHundred = pool.estimatedRunS('probe', 100);
      expect(pool.estimatedRunS('probe', 3000)).toBeCloseTo(30 * perHundred, 12);
      // Tasks not held by the budget (0 bytes) take the mean of every run.
      expect(pool.estimatedRunS('probe', 0)).toBe(perHundred);
    } finally {
      await pool.close();
    }
  }, 60_000);
});
