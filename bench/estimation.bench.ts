/**
 * ZWD estimation benchmark (issues 3, 10 and 14): in-process time for one realistic day of
 * four-constellation data (≈ 92 000 observations), CPU time of it and of a GPS-like day (≈ 26 000
 * observations, issue 14), the four-day to one-day ratio (linear scaling),
 * peak memory for seven days (in a child process), and the speed-up against the dense
 * least-squares solver at one day.
 *
 * Data: test/helpers/realistic-sky.ts (GPS, GLONASS, Galileo, BeiDou MEO; 30 s sampling; 7°
 * cutoff; 70 % AR(1) noise; a front; 100 gross errors and a 1-h gap per day), default options
 * (random-walk states at every epoch, 300 s output nodes, 6 h gradient output nodes, epoch biases,
 * variance components, correlated-noise inflation, screening k = 4 one-per-window). Times are
 * ranges (min–max) and medians of repeated runs after warm-up, interleaved so that load from
 * other processes hits both sizes alike. Set BENCH_SKIP_DENSE=1 to skip the dense solver, and
 * BENCH_ESTIMATION_REFERENCE=<root of an older source tree> to time its estimator against this one
 * by turns (CPU time, the same process), and to compare the peak memory of the estimation step on 30
 * GPS-like days (bench/service-memory.child.ts `estimator`, a fresh process each, the two trees by turns,
 * BENCH_MEMORY_ROUNDS rounds, default 3; 0 skips it).
 */

import { execFileSync } from 'node:child_process';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { generateSyntheticResiduals } from '../scripts/synthetic-residuals.js';
import { estimateZwd } from '../src/estimation/estimate.js';
import type { ZwdEstimationInput } from '../src/estimation/types.js';
import { denseZwdEstimate } from '../test/helpers/dense-estimation.js';
import { simulateSky } from '../test/helpers/realistic-sky.js';
import { skyInput, toEstimationInput } from '../test/helpers/synthetic-input.js';

const LATITUDE_DEG = 46.2;

/** Realistic days: one front, one gap and 100 gross errors per day. */
function realisticDays(days: number): ZwdEstimationInput {
  const sky = simulateSky({ seed: 11, durationS: days * 86_400, grossErrors: 100 * days });
  return skyInput(sky);
}

/** A GPS-like day (issue 14's "30-satellite data"): one constellation of 30 satellites, 7–11 in view, 25 gross errors. */
function gpsLikeDay(): ZwdEstimationInput {
  return skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 25, constellations: ['gps'] }));
}

/** CPU milliseconds (user + system of this process) of each of `rounds` runs, after one warm-up run. */
function cpuTimes(input: ZwdEstimationInput, rounds: number): number[] {
  const out: number[] = [];
  for (let r = 0; r <= rounds; r++) {
    const before = process.cpuUsage();
    estimateZwd(input);
    const used = process.cpuUsage(before);
    if (r > 0) out.push((used.user + used.system) / 1000);
  }
  return out;
}

interface Timing {
  median: number;
  min: number;
  max: number;
  solutions: number;
}

function summarise(times: number[], solutions: number): Timing {
  const sorted = times.slice().sort((a, b) => a - b);
  return { median: sorted[Math.floor(sorted.length / 2)]!, min: sorted[0]!, max: sorted[sorted.length - 1]!, solutions };
}

/** Times the inputs in turn, round after round, so that load from other processes hits them alike. */
function interleaved(inputs: ZwdEstimationInput[], rounds: number): Timing[] {
  const times = inputs.map(() => [] as number[]);
  const solutions = inputs.map(() => 0);
  for (let r = 0; r < rounds; r++) {
    inputs.forEach((input, i) => {
      const started = performance.now();
      solutions[i] = estimateZwd(input).statistics.solutions;
      times[i]!.push(performance.now() - started);
    });
  }
  return times.map((t, i) => summarise(t, solutions[i]!));
}

/**
 * Before/after in one process: the estimator of an older source tree (BENCH_ESTIMATION_REFERENCE =
 * its root, e.g. `git archive <commit> src | tar -x -C /tmp/before`, with node_modules linked) and
 * this one, run by turns on the same inputs so that load from other processes hits both alike.
 */
