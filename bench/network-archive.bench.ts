/**
 * The network routes on an archive of many stations (issue 14: an agency's hundreds to thousands of stations, on
 * SQLite or PostgreSQL). Three parts (NETWORK_ARCHIVE_BENCH_PART=repository,scan,http, comma-separated; default all),
 * all on an archive of NETWORK_ARCHIVE_BENCH_STATIONS invented stations (default 1 000), by turns, ranges over blocks,
 * the load average beside them:
 *
 * - repository (in-process, this tree): what a request paid for the stations it names, on each backend: the whole
 *   table (listStations() and a Map of it, what the network routes did per request) against the named ones
 *   (Repository.getStations of 10 and of 1 000 ids); CPU µs per call of this process (SQLite reads are in-process
 *   CPU; PostgreSQL's are the driver's work on the event loop, the server's not counted).
 * - scan (in-process, two trees): the storing network route's two tasks called as the pool calls them,
 *   scanNetworkRequest then handleNetworkRequest with the archive's sites, from BENCH_NETWORK_OLD and
 *   BENCH_NETWORK_NEW (roots of built trees, their dist/; both default to this tree: the spread of two equal trees) alternately; CPU ms of
 *   the scan and of the estimation task of 10 stations × 1 h of 30-s data as JSON columns and as JSON objects.
 * - http (two services by turns, as bench/edge-ab.bench.ts): each tree's dist/server.js (one worker) on an archive of
 *   its own, POST /v1/network/zwd-estimates of 4 stations × 15 min (columns JSON: a small request, where what the
 *   route does besides estimating shows), GET /v1/network/precipitable-water of 10 named stations at their latest
 *   epoch, and the same read of the stations in the network's region (bbox); CPU ms a request of the whole process
 *   and of its event loop (/proc), answers compared byte for byte (the storing route's stored counts aside).
 *
 * NETWORK_ARCHIVE_BENCH_BACKEND: sqlite, postgres or both (default both when PostgreSQL answers at
 * BENCH_DATABASE_URL, default postgres://postgres@127.0.0.1:5432/test; each run in a schema of its own, dropped
 * after); NETWORK_ARCHIVE_BENCH_BLOCKS (default 6). Build both trees first (`npm run build`).
 * `npm run bench -- network-archive`.
 */

import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { createRepository, type StorageConfig } from '../src/storage/factory.js';
import type { Repository } from '../src/storage/repository.js';
import { benchNetwork, benchStations } from './bench-network.js';
import { startService, stopService } from './edge-ab.bench.js';
import { BENCH_PG_URL, pgAvailable } from './postgres-available.js';

const RAD = 180 / Math.PI;
const KEY = 'bench-key-0123456789abcdef';
const PG_URL = BENCH_PG_URL;
const STATIONS = Number(process.env.NETWORK_ARCHIVE_BENCH_STATIONS ?? 1000);
const BLOCKS = Number(process.env.NETWORK_ARCHIVE_BENCH_BLOCKS ?? 6);
const DAY = '2026-10-01';
/** The bench network's region (bench/bench-network.ts: rings up to 600 km around 48° N, 11° E) as west,south,east,north [deg]. */
const BOX = '2,42,20,54';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const fmt = (xs: number[], d = 2) => `${median(xs).toFixed(d)} (${Math.min(...xs).toFixed(d)}–${Math.max(...xs).toFixed(d)})`;
const loadRange = (xs: number[]) => `load ${Math.min(...xs).toFixed(1)}–${Math.max(...xs).toFixed(1)}`;
const cpuMs = (since: NodeJS.CpuUsage) => {
  const c = process.cpuUsage(since);
  return (c.user + c.system) / 1000;
};

/** An archive location on the backend: a fresh SQLite directory or PostgreSQL schema. */
async function freshStorage(backend: 'sqlite' | 'postgres'): Promise<{ config: StorageConfig; cleanup: () => Promise<void> }> {
  const dir = mkdtempSync(join(tmpdir(), 'network-archive-bench-'));
  if (backend === 'sqlite') return { config: { dataDir: dir }, cleanup: async () => rmSync(dir, { recursive: true, force: true }) };
  const schema = `bench_${randomBytes(5).toString('hex')}`;
  return {
    config: { dataDir: dir, databaseUrl: PG_URL, pgSchema: schema },
    cleanup: async () => {
      rmSync(dir, { recursive: true, force: true });
      const client = new pg.Client({ connectionString: PG_URL });
      await client.connect();
      await client.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
      await client.end();
    },
  };
}

