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
 * one iteration the largest |τ| > k and, greedily in decreasing |τ|, every further candidate whose
 * ZWD interval is more than `window` intervals from all candidates taken so far, window =
 * max(3, ⌈1800 s / Δ⌉) intervals (at least 30 min). A gross error shifts the estimates around its
 * own epoch over about √(R)/q (R the white-noise density of the epoch-wise ZWD information, q the
 * random walk; a few minutes for 30 s data and 10 mm/√h), so candidates that far apart do not mask
 * or inflate each other; the result is the one-at-a-time result (checked in the tests against
 * the dense one-at-a-time reference) at a cost linear in the span. "one-per-solution" is the
 * textbook loop for those who want it.
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

/** Window of "one-per-window" mode in ZWD intervals. */
export function rejectionWindowIntervals(zwdIntervalS: number): number {
  return Math.max(MIN_REJECTION_WINDOW_INTERVALS, Math.ceil(MIN_REJECTION_WINDOW_S / zwdIntervalS - 1e-9));
}

/**
 * Observations to reject after this solution, largest |τ| first; empty when no |τ| exceeds k.
 *
 * @param sigmaZero σ̂0 (√variance factor), or 1 when the degrees of freedom are 0
 * @param threshold k
 */
export function rejectionCandidates(
  design: Design,
  solution: Solution,
  used: Uint8Array,
  sigmaZero: number,
  threshold: number,
  mode: OutlierRejectionMode,
  zwdIntervalS: number,
): RejectionCandidate[] {
  const above: RejectionCandidate[] = [];
  for (let s = 0; s < used.length; s++) {
    if (!used[s]) continue;
    const sigma = design.sigmaM[s]!;
    const qv = solution.residualVarianceM2[s]!;
    if (!(qv > MIN_TESTABLE_REDUNDANCY * sigma * sigma)) continue;
    const tau = solution.fittedResidualM[s]! / (sigmaZero * Math.sqrt(qv));
    if (Math.abs(tau) > threshold) above.push({ index: s, normalizedResidual: tau });
  }
  if (above.length === 0) return [];
  above.sort((a, b) => Math.abs(b.normalizedResidual) - Math.abs(a.normalizedResidual) || a.index - b.index);
  if (mode === 'one-per-solution') return [above[0]!];

  // Interval of each observation's epoch (the design keeps it per epoch).
  const epochOf = epochIndexOf(design);
  const window = rejectionWindowIntervals(zwdIntervalS);
  const taken = new Uint8Array(design.zwd.count);
  const out: RejectionCandidate[] = [];
  for (const c of above) {
    const j = design.zwdInterval[epochOf[c.index]!]!;
    let free = true;
    for (let d = Math.max(0, j - window); d <= Math.min(design.zwd.count - 1, j + window) && free; d++) if (taken[d]) free = false;
    if (!free) continue;
    taken[j] = 1;
    out.push(c);
  }
  return out;
}

function epochIndexOf(design: Design): Int32Array {
  const out = new Int32Array(design.residualM.length);
  for (let k = 0; k + 1 < design.epochStart.length; k++) out.fill(k, design.epochStart[k]!, design.epochStart[k + 1]!);
  return out;
}
