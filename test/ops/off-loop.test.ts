/**
 * Estimations run in worker threads: health stays responsive while they saturate the CPU, a full
 * queue answers 503 with Retry-After, and a SIGTERM lets an estimation in flight finish.
 * The service runs in its own process here, as in production.
 */

import { setTimeout as sleep } from 'node:timers/promises';
import { afterEach, describe, expect, it } from 'vitest';
import { postJson, slowEstimationBody } from '../helpers/estimation-load.js';
import { startServerProcess, type ServerProcess } from '../helpers/server-process.js';

let server: ServerProcess | undefined;
afterEach(async () => {
  await server?.stop();
  server = undefined;
});

/**
 * Loose on purpose: this shows that health is not queued behind an estimation (which takes seconds here), not
 * how fast it answers. That figure (p50/p99 under the same load) is measured by `npm run bench -- health`.
 */
const HEALTH_BOUND_MS = 2000;

describe('estimation off the event loop', () => {
  it(`GET /v1/health answers while both workers are busy with estimations, each answer within ${HEALTH_BOUND_MS} ms`, async () => {
    server = await startServerProcess({ ESTIMATION_WORKERS: '2', ESTIMATION_QUEUE_LIMIT: '64' });
    // Two estimations of one day with 50 gross errors rejected one per solution (about 50 re-solves
    // each, about a second of CPU), one per worker: until the first of them answers, both workers are busy.
    const requests = [1, 2].map((seed) => postJson(server!.baseUrl, '/v1/zwd-estimates', slowEstimationBody(24, seed, 50)));
    await Promise.all(requests.map((r) => r.sent));
    const busySince = performance.now();
    let firstAnsweredAt = Infinity;
    for (const r of requests)
      void r.answer.then(
        (a) => (firstAnsweredAt = Math.min(firstAnsweredAt, a.answeredAt)),
        () => undefined,
      );

    const health: { latencyMs: number; answeredAt: number }[] = [];
    while (firstAnsweredAt === Infinity) {
      const t0 = performance.now();
      const r = await fetch(`${server.baseUrl}/v1/health`);
      await r.text();
      expect(r.status).toBe(200);
      const answeredAt = performance.now();
      health.push({ latencyMs: answeredAt - t0, answeredAt });
      await sleep(10);
    }
    const answers = await Promise.all(requests.map((r) => r.answer));

    expect(answers.map((a) => a.status)).toEqual([200, 200]);
    // Health answered while neither estimation had answered yet: it does not wait for the workers.
    const whileBusy = health.filter((h) => h.answeredAt < firstAnsweredAt);
    const busyS = ((firstAnsweredAt - busySince) / 1000).toFixed(2);
    expect(whileBusy.length, `health answers during the ${busyS} s before the first estimation answered`).toBeGreaterThanOrEqual(5);
    const slowest = Math.max(...health.map((h) => h.latencyMs));
    expect(slowest, `slowest of ${health.length} health answers [ms]; first estimation answered after ${busyS} s`).toBeLessThan(
      HEALTH_BOUND_MS,
    );
  }, 120_000);

  it('a full queue answers 503 with Retry-After rather than piling work up', async () => {
    server = await startServerProcess({ ESTIMATION_WORKERS: '1', ESTIMATION_QUEUE_LIMIT: '1' });
    const body = slowEstimationBody(6, 7);
    const answers = await Promise.all([1, 2, 3, 4, 5, 6].map(() => postJson(server!.baseUrl, '/v1/zwd-estimates', body).answer));
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses).toContain(200);
    expect(statuses).toContain(503);
    const refused = answers.find((a) => a.status === 503)!;
    expect(Number(refused.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    expect(JSON.parse(refused.body).detail).toMatch(/queue is full/);
  }, 60_000);

  it('an estimation in flight when SIGTERM arrives still completes with 200, and the process exits 0', async () => {
    server = await startServerProcess();
    const body = slowEstimationBody(12, 11);
    const request = postJson(server.baseUrl, '/v1/zwd-estimates', body);
    // SIGTERM once the service has the request: its bytes reached the socket before a health request on
    // another connection was sent, and the event loop that answers health has read them by then.
    await request.sent;
    expect((await fetch(`${server.baseUrl}/v1/health`)).status).toBe(200);
    const exited = new Promise<number | null>((resolve) => server!.child.once('exit', (code) => resolve(code)));
    server.child.kill('SIGTERM');
    const r = await request.answer;
    expect(r.status).toBe(200);
    expect(JSON.parse(r.body).zwd_nodes.length).toBeGreaterThan(100);
    expect(await exited).toBe(0);
    // and it no longer accepts connections
    await expect(fetch(`${server.baseUrl}/v1/health`)).rejects.toThrow();
  }, 60_000);
});
