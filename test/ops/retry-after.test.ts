/**
 * Retry-After of a refused estimation comes from the real queue (issue 11, item 13: "Retry-After
 * always says 1 s while queued requests wait up to 6.4 s"): the work ahead, (queued + running) tasks
 * of the mean run time, spread over the worker threads. Queueing arithmetic, common practice.
 */

import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { retryAfterEstimateS } from '../../src/workers/compute-pool.js';
import { startServerProcess } from '../helpers/server-process.js';

describe('retryAfterEstimateS: work ahead / threads, rounded up to whole seconds, at least 1', () => {
  it.each([
    // queued, running, threads, mean run time [s], expected [s]
    [6, 1, 1, 0.9, 7], // 7 tasks × 0.9 s on one thread = 6.3 s → 7
    [6, 2, 2, 0.9, 4], // 8 × 0.9 / 2 = 3.6 → 4
    [0, 1, 4, 0.2, 1], // under a second: the header's floor
    [31, 1, 1, 2.5, 80], // 32 × 2.5 = 80 exactly
  ])('queued %i, running %i, threads %i, mean %f s → %i s', (queued, running, threads, meanRunS, expected) => {
    expect(retryAfterEstimateS({ queued, running, threads, meanRunS })).toBe(expected);
  });

  it('takes 1 s per task before any task has been measured', () => {
    expect(retryAfterEstimateS({ queued: 3, running: 1, threads: 1, meanRunS: null })).toBe(4);
  });
});

describe('a refused estimation through a real server', () => {
  it('carries Retry-After = ceil((1 queued + 1 running) × the measured run time / 1 thread)', async () => {
    const server = await startServerProcess({ ESTIMATION_WORKERS: '1', ESTIMATION_QUEUE_LIMIT: '1' });
    try {
      const data = generateSyntheticResiduals({ seed: 21, durationS: 6 * 3600, grossErrors: 12 });
      const body = JSON.stringify({ ...toRequestBody(data, { durationS: 6 * 3600 }), options: { outlier_rejection: 'one-per-solution' } });
      const post = () =>
        fetch(`${server.baseUrl}/v1/zwd-estimates`, { method: 'POST', headers: { 'content-type': 'application/json' }, body });
      expect((await post()).status).toBe(200);
      // The run time the pool measured, as the metrics report it (one task so far: the mean is that task).
      const metrics = await (await fetch(`${server.baseUrl}/metrics`)).text();
      const sum = Number(/tropodelay_compute_duration_seconds_sum\{[^}]*\} ([0-9.e+-]+)/.exec(metrics)![1]);
      const count = Number(/tropodelay_compute_duration_seconds_count\{[^}]*\} ([0-9]+)/.exec(metrics)![1]);
      expect(count).toBe(1);

      const answers = await Promise.all(Array.from({ length: 6 }, post));
      const refused = answers.filter((r) => r.status === 503);
      expect(refused.length).toBeGreaterThanOrEqual(1);
      for (const r of refused) expect(Number(r.headers.get('retry-after'))).toBe(Math.max(1, Math.ceil((2 * sum) / 1)));
      await Promise.all(answers.map((r) => r.arrayBuffer()));
    } finally {
      await server.stop();
    }
  }, 60_000);
});
