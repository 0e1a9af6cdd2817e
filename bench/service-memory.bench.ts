/**
 * Peak memory of one replica under estimation load through HTTP (issue 14: "peak RSS per replica under
 * the estimation benchmark stated, and under 600 MB with default settings"; "30 days of data can be sent
 * in one request"). The service runs in its own process (as `npm run bench` runs it: node's
 * --max-semi-space-size=32, which applies to every thread: a worker's resourceLimits cannot lower it) with a worker pool of
 * TROPODELAY_ESTIMATION_WORKERS=2, as on a 2-core replica; two clients send one GPS-like day (30 satellites
 * at 30 s, 7–11 in view) as column arrays, back to back, then one 30-day request of the same sky (the
 * largest under MAX_OBSERVATIONS) as columns JSON and then as an Arrow table while the clients go on.
 *
 * `idle` is the resident set when the replica is ready (warm), and again BENCH_MEMORY_SETTLE_S (default 8) later,
 * e.g. past the threads' idle trim (TROPODELAY_WORKER_IDLE_TRIM_S=6 in BENCH_MEMORY_NEW_ENV and
 * BENCH_MEMORY_SETTLE_S=14: its two collections 6 s apart; the trim is off by default). The figure is the
 * service process's peak resident set (VmHWM of /proc/<pid>/status: the main thread,
 * the workers and their heaps) in each phase (reset between phases through /proc/<pid>/clear_refs). Settings compared in interleaved rounds
 * (BENCH_ROUNDS, default 2): the defaults (the pool's memory budget: a 30-day request runs alone and its
 * threads are replaced after it) and the same service without it (TROPODELAY_COMPUTE_MEMORY_BUDGET_MB=0).
 * The service CPU per 1-day request (its process, all threads, /proc/<pid>/stat) beside it. BENCH_FROM_DIST=1
 * runs the service as `npm start` does (compiled dist/, no tsx) instead. BENCH_MONTH=arrow (or json) sends
 * only that 30-day request: the Arrow phase after the JSON one starts from what the JSON phase left resident
 * (pages the allocator keeps), so its peak alone is measured this way.
 *
 * By turns with another build: BENCH_MEMORY_OLD=<dir of a built dist/> (e.g. /tmp/ref-main/dist) adds its defaults
 * as a setting of its own ("defaults, old build"), run in the same interleaved rounds (implies BENCH_FROM_DIST=1
 * for both). BENCH_MEMORY_OLD_ENV / BENCH_MEMORY_NEW_ENV: extra environment of each ("NAME=value NAME=value",
 * e.g. a C library setting).
 */

import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { DEFAULT_WARM_UP_ESTIMATIONS } from '../src/config.js';

/** BENCH_MEMORY_SETTLE_S: how long the bench waits after ready before it reads the resident set again [s] (default 8). */
const SETTLE_MS = Number(process.env.BENCH_MEMORY_SETTLE_S ?? 8) * 1000;
import { MAX_OBSERVATIONS } from '../src/limits.js';
import { startServerProcess, type ServerProcess } from '../test/helpers/server-process.js';
import { columnsArrow, columnsJson, gpsLikeColumns } from '../test/helpers/gps-like-days.js';
import { envOf } from './edge-ab.bench.js';

const ARROW = 'application/vnd.apache.arrow.stream';
const CLOCK_TICKS = 100;

const statusMb = (pid: number, field: string) => {
  const m = new RegExp(`${field}:\\s+(\\d+) kB`).exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : NaN;
};

/** Resets the process's peak resident set (VmHWM) to its current one, so that each phase reports its own peak. */
const resetPeak = (pid: number) => writeFileSync(`/proc/${pid}/clear_refs`, '5');

/** CPU seconds of a process, all threads (utime + stime of /proc/<pid>/stat). */
const cpuS = (pid: number) => {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return (Number(fields[11]) + Number(fields[12])) / CLOCK_TICKS;
};

