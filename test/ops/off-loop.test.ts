/**
 * Estimations run in worker threads: health stays responsive while they saturate the CPU, a full
 * queue answers 503 with Retry-After, and a SIGTERM lets an estimation in flight finish.
 * The service runs in its own process here, as in production.
 */

import { spawn } from 'node:child_process';
import { request as httpRequest } from 'node:http';
import { afterEach, describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { startServerProcess, type ServerProcess } from '../helpers/server-process.js';

let server: ServerProcess | undefined;
afterEach(async () => {
  await server?.stop();
  server = undefined;
});

/** A request whose estimation is slow on purpose: gross errors rejected one per solution. */
function slowEstimationBody(hours: number, seed: number): string {
  const data = generateSyntheticResiduals({ seed, durationS: hours * 3600, grossErrors: 12 });
  return JSON.stringify({ ...toRequestBody(data, { durationS: hours * 3600 }), options: { outlier_rejection: 'one-per-solution' } });
}

function post(baseUrl: string, path: string, body: string): Promise<{ status: number; headers: Record<string, unknown>; body: string; sentAt: number }> {
  return new Promise((resolve, reject) => {
    const url = new URL(path, baseUrl);
    let sentAt = 0;
    const req = httpRequest(url, { method: 'POST', headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks).toString('utf8'), sentAt }));
    });
    req.on('error', reject);
    req.on('finish', () => (sentAt = performance.now()));
    req.end(body);
  });
}

/** Polls `url` every 25 ms for `durationMs` from a separate Node process; the latencies [ms] of 200 answers. */
function probeHealth(url: string, durationMs: number): Promise<number[]> {
  const script = `
    const out = [];
    let until;
    (async () => {
      await (await fetch(${JSON.stringify(url)})).text(); // the first fetch of a process loads the HTTP client
      until = performance.now() + ${durationMs};
      while (performance.now() < until) {
        const t0 = performance.now();
        const r = await fetch(${JSON.stringify(url)});
        await r.text();
        if (r.status !== 200) { console.error('status ' + r.status); process.exit(1); }
        out.push(performance.now() - t0);
        await new Promise((r) => setTimeout(r, 25));
      }
      process.stdout.write(JSON.stringify(out));
    })();`;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['-e', script], { stdio: ['ignore', 'pipe', 'inherit'] });
    let text = '';
    child.stdout.on('data', (d: Buffer) => (text += d.toString('utf8')));
    child.on('exit', (code) => (code === 0 ? resolve(JSON.parse(text) as number[]) : reject(new Error(`health probe exited ${code}`))));
  });
}

describe('estimation off the event loop', () => {
  it('GET /v1/health answers in under 100 ms while estimations keep the workers busy', async () => {
    server = await startServerProcess({ ESTIMATION_WORKERS: '2', ESTIMATION_QUEUE_LIMIT: '64' });
    const bodies = [1, 2, 3, 4].map((seed) => slowEstimationBody(6, seed));
    let running = true;
    const load = bodies.map(async (body) => {
      let done = 0;
      while (running) {
        const r = await post(server!.baseUrl, '/v1/zwd-estimates', body);
        expect(r.status).toBe(200);
        done++;
      }
      return done;
    });
    await new Promise((r) => setTimeout(r, 1000)); // let the load build up
    // The health probe runs in a process of its own, so that the load generator's event loop here
    // does not add to the latencies it measures.
    const latenciesMs = await probeHealth(`${server.baseUrl}/v1/health`, 4000);
    running = false;
    const completed = (await Promise.all(load)).reduce((a, b) => a + b, 0);
    latenciesMs.sort((a, b) => a - b);
    expect(completed).toBeGreaterThan(4); // the estimations did run meanwhile
    expect(latenciesMs.length).toBeGreaterThan(50);
    expect(latenciesMs.at(-1)!, `health latencies (ms), slowest last: ${latenciesMs.slice(-5).map((x) => x.toFixed(1)).join(', ')}`).toBeLessThan(100);
  }, 60_000);

  it('a full queue answers 503 with Retry-After rather than piling work up', async () => {
    server = await startServerProcess({ ESTIMATION_WORKERS: '1', ESTIMATION_QUEUE_LIMIT: '1' });
    const body = slowEstimationBody(6, 7);
    const answers = await Promise.all([1, 2, 3, 4, 5, 6].map(() => post(server!.baseUrl, '/v1/zwd-estimates', body)));
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
    const answer = post(server.baseUrl, '/v1/zwd-estimates', body);
    // SIGTERM as soon as the whole request has been sent.
    await new Promise<void>((resolve) => {
      const poll = setInterval(() => {
        void answer; // keep the promise referenced
        resolve();
        clearInterval(poll);
      }, 50);
    });
    const exited = new Promise<number | null>((resolve) => server!.child.once('exit', (code) => resolve(code)));
    server.child.kill('SIGTERM');
    const r = await answer;
    expect(r.status).toBe(200);
    expect(JSON.parse(r.body).zwd_nodes.length).toBeGreaterThan(100);
    expect(await exited).toBe(0);
    // and it no longer accepts connections
    await expect(fetch(`${server.baseUrl}/v1/health`)).rejects.toThrow();
  }, 60_000);
});
