/**
 * Network estimation benchmark (issue 12): one day of 30-s data with about 18 satellites in view
 * (six planes of nine satellites, 7° cutoff) for 10, 25 and 50 stations (50 stations ≈ 2.6 M
 * observations), satellite and receiver clocks estimated, gradients, outlier screening (k = 4,
 * one-per-window) with a few gross errors, sigmas scaled, correlated-noise inflation, states at every
 * epoch asked (so the network's model nodes of 300 s / 1 800 s): the route's defaults (the child's
 * fifth argument "nodes-6h" runs the older 300-s / 6-h node model for comparisons). Each run is a fresh
 * child process (bench/network-run.child.ts), so its peak resident set size is its own; the time
 * is that of estimateNetwork alone (wall clock and CPU time of the process, one thread).
 * Linearity in the length of the series: 6 h against 24 h at 10 stations.
 *
 * Targets (issue 12): 50 stations × 1 day < 60 s in-process on one core, memory < 2 GB.
 * `npm run bench -- network`; NETWORK_BENCH_QUICK=1 runs 10 and 25 stations only.
 */

import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

interface Run {
  stations: number;
  hours: number;
  observations: number;
  epochs: number;
  solutions: number;
  rejected: number;
  unknowns: number;
  maxRssMb: number;
  elapsedMs: number;
  cpuMs: number;
}

const child = fileURLToPath(new URL('./network-run.child.ts', import.meta.url));

function run(stations: number, hours: number): Run {
  const out = execFileSync(
    process.execPath,
    ['--max-semi-space-size=32', '--import', 'tsx', child, String(stations), String(hours), 'on'],
    {
      encoding: 'utf8',
      maxBuffer: 1 << 20,
    },
  );
  return JSON.parse(out) as Run;
}

const describe = (r: Run) =>
  `${r.stations} stations × ${r.hours} h: ${(r.observations / 1e6).toFixed(2)} M observations, ${r.epochs} epochs, ${r.unknowns} unknowns, ${r.solutions} solutions (${r.rejected} rejected): ` +
  `${(r.elapsedMs / 1000).toFixed(1)} s wall, ${(r.cpuMs / 1000).toFixed(1)} s CPU, peak RSS ${r.maxRssMb.toFixed(0)} MB`;

export default async function (): Promise<string[]> {
  const lines: string[] = [];
  const quick = process.env.NETWORK_BENCH_QUICK === '1';
  const short = run(10, 6);
  const day10 = run(10, 24);
  lines.push(describe(short), describe(day10));
  lines.push(
    `  series length: 24 h / 6 h = ${(day10.cpuMs / short.cpuMs).toFixed(2)} in CPU time per run (${(day10.solutions / short.solutions).toFixed(2)} in solutions) [target ≈ 4]`,
  );
  const day25 = run(25, 24);
  lines.push(describe(day25));
  const runs = [day10, day25];
  if (!quick) {
    const day50 = run(50, 24);
    lines.push(`${describe(day50)} [target < 60 s, < 2 GB]`);
    runs.push(day50);
  }
  // Growth with the number of stations: exponent of CPU time per solution between the smallest and largest run.
  const a = runs[0]!;
  const b = runs[runs.length - 1]!;
  const perSolution = (r: Run) => r.cpuMs / r.solutions;
  const exponent = Math.log(perSolution(b) / perSolution(a)) / Math.log(b.stations / a.stations);
  lines.push(
    `  growth with stations: CPU time per solution ∝ S^${exponent.toFixed(2)} between ${a.stations} and ${b.stations} stations (${(perSolution(a) / 1000).toFixed(1)} s → ${(perSolution(b) / 1000).toFixed(1)} s); per epoch the dense front is 6S wide, so the elimination grows as S² per node and S³ per epoch`,
  );
  return lines;
}
