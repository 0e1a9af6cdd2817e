/**
 * Health latency while open clients send the largest allowed a-priori batches (issue 11 item 8):
 * `GET /v1/health` polled every 25 ms from this process while four clients post back to back, two a
 * 100 000-direction slant-delay batch and two a 100 000-record PWV batch, to a server with two
 * workers. Above OFFLOAD_BODY_BYTES these run in the worker pool, so the event loop only moves the
 * bytes (and sends the answers). Three runs; p50, p99 and the slowest answer, ranges over the runs.
 * (Station-year reads are not in this load: they still run on the event loop.)
 */

import { mulberry32 } from '../scripts/synthetic-residuals.js';
import { postJson, probeLatenciesMs } from '../test/helpers/estimation-load.js';
import { startServerProcess } from '../test/helpers/server-process.js';

const RUNS = 3;
const PROBE_MS = 6000;
const N = 100_000;

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
const summary = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return { p50: percentile(s, 50), p99: percentile(s, 99), max: s.at(-1)!, n: s.length };
};
const range = (xs: number[], digits = 1) => {
  const lo = Math.min(...xs).toFixed(digits);
  const hi = Math.max(...xs).toFixed(digits);
  return lo === hi ? lo : `${lo}–${hi}`;
};

function bodies(): { path: string; body: string }[] {
  const u = mulberry32(11_8);
  const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };
  const epoch = '2026-06-21T06:30:00Z';
  const directions = Array.from({ length: N }, () => ({ elevation_deg: 3 + 87 * u(), azimuth_deg: 360 * u() }));
  const records = Array.from({ length: N }, (_, i) => ({
    epoch: new Date(Date.parse(epoch) + i * 30_000).toISOString(),
    ztd_m: 2.3 + 0.2 * u(),
    ztd_sigma_m: 0.004,
    pressure_hpa: 950 + 20 * u(),
    temperature_c: 5 + 20 * u(),
  }));
  const slant = JSON.stringify({ site, epoch, met: { pressure_hpa: 960, temperature_c: 15, relative_humidity_pct: 60 }, directions });
  const pwv = JSON.stringify({ site, records });
  return [
    { path: '/v1/slant-delays', body: slant },
    { path: '/v1/precipitable-water', body: pwv },
    { path: '/v1/slant-delays', body: slant },
    { path: '/v1/precipitable-water', body: pwv },
  ];
}

export default async function healthOpenBatches(): Promise<string[]> {
  const load = bodies();
  const lines: string[] = [];
  const busy: ReturnType<typeof summary>[] = [];
  for (let run = 0; run < RUNS; run++) {
    const server = await startServerProcess({ ESTIMATION_WORKERS: '2', ESTIMATION_QUEUE_LIMIT: '64', LOG_LEVEL: 'info' }, true);
    try {
      let running = true;
      const clients = load.map(async ({ path, body }) => {
        let done = 0;
        while (running) {
          const answer = await postJson(server.baseUrl, path, body).answer;
          if (answer.status !== 200) throw new Error(`${path} answered ${answer.status}: ${answer.body.slice(0, 200)}`);
          done++;
        }
        return done;
      });
      await new Promise((r) => setTimeout(r, 1500));
      const s = summary(await probeLatenciesMs(`${server.baseUrl}/v1/health`, PROBE_MS));
      running = false;
      const batches = (await Promise.all(clients)).reduce((a, b) => a + b, 0);
      busy.push(s);
      lines.push(
        `run ${run + 1}: health p50 ${s.p50.toFixed(1)} ms, p99 ${s.p99.toFixed(1)} ms, max ${s.max.toFixed(1)} ms (n ${s.n}); ${batches} batches of ${N} meanwhile`,
      );
    } finally {
      await server.stop();
    }
  }
  lines.push(
    `health while 4 clients send 100 000-item slant/PWV batches (2 workers): p50 ${range(busy.map((s) => s.p50))} ms, ` +
      `p99 ${range(busy.map((s) => s.p99))} ms, max ${range(busy.map((s) => s.max))} ms, ${RUNS} runs`,
  );
  return lines;
}
