/**
 * The estimation workers warmed at start (TROPODELAY_WARM_UP_ESTIMATIONS, src/http/plugins/compute-pool.ts,
 * src/http/tasks/warm-up.ts), as server.ts starts them (buildApp's `startWorkers`): /v1/ready not ready with
 * the check `compute_warm_up` until every thread has run the real request task on the invented slice, liveness
 * unaffected, requests served meanwhile, one info line and nothing in the metrics, and the same answer bytes
 * as a cold service. Expected values: the brief of the warm-up (issue 14) and common practice. The setting's
 * default and range: test/ops/config.test.ts.
 */

import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultConfig } from '../../src/config.js';
import { buildApp } from '../../src/http/app.js';
import { loggerOptions } from '../../src/http/logger-options.js';
import { warmUpBody } from '../../src/http/tasks/warm-up.js';
import { columnsJson, dayRequest } from '../helpers/gps-like-days.js';
import { collector, type LogLine } from '../helpers/log-lines.js';

/** An invented 3-hour slice of the simulated sky (test/helpers/realistic-sky.ts), not the warm-up's own. */
const body = Buffer.from(columnsJson(dayRequest({ durationS: 3 * 3600, grossErrors: 3 }))).toString('utf8');

/** The estimation's answer as bytes (fastify's inject: the bytes the route sends). */
const estimate = async (app: FastifyInstance) => {
  const res = await app.inject({
    method: 'POST',
    url: '/v1/zwd-estimates',
    headers: { 'content-type': 'application/json' },
    payload: body,
  });
  return { status: res.statusCode, bytes: res.rawPayload };
};

describe('the invented warm-up slice', () => {
  it('is a valid estimation request of 30 s epochs over three hours above 7°', () => {
    const parsed = JSON.parse(Buffer.from(warmUpBody()).toString('utf8')) as {
      observations: { epoch: string[]; elevation_deg: number[]; satellite: string[] };
    };
    const { epoch, elevation_deg, satellite } = parsed.observations;
    const epochs = new Set(epoch);
    expect(epochs.size).toBe(360); // 3 h / 30 s
    expect(Math.min(...elevation_deg)).toBeGreaterThanOrEqual(7);
    // A GPS-like sky has about 8–12 satellites above 7° at a mid-latitude site (common practice).
    const perEpoch = epoch.length / epochs.size;
    expect(perEpoch).toBeGreaterThan(6);
    expect(perEpoch).toBeLessThan(14);
    expect(new Set(satellite).size).toBeLessThanOrEqual(30);
  });
});

describe('a service started warm (2 threads, 2 estimations each)', () => {
  let app: FastifyInstance;
  let lines: LogLine[];
  let firstReady: request.Response;
  let early: ReturnType<typeof estimate>;
  beforeAll(async () => {
    const c = collector();
    lines = c.lines;
    const config = defaultConfig({ ESTIMATION_WORKERS: 2, TROPODELAY_WARM_UP_ESTIMATIONS: 2, LOG_LEVEL: 'info' });
    app = await buildApp({ config, logger: loggerOptions(config, c.stream), startWorkers: true, validateResponses: true });
    // At once: the threads are still loading the task modules (seconds under tsx) and warming.
    early = estimate(app);
    firstReady = await request(app.server).get('/v1/ready');
  });
  afterAll(async () => {
    await app.close();
  });

  it('answers /v1/ready 503 not-ready, naming the check compute_warm_up, while liveness is 200', async () => {
    expect(firstReady.status).toBe(503);
    expect(firstReady.body.status).toBe('not-ready');
    expect(firstReady.body.checks.compute_warm_up).toMatch(/warming up \(2 estimations each\)/);
    await request(app.server).get('/v1/health').expect(200);
  });

  it('serves an estimation that arrives during the warm-up', async () => {
    expect(firstReady.status).toBe(503); // it was sent before this answer, so while warming
    expect((await early).status).toBe(200);
  });

  it('is ready once every thread reported, each a distinct thread, none failed; one info line, nothing in the metrics', async () => {
    const reports = await app.compute.warmUp;
    expect(reports).toHaveLength(2);
    expect(new Set(reports.map((r) => r.threadId)).size).toBe(2);
    for (const r of reports) expect(r.error).toBeUndefined();
    const ready = await request(app.server).get('/v1/ready').expect(200);
    expect(ready.body.checks.compute_warm_up).toBe('ok');
    const warmLines = lines.filter((l) => l['msg'] === 'compute workers warmed up');
    expect(warmLines).toHaveLength(1);
    expect(warmLines[0]).toMatchObject({ level: 'info', threads: 2, estimations: 2 });
    expect(lines.filter((l) => typeof l['msg'] === 'string' && /warm/.test(l['msg']))).toHaveLength(1);
    expect(lines.some((l) => l['msg'] === 'readiness check failed')).toBe(false); // not-ready while warming is not a failure
    // Only the one request of the test went through the pool's metrics, not the 4 warm-up estimations.
    const metrics = (await request(app.server).get('/metrics')).text;
    expect(/tropodelay_compute_duration_seconds_count\{task="zwd-estimate-request"\} (\d+)/.exec(metrics)?.[1]).toBe('1');
  });
});

describe('the answer is the same with and without the warm-up', () => {
  let warm: FastifyInstance;
  let cold: FastifyInstance;
  beforeAll(async () => {
    warm = await buildApp({ config: { ESTIMATION_WORKERS: 1, TROPODELAY_WARM_UP_ESTIMATIONS: 3 }, startWorkers: true });
    cold = await buildApp({ config: { ESTIMATION_WORKERS: 1, TROPODELAY_WARM_UP_ESTIMATIONS: 0 }, startWorkers: true });
  });
  afterAll(async () => {
    await Promise.all([warm.close(), cold.close()]);
  });

  it('byte for byte, after the warm-up has run', async () => {
    expect(await warm.compute.warmUp).toHaveLength(1);
    expect(await cold.compute.warmUp).toEqual([]); // 0: no warm-up ran
    const a = await estimate(warm);
    const b = await estimate(cold);
    expect(a.status).toBe(200);
    expect(b.status).toBe(200);
    expect(a.bytes.length).toBeGreaterThan(1000);
    expect(a.bytes.equals(b.bytes)).toBe(true);
  });

  it('0: /v1/ready has no warm-up check and is ready at once', async () => {
    const ready = await request(cold.server).get('/v1/ready').expect(200);
    expect(ready.body.checks.compute_warm_up).toBeUndefined();
  });
});