async function againstReference(root: string, inputs: ZwdEstimationInput[]): Promise<string[]> {
  const module = (await import(pathToFileURL(`${root}/src/estimation/estimate.ts`).href)) as { estimateZwd: typeof estimateZwd };
  const before = module.estimateZwd;
  const out: string[] = [];
  for (const input of inputs) {
    const times: [number[], number[]] = [[], []];
    for (let r = 0; r < 33; r++) {
      for (const [i, estimate] of [before, estimateZwd].entries()) {
        const started = process.cpuUsage();
        estimate(input);
        const used = process.cpuUsage(started);
        if (r >= 3) times[i]!.push((used.user + used.system) / 1000);
      }
    }
    const [a, b] = times.map((t) => summarise(t, 0)) as [Timing, Timing];
    out.push(
      `  against ${root}, interleaved, ${input.observations.epochMs.length} observations, CPU ms median (range) over 30 runs: before ${a.median.toFixed(1)} (${a.min.toFixed(1)}–${a.max.toFixed(1)}), now ${b.median.toFixed(1)} (${b.min.toFixed(1)}–${b.max.toFixed(1)}): ${(b.median / a.median).toFixed(2)}×`,
    );
  }
  return out;
}

interface StepMemory {
  observations: number;
  peakOverBeforeMb: number;
  peakBytesPerObservation: number;
  keptHeapMb: number;
}

/**
 * The estimation step (runZwdEstimation) on 30 GPS-like days, its peak RSS over the RSS before it, for an older
 * source tree and this one, each run in a fresh process (node's flags of `npm run bench`, --max-semi-space-size=32
 * included), the trees by turns so that load and the machine's state hit both alike.
 */
function memoryAgainstReference(root: string, rounds: number): string[] {
  if (!(rounds > 0)) return [];
  const child = fileURLToPath(new URL('./service-memory.child.ts', import.meta.url));
  const here = fileURLToPath(new URL('..', import.meta.url));
  const runs: [StepMemory[], StepMemory[]] = [[], []];
  for (let r = 0; r < rounds; r++) {
    for (const [i, tree] of [root, here].entries()) {
      const out = execFileSync(process.execPath, ['--expose-gc', '--import', 'tsx', child, '30', 'json', 'estimator', tree], {
        encoding: 'utf8',
      });
      runs[i]!.push(JSON.parse(out.trim().split('\n').pop()!) as StepMemory);
    }
  }
  const range = (xs: number[], unit: string) => `${Math.min(...xs).toFixed(0)}–${Math.max(...xs).toFixed(0)} ${unit}`;
  const describe = (m: StepMemory[]) =>
    `+${range(
      m.map((x) => x.peakOverBeforeMb),
      'MB',
    )} (${range(
      m.map((x) => x.peakBytesPerObservation),
      'bytes an observation',
    )}; heap kept ${range(
      m.map((x) => x.keptHeapMb),
      'MB',
    )})`;
  return [
    `  estimation step on 30 GPS-like days (${runs[1][0]!.observations} observations), peak RSS over the RSS before it, ${rounds} fresh processes each, by turns: before ${describe(runs[0])}, now ${describe(runs[1])}`,
  ];
}

