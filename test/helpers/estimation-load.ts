/**
 * Load for the worker pool, shared by test/ops/off-loop.test.ts (does health answer while the workers are
 * busy?) and bench/health-under-load.bench.ts (how fast does it answer then?): slow ZWD estimations from the
 * seeded residual generator, a raw HTTP POST that tells when its body has left, and a health poller.
 */

import { spawn } from 'node:child_process';
import { request as httpRequest } from 'node:http';
import { generateSyntheticResiduals, toRequestBody } from '../../scripts/synthetic-residuals.js';

/**
 * A /v1/zwd-estimates body whose estimation is slow on purpose: `grossErrors` gross errors in `hours` of 30 s
 * data, rejected one per solution (one full re-solve per rejected observation).
 */
export function slowEstimationBody(hours: number, seed: number, grossErrors = 12): string {
  const durationS = hours * 3600;
  const data = generateSyntheticResiduals({ seed, durationS, grossErrors });
  return JSON.stringify({ ...toRequestBody(data, { durationS }), options: { outlier_rejection: 'one-per-solution' } });
}

export interface PostAnswer {
  status: number;
  headers: Record<string, unknown>;
  body: string;
  /** performance.now() when the whole request body had been handed to the socket. */
  sentAt: number;
  /** performance.now() when the whole answer had arrived. */
  answeredAt: number;
}

export interface PostInFlight {
  /** Resolves when the whole request body has been handed to the socket. */
  sent: Promise<void>;
  answer: Promise<PostAnswer>;
}

/** POSTs a JSON `body` to `path` with node:http (no client-side pooling or buffering surprises). */
export function postJson(baseUrl: string, path: string, body: string): PostInFlight {
  let sentAt = 0;
  let markSent!: () => void;
  const sent = new Promise<void>((resolve) => (markSent = resolve));
  const answer = new Promise<PostAnswer>((resolve, reject) => {
    const req = httpRequest(
      new URL(path, baseUrl),
      { method: 'POST', headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () =>
          resolve({
            status: res.statusCode!,
            headers: res.headers,
            body: Buffer.concat(chunks).toString('utf8'),
            sentAt,
            answeredAt: performance.now(),
          }),
        );
      },
    );
    req.on('error', reject);
    req.on('finish', () => {
      sentAt = performance.now();
      markSent();
    });
    req.end(body);
  });
  return { sent, answer };
}

/**
 * Polls `url` for `durationMs` from a Node process of its own (so that the caller's event loop, busy sending
 * load, adds nothing to what is measured), `pauseMs` between answers. Resolves with the latencies [ms] of the
 * answers; rejects if one is not 200.
 */
export function probeLatenciesMs(url: string, durationMs: number, pauseMs = 25): Promise<number[]> {
  const script = `
    const out = [];
    (async () => {
      await (await fetch(${JSON.stringify(url)})).text(); // the first fetch of a process loads the HTTP client
      const until = performance.now() + ${durationMs};
      while (performance.now() < until) {
        const t0 = performance.now();
        const r = await fetch(${JSON.stringify(url)});
        await r.text();
        if (r.status !== 200) { console.error('status ' + r.status); process.exit(1); }
        out.push(performance.now() - t0);
        await new Promise((r) => setTimeout(r, ${pauseMs}));
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
