/**
 * The worker pool's admission by memory (issue 14: "a large request could be admitted one at a time …
 * so two near-limit requests never overlap"): a first-come, first-served semaphore counted in bytes
 * (src/workers/compute-pool.ts MemoryBudget), and the estimate each request brings to it (the body
 * bytes times the measured cost per byte of its form, src/limits.ts). Semaphore semantics: common
 * practice (a counting semaphore with a FIFO wait queue; a request larger than the budget runs alone).
 */

import { describe, expect, it } from 'vitest';
import { DEFAULT_COMPUTE_MEMORY_BUDGET_MB, loadConfig } from '../../src/config.js';
import { taskMemoryBytes } from '../../src/http/plugins/compute-pool.js';
import {
  MAX_OBSERVATIONS,
  NETWORK_DAY_MEMORY_PER_STATION_OBSERVATION,
  TASK_MEMORY_PER_BODY_BYTE,
  ZWD_BODY_LIMIT_BYTES,
} from '../../src/limits.js';
import { ComputePool, ComputePoolFullError, MemoryBudget } from '../../src/workers/compute-pool.js';

const MB = 1024 * 1024;

/** Admits `bytes` and records the order in which admissions happen. */
function admitInto(budget: MemoryBudget, order: string[], name: string, bytes: number) {
  return budget.admit(bytes).then((release) => {
    order.push(name);
    return release;
  });
}
const settle = () => new Promise((r) => setTimeout(r, 0));

describe('MemoryBudget: tasks run while their bytes fit, in arrival order', () => {
  it('admits small tasks together up to the budget, and the next one when one is released', async () => {
    const budget = new MemoryBudget(100);
    const order: string[] = [];
    const a = admitInto(budget, order, 'a', 40);
    const b = admitInto(budget, order, 'b', 40);
    const c = admitInto(budget, order, 'c', 40); // 120 > 100: waits
    await settle();
    expect(order).toEqual(['a', 'b']);
    expect(budget.bytesInUse).toBe(80);
    expect(budget.queued).toBe(1);
    (await a)();
    await settle();
    expect(order).toEqual(['a', 'b', 'c']);
    expect(budget.bytesInUse).toBe(80);
    (await b)();
    (await c)();
    expect(budget.bytesInUse).toBe(0);
  });

  it('runs a task larger than the whole budget alone: after the running ones end, before any later one', async () => {
    const budget = new MemoryBudget(100);
    const order: string[] = [];
    const small = admitInto(budget, order, 'small', 10);
    const huge = admitInto(budget, order, 'huge', 500);
    const later = admitInto(budget, order, 'later', 10); // would fit, but arrived after the huge one
    await settle();
    expect(order).toEqual(['small']);
    expect(budget.mustWait(1)).toBe(true); // a task waits before any new one
    (await small)();
    await settle();
    expect(order).toEqual(['small', 'huge']);
    expect(budget.bytesInUse).toBe(500);
    (await huge)();
    await settle();
    expect(order).toEqual(['small', 'huge', 'later']);
    (await later)();
    expect(budget.bytesInUse).toBe(0);
    expect(budget.queued).toBe(0);
  });

  it('two near-limit tasks never overlap', async () => {
    const budget = new MemoryBudget(DEFAULT_COMPUTE_MEMORY_BUDGET_MB * MB);
    const near = taskMemoryBytes({ body: new Uint8Array(60 * MB), format: 'json' });
    let running = 0;
    let most = 0;
    const task = async () => {
      const release = await budget.admit(near);
      most = Math.max(most, ++running);
      await settle();
      running--;
      release();
    };
    await Promise.all([task(), task(), task()]);
    expect(most).toBe(1);
  });

  it('a release called twice counts once', async () => {
    const budget = new MemoryBudget(100);
    const release = await budget.admit(60);
    release();
    release();
    expect(budget.bytesInUse).toBe(0);
    const again = await budget.admit(100);
    expect(budget.bytesInUse).toBe(100);
    again();
  });
});

