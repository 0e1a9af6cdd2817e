/**
 * A network day from residual deposits through HTTP (POST /v1/network/days/{day}/zwd-estimates, issue
 * 12: networks beyond one request body): 50 stations (NETWORK_DAY_BENCH_STATIONS), 24 h of 30-s data,
 * about 18 satellites in view, default options (clocks estimated), one estimation worker, SQLite
 * archive. Each run in a fresh child process (bench/network-day.child.ts) so that its peak RSS is its
 * own (the simulation and the deposits run in a child of their own before it); compare with the
 * in-process figures of `npx tsx bench/run.ts network.bench` (same simulated network).
 * `npm run bench -- network-day`.
 */

import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const child = fileURLToPath(new URL('./network-day.child.ts', import.meta.url));

interface Run {
  stations: number;
  observations: number;
  wallMs: number;
  cpuMs: number;
  maxRssMb: number;
  answerBytes: number;
}

export default async function networkDayBench(): Promise<string[]> {
  const stations = Number(process.env.NETWORK_DAY_BENCH_STATIONS ?? 50);
  const runs = Number(process.env.NETWORK_DAY_BENCH_RUNS ?? 2);
  const lines: string[] = [];
  const results: Run[] = [];
  for (let r = 0; r < runs; r++) {
    const dir = mkdtempSync(join(tmpdir(), 'tropodelay-bench-network-day-'));
    const node = (mode: string) =>
      execFileSync(process.execPath, ['--max-semi-space-size=32', '--import', 'tsx', child, mode, dir, String(stations)], {
        encoding: 'utf8',
        maxBuffer: 1 << 20,
      });
    let run: Run;
    try {
      node('deposit');
      run = JSON.parse(node('serve')) as Run;
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    results.push(run);
    lines.push(
      `run ${r + 1}: ${run.stations} stations, ${(run.observations / 1e6).toFixed(2)} M observations: HTTP wall ${(run.wallMs / 1000).toFixed(1)} s, process CPU ${(run.cpuMs / 1000).toFixed(1)} s, peak RSS ${run.maxRssMb.toFixed(0)} MB, answer ${(run.answerBytes / 1e6).toFixed(1)} MB (load ${loadavg()[0]!.toFixed(1)})`,
    );
  }
  const range = (f: (r: Run) => number, d = 1) => `${Math.min(...results.map(f)).toFixed(d)}–${Math.max(...results.map(f)).toFixed(d)}`;
  lines.push(
    `network day from deposits, ${stations} stations: wall ${range((r) => r.wallMs / 1000)} s, CPU ${range((r) => r.cpuMs / 1000)} s, peak RSS ${range((r) => r.maxRssMb, 0)} MB`,
  );
  return lines;
}
