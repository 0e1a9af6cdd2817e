/**
 * Health latency under the open requests of issue 11 (item 8 and the 1.1 M-row uploads):
 * `GET /v1/health` polled every 25 ms from a process of its own while clients send back to back, to a
 * server with two workers. Three loads, three runs each; p50, p99 and the slowest answer, ranges over
 * the runs:
 *  1. batches: four clients, two a 100 000-direction slant-delay batch and two a 100 000-record PWV
 *     batch (above OFFLOAD_BODY_BYTES these run in the worker pool);
 *  2. batches + station-year reads: the same four, plus two clients reading a seeded station-year
 *     (105 120 five-minute epochs of met and delays) from the archive: the stored met as JSON and the
 *     station PWV as CSV (read in keyset pages, answered piece by piece, src/http/streamed-answer.ts);
 *     then the four-client mix: one slant batch, one PWV batch and the two readers;
 *  3. 1.1 M met rows: four clients uploading met files that the service must refuse: 1.1 M rows as
 *     CSV and as RINEX met (above the 32 MiB body limit: 413 while the body arrives), and 500 000
 *     rows as CSV and 300 000 as RINEX (within the body limit, refused by the 100 000-record limit
 *     in the worker pool: 413 naming it).
 * Run alone: `npm run bench -- health-open-batches` (about 5 minutes on a quiet 2-core machine).
 */