describe('taskMemoryBytes: body bytes × the cost per byte of the form', () => {
  it('JSON and Arrow bytes, CSV text; a task without a body is not held', () => {
    expect(taskMemoryBytes({ body: new Uint8Array(1000), format: 'json' })).toBe(1000 * TASK_MEMORY_PER_BODY_BYTE.json);
    expect(taskMemoryBytes({ body: new Uint8Array(1000), format: 'arrow' })).toBe(1000 * TASK_MEMORY_PER_BODY_BYTE.arrow);
    expect(taskMemoryBytes({ body: 'x'.repeat(1000), format: 'csv' })).toBe(1000 * TASK_MEMORY_PER_BODY_BYTE.csv);
    expect(taskMemoryBytes({ itemId: 7 })).toBe(0);
  });

  it('a task without a body that states its memory (a network day from deposits) is held by it', () => {
    // 50 stations × 2.37 M observations at 15 bytes (measured by `npm run bench -- network-day`): ~1.8 GB, alone.
    const networkDay = taskMemoryBytes({
      day: '2026-10-01',
      residuals: [],
      memoryBytes: 50 * 2.37e6 * NETWORK_DAY_MEMORY_PER_STATION_OBSERVATION,
    });
    expect(networkDay).toBe(50 * 2.37e6 * NETWORK_DAY_MEMORY_PER_STATION_OBSERVATION);
    expect(networkDay).toBeGreaterThan(DEFAULT_COMPUTE_MEMORY_BUDGET_MB * MB);
  });

  it('with the default budget, a 1-day request (2.3 MB of columns JSON) runs beside others and a body near the limit runs alone', () => {
    const budgetBytes = DEFAULT_COMPUTE_MEMORY_BUDGET_MB * MB;
    expect(3 * taskMemoryBytes({ body: new Uint8Array(2.3e6), format: 'json' })).toBeLessThan(budgetBytes);
    expect(taskMemoryBytes({ body: new Uint8Array(ZWD_BODY_LIMIT_BYTES / 2), format: 'json' })).toBeGreaterThan(budgetBytes);
    // MAX_OBSERVATIONS as Arrow (~35 bytes an observation, 30 GPS-like days measured) runs alone as well.
    expect(taskMemoryBytes({ body: new Uint8Array(MAX_OBSERVATIONS * 35), format: 'arrow' })).toBeGreaterThan(budgetBytes);
  });
});

describe('TROPODELAY_COMPUTE_MEMORY_BUDGET_MB', () => {
  it('defaults to the documented budget; 0 turns it off; other values are refused with the range', () => {
    expect(loadConfig({}).TROPODELAY_COMPUTE_MEMORY_BUDGET_MB).toBe(DEFAULT_COMPUTE_MEMORY_BUDGET_MB);
    expect(loadConfig({ TROPODELAY_COMPUTE_MEMORY_BUDGET_MB: '0' }).TROPODELAY_COMPUTE_MEMORY_BUDGET_MB).toBe(0);
    expect(() => loadConfig({ TROPODELAY_COMPUTE_MEMORY_BUDGET_MB: '-1' })).toThrow(
      /TROPODELAY_COMPUTE_MEMORY_BUDGET_MB="-1": must be a whole number in 0\.\.1048576/,
    );
  });
});

describe('ComputePool with a memory budget (real worker threads)', () => {
  const probe = { module: new URL('../helpers/pool-probe-task.ts', import.meta.url).href, exportName: 'threadIdTask' };
  type Tasks = { probe: (input: { waitMs?: number }) => Promise<{ ok: true; output: { threadId: number; observations: number } }> };

  it('a task over the whole budget runs alone on new threads, and they are replaced after it (their heaps given back)', async () => {
    const pool = new ComputePool<Tasks>({ threads: 2, queueLimit: 8, tasks: { probe }, memoryBudgetBytes: 1000 });
    try {
      const before = new Set<number>();
      for (const r of await Promise.all([1, 2, 3, 4].map(() => pool.run('probe', { waitMs: 20 }, [], 100)))) before.add(r.threadId);
      expect(pool.recycled).toBe(0);
      const huge = await pool.run('probe', {}, [], 5000);
      expect(before.has(huge.threadId)).toBe(false); // a new thread
      expect(pool.recycled).toBe(2); // before and after it
      const after = await pool.run('probe', {}, [], 100);
      expect(before.has(after.threadId)).toBe(false); // a new thread
    } finally {
      await pool.close();
    }
  }, 60_000);

  it('a full queue of tasks waiting for memory is a ComputePoolFullError', async () => {
    const pool = new ComputePool<Tasks>({ threads: 1, queueLimit: 1, tasks: { probe }, memoryBudgetBytes: 1000 });
    try {
      const first = pool.run('probe', { waitMs: 300 }, [], 800);
      const waiting = pool.run('probe', {}, [], 800); // waits for memory (the one queue place)
      await expect(pool.run('probe', {}, [], 800)).rejects.toBeInstanceOf(ComputePoolFullError);
      await Promise.all([first, waiting]);
    } finally {
      await pool.close();
    }
  }, 60_000);
});
