/**
 * The HTTP edge by turns (issue 14): two builds of the service (tsc output, `node --max-semi-space-size=32
 * <dist>/server.js` as `npm start` runs it) side by side, requests sent to each in alternating blocks (A B B A …)
 * so that both see the same load, each block's CPU read from /proc: the whole process (all threads) and its
 * event-loop thread (/proc/<pid>/task/<pid>/stat). Workloads: the GPS-like day (26 452 observations, columns
 * JSON, default options, rows answer) through `POST /v1/zwd-estimates`, and 10 000 slant delays a request
 * through `POST /v1/slant-delays` (Arrow in and out; columns JSON in, `shape=columns` out) after every mapping
 * model ran in each service.
 *
 * `BENCH_EDGE_OLD=<dir of a built dist/> BENCH_EDGE_NEW=dist npm run bench -- edge-ab` (both default to dist/,
 * built first when older than the sources: the spread between two equal processes); `BENCH_EDGE_OLD_FLAGS` /
 * `BENCH_EDGE_NEW_FLAGS`: node flags of each beside --max-semi-space-size=32 (e.g. `--initial-old-space-size=128`);
 * `BENCH_EDGE_OLD_ENV` / `BENCH_EDGE_NEW_ENV`: extra environment of each ("NAME=value NAME=value", e.g.
 * `MALLOC_ARENA_MAX=2`); `BENCH_EDGE_BLOCKS` (default 10); `BENCH_EDGE_PART` (gps | gps-columns | gps-arrow | arrow | columns,
 * comma-separated, default all; gps-columns: the GPS-like day with the `shape=columns` answer, gps-arrow: Arrow in
 * and out); `BENCH_EDGE_WARM`: requests per workload and service before timing (default 10 or the block size if
 * smaller: a fresh service). The answers of both are compared byte for byte (Arrow: by length, its flatbuffer
 * bytes differ run to run).
 */

import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, openSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { tableFromArrays, tableToIPC, type Table } from 'apache-arrow';
import { MAPPING_MODEL_KEYS } from '../src/domain/mapping/registry.js';
import { freePort, serverEnvironment } from '../test/helpers/server-process.js';
import { columnsArrow, dayRequest } from '../test/helpers/gps-like-days.js';

const ARROW = 'application/vnd.apache.arrow.stream';
const N = 10_000;
const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };
const base = { site, epoch: '2026-06-21T06:30:00Z', met: { pressure_hpa: 965.3, temperature_c: 18.2, relative_humidity_pct: 61 } };
const elevation = Array.from({ length: N }, (_, i) => 3 + (87 * i) / N);
const azimuth = Array.from({ length: N }, (_, i) => (i * 37) % 360);

interface Service {
  name: string;
  baseUrl: string;
  child: ChildProcess;
  dataDir: string;
}

/** CPU ticks (1/100 s) of the whole process and of its event-loop thread so far. */
function ticks(pid: number): { process: number; loop: number } {
  const read = (path: string) => {
    const fields = readFileSync(path, 'utf8').split(') ')[1]!.split(' ');
    return Number(fields[11]) + Number(fields[12]);
  };
  return { process: read(`/proc/${pid}/stat`), loop: read(`/proc/${pid}/task/${pid}/stat`) };
}

export /** The process's peak resident set so far [kB] (/proc/<pid>/status VmHWM). */
function peakRssKb(pid: number): number {
  return Number(/VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? NaN);
}