async function post(server: ServerProcess, body: Uint8Array<ArrayBuffer>, type: string): Promise<void> {
  const res = await fetch(`${server.baseUrl}/v1/zwd-estimates?fields=ztd_m,sigma_m`, {
    method: 'POST',
    body,
    headers: { 'content-type': type },
  });
  await res.arrayBuffer();
  if (!res.ok) throw new Error(`${res.status}`);
}

interface Round {
  idleMb: number;
  settledMb: number;
  dayPeakMb: number;
  dayCpuMs: number;
  jsonPeakMb: number;
  jsonS: number;
  arrowPeakMb: number;
  arrowS: number;
  dayRequests: number;
}

async function round(
  env: Record<string, string>,
  dist: string | undefined,
  dayBody: Uint8Array<ArrayBuffer>,
  monthJson: Uint8Array<ArrayBuffer>,
  monthArrow: Uint8Array<ArrayBuffer>,
): Promise<Round> {
  // The service's default warm-up (startServerProcess starts test servers cold): `idle` is then a warm, ready replica.
  const settings = { TROPODELAY_ESTIMATION_WORKERS: '2', TROPODELAY_WARM_UP_ESTIMATIONS: String(DEFAULT_WARM_UP_ESTIMATIONS), ...env };
  const fromDist = dist ?? false;
  // BENCH_FROM_DIST=1: the service as `npm start` runs it, from a dist/ built beforehand (npx tsc -p tsconfig.build.json).
  if (fromDist && !existsSync(`${fromDist}/server.js`))
    throw new Error(`${fromDist}/server.js not found: build it first (npx tsc -p tsconfig.build.json)`);
  const server = await startServerProcess(settings, true, fromDist);
  const pid = server.child.pid!;
  try {
    const idleMb = statusMb(pid, 'VmRSS');
    // And once more after a quiet time, e.g. past the threads' idle trim (TROPODELAY_WORKER_IDLE_TRIM_S).
    await new Promise((r) => setTimeout(r, SETTLE_MS));
    const settledMb = statusMb(pid, 'VmRSS');
    // Warm-up: the worker threads start (and, under tsx, compile) with the first tasks.
    await Promise.all([post(server, dayBody, 'application/json'), post(server, dayBody, 'application/json')]);
    resetPeak(pid);
    let running = true;
    let dayRequests = 0;
    const client = async () => {
      while (running) {
        await post(server, dayBody, 'application/json');
        dayRequests++;
      }
    };
    const cpu0 = cpuS(pid);
    const clients = [client(), client()];
    await new Promise((r) => setTimeout(r, 8000));
    const dayCpuMs = ((cpuS(pid) - cpu0) / Math.max(1, dayRequests)) * 1000;
    const dayPeakMb = statusMb(pid, 'VmHWM');
    const month = process.env.BENCH_MONTH ?? 'both';
    // One 30-day request: its time [s] and the peak RSS over it [MB]; NaN when BENCH_MONTH leaves it out.
    const monthPhase = async (body: Uint8Array<ArrayBuffer>, type: string, sent: boolean) => {
      if (!sent) return { s: Number.NaN, peakMb: Number.NaN };
      resetPeak(pid);
      const t0 = performance.now();
      await post(server, body, type);
      return { s: (performance.now() - t0) / 1000, peakMb: statusMb(pid, 'VmHWM') };
    };
    const json = await monthPhase(monthJson, 'application/json', month !== 'arrow');
    const arrow = await monthPhase(monthArrow, ARROW, month !== 'json');
    running = false;
    await Promise.all(clients);
    return {
      idleMb,
      settledMb,
      dayPeakMb,
      dayCpuMs,
      jsonPeakMb: json.peakMb,
      jsonS: json.s,
      arrowPeakMb: arrow.peakMb,
      arrowS: arrow.s,
      dayRequests,
    };
  } finally {
    await server.stop();
  }
}