export default async function (): Promise<string[]> {
  const lines: string[] = [];
  const oneDay = realisticDays(1);
  const fourDays = realisticDays(4);
  // Warm-up: let the JIT compile the hot loops.
  interleaved([oneDay, fourDays], 2);

  const [t1, t4] = interleaved([oneDay, fourDays], 9) as [Timing, Timing];
  lines.push(
    `one realistic day, four constellations, 30 s: ${oneDay.observations.epochMs.length} observations: median ${t1.median.toFixed(0)} ms, range ${t1.min.toFixed(0)}–${t1.max.toFixed(0)} ms over 9 runs (${t1.solutions} solutions: variance components, screening) [target < 500 ms]`,
  );
  lines.push(
    `four days: ${fourDays.observations.epochMs.length} observations: median ${t4.median.toFixed(0)} ms, range ${t4.min.toFixed(0)}–${t4.max.toFixed(0)} ms (${t4.solutions} solutions); four days / one day = ${(t4.median / t1.median).toFixed(2)} (medians), ${(t4.min / t1.min).toFixed(2)} (minima) [target < 5]`,
  );
  const gps = gpsLikeDay();
  const gpsCpu = summarise(cpuTimes(gps, 15), estimateZwd(gps).statistics.solutions);
  const fourCpu = summarise(cpuTimes(oneDay, 9), t1.solutions);
  lines.push(
    `CPU time (process.cpuUsage), default options: GPS-like day (30 satellites, 7–11 in view) ${gps.observations.epochMs.length} observations: median ${gpsCpu.median.toFixed(1)} ms, range ${gpsCpu.min.toFixed(1)}–${gpsCpu.max.toFixed(1)} ms over 15 runs (${gpsCpu.solutions} solutions); the four-constellation day: median ${fourCpu.median.toFixed(1)} ms, range ${fourCpu.min.toFixed(1)}–${fourCpu.max.toFixed(1)} ms over 9 runs`,
  );
  const reference = process.env.BENCH_ESTIMATION_REFERENCE;
  if (reference) lines.push(...(await againstReference(reference, [gps, oneDay])));
  if (reference) lines.push(...memoryAgainstReference(reference, Number(process.env.BENCH_MEMORY_ROUNDS ?? 3)));
  const plain = (input: ZwdEstimationInput) => ({
    ...input,
    options: { ...input.options, outlierThreshold: null, scaleSigmas: false, correlatedNoise: false },
  });
  // Warm-up first: without screening and the other steps the JIT meets new paths (cold runs cost 5–10×).
  interleaved([plain(oneDay)], 5);
  const [p1] = interleaved([plain(oneDay)], 9) as [Timing];
  lines.push(
    `  one solution of the same day (no screening, no variance components, no correlated-noise step): median ${p1.median.toFixed(0)} ms, range ${p1.min.toFixed(0)}–${p1.max.toFixed(0)} ms over 9 runs after 5 warm-up runs`,
  );

  const child = fileURLToPath(new URL('./estimation-memory.child.ts', import.meta.url));
  const memory = JSON.parse(execFileSync(process.execPath, ['--import', 'tsx', child, '7'], { encoding: 'utf8' })) as {
    observations: number;
    epochs: number;
    rssBeforeMb: number;
    maxRssBeforeMb: number;
    maxRssMb: number;
    elapsedMs: number;
  };
  lines.push(
    `seven days (child process): ${memory.observations} observations, ${memory.epochs} epochs, ${memory.elapsedMs.toFixed(0)} ms cold; peak RSS ${memory.maxRssMb.toFixed(0)} MB for the whole process (node, generator and input included; ${memory.rssBeforeMb.toFixed(0)} MB before the estimation) [target < 300 MB]`,
  );

  if (process.env.BENCH_SKIP_DENSE !== '1') {
    // The dense reference at one day of the older 24-satellite data with piecewise-linear 300 s
    // nodes (a state per epoch would make the dense normal matrix ~1 GB).
    const data = generateSyntheticResiduals({ durationS: 86_400, latitudeDeg: LATITUDE_DEG });
    const noScreening = toEstimationInput(data, LATITUDE_DEG, { outlierThreshold: null, parametrisation: 'nodes', correlatedNoise: false });
    const [fast] = interleaved([noScreening], 9) as [Timing];
    const started = performance.now();
    const dense = denseZwdEstimate(noScreening, { covariance: false });
    const denseMs = performance.now() - started;
    lines.push(
      `dense solver at one day (ml-matrix Cholesky of the ${dense.unknowns}-unknown normal matrix with explicit biases, solution only, no variances, no screening): ${(denseMs / 1000).toFixed(1)} s vs ${fast.median.toFixed(0)} ms for the same solution with variances: speed-up ${(denseMs / fast.median).toFixed(0)}× (a lower bound: the dense variances need the inverse, several times the Cholesky cost)`,
    );
  } else {
    lines.push('dense solver skipped (BENCH_SKIP_DENSE=1)');
  }
  return lines;
}