/** The network's stations (B000 …, invented, bench/bench-network.ts) first, then invented stations X0000 … up to `count`. */
async function fillArchive(repo: Repository, count: number, network = benchStations(10)): Promise<string[]> {
  const ids: string[] = [];
  for (let i = 0; i < count; i++) {
    const s = network[i];
    const id = s ? s.name : `X${String(i).padStart(5, '0')}`;
    await repo.putStation(id, {
      name: `${id} (invented)`,
      latitudeDeg: s ? s.latitudeDeg : -60 + ((i * 7.3) % 120),
      longitudeDeg: s ? s.longitudeDeg : -180 + ((i * 13.7) % 360),
      heightM: s ? s.heightM : 50 + (i % 900),
      metHeightM: null,
      description: 'invented for the benchmark',
    });
    ids.push(id);
  }
  return ids;
}

/** A storing network request: `stations` of the bench network over `hours` of 30-s data, as JSON columns or objects. */
function networkBody(stations: number, hours: number, form: 'columns' | 'objects'): string {
  const list = benchStations(stations);
  const o = benchNetwork(list, `${DAY}T00:00:00Z`, hours * 3600 - 30).observations;
  const round = (x: number, digits: number) => Number(x.toFixed(digits));
  const epoch = o.epochMs.map((t) => new Date(t).toISOString());
  const elevation = o.elevationRad.map((x) => round(x * RAD, 6));
  const azimuth = o.azimuthRad.map((x) => round(x * RAD, 6));
  const residual = o.residualM.map((x) => round(x, 5));
  const observations =
    form === 'columns'
      ? { station: o.station, epoch, satellite: o.satellite, elevation_deg: elevation, azimuth_deg: azimuth, residual_m: residual }
      : o.station.map((s, i) => ({
          station: s,
          epoch: epoch[i],
          satellite: o.satellite[i],
          elevation_deg: elevation[i],
          azimuth_deg: azimuth[i],
          residual_m: residual[i],
        }));
  // An a-priori ZWD of 0.4 m: the simulated corrections wander around zero, and a stored ZWD must not be negative.
  return JSON.stringify({ stations: list.map((s) => ({ id: s.name, apriori: { zwd_m: 0.4 } })), observations, options: {} });
}

async function repositoryPart(backends: ('sqlite' | 'postgres')[]): Promise<string[]> {
  const lines: string[] = [];
  for (const backend of backends) {
    const { config, cleanup } = await freshStorage(backend);
    const repo = await createRepository(config);
    try {
      const ids = await fillArchive(repo, STATIONS);
      const named10 = ids.filter((_, i) => i % Math.floor(ids.length / 10) === 0).slice(0, 10);
      const named1000 = ids.slice(0, 1000);
      const ways: [string, () => Promise<unknown>, number][] = [
        ['listStations() + Map (before)', async () => new Map((await repo.listStations()).map((s) => [s.stationId, s])), 20],
        ['getStations(10 ids)', () => repo.getStations(named10), 200],
        [`getStations(${named1000.length} ids)`, () => repo.getStations(named1000), 20],
      ];
      const times = ways.map(() => [] as number[]);
      const loads: number[] = [];
      for (const [, f] of ways) for (let i = 0; i < 5; i++) await f(); // warm-up
      for (let b = 0; b < BLOCKS; b++) {
        for (const [k, [, f, n]] of ways.entries()) {
          const c0 = process.cpuUsage();
          for (let i = 0; i < n; i++) await f();
          times[k]!.push((cpuMs(c0) * 1000) / n);
        }
        loads.push(loadavg()[0]!);
      }
      lines.push(`repository, ${backend}, ${STATIONS} stations (${BLOCKS} blocks, ${loadRange(loads)}), CPU µs a call, median (range):`);
      ways.forEach(([name], k) => lines.push(`  ${name}: ${fmt(times[k]!, 0)}`));
    } finally {
      await repo.close();
      await cleanup();
    }
  }
  return lines;
}

type Tasks = typeof import('../src/http/tasks/network-request.js');