import { mkdtempSync, rmSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { mulberry32 } from '../scripts/synthetic-residuals.js';
import { writeRinexMet } from '../src/formats/rinex-met-writer.js';
import { postJson, probeLatenciesMs } from '../test/helpers/estimation-load.js';
import { startServerProcess, type ServerProcess } from '../test/helpers/server-process.js';

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

const KEY = 'bench-health-open-batches-key';
const T0 = Date.UTC(2025, 0, 1);
const STEP_MS = 300_000;
const YEAR_EPOCHS = 105_120;
const iso = (ms: number) => new Date(ms).toISOString();

/** One request with node:http; the status (0 when the connection was cut, as after an early 413) and the answer size. */
function send(base: string, method: string, path: string, body?: string, type?: string): Promise<{ status: number; bytes: number }> {
  return new Promise((resolve) => {
    const headers: Record<string, string | number> = { authorization: `Bearer ${KEY}` };
    if (body !== undefined) Object.assign(headers, { 'content-type': type!, 'content-length': Buffer.byteLength(body) });
    const req = httpRequest(new URL(path, base), { method, headers }, (res) => {
      let bytes = 0;
      res.on('data', (c: Buffer) => (bytes += c.length));
      res.on('end', () => resolve({ status: res.statusCode!, bytes }));
      res.on('error', () => resolve({ status: res.statusCode ?? 0, bytes }));
    });
    req.on('error', () => resolve({ status: 0, bytes: 0 }));
    req.end(body);
  });
}

const metCsv = (first: number, count: number) => {
  const lines = ['epoch,pressure_hpa,temperature_c,relative_humidity_pct'];
  for (let i = first; i < first + count; i++)
    lines.push(`${iso(T0 + i * STEP_MS)},${(950 + (i % 300) / 10).toFixed(1)},${(5 + (i % 200) / 10).toFixed(1)},${40 + (i % 50)}`);
  return lines.join('\n');
};
const rinexMet = (count: number) =>
  writeRinexMet({
    version: '2.11',
    program: 'bench-writer',
    runBy: 'bench',
    createdAt: new Date(T0),
    markerName: 'BENCHRNX',
    observationTypes: ['PR', 'TD', 'HR'],
    records: Array.from({ length: count }, (_, i) => ({
      epochMs: T0 + i * 60_000,
      values: [950 + (i % 300) / 10, 5 + (i % 200) / 10, 40 + (i % 50)],
    })),
  });

/** A server with an archive in a temporary directory and one station-year of met and delays. */
async function archiveServer(seed: boolean): Promise<{ server: ServerProcess; cleanup: () => Promise<void> }> {
  const dataDir = mkdtempSync(join(tmpdir(), 'bench-health-'));
  const env = { ESTIMATION_WORKERS: '2', ESTIMATION_QUEUE_LIMIT: '64', LOG_LEVEL: 'info', TROPO_DATA_DIR: dataDir, TROPO_API_KEYS: KEY };
  // A start may take more than the helper's 30 s on a loaded machine: one more try.
  const server = await startServerProcess(env, true).catch(() => startServerProcess(env, true));
  const cleanup = async () => {
    await server.stop();
    rmSync(dataDir, { recursive: true, force: true });
  };
  const station = JSON.stringify({
    name: 'Benchmoor (invented)',
    latitude_deg: 47.5,
    longitude_deg: 8.25,
    height_m: 420,
    met_height_m: 418,
  });
  const ok = (r: { status: number }, what: string) => {
    if (r.status !== 200 && r.status !== 201) throw new Error(`${what} answered ${r.status}`);
  };
  ok(await send(server.baseUrl, 'PUT', '/v1/stations/BENCH-1', station, 'application/json'), 'PUT station');
  if (seed) {
    const u = mulberry32(2025);
    for (let first = 0; first < YEAR_EPOCHS; first += YEAR_EPOCHS / 2) {
      ok(await send(server.baseUrl, 'POST', '/v1/stations/BENCH-1/met', metCsv(first, YEAR_EPOCHS / 2), 'text/csv'), 'met upload');
      const records = Array.from({ length: YEAR_EPOCHS / 2 }, (_, k) => ({
        epoch: iso(T0 + (first + k) * STEP_MS),
        ztd_m: Math.round((2.25 + 0.1 * u()) * 1e5) / 1e5,
        ztd_sigma_m: 0.004,
      }));
      ok(
        await send(server.baseUrl, 'POST', '/v1/stations/BENCH-1/delays', JSON.stringify({ records, source: 'bench' }), 'application/json'),
        'delay deposit',
      );
    }
  }
  return { server, cleanup };
}

interface Client {
  label: string;
  once: (base: string) => Promise<{ status: number; bytes: number }>;
  expect: (status: number) => boolean;
}

/** Health while `clients` run back to back; one line per run, the summary line last. */
async function measure(title: string, clients: Client[], server: () => Promise<{ server: ServerProcess; cleanup: () => Promise<void> }>) {
  const lines: string[] = [];
  const runs: ReturnType<typeof summary>[] = [];
  for (let run = 0; run < RUNS; run++) {
    const { server: s, cleanup } = await server();
    try {
      let running = true;
      const counts = clients.map(async (c) => {
        let done = 0;
        while (running) {
          const answer = await c.once(s.baseUrl);
          if (!c.expect(answer.status)) throw new Error(`${c.label} answered ${answer.status}`);
          done++;
        }
        return done;
      });
      await new Promise((r) => setTimeout(r, 1500));
      const h = summary(await probeLatenciesMs(`${s.baseUrl}/v1/health`, PROBE_MS));
      running = false;
      const done = await Promise.all(counts);
      runs.push(h);
      lines.push(
        `${title}, run ${run + 1}: health p50 ${h.p50.toFixed(1)} ms, p99 ${h.p99.toFixed(1)} ms, max ${h.max.toFixed(1)} ms (n ${h.n}); ` +
          clients.map((c, k) => `${done[k]} × ${c.label}`).join(', '),
      );
      process.stderr.write(`${lines.at(-1)}\n`); // progress, in case a later load fails
    } finally {
      await cleanup();
    }
  }
  lines.push(
    `health while ${title} (2 workers): p50 ${range(runs.map((s) => s.p50))} ms, ` +
      `p99 ${range(runs.map((s) => s.p99))} ms, max ${range(runs.map((s) => s.max))} ms, ${RUNS} runs`,
  );
  return lines;
}

export default async function healthOpenBatches(): Promise<string[]> {
  const load = bodies();
  const batchClients: Client[] = load.map(({ path, body }) => ({
    label: `${path} batch of ${N}`,
    once: async (base) => {
      const a = await postJson(base, path, body).answer;
      return { status: a.status, bytes: a.body.length };
    },
    expect: (status) => status === 200,
  }));
  const yearRange = `from=${iso(T0)}&to=${iso(T0 + YEAR_EPOCHS * STEP_MS)}`;
  const readClients: Client[] = [
    { label: 'station-year met read (JSON)', path: `/v1/stations/BENCH-1/met?${yearRange}` },
    { label: 'station-year PWV read (CSV)', path: `/v1/stations/BENCH-1/precipitable-water?${yearRange}&format=csv` },
  ].map(({ label, path }) => ({ label, once: (base) => send(base, 'GET', path), expect: (status) => status === 200 }));

  const csvHuge = metCsv(0, 1_100_000);
  const rinexHuge = rinexMet(1_100_000);
  const csvOverRecords = metCsv(0, 500_000);
  const rinexOverRecords = rinexMet(300_000);
  const refused = (status: number) => status === 413 || status === 0; // 0: the service cut the connection after its 413
  const uploadClients: Client[] = [
    { label: `CSV of 1.1 M rows (${(csvHuge.length / 2 ** 20).toFixed(0)} MiB)`, body: csvHuge, type: 'text/csv' },
    { label: `RINEX met of 1.1 M records (${(rinexHuge.length / 2 ** 20).toFixed(0)} MiB)`, body: rinexHuge, type: 'text/plain' },
    { label: `CSV of 500 000 rows (${(csvOverRecords.length / 2 ** 20).toFixed(0)} MiB)`, body: csvOverRecords, type: 'text/csv' },
    {
      label: `RINEX met of 300 000 records (${(rinexOverRecords.length / 2 ** 20).toFixed(0)} MiB)`,
      body: rinexOverRecords,
      type: 'text/plain',
    },
  ].map(({ label, body, type }) => ({
    label,
    once: (base) => send(base, 'POST', '/v1/stations/BENCH-1/met', body, type),
    expect: refused,
  }));

  const plainServer = async () => {
    const server = await startServerProcess({ ESTIMATION_WORKERS: '2', ESTIMATION_QUEUE_LIMIT: '64', LOG_LEVEL: 'info' }, true);
    return { server, cleanup: async () => void (await server.stop()) };
  };
  // One seeded archive for the three runs of the read load (seeding a station-year takes a while).
  const seeded = await archiveServer(true);
  const reuse = async () => ({ server: seeded.server, cleanup: async () => undefined });
  const lines: string[] = [];
  try {
    lines.push(...(await measure('4 clients send 100 000-item slant/PWV batches', batchClients, plainServer)));
    lines.push(
      ...(await measure('the 4 batch clients + 2 station-year readers (met JSON, PWV CSV)', [...batchClients, ...readClients], reuse)),
    );
    // The mix: four clients in all, one slant batch, one PWV batch and the two station-year readers.
    const oneOfEach = [batchClients.find((c) => c.label.includes('slant'))!, batchClients.find((c) => c.label.includes('precipitable'))!];
    lines.push(...(await measure('4 clients: a slant batch, a PWV batch, 2 station-year readers', [...oneOfEach, ...readClients], reuse)));
  } finally {
    await seeded.cleanup();
  }
  lines.push(
    ...(await measure('4 clients send 1.1 M-row met files (CSV, RINEX) and 500 000 / 300 000-row ones', uploadClients, () =>
      archiveServer(false),
    )),
  );
  return lines;
}