const range = (xs: number[], digits = 0) => {
  if (xs.every(Number.isNaN)) return 'not sent';
  const lo = Math.min(...xs).toFixed(digits);
  const hi = Math.max(...xs).toFixed(digits);
  return lo === hi ? lo : `${lo}–${hi}`;
};

export default async function bench(): Promise<string[]> {
  const rounds = Number(process.env.BENCH_ROUNDS ?? 2);
  const day = gpsLikeColumns(1);
  const dayBody = columnsJson(day);
  const month = gpsLikeColumns(30);
  if (month.count > MAX_OBSERVATIONS) throw new Error(`30 days are ${month.count} observations, over MAX_OBSERVATIONS`);
  const monthJson = columnsJson(month);
  const monthArrow = columnsArrow(month);
  const oldDist = process.env.BENCH_MEMORY_OLD;
  const newDist = oldDist || process.env.BENCH_FROM_DIST === '1' ? 'dist' : undefined;
  const newEnv = envOf('BENCH_MEMORY_NEW_ENV');
  const settings: Record<string, { env: Record<string, string>; dist: string | undefined }> = {
    defaults: { env: newEnv, dist: newDist },
    'without the memory budget (as before)': { env: { ...newEnv, TROPODELAY_COMPUTE_MEMORY_BUDGET_MB: '0' }, dist: newDist },
  };
  // BENCH_SETTINGS=defaults: the defaults alone (e.g. to compare two builds of dist/ in alternate runs).
  const chosen = Object.entries(settings).filter(
    ([name]) => process.env.BENCH_SETTINGS === undefined || process.env.BENCH_SETTINGS === name,
  );
  if (oldDist) chosen.unshift([`defaults, old build ${oldDist}`, { env: envOf('BENCH_MEMORY_OLD_ENV'), dist: oldDist }]);
  const results = new Map<string, Round[]>(chosen.map(([k]) => [k, []]));
  for (let r = 0; r < rounds; r++) {
    // By turns: the order of the settings alternates from one round to the next.
    const order = r % 2 === 0 ? chosen : [...chosen].reverse();
    for (const [name, { env, dist }] of order) results.get(name)!.push(await round(env, dist, dayBody, monthJson, monthArrow));
  }
  const loadavg = readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');
  return [
    `service memory (${newDist ? 'node <dist>/server.js, as npm start' : 'through tsx'}${
      process.env.BENCH_MEMORY_NEW_ENV ? `, new with ${process.env.BENCH_MEMORY_NEW_ENV}` : ''
    }${process.env.BENCH_MEMORY_OLD_ENV ? `, old with ${process.env.BENCH_MEMORY_OLD_ENV}` : ''}), 2 workers, ${rounds} interleaved rounds, load average at the end ${loadavg}; 1 day = ${day.count} observations (${(dayBody.length / 1e6).toFixed(1)} MB columns JSON), 30 days = ${month.count} (columns JSON ${(monthJson.length / 1e6).toFixed(1)} MB, Arrow ${(monthArrow.length / 1e6).toFixed(1)} MB); peak RSS of the service process (MB):`,
    ...[...results].map(
      ([name, rs]) =>
        `  ${name}: idle ${range(rs.map((x) => x.idleMb))}, ${SETTLE_MS / 1000} s later ${range(
          rs.map((x) => x.settledMb),
        )}; two clients of 1-day requests ${range(rs.map((x) => x.dayPeakMb))} (service CPU ${range(
          rs.map((x) => x.dayCpuMs),
        )} ms a request); 30 days as columns JSON ${range(rs.map((x) => x.jsonPeakMb))} (${range(
          rs.map((x) => x.jsonS),
          1,
        )} s), then as Arrow ${range(rs.map((x) => x.arrowPeakMb))} (${range(
          rs.map((x) => x.arrowS),
          1,
        )} s); ${range(rs.map((x) => x.dayRequests))} day requests a round (target < 600)`,
    ),
  ];
}