async function scanPart(roots: { name: string; root: string }[]): Promise<string[]> {
  const lines: string[] = [];
  const trees = await Promise.all(
    roots.map(async (r) => ({
      ...r,
      tasks: (await import(pathToFileURL(join(resolve(r.root), 'dist/http/tasks/network-request.js')).href)) as Tasks,
    })),
  );
  const sites = Object.fromEntries(
    benchStations(10).map((s) => [s.name, { latitudeDeg: s.latitudeDeg, longitudeDeg: s.longitudeDeg, heightM: s.heightM }]),
  );
  for (const form of ['columns', 'objects'] as const) {
    const bytes = new TextEncoder().encode(networkBody(10, 1, form));
    const run = async (t: Tasks) => {
      const c0 = process.cpuUsage();
      const scanned = await t.scanNetworkRequest({ body: bytes.slice(), format: 'json', query: {} });
      const scanMs = cpuMs(c0);
      if (!scanned.ok) throw new Error(scanned.error.detail);
      const { prepared, body } = scanned.output as { prepared?: unknown; body?: Uint8Array };
      const c1 = process.cpuUsage();
      const out = await t.handleNetworkRequest({
        body: prepared ? '' : (body ?? bytes.slice()),
        format: 'json',
        query: {},
        archiveSites: sites,
        storedMet: {},
        ...(prepared ? { prepared } : {}),
      } as Parameters<Tasks['handleNetworkRequest']>[0]);
      const estimateMs = cpuMs(c1);
      if (!out.ok) throw new Error(out.error.detail);
      return { scanMs, estimateMs, json: Buffer.from(out.output.json) };
    };
    const answers: Buffer[] = [];
    for (const t of trees) {
      await run(t.tasks); // warm-up
      answers.push((await run(t.tasks)).json);
    }
    if (!answers.every((a) => a.equals(answers[0]!))) throw new Error(`scan part, ${form}: the trees answer differently`);
    const figures = new Map(trees.map((t) => [t.name, { scan: [] as number[], estimate: [] as number[] }]));
    const loads: number[] = [];
    for (let b = 0; b < BLOCKS; b++) {
      for (const t of b % 2 === 0 ? trees : [...trees].reverse()) {
        const r = await run(t.tasks);
        figures.get(t.name)!.scan.push(r.scanMs);
        figures.get(t.name)!.estimate.push(r.estimateMs);
      }
      loads.push(loadavg()[0]!);
    }
    lines.push(
      `scan + estimation tasks in-process, 10 stations × 1 h, JSON ${form} (${(bytes.length / 1e6).toFixed(1)} MB; ${BLOCKS} runs each by turns, ${loadRange(loads)}), CPU ms:`,
    );
    const total = (name: string) => figures.get(name)!.scan.map((x, i) => x + figures.get(name)!.estimate[i]!);
    for (const t of trees) {
      const f = figures.get(t.name)!;
      lines.push(`  ${t.name} (${t.root}): scan ${fmt(f.scan, 0)}, estimation task ${fmt(f.estimate, 0)}, both ${fmt(total(t.name), 0)}`);
    }
    const [a, b] = trees.map((t) => total(t.name));
    lines.push(`  ${trees[1]!.name} ÷ ${trees[0]!.name}, both tasks, run by run: ${fmt(b!.map((x, i) => x / a![i]!))}`);
  }
  return lines;
}

/** CPU ticks (1/100 s) of the whole process and of its event-loop thread so far. */
function ticks(pid: number): { process: number; loop: number } {
  const read = (path: string) => {
    const fields = readFileSync(path, 'utf8').split(') ')[1]!.split(' ');
    return Number(fields[11]) + Number(fields[12]);
  };
  return { process: read(`/proc/${pid}/stat`), loop: read(`/proc/${pid}/task/${pid}/stat`) };
}

/** An answer without what differs between two runs: times and model versions are the same, stored counts are not. */
const comparable = (text: string) => text.replace(/"(inserted|updated|unchanged)":\d+/g, '"$1":_');

