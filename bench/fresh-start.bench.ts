/**
 * A fresh replica by turns (issue 14, the workers' warm-up at start, TROPODELAY_WARM_UP_ESTIMATIONS): services
 * started one after another from two builds (`node --max-semi-space-size=32 <dist>/server.js`, as `npm start`
 * runs it), in alternating order each round; for each: the time from spawn until `GET /v1/ready` answers 200
 * (polled every 20 ms), the process's CPU until then (/proc, all threads) and its resident set then, then the
 * GPS-like day (26 452 observations, columns JSON, rows answer, as bench/edge-ab.bench.ts) sent 40 times one
 * after the other: the wall time of the 1st request, the mean of the first 5 and of all 40, the CPU of the
 * process from spawn to the 40th answer, and its peak resident set (VmHWM). The first answers of all variants
 * are compared byte for byte.
 *
 * `BENCH_FRESH_OLD=<dir of a built dist/> BENCH_FRESH_NEW=dist npm run bench -- fresh-start` (both default to
 * dist/, built first when older than the sources); `BENCH_FRESH_ROUNDS` (default 4); `BENCH_FRESH_WARM_UP`:
 * comma-separated values of TROPODELAY_WARM_UP_ESTIMATIONS for the new build, one variant each (default: its
 * own default only); the old build runs with its defaults.
 */

import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { freePort, serverEnvironment } from '../test/helpers/server-process.js';
import { buildDistIfNamed, gpsDay, send } from './edge-ab.bench.js';

const REQUESTS = 40;

interface Variant {
  name: string;
  dist: string;
  env: Record<string, string>;
}

interface Run {
  readyMs: number;
  startCpuMs: number;
  readyRssMb: number;
  requestMs: number[];
  totalCpuMs: number;
  peakRssMb: number;
  first: Buffer;
}

/** CPU of the whole process so far [ms] (utime + stime, 10 ms ticks). */
function cpuMs(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return (Number(fields[11]) + Number(fields[12])) * 10;
}

const statusMb = (pid: number, key: 'VmRSS' | 'VmHWM') =>
  Number(new RegExp(`${key}:\\s+(\\d+)`).exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? NaN) / 1024;

async function freshRun(v: Variant, body: ReturnType<typeof gpsDay>): Promise<Run> {
  const port = await freePort();
  const dataDir = mkdtempSync(join(tmpdir(), 'fresh-start-'));
  const started = performance.now();
  const child = spawn(process.execPath, ['--max-semi-space-size=32', join(resolve(v.dist), 'server.js')], {
    env: { ...serverEnvironment(port, { TROPODELAY_DATA_DIR: dataDir, ...v.env }), NODE_OPTIONS: '' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const pid = child.pid!;
  const service = { name: v.name, baseUrl: `http://127.0.0.1:${port}` };
  try {
    for (;;) {
      try {
        if ((await fetch(`${service.baseUrl}/v1/ready`)).status === 200) break;
      } catch {
        // not listening yet
      }
      if (performance.now() - started > 120_000 || child.exitCode !== null) throw new Error(`${v.name} did not become ready`);
      await new Promise((r) => setTimeout(r, 20));
    }
    const readyMs = performance.now() - started;
    const startCpuMs = cpuMs(pid);
    const readyRssMb = statusMb(pid, 'VmRSS');
    const requestMs: number[] = [];
    let first: Buffer | undefined;
    for (let i = 0; i < REQUESTS; i++) {
      const t = performance.now();
      const answer = await send(service as never, body);
      requestMs.push(performance.now() - t);
      first ??= answer;
    }
    return { readyMs, startCpuMs, readyRssMb, requestMs, totalCpuMs: cpuMs(pid), peakRssMb: statusMb(pid, 'VmHWM'), first: first! };
  } finally {
    await new Promise<void>((r) => {
      if (child.exitCode !== null) return r();
      child.once('exit', () => r());
      child.kill('SIGTERM');
    });
    rmSync(dataDir, { recursive: true, force: true });
  }
}

const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
const range = (xs: number[], digits = 0) => `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)}`;

export default async function freshStart(): Promise<string[]> {
  const oldDir = process.env.BENCH_FRESH_OLD ?? 'dist';
  const newDir = process.env.BENCH_FRESH_NEW ?? 'dist';
  buildDistIfNamed(oldDir, newDir);
  const rounds = Number(process.env.BENCH_FRESH_ROUNDS ?? 4);
  const counts = (process.env.BENCH_FRESH_WARM_UP ?? '').split(',').filter(Boolean);
  const variants: Variant[] = [
    { name: `old (${oldDir})`, dist: oldDir, env: {} },
    ...(counts.length ? counts : ['']).map((n) => ({
      name: `new (${newDir})${n ? ` warm-up ${n}` : ''}`,
      dist: newDir,
      env: n ? { TROPODELAY_WARM_UP_ESTIMATIONS: n } : ({} as Record<string, string>),
    })),
  ];
  const body = gpsDay();
  const runs = new Map<string, Run[]>(variants.map((v) => [v.name, []]));
  for (let round = 0; round < rounds; round++) {
    const order = round % 2 === 0 ? variants : [...variants].reverse();
    for (const v of order) runs.get(v.name)!.push(await freshRun(v, body));
  }
  const reference = runs.get(variants[0]!.name)![0]!.first;
  const lines = [
    `fresh service by turns, ${rounds} rounds, ${body.name}, ${REQUESTS} requests one after another; ranges over rounds`,
    'variant | until ready [ms] | CPU until ready [ms] | RSS at ready [MB] | 1st request [ms] | mean of first 5 [ms] | mean of 40 [ms] | CPU spawn → 40th answer [ms] | peak RSS [MB]',
  ];
  for (const v of variants) {
    const rs = runs.get(v.name)!;
    for (const r of rs) if (!r.first.equals(reference)) throw new Error(`${v.name}: the answer differs from ${variants[0]!.name}'s`);
    lines.push(
      [
        v.name,
        range(rs.map((r) => r.readyMs)),
        range(rs.map((r) => r.startCpuMs)),
        range(rs.map((r) => r.readyRssMb)),
        range(rs.map((r) => r.requestMs[0]!)),
        range(rs.map((r) => mean(r.requestMs.slice(0, 5)))),
        range(
          rs.map((r) => mean(r.requestMs)),
          1,
        ),
        range(rs.map((r) => r.totalCpuMs)),
        range(rs.map((r) => r.peakRssMb)),
      ].join(' | '),
    );
  }
  lines.push('(answers of every variant identical byte for byte)');
  return lines;
}
