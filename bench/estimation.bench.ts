/**
 * ZWD estimation benchmark (issue 3): in-process time for one day of 30 s data, the four-day to
 * one-day ratio (linear scaling), peak memory for seven days (in a child process), and the
 * speed-up against the dense least-squares solver at one day.
 *
 * Data: scripts/synthetic-residuals.ts (GNSS-like sky, 24 satellites, 7° cutoff: ~20 800
 * observations a day above the cutoff, ~23 000 sent), five gross errors a day, default options
 * (300 s ZWD nodes, 6 h gradient nodes, epoch biases, outlier screening k = 4 one-per-window).
 * Times are medians of repeated runs after warm-up. Set BENCH_SKIP_DENSE=1 to skip the dense
 * solver (about a minute).
 */

import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { generateSyntheticResiduals } from '../scripts/synthetic-residuals.js';
import { estimateZwd } from '../src/estimation/estimate.js';
import type { ZwdEstimationInput } from '../src/estimation/types.js';
import { denseZwdEstimate } from '../test/helpers/dense-estimation.js';
import { toEstimationInput } from '../test/helpers/synthetic-input.js';

const LATITUDE_DEG = 46.2;

function inputForDays(days: number, options: Partial<ZwdEstimationInput['options']> = {}): ZwdEstimationInput {
  const data = generateSyntheticResiduals({ durationS: days * 86_400, grossErrors: 5 * days, latitudeDeg: LATITUDE_DEG });
  return toEstimationInput(data, LATITUDE_DEG, { scaleSigmas: true, ...options });
}

interface Timing {
  median: number;
  min: number;
  solutions: number;
}

function summarise(times: number[], solutions: number): Timing {
  const sorted = times.slice().sort((a, b) => a - b);
  return { median: sorted[Math.floor(sorted.length / 2)]!, min: sorted[0]!, solutions };
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

export default async function (): Promise<string[]> {
  const lines: string[] = [];
  const oneDay = inputForDays(1);
  const fourDays = inputForDays(4);
  // Warm-up: let the JIT compile the hot loops.
  interleaved([oneDay, fourDays], 5);

  const [t1, t4] = interleaved([oneDay, fourDays], 11) as [Timing, Timing];
  lines.push(
    `one day of 30 s data: ${oneDay.observations.epochMs.length} observations, 2881 epochs: median ${t1.median.toFixed(0)} ms, min ${t1.min.toFixed(0)} ms (${t1.solutions} solutions with screening) [target < 200 ms]`,
  );
  lines.push(
    `four days: ${fourDays.observations.epochMs.length} observations: median ${t4.median.toFixed(0)} ms, min ${t4.min.toFixed(0)} ms (${t4.solutions} solutions); four days / one day = ${(t4.median / t1.median).toFixed(2)} (medians), ${(t4.min / t1.min).toFixed(2)} (minima) [target ≈ 4]`,
  );
  const strict = { outlierRejection: 'one-per-solution' as const };
  const [s1, s4] = interleaved(
    [
      { ...oneDay, options: { ...oneDay.options, ...strict } },
      { ...fourDays, options: { ...fourDays.options, ...strict } },
    ],
    3,
  ) as [Timing, Timing];
  lines.push(
    `  for comparison, outlier_rejection one-per-solution: one day ${s1.median.toFixed(0)} ms (${s1.solutions} solutions), four days ${s4.median.toFixed(0)} ms (${s4.solutions} solutions), ratio ${(s4.median / s1.median).toFixed(2)}: the textbook loop grows with rejections × observations`,
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
    const noScreening = { ...oneDay, options: { ...oneDay.options, outlierThreshold: null } };
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