/** `env`: settings beside the data directory (by their current or deprecated name; TROPODELAY_DATA_DIR there replaces the fresh one). */
export async function startService(
  name: string,
  distDir: string,
  nodeArgs: string[] = [],
  env: Record<string, string> = {},
): Promise<Service> {
  const server = join(resolve(distDir), 'server.js');
  if (!existsSync(server)) throw new Error(`${server} not found: build it first (npx tsc -p tsconfig.build.json)`);
  const port = await freePort();
  const dataDir = mkdtempSync(join(tmpdir(), 'edge-ab-'));
  const child = spawn(process.execPath, ['--max-semi-space-size=32', ...nodeArgs, server], {
    env: { ...serverEnvironment(port, { TROPODELAY_DATA_DIR: dataDir, ...env }), NODE_OPTIONS: '' },
    // BENCH_EDGE_STDOUT=<file>: the service's stdout there (e.g. with --trace-gc among the node flags).
    stdio: ['ignore', process.env.BENCH_EDGE_STDOUT ? openSync(process.env.BENCH_EDGE_STDOUT, 'w') : 'ignore', 'inherit'],
  });
  const baseUrl = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    try {
      if ((await fetch(`${baseUrl}/v1/health`)).ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline || child.exitCode !== null) throw new Error(`service ${name} did not start`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return { name, baseUrl, child, dataDir };
}

export async function stopService(s: Service): Promise<void> {
  if (s.child.exitCode === null && s.child.signalCode === null) {
    await new Promise<void>((r) => {
      s.child.once('exit', () => r());
      s.child.kill('SIGTERM');
    });
  }
  rmSync(s.dataDir, { recursive: true, force: true });
}

interface Workload {
  name: string;
  path: string;
  body: string | Uint8Array<ArrayBuffer>;
  type: string;
  accept: string;
  /** Requests per block: enough 10 ms ticks for a block's figure. */
  block: number;
}

export async function send(s: Service, w: Workload): Promise<Buffer> {
  const res = await fetch(`${s.baseUrl}${w.path}`, { method: 'POST', body: w.body, headers: { 'content-type': w.type, accept: w.accept } });
  const bytes = Buffer.from(await res.arrayBuffer());
  if (!res.ok) throw new Error(`${s.name} ${w.path}: ${res.status} ${bytes.toString('utf8').slice(0, 300)}`);
  return bytes;
}

export function gpsDay(): Workload {
  const { rest, columns } = dayRequest();
  const body = JSON.stringify({ ...rest, observations: columns });
  const count = columns.epoch.length;
  return {
    name: `GPS-like day (${count} observations, columns JSON ${(body.length / 1e6).toFixed(1)} MB)`,
    path: '/v1/zwd-estimates',
    body,
    type: 'application/json',
    accept: 'application/json',
    block: 10,
  };
}

/** The GPS-like day as columns JSON with the `shape=columns` answer. */
export function gpsDayColumnsOut(): Workload {
  return { ...gpsDay(), name: 'GPS-like day, columns JSON in, shape=columns out', path: '/v1/zwd-estimates?shape=columns' };
}

/** The GPS-like day as an Arrow table in, `Accept: Arrow` out (the same form as the columns bench). */
export function gpsDayArrow(): Workload {
  const body = columnsArrow(dayRequest());
  return { ...gpsDay(), name: `GPS-like day, Arrow in (${(body.length / 1e6).toFixed(1)} MB) and out`, body, type: ARROW, accept: ARROW };
}

export function slantArrow(): Workload {
  const table = tableFromArrays({ elevation_deg: Float64Array.from(elevation), azimuth_deg: Float64Array.from(azimuth) }) as Table;
  table.schema.metadata.set('request', JSON.stringify(base));
  return {
    name: 'slant delays, 10 000 directions, Arrow in and out',
    path: '/v1/slant-delays',
    body: tableToIPC(table, 'stream') as Uint8Array<ArrayBuffer>,
    type: ARROW,
    accept: ARROW,
    block: 40,
  };
}

export function slantColumns(): Workload {
  const body = JSON.stringify({ ...base, directions: { elevation_deg: elevation, azimuth_deg: azimuth } });
  return {
    name: 'slant delays, 10 000 directions, columns JSON in, shape=columns out',
    path: '/v1/slant-delays?shape=columns',
    body,
    type: 'application/json',
    accept: 'application/json',
    block: 30,
  };
}

export async function warmSlant(s: Service): Promise<void> {
  for (const model of MAPPING_MODEL_KEYS) {
    const coefficients = model === 'vmf1' ? { coefficients: { ah: 0.00121, aw: 0.00055, height_reference: 'site' } } : {};
    const body = JSON.stringify({ ...base, model, ...coefficients, directions: { elevation_deg: elevation, azimuth_deg: azimuth } });
    await send(s, { name: 'warm', path: '/v1/slant-delays', body, type: 'application/json', accept: 'application/json', block: 1 });
  }
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const fmt = (xs: number[]) => `${median(xs).toFixed(2)} (${Math.min(...xs).toFixed(2)}–${Math.max(...xs).toFixed(2)})`;

/**
 * When one of the builds compared is this tree's dist/, compiles it from the current sources first (as npm start
 * does, scripts/build-if-stale.mjs), so that "new" is the code checked out.
 */
export function buildDistIfNamed(...dirs: string[]): void {
  if (dirs.includes('dist') && spawnSync(process.execPath, ['scripts/build-if-stale.mjs'], { stdio: 'inherit' }).status !== 0)
    throw new Error('the build of dist/ failed');
}

/** The environment variable `name` of the bench ("NAME=value NAME=value") as an environment for a service. */
export const envOf = (name: string): Record<string, string> =>
  Object.fromEntries(
    (process.env[name] ?? '')
      .split(' ')
      .filter(Boolean)
      .map((pair) => [pair.slice(0, pair.indexOf('=')), pair.slice(pair.indexOf('=') + 1)]),
  );

export default async function edgeAb(): Promise<string[]> {
  const oldDir = process.env.BENCH_EDGE_OLD ?? 'dist';
  const newDir = process.env.BENCH_EDGE_NEW ?? 'dist';
  buildDistIfNamed(oldDir, newDir);
  const blocks = Number(process.env.BENCH_EDGE_BLOCKS ?? 10);
  // A replica that has run for a while costs less than a fresh one: code run once a request (fastify, node's
  // HTTP, apache-arrow's reader and writer, zod) is optimised by V8 only after hundreds to thousands of requests
  // (slant Arrow: 2.7–3.4 ms a request in the first 500, 1.6–1.9 ms from about the 3 000th on). The default
  // warm-up (10 requests) measures a fresh service; BENCH_EDGE_WARM=<n> measures after n requests per workload.
  const warmRequests = process.env.BENCH_EDGE_WARM ? Number(process.env.BENCH_EDGE_WARM) : undefined;
  const part = process.env.BENCH_EDGE_PART;
  const all = { gps: gpsDay, 'gps-columns': gpsDayColumnsOut, 'gps-arrow': gpsDayArrow, arrow: slantArrow, columns: slantColumns };
  const workloads = Object.entries(all)
    .filter(([k]) => !part || part.split(',').includes(k))
    .map(([, make]) => make());
  const flagsOf = (name: string) => (process.env[name] ?? '').split(' ').filter(Boolean);
  const oldFlags = flagsOf('BENCH_EDGE_OLD_FLAGS');
  const newFlags = flagsOf('BENCH_EDGE_NEW_FLAGS');
  const services = [
    await startService('old', oldDir, oldFlags, envOf('BENCH_EDGE_OLD_ENV')),
    await startService('new', newDir, newFlags, envOf('BENCH_EDGE_NEW_ENV')),
  ];
  const lines = [
    `edge by turns: old = ${oldDir} ${oldFlags.join(' ')} ${process.env.BENCH_EDGE_OLD_ENV ?? ''}, new = ${newDir} ${newFlags.join(' ')} ${process.env.BENCH_EDGE_NEW_ENV ?? ''}; ${blocks} blocks each, CPU ms per request, median (range) over blocks`,
  ];
  try {
    for (const s of services) await warmSlant(s);
    for (const w of workloads) {
      // Warm-up, and the same answer from both (Arrow: the same length; its metadata bytes vary).
      const answers: Buffer[] = [];
      for (const s of services) {
        for (let i = 0; i < (warmRequests ?? Math.min(w.block, 10)); i++) await send(s, w);
        answers.push(await send(s, w));
      }
      const same = w.accept === ARROW ? answers[0]!.length === answers[1]!.length : answers[0]!.equals(answers[1]!);
      if (!same) throw new Error(`${w.name}: the two services answer differently`);
      const cpu = new Map(services.map((s) => [s.name, { process: [] as number[], loop: [] as number[] }]));
      const loads: number[] = [];
      for (let b = 0; b < blocks; b++) {
        const order = b % 2 === 0 ? services : [...services].reverse();
        for (const s of order) {
          const pid = s.child.pid!;
          const t0 = ticks(pid);
          for (let i = 0; i < w.block; i++) await send(s, w);
          const t1 = ticks(pid);
          cpu.get(s.name)!.process.push(((t1.process - t0.process) * 10) / w.block);
          cpu.get(s.name)!.loop.push(((t1.loop - t0.loop) * 10) / w.block);
        }
        loads.push(Number(readFileSync('/proc/loadavg', 'utf8').split(' ')[0]));
      }
      lines.push(`${w.name} (blocks of ${w.block}, load ${Math.min(...loads).toFixed(1)}–${Math.max(...loads).toFixed(1)}):`);
      for (const s of services) {
        const c = cpu.get(s.name)!;
        const perCpuSecond = w.path.startsWith('/v1/slant')
          ? `; ${(N / median(c.process) / 1000).toFixed(2)} M directions per CPU-second`
          : '';
        lines.push(`  ${s.name}: process ${fmt(c.process)}, event loop ${fmt(c.loop)}${perCpuSecond}`);
      }
      const ratio = cpu.get('new')!.process.map((x, i) => x / cpu.get('old')!.process[i]!);
      lines.push(`  new ÷ old, process, block by block: ${fmt(ratio)}`);
    }
    lines.push(`peak RSS (VmHWM): ${services.map((s) => `${s.name} ${(peakRssKb(s.child.pid!) / 1024).toFixed(0)} MB`).join(', ')}`);
  } finally {
    for (const s of services) await stopService(s);
  }
  return lines;
}
