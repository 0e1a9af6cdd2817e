/**
 * Child process of bench/network-day.bench.ts: a network day estimated from residual deposits through
 * HTTP (POST /v1/network/days/{day}/zwd-estimates) on a fresh SQLite archive, one estimation worker.
 * Arguments: `deposit` or `serve`, the archive directory, the stations (rings around an invented
 * centre, as bench/network-run.child.ts; 30-s data, about 18 satellites in view, 24 h). `deposit`
 * simulates the day and writes the deposits straight into the archive (and a 2-station hour on the day
 * before); `serve` is a fresh process with the service alone: the 2-station hour goes through the route
 * first (every model exercised), then the day. Prints JSON: observations, wall time of the request, CPU
 * time of the whole process (all threads) during it, peak RSS of the process.
 */

import { resourceUsage } from 'node:process';
import { buildApp } from '../src/http/app.js';
import { encodeResidualDay } from '../src/formats/residual-day-form.js';
import { ResidualStore } from '../src/storage/campaigns/residual-store.js';
import type { SimStation } from '../test/estimation/network/network-simulator.js';
import { benchNetwork, benchStations } from './bench-network.js';

const RAD = 180 / Math.PI;
const KEY = 'bench-key-0123456789abcdef';
const mode = process.argv[2] as 'deposit' | 'serve';
const dir = process.argv[3]!;
const stations = Number(process.argv[4] ?? 50);
const list = benchStations(stations);
// The last epoch 23:59:30 (a deposit holds one UTC day).
const simulate = (stationList: SimStation[], startIso: string, hours: number) => benchNetwork(stationList, startIso, hours * 3600 - 30);

const app = await buildApp({
  logger: false,
  config: { ESTIMATION_WORKERS: 1 },
  archive: {
    storage: { dataDir: dir },
    apiKeys: [{ name: 'bench', role: 'admin', secret: KEY }],
    readKeysRequired: false,
    schedulePurge: false,
    maxReadRangeDays: 366,
    campaigns: { concurrency: 0 },
  },
});
const base = await app.listen({ port: 0, host: '127.0.0.1' });
const store = new ResidualStore(app.repository.sqlExecutor());

async function deposit(stationList: SimStation[], day: string, hours: number): Promise<number> {
  const sim = simulate(stationList, `${day}T00:00:00Z`, hours);
  const o = sim.observations;
  for (const st of stationList) {
    await app.repository.putStation(st.name, {
      name: `${st.name} (invented)`,
      latitudeDeg: st.latitudeDeg,
      longitudeDeg: st.longitudeDeg,
      heightM: st.heightM,
      metHeightM: null,
      description: null,
    });
    const idx = o.station.flatMap((s, i) => (s === st.name ? [i] : []));
    const encoded = encodeResidualDay(day, {
      epochMs: idx.map((i) => o.epochMs[i]!),
      satellite: idx.map((i) => o.satellite[i]!),
      elevationDeg: idx.map((i) => o.elevationRad[i]! * RAD),
      azimuthDeg: idx.map((i) => o.azimuthRad[i]! * RAD),
      residualM: idx.map((i) => o.residualM[i]!),
    });
    await store.put(
      { stationId: st.name, day, observationCount: encoded.observationCount, sha256: encoded.sha256, storedAt: new Date().toISOString() },
      encoded.bytes,
    );
  }
  return o.epochMs.length;
}

async function estimate(stationList: SimStation[], day: string): Promise<{ status: number; bytes: number }> {
  const res = await fetch(`${base}/v1/network/days/${day}/zwd-estimates?source=bench`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', authorization: `Bearer ${KEY}` },
    // An a-priori ZWD of 0.4 m: the simulated corrections wander ±0.2 m around zero, and a stored ZWD must not be negative.
    body: JSON.stringify({ stations: stationList.map((s) => ({ id: s.name, apriori: { zwd_m: 0.4 } })), options: {} }),
  });
  const text = await res.text();
  if (res.status !== 200) throw new Error(`${res.status}: ${text.slice(0, 400)}`);
  return { status: res.status, bytes: text.length };
}

if (mode === 'deposit') {
  await deposit(list.slice(0, 2), '2026-09-30', 1);
  const observations = await deposit(list, '2026-10-01', 24);
  await app.close();
  process.stdout.write(JSON.stringify({ observations }) + '\n');
  process.exit(0);
}
await estimate(list.slice(0, 2), '2026-09-30');
const observations = (await store.listMany('2026-10-01', '2026-10-01')).reduce((n, d) => n + d.observationCount, 0);
const cpu0 = process.cpuUsage();
const started = performance.now();
const answer = await estimate(list, '2026-10-01');
const wallMs = performance.now() - started;
const cpu = process.cpuUsage(cpu0);
await app.close();
process.stdout.write(
  JSON.stringify({
    stations,
    observations,
    wallMs,
    cpuMs: (cpu.user + cpu.system) / 1000,
    maxRssMb: resourceUsage().maxRSS / 1e3,
    answerBytes: answer.bytes,
  }) + '\n',
);
