/**
 * Health latency while estimations keep both workers busy: what a load balancer's health check pays when the
 * service is computing. `GET /v1/health` is polled every 25 ms from a Node process of its own, first on an idle
 * service, then while four clients post slow estimations back to back to a service with two workers.
 * Three runs; p50, p99 and the slowest answer of each, the ranges over the runs for the README.
 * (test/ops/off-loop.test.ts only shows that health answers at all then, with a 2 s bound.)
 */

import { postJson, probeLatenciesMs, slowEstimationBody } from '../test/helpers/estimation-load.js';
import { startServerProcess } from '../test/helpers/server-process.js';

const RUNS = 3;
const PROBE_MS = 4000;

/** Nearest-rank percentile of sorted values. */
const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;

interface RunFigures {
  idle: { p50: number; p99: number; max: number; n: number };
  busy: { p50: number; p99: number; max: number; n: number };
  estimations: number;
}

function summary(latenciesMs: number[]) {
  const s = [...latenciesMs].sort((a, b) => a - b);
  return { p50: percentile(s, 50), p99: percentile(s, 99), max: s.at(-1)!, n: s.length };
}

async function oneRun(bodies: string[]): Promise<RunFigures> {
  // Default logging (one line per request), its output discarded, as in the a-priori benchmark.
  const server = await startServerProcess({ ESTIMATION_WORKERS: '2', ESTIMATION_QUEUE_LIMIT: '64', LOG_LEVEL: 'info' }, true);
  try {
    const healthUrl = `${server.baseUrl}/v1/health`;
    const idle = await probeLatenciesMs(healthUrl, PROBE_MS);
    let running = true;
    const load = bodies.map(async (body) => {
      let done = 0;
      while (running) {
        const answer = await postJson(server.baseUrl, '/v1/zwd-estimates', body).answer;
        if (answer.status !== 200) throw new Error(`estimation answered ${answer.status}: ${answer.body.slice(0, 200)}`);
        done++;
      }
      return done;
    });
    await new Promise((r) => setTimeout(r, 1000)); // both workers busy, two requests queued
    const busy = await probeLatenciesMs(healthUrl, PROBE_MS);
    running = false;
    const estimations = (await Promise.all(load)).reduce((a, b) => a + b, 0);
    return { idle: summary(idle), busy: summary(busy), estimations };
  } finally {
    await server.stop();
  }
}

const range = (xs: number[], digits = 1) => {
  const lo = Math.min(...xs).toFixed(digits);
  const hi = Math.max(...xs).toFixed(digits);
  return lo === hi ? lo : `${lo}–${hi}`;
};

export default async function healthUnderLoad(): Promise<string[]> {
  // Six hours of 30 s data with 12 gross errors rejected one per solution: one estimation is some 100 ms of CPU.
  const bodies = [1, 2, 3, 4].map((seed) => slowEstimationBody(6, seed));
  const runs: RunFigures[] = [];
  for (let i = 0; i < RUNS; i++) runs.push(await oneRun(bodies));
  const lines = runs.map(
    (r, i) =>
      `run ${i + 1}: idle p50 ${r.idle.p50.toFixed(1)} ms, p99 ${r.idle.p99.toFixed(1)} ms (n ${r.idle.n}); ` +
      `busy p50 ${r.busy.p50.toFixed(1)} ms, p99 ${r.busy.p99.toFixed(1)} ms, max ${r.busy.max.toFixed(1)} ms (n ${r.busy.n}); ` +
      `${r.estimations} estimations meanwhile`,
  );
  lines.push(
    `health while 2 workers estimate: p50 ${range(runs.map((r) => r.busy.p50))} ms, p99 ${range(runs.map((r) => r.busy.p99))} ms ` +
      `(idle: p50 ${range(runs.map((r) => r.idle.p50))} ms, p99 ${range(runs.map((r) => r.idle.p99))} ms), ${RUNS} runs`,
  );
  return lines;
}