async function httpPart(roots: { name: string; root: string }[], backend: 'sqlite' | 'postgres'): Promise<string[]> {
  const storages = await Promise.all(roots.map(() => freshStorage(backend)));
  const services: Awaited<ReturnType<typeof startService>>[] = [];
  const lines: string[] = [];
  try {
    for (const [i, r] of roots.entries()) {
      const repo = await createRepository(storages[i]!.config);
      await fillArchive(repo, STATIONS);
      await repo.close();
      const { config } = storages[i]!;
      const env: Record<string, string> = {
        TROPODELAY_DATA_DIR: config.dataDir,
        TROPODELAY_API_KEYS: `bench:admin:${KEY}`,
        ESTIMATION_WORKERS: '1',
        ...(config.databaseUrl ? { DATABASE_URL: config.databaseUrl, TROPO_PG_SCHEMA: config.pgSchema! } : {}),
      };
      services.push(await startService(r.name, join(r.root, 'dist'), [], env));
    }
    const store = networkBody(4, 0.25, 'columns');
    const box = BOX.split(',').map(Number) as [number, number, number, number];
    const inBox = (s: { latitudeDeg: number; longitudeDeg: number }) =>
      s.latitudeDeg >= box[1] && s.latitudeDeg <= box[3] && s.longitudeDeg >= box[0] && s.longitudeDeg <= box[2];
    const boxed = (
      await createRepository(storages[0]!.config).then(async (r) => {
        const all = await r.listStations();
        await r.close();
        return all;
      })
    ).filter(inBox).length;
    const named = [
      ...benchStations(4).map((s) => s.name),
      ...Array.from({ length: 6 }, (_, i) => `X${String(100 + i * 97).padStart(5, '0')}`),
    ];
    const workloads = [
      {
        name: `POST /v1/network/zwd-estimates, 4 stations × 15 min, columns JSON (${(store.length / 1e3).toFixed(0)} kB)`,
        send: (base: string) =>
          fetch(`${base}/v1/network/zwd-estimates?source=bench`, {
            method: 'POST',
            headers: { 'content-type': 'application/json', authorization: `Bearer ${KEY}` },
            body: store,
          }),
        block: 10,
      },
      {
        name: 'GET /v1/network/precipitable-water, 10 named stations, latest=true',
        send: (base: string) => fetch(`${base}/v1/network/precipitable-water?stations=${named.join(',')}&latest=true`),
        block: 40,
      },
      {
        // The bench network's region: its 10 stations (4 with delays stored by the first workload) and the invented ones there.
        name: `GET /v1/network/precipitable-water, bbox=${BOX} (${boxed} of the ${STATIONS} stations), latest=true`,
        send: (base: string) => fetch(`${base}/v1/network/precipitable-water?bbox=${BOX}&latest=true`),
        block: 40,
      },
    ];
    for (const w of workloads) {
      const answers: string[] = [];
      for (const s of services) {
        for (let i = 0; i < 3; i++) await (await w.send(s.baseUrl)).arrayBuffer();
        const res = await w.send(s.baseUrl);
        const text = await res.text();
        if (!res.ok) throw new Error(`${s.name}: ${res.status} ${text.slice(0, 300)}`);
        answers.push(comparable(text));
      }
      if (answers[0] !== answers[1]) throw new Error(`${w.name}: the two services answer differently`);
      const cpu = new Map(services.map((s) => [s.name, { process: [] as number[], loop: [] as number[] }]));
      const loads: number[] = [];
      for (let b = 0; b < BLOCKS; b++) {
        for (const s of b % 2 === 0 ? services : [...services].reverse()) {
          const pid = s.child.pid!;
          const t0 = ticks(pid);
          for (let i = 0; i < w.block; i++) {
            const res = await w.send(s.baseUrl);
            await res.arrayBuffer();
            if (!res.ok) throw new Error(`${s.name}: ${res.status}`);
          }
          const t1 = ticks(pid);
          cpu.get(s.name)!.process.push(((t1.process - t0.process) * 10) / w.block);
          cpu.get(s.name)!.loop.push(((t1.loop - t0.loop) * 10) / w.block);
        }
        loads.push(loadavg()[0]!);
      }
      lines.push(
        `http, ${backend}, ${STATIONS} stations: ${w.name} (${BLOCKS} blocks of ${w.block} by turns, ${loadRange(loads)}), CPU ms a request:`,
      );
      for (const s of services) {
        const c = cpu.get(s.name)!;
        lines.push(`  ${s.name}: process ${fmt(c.process, 1)}, event loop ${fmt(c.loop, 1)}`);
      }
      const ratio = cpu.get(services[1]!.name)!.process.map((x, i) => x / cpu.get(services[0]!.name)!.process[i]!);
      lines.push(`  ${services[1]!.name} ÷ ${services[0]!.name}, process, block by block: ${fmt(ratio)}`);
    }
  } finally {
    for (const s of services) await stopService(s);
    for (const st of storages) await st.cleanup();
  }
  return lines;
}

export default async function networkArchiveBench(): Promise<string[]> {
  const parts = (process.env.NETWORK_ARCHIVE_BENCH_PART ?? 'repository,scan,http').split(',');
  const wanted = process.env.NETWORK_ARCHIVE_BENCH_BACKEND ?? 'both';
  const pgUp = await pgAvailable(PG_URL);
  const backends = (['sqlite', 'postgres'] as const).filter((b) => (wanted === 'both' || wanted === b) && (b === 'sqlite' || pgUp));
  const roots = [
    { name: 'old', root: process.env.BENCH_NETWORK_OLD ?? '.' },
    { name: 'new', root: process.env.BENCH_NETWORK_NEW ?? '.' },
  ];
  const lines: string[] = [];
  if (parts.includes('repository')) lines.push(...(await repositoryPart([...backends])));
  if (parts.includes('scan')) lines.push(...(await scanPart(roots)));
  if (parts.includes('http')) for (const b of backends) lines.push(...(await httpPart(roots, b)));
  return lines;
}
