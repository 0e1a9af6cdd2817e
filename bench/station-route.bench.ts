/**
 * Event-loop time of the station ZWD route against the plain route (issue 9: the station route
 * used to get the whole validated body back from the worker, 199–328 ms of deserialisation on the
 * event loop for 7 days of data, against 4–10 ms for the plain route; target: within 2×).
 *
 * One request of 7 days of 30 s residuals (scripts/synthetic-residuals.ts, ~160 000 observations,
 * ~21 MB of JSON) to POST /v1/zwd-estimates and to POST /v1/stations/{id}/zwd-estimates (stored met
 * every 5 min on an in-memory SQLite archive, so the route reads, reduces and passes 2 000+ met
 * records). In-process (app.inject): the event-loop time is the main thread's active time during
 * the request (performance.eventLoopUtilization), i.e. what the loop spends on the request while
 * the workers estimate; it includes the harness's own work (handing the prepared Buffer to
 * light-my-request, collecting the answer), equal for both routes. The station route's delay write
 * (better-sqlite3 is synchronous: it runs on the loop) is shown separately. Runs alternate between
 * the routes; ranges over the runs after one warm-up run each.
 */

import { performance } from 'node:perf_hooks';
import { generateSyntheticResiduals, toRequestBody } from '../scripts/synthetic-residuals.js';
import { buildApp } from '../src/http/app.js';

const KEY = 'bench-key-0123456789abcdef';
const DAYS = 7;
const RUNS = 5;
const LATITUDE_DEG = 46.2;

interface Run {
  loopMs: number;
  wallMs: number;
  writeMs: number;
}

const range = (xs: number[]) => `${Math.min(...xs).toFixed(0)}–${Math.max(...xs).toFixed(0)} ms`;

export default async function (): Promise<string[]> {
  const data = generateSyntheticResiduals({ durationS: DAYS * 86_400, latitudeDeg: LATITUDE_DEG, seed: 7 });
  const body = toRequestBody(data);
  const { site, observations } = body;
  const plainPayload = Buffer.from(JSON.stringify({ site, observations, apriori: { zhd_m: 2.2 } }));
  const stationPayload = Buffer.from(JSON.stringify({ observations, apriori: { zhd_m: 2.2 } }));

  const app = await buildApp({
    config: { ESTIMATION_WORKERS: 1 },
    archive: { storage: { dataDir: ':memory:' }, apiKeys: [KEY], readKeysRequired: false, maxReadRangeDays: 366 },
  });
  const auth = { authorization: `Bearer ${KEY}`, 'content-type': 'application/json' };
  await app.inject({ method: 'PUT', url: '/v1/stations/BNCH', headers: auth, payload: { name: 'Bench station (invented)', ...site } });
  const t0 = Date.parse(observations[0]!.epoch) - 86_400_000;
  const met = Array.from({ length: (DAYS + 2) * 288 }, (_, k) => ({
    epoch: new Date(t0 + k * 300_000).toISOString(),
    pressure_hpa: 955 + Math.sin(k / 50),
    temperature_c: 12 + 3 * Math.sin(k / 144),
  }));
  await app.inject({ method: 'POST', url: '/v1/stations/BNCH/met', headers: auth, payload: { records: met } });

  // Time the synchronous delay write on the loop separately.
  let writeMs = 0;
  const writeKinds = new Set<string>();
  const repository = app.repository;
  const writeDelays = repository.writeDelays.bind(repository);
  repository.writeDelays = async (...args: Parameters<typeof writeDelays>) => {
    const started = performance.now();
    try {
      const counts = await writeDelays(...args);
      writeKinds.add(
        Object.entries(counts)
          .filter(([, n]) => n > 0)
          .map(([kind, n]) => `${n} ${kind}`)
          .join(', '),
      );
      return counts;
    } finally {
      writeMs += performance.now() - started;
    }
  };

  async function run(url: string, payload: Buffer, headers: Record<string, string>): Promise<Run> {
    writeMs = 0;
    const elu = performance.eventLoopUtilization();
    const started = performance.now();
    const res = await app.inject({ method: 'POST', url, headers, payload });
    const wallMs = performance.now() - started;
    const used = performance.eventLoopUtilization(elu);
    if (res.statusCode !== 200) throw new Error(`${url}: ${res.statusCode} ${res.body.slice(0, 300)}`);
    return { loopMs: used.active, wallMs, writeMs };
  }

  const plainUrl = '/v1/zwd-estimates';
  const stationUrl = '/v1/stations/BNCH/zwd-estimates?source=bench';
  await run(plainUrl, plainPayload, { 'content-type': 'application/json' });
  await run(stationUrl, stationPayload, auth);
  const plain: Run[] = [];
  const station: Run[] = [];
  writeKinds.clear();
  for (let r = 0; r < RUNS; r++) {
    plain.push(await run(plainUrl, plainPayload, { 'content-type': 'application/json' }));
    station.push(await run(stationUrl, stationPayload, auth));
  }
  await app.close();

  const median = (xs: number[]) => xs.slice().sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  const plainLoop = plain.map((r) => r.loopMs);
  const stationLoop = station.map((r) => r.loopMs);
  const stationLoopNoWrite = station.map((r) => r.loopMs - r.writeMs);
  return [
    `${DAYS} days of 30 s data: ${observations.length} observations, ${(plainPayload.length / 1e6).toFixed(1)} MB of JSON; ${RUNS} runs each after a warm-up, in-process (app.inject), 1 worker`,
    `POST /v1/zwd-estimates: event-loop time ${range(plainLoop)} (median ${median(plainLoop).toFixed(0)} ms); wall ${range(plain.map((r) => r.wallMs))}`,
    `POST /v1/stations/{id}/zwd-estimates: event-loop time ${range(stationLoop)} (median ${median(stationLoop).toFixed(0)} ms), of which the synchronous SQLite write of the delay series (${[...writeKinds].join(' / ')}) ${range(station.map((r) => r.writeMs))}; without the write ${range(stationLoopNoWrite)}; wall ${range(station.map((r) => r.wallMs))}`,
    `station / plain event-loop time (medians): ${(median(stationLoop) / median(plainLoop)).toFixed(2)}×, without the storage write ${(median(stationLoopNoWrite) / median(plainLoop)).toFixed(2)}× [target ≤ 2×]`,
  ];
}
