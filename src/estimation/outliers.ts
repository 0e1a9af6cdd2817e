/**
 * Outlier screening with normalised (studentised) residuals.
 *
 * The normalised residual of observation i is Pope's τ:
 *
 *     τ_i = v_i / (σ̂0 σ_v_i),   σ̂0² = Ω / f (the a-posteriori variance factor)
 *
 * with v_i the post-fit residual, σ_v_i its a-priori standard deviation from Q_v = Q_ℓ − A Q_x Aᵀ
 * (least-squares.ts; so the leverage of each observation is accounted for, unlike |v_i|/σ_i), Ω the
 * weighted square sum of all residuals including the constraints and f the degrees of freedom.
 * Pope, A. J. (1976), The statistics of residuals and the detection of outliers, NOAA Technical
 * Report NOS 65 NGS 1 (from memory). It is Baarda's (1968) w-test statistic w_i = v_i/σ_v_i divided
 * by σ̂0, so a wrong sigma0_m scales every τ alike and does not by itself cause rejections.
 *
 * The loop (issue text): solve, reject the observation with the largest |τ| above k, re-solve,
 * until no |τ| exceeds k. Rejecting one observation per solution makes the cost grow with the
 * number of rejections times the number of observations, i.e. quadratically with the time span
 * when outliers occur at a steady rate. Mode "one-per-window" (the default) therefore rejects in
 * one iteration the largest |τ| > k and, greedily in decreasing |τ|, every further candidate more
 * than a window W from all candidates taken so far. A gross error shifts the estimates around its
 * own epoch over the length of the smoother's kernel, so candidates that far apart do not mask or
 * inflate each other; the result is the one-at-a-time result (checked in the tests against the
 * dense one-at-a-time reference) at a cost linear in the span. W:
 * - piecewise-linear nodes: max(3 Δ, 1800 s), Δ the node spacing (a node's influence spans 2 Δ);
 * - states at every epoch: the kernel w_j ∝ λ^|j| of the random-walk smoother (correlated-noise.ts,
 *   λ + 1/λ = 2 + Q I) falls below 1e-3 after n = ln(1e-3)/ln λ epochs; W = n sampling intervals
 *   for the slowest family (median λ over the epochs), between 300 s and 1800 s. For 30 s data of
 *   four constellations λ ≈ 0.4–0.6, so W is the 300 s floor.
 * "one-per-solution" is the textbook loop for those who want it.
 *
 * Observations with redundancy σ_v²/σ² below MIN_TESTABLE_REDUNDANCY cannot be tested (they alone
 * determine a parameter) and are never rejected, so screening never makes the system singular.
 */

import type { Design } from './design.js';
import { MIN_TESTABLE_REDUNDANCY, type Solution } from './least-squares.js';
import type { OutlierRejectionMode } from './types.js';

/** Shortest time between two rejections of one iteration in "one-per-window" mode [s]. */
export const MIN_REJECTION_WINDOW_S = 1800;
/** ... and at least this many ZWD intervals. */
export const MIN_REJECTION_WINDOW_INTERVALS = 3;

export interface RejectionCandidate {
  /** Design index of the observation. */
  index: number;
  /** τ, signed. */
  normalizedResidual: number;
}

/** Shortest window of "one-per-window" mode with states at every epoch [s]. */
export const MIN_EPOCH_STATE_WINDOW_S = 300;

/** Window W of "one-per-window" mode with piecewise-linear nodes of spacing Δ [ms]. */
export function nodeRejectionWindowMs(zwdIntervalS: number): number {
  return Math.max(MIN_REJECTION_WINDOW_INTERVALS * zwdIntervalS, MIN_REJECTION_WINDOW_S) * 1000;
}

/**
 * Window W with states at every epoch [ms]: see header.
 *
 * @param lambdas median kernel factor λ of each family, in (0, 1]
 * @param samplingMs epoch spacing [ms]
 */
export function epochStateRejectionWindowMs(lambdas: readonly number[], samplingMs: number): number {
  let epochs = 0;
  // An indexed loop: `for … of` was compiled for one elements kind of the array and deoptimised on the other
  // (medians that are whole numbers make an array of small integers), several times a request (`--trace-deopt`).
  for (let i = 0; i < lambdas.length; i++) {
    const l = lambdas[i]!;
    epochs = Math.max(epochs, l >= 1 ? Infinity : l <= 0 ? 1 : Math.log(1e-3) / Math.log(l));
  }
  return Math.min(Math.max(epochs * samplingMs, MIN_EPOCH_STATE_WINDOW_S * 1000), MIN_REJECTION_WINDOW_S * 1000);
}

/**
 * Observations to reject after this solution, largest |τ| first; empty when no |τ| exceeds k.
 *
 * @param sigmaZero σ̂0 (√variance factor), or 1 when the degrees of freedom are 0
 * @param threshold k
 * @param windowMs the window W of "one-per-window" mode [ms], evaluated only when two or more candidates compete
 */
export function rejectionCandidates(
  design: Design,
  solution: Solution,
  used: Uint8Array,
  sigmaZero: number,
  threshold: number,
  mode: OutlierRejectionMode,
  windowMs: () => number,
): RejectionCandidate[] {
  const above: RejectionCandidate[] = [];
  // |τ| > k needs v² > (k σ̂0)² σ_v²: observations below that bound less a relative 1e-9 (far more
  // than the rounding of either form) are passed over without the square root; the others get τ exactly.
  const bound = (threshold * sigmaZero) ** 2 * (1 - 1e-9);
  for (let s = 0; s < used.length; s++) {
    if (!used[s]) continue;
    const sigma = Math.sqrt(design.observationVarianceM2[s]!);
    const qv = solution.residualVarianceM2[s]!;
    if (!(qv > MIN_TESTABLE_REDUNDANCY * sigma * sigma)) continue;
    const v = solution.fittedResidualM[s]!;
    if (v * v <= bound * qv) continue;
    const tau = solution.fittedResidualM[s]! / (sigmaZero * Math.sqrt(qv));
    if (Math.abs(tau) > threshold) above.push({ index: s, normalizedResidual: tau });
  }
  if (above.length === 0) return [];
  above.sort((a, b) => Math.abs(b.normalizedResidual) - Math.abs(a.normalizedResidual) || a.index - b.index);
  if (mode === 'one-per-solution' || above.length === 1) return [above[0]!];
  const window = windowMs();

  // Greedy in decreasing |τ|: a candidate is taken when no taken one is within the window.
  const takenMs: number[] = [];
  const out: RejectionCandidate[] = [];
  for (const c of above) {
    const t = design.epochMs[epochIndexOf(design.epochStart, c.index)]!;
    if (takenMs.some((u) => Math.abs(u - t) < window)) continue;
    takenMs.push(t);
    out.push(c);
  }
  return out;
}

/** Epoch k of design observation s: epochStart[k] ≤ s < epochStart[k + 1] (binary search; candidates are few). */
function epochIndexOf(epochStart: Int32Array, s: number): number {
  let lo = 0;
  let hi = epochStart.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (epochStart[mid]! <= s) lo = mid;
    else hi = mid;
  }
  return lo;
}
