/**
 * Time-correlated observation noise: its estimate from the post-fit residuals of each satellite
 * arc, and the factor by which it inflates the formal variances of the random-walk states.
 *
 * Why: the weights assume white noise, but multipath and unmodelled slant effects are correlated
 * over minutes along a satellite arc. A smoother that averages over a few epochs then averages
 * noise that does not average out, and its formal errors are too small (issue 10: σ 2.4–3.7× too
 * small with 70 % AR(1) noise of τ = 10 min), while the variance factor stays near 1.
 *
 * 1. Autocorrelation of the normalised residuals z_i = v_i/σ_i, pooled over satellite arcs
 *    (pairs of the same satellite exactly m sampling intervals apart):
 *        ρ(m) = Σ z_t z_{t+m} / n_m  ÷  Σ z² / n,
 *    for m = 1, 2, … up to the first lag where ρ(m) < 2/√n_m (the first lag not significant at
 *    about 95 %; a truncation in the spirit of Geyer's initial sequence, Geyer (1992), Statistical
 *    Science 7, 473–483; from memory), at most MAX_LAG_S (1 h).
 * 2. Inflation. In steady state the estimate of a random walk (step variance Q per epoch) from
 *    per-epoch information I (noise variance R = 1/I) is the two-sided exponential smoother
 *        x̂_k = Σ_j w_j y_{k+j},  w_j = (1 − λ)/(1 + λ) λ^|j|,  λ + 1/λ = 2 + Q I,
 *    (the Wiener smoother of a local-level model; e.g. Durbin & Koopman (2012), Time Series
 *    Analysis by State Space Methods, 2nd ed., ch. 2; from memory), with posterior variance
 *    P = R (1 − λ)/(1 + λ) (checked numerically against a Kalman smoother) of which the noise part
 *    is R Σ w_j² = P (1 + λ²)/(1 + λ)². With noise autocorrelation ρ the noise part is multiplied by
 *        r = 1 + 2 Σ_{m≥1} ρ(m) S(m)/S(0),  S(m) = Σ_j λ^|j| λ^|j+m| = λ^m (2/(1 − λ²) + m − 1),
 *    so the variance is multiplied by 1 + (1 + λ²)/(1 + λ)² (r − 1). This is evaluated per epoch
 *    with the epoch's own information (I from the inverse of its 3×3 bias-reduced normal matrix,
 *    so the correlation of ZWD and gradients is accounted for) and per parameter family.
 *
 * Not included: correlation between satellites (common-mode errors go into the epoch bias when
 * they are common to all satellites, and are otherwise not modelled), and changes of the noise
 * along the day (one ρ for the whole series).
 */

import type { Design } from './design.js';
import { EPOCH_NORMAL_ENTRIES, type Solution } from './least-squares.js';
import { FRESH_ARRAYS, type ArraySource } from './reused-arrays.js';
import type { ZwdEstimationOptions, ZwdEstimationStatistics } from './types.js';

/** Longest lag the autocorrelation is estimated for [s]: 1 h (correlation times up to ~20 min). */
export const MAX_LAG_S = 3600;
/** Every lag up to this one is evaluated ... */
const DENSE_LAGS = 20;
/** ... then every LAG_STEP-th. */
const LAG_STEP = 4;

/**
 * ρ(1), ρ(2), … of the normalised residuals per satellite arc (see header), at the sampling
 * interval samplingMs; empty when lag 1 is already not significant or there are too few pairs.
 * Lag by lag over the pairs of each satellite, up to the first lag that is not significant (cost n × lags evaluated).
 *
 */
export function residualAutocorrelation(
  design: Pick<Design, 'epochStart' | 'epochMs' | 'observationVarianceM2' | 'satelliteIndex' | 'satelliteCount'>,
  solution: Pick<Solution, 'fittedResidualM'>,
  used: Uint8Array,
  samplingMs: number,
  arrays: ArraySource = FRESH_ARRAYS,
): number[] {
  // Per satellite, its used observations in epoch order (the design is sorted by epoch), packed
  // satellite after satellite into epoch (the epoch's index; its time is design.epochMs[epoch[i]]) and
  // z (normalised residual): 12 bytes per used observation, the step's only per-observation arrays.
  const n = used.length;
  // Arcs numbered in order of first appearance among the used observations.
  const ids = arrays.int32('noise.arcOfSatellite', design.satelliteCount).fill(-1);
  const counts: number[] = [];
  let total = 0;
  for (let s = 0; s < n; s++) {
    if (!used[s]) continue;
    let id = ids[design.satelliteIndex[s]!]!;
    if (id < 0) {
      id = counts.length;
      ids[design.satelliteIndex[s]!] = id;
      counts.push(0);
    }
    counts[id]!++;
    total++;
  }
  if (total < 10) return [];
  const start = new Int32Array(counts.length + 1);
  for (let id = 0; id < counts.length; id++) start[id + 1] = start[id]! + counts[id]!;
  const fill = start.slice(0, counts.length);
  const epoch = arrays.int32('noise.epoch', total);
  const z = arrays.float64('noise.z', total);
  const epochMs = design.epochMs;
  let c0 = 0;
  for (let k = 0; k + 1 < design.epochStart.length; k++) {
    for (let s = design.epochStart[k]!; s < design.epochStart[k + 1]!; s++) {
      if (!used[s]) continue;
      const at = fill[ids[design.satelliteIndex[s]!]!]!++;
      epoch[at] = k;
      const value = solution.fittedResidualM[s]! / Math.sqrt(design.observationVarianceM2[s]!);
      z[at] = value;
      c0 += value * value;
    }
  }
  if (!(c0 > 0)) return [];
  c0 /= total;
  const maxLag = Math.max(1, Math.min(Math.floor(MAX_LAG_S / (samplingMs / 1000)), 1000));
  // Lags evaluated: every lag up to DENSE_LAGS, then every LAG_STEP-th (ρ is smooth there; the
  // lags between are interpolated linearly).
  const lags: number[] = [];
  for (let m = 1; m <= maxLag; m += m < DENSE_LAGS ? 1 : LAG_STEP) lags.push(m);
  // Runs: stretches of an arc whose consecutive epochs are exactly one sampling interval apart.
  // When every other step of an arc is longer than an interval and a millisecond, a pair m places
  // apart is m intervals apart (within 0.5 ms) exactly when both lie in one run: the lag loop then
  // visits the runs instead of testing every pair (the same pairs, summed in the same order).
  const runs = regularRuns(epoch, epochMs, start, counts.length, samplingMs);
  // Lag by lag, each over every arc, until the first lag that is not significant (the lags after it
  // are never needed).
  const rho: number[] = [];
  // With runs, four lags are summed in one pass (four independent sums, each over the same terms in
  // the same order as lag by lag): up to three lags past the last significant one are summed in vain.
  const group = new Float64Array(2 * LAG_GROUP);
  for (let l = 0; l < lags.length; l++) {
    const m = lags[l]!;
    const spanMs = m * samplingMs;
    let sum = 0;
    let pairs = 0;
    if (runs) {
      const g = l % LAG_GROUP;
      if (g === 0) runLagSums(z, runs, lags, l, group);
      sum = group[g]!;
      pairs = group[LAG_GROUP + g]!;
    } else {
      for (let id = 0; id < counts.length; id++) {
        const end = start[id + 1]! - m;
        // In an arc without gaps the partner m intervals on is m places on; where the arc has a gap
        // the pair is skipped (pairs are lost independently of their values: no bias).
        for (let i = start[id]!; i < end; i++) {
          if (Math.abs(epochMs[epoch[i + m]!]! - epochMs[epoch[i]!]! - spanMs) > 0.5) continue;
          sum += z[i]! * z[i + m]!;
          pairs++;
        }
      }
    }
    if (pairs < 10) break;
    const r = sum / pairs / c0;
    if (r < 2 / Math.sqrt(pairs)) break;
    // Lags skipped since the previous evaluated one: linear between the two.
    const previous = rho.length;
    const before = previous > 0 ? rho[previous - 1]! : 1;
    for (let k = previous + 1; k < m; k++) rho.push(before + ((r - before) * (k - previous)) / (m - previous));
    rho.push(r);
  }
  return rho;
}

/** Lags summed together over the runs. */
const LAG_GROUP = 4;

/**
 * Σ z_i z_{i+m} over the pairs within the runs, and the number of pairs, for the lags
 * lags[l..l+LAG_GROUP) (the last one repeated past the end): sums in out[0..LAG_GROUP), pairs after them.
 */
function runLagSums(z: Float64Array, runs: Int32Array, lags: readonly number[], l: number, out: Float64Array): void {
  const last = lags.length - 1;
  const m0 = lags[l]!;
  const m1 = lags[Math.min(l + 1, last)]!;
  const m2 = lags[Math.min(l + 2, last)]!;
  const m3 = lags[Math.min(l + 3, last)]!;
  let s0 = 0,
    s1 = 0,
    s2 = 0,
    s3 = 0;
  let p0 = 0,
    p1 = 0,
    p2 = 0,
    p3 = 0;
  // The sums so far are written after every run, not after the loop: compiled by on-stack replacement during
  // a request's first groups, the code deoptimised at statements after the loop on later calls (`--trace-deopt`).
  out.fill(0);
  for (let r = 0; r < runs.length; r += 2) {
    const a = runs[r]!;
    const e = runs[r + 1]!;
    // Pairs of all four lags (m0 ≤ m1 ≤ m2 ≤ m3), then the further pairs of the shorter lags, i ascending for each.
    const common = e - m3;
    let i = a;
    for (; i < common; i++) {
      const zi = z[i]!;
      s0 += zi * z[i + m0]!;
      s1 += zi * z[i + m1]!;
      s2 += zi * z[i + m2]!;
      s3 += zi * z[i + m3]!;
    }
    for (let j = i; j < e - m2; j++) s2 += z[j]! * z[j + m2]!;
    for (let j = i; j < e - m1; j++) s1 += z[j]! * z[j + m1]!;
    for (let j = i; j < e - m0; j++) s0 += z[j]! * z[j + m0]!;
    if (e - m0 > a) p0 += e - m0 - a;
    if (e - m1 > a) p1 += e - m1 - a;
    if (e - m2 > a) p2 += e - m2 - a;
    if (e - m3 > a) p3 += e - m3 - a;
    out[0] = s0;
    out[1] = s1;
    out[2] = s2;
    out[3] = s3;
    out[4] = p0;
    out[5] = p1;
    out[6] = p2;
    out[7] = p3;
  }
}

/**
 * [start, end) of every run of consecutive epochs exactly samplingMs apart, arc after arc (flat
 * pairs), or null when some step within an arc is neither samplingMs nor longer than samplingMs + 1 ms
 * (irregular sampling: the caller then tests every pair). Two passes: the runs are counted first, so
 * that the array is as long as they need (a run per arc and gap, not two entries per observation).
 *
 * @param epoch epoch index of each packed observation, arc after arc  @param epochMs time of each epoch [ms]
 */
function regularRuns(epoch: Int32Array, epochMs: Float64Array, arcStart: Int32Array, arcs: number, samplingMs: number): Int32Array | null {
  let runs = 0;
  for (let id = 0; id < arcs; id++) {
    const end = arcStart[id + 1]!;
    const first = arcStart[id]!;
    for (let i = first + 1; i <= end; i++) {
      if (i < end) {
        const step = epochMs[epoch[i]!]! - epochMs[epoch[i - 1]!]!;
        if (step === samplingMs) continue;
        if (!(step > samplingMs + 1)) return null;
      }
      runs++;
    }
  }
  const out = new Int32Array(2 * runs);
  let n = 0;
  for (let id = 0; id < arcs; id++) {
    const end = arcStart[id + 1]!;
    let runStart = arcStart[id]!;
    for (let i = runStart + 1; i <= end; i++) {
      if (i < end && epochMs[epoch[i]!]! - epochMs[epoch[i - 1]!]! === samplingMs) continue;
      out[n++] = runStart;
      out[n++] = i;
      runStart = i;
    }
  }
  return out;
}

/**
 * Variance inflation factor of a random-walk state (see header).
 *
 * epochInflations computes the same factor for ZWD, north and east at once (the three lag sums in one loop,
 * 0.94× of a GPS-like day's estimator CPU by turns against three calls of this function): a change to the
 * sum here must be made there too (test/estimation/unchanged-results.test.ts covers both: with and without
 * gradients).
 *
 * @param information I: information of the epoch on the parameter [1/m²]
 * @param stepVariance Q: random-walk variance per sampling interval [m²]; null = no random walk
 * @param rho ρ(1), ρ(2), …
 */
export function varianceInflation(information: number, stepVariance: number | null, rho: readonly number[]): number {
  if (rho.length === 0 || !(information > 0)) return 1;
  const lambda = kernelFactor(information, stepVariance);
  let sum = 0;
  if (lambda >= 1 - 1e-12) {
    for (const r of rho) sum += r; // S(m)/S(0) → 1 for an unconstrained (constant) parameter
  } else {
    const l2 = lambda * lambda;
    const s0 = (1 + l2) / (1 - l2);
    // Σ ρ(m) S(m)/S(0), S(0) divided out once (it runs per epoch and family over every lag).
    const c = 2 / (1 - l2);
    let lm = 1;
    for (let m = 1; m <= rho.length; m++) {
      lm *= lambda;
      sum += rho[m - 1]! * lm * (c + m - 1);
    }
    sum /= s0;
  }
  return inflationOf(lambda, sum);
}

/** The factor of varianceInflation from λ and Σ ρ(m) S(m)/S(0). */
function inflationOf(lambda: number, sum: number): number {
  const r = 1 + 2 * sum;
  const noiseShare = (1 + lambda * lambda) / (1 + lambda) ** 2;
  return Math.max(1, 1 + noiseShare * (r - 1));
}

/**
 * The factors of every epoch into out (noiseInflation), and [Σ ZWD factor, Σ mean gradient factor, epochs]
 * over the epochs with information. The loop alone in a function: run once per request inside
 * noiseInflation, it was compiled by on-stack replacement and deoptimised at the statements after it on every
 * call (`--trace-deopt`, the pattern of addPartSums in variance-components.ts), so that part of it ran in the
 * interpreter each time; a function of its own is optimised whole.
 */
function epochFactors(
  solution: Pick<Solution, 'epochNormal'>,
  withGradients: boolean,
  qW: number | null,
  qG: number | null,
  rho: readonly number[],
  out: NoiseInflation,
): Float64Array {
  const epochs = out.zwd.length;
  let sumW = 0,
    sumG = 0,
    count = 0;
  const information = new Float64Array(3);
  const rhoLags = Float64Array.from(rho);
  const lagSums = new Float64Array(3);
  for (let k = 0; k < epochs; k++) {
    epochInformation(solution, k, withGradients, information);
    const iW = information[0]!;
    if (withGradients) {
      epochInflations(information, qW, qG, rho, rhoLags, lagSums);
      out.zwd[k] = lagSums[0]!;
      out.north[k] = lagSums[1]!;
      out.east[k] = lagSums[2]!;
    } else {
      out.zwd[k] = varianceInflation(iW, qW, rho);
    }
    if (iW > 0) {
      sumW += out.zwd[k]!;
      sumG += (out.north[k]! + out.east[k]!) / 2;
      count++;
    }
  }
  return Float64Array.of(sumW, sumG, count);
}

/**
 * varianceInflation of ZWD, north and east of one epoch at once, into out[0..2]: the three lag sums
 * in one loop (three independent chains of additions that the processor overlaps, where one family
 * after the other waits on each addition); each sum has the same terms in the same order as
 * varianceInflation's, so the factors are the same doubles. A family whose λ is not below 1 − 1e-12
 * (or without information) is left to varianceInflation.
 *
 * @param information I of ZWD, north, east [1/m²]  @param qW @param qG Q of ZWD and gradients [m²]
 * @param rhoLags ρ as a Float64Array (the same values)
 */
function epochInflations(
  information: Float64Array,
  qW: number | null,
  qG: number | null,
  rho: readonly number[],
  rhoLags: Float64Array,
  out: Float64Array,
): void {
  const iW = information[0]!;
  const iN = information[1]!;
  const iE = information[2]!;
  const lags = rhoLags.length;
  const lW = iW > 0 ? kernelFactor(iW, qW) : 1;
  const lN = iN > 0 ? kernelFactor(iN, qG) : 1;
  const lE = iE > 0 ? kernelFactor(iE, qG) : 1;
  if (lags === 0 || !(lW < 1 - 1e-12 && lN < 1 - 1e-12 && lE < 1 - 1e-12)) {
    out[0] = varianceInflation(iW, qW, rho);
    out[1] = varianceInflation(iN, qG, rho);
    out[2] = varianceInflation(iE, qG, rho);
    return;
  }
  const l2W = lW * lW;
  const l2N = lN * lN;
  const l2E = lE * lE;
  const cW = 2 / (1 - l2W);
  const cN = 2 / (1 - l2N);
  const cE = 2 / (1 - l2E);
  let lmW = 1,
    lmN = 1,
    lmE = 1;
  let sumW = 0,
    sumN = 0,
    sumE = 0;
  for (let m = 1; m <= lags; m++) {
    const r = rhoLags[m - 1]!;
    lmW *= lW;
    lmN *= lN;
    lmE *= lE;
    sumW += r * lmW * (cW + m - 1);
    sumN += r * lmN * (cN + m - 1);
    sumE += r * lmE * (cE + m - 1);
  }
  out[0] = inflationOf(lW, sumW / ((1 + l2W) / (1 - l2W)));
  out[1] = inflationOf(lN, sumN / ((1 + l2N) / (1 - l2N)));
  out[2] = inflationOf(lE, sumE / ((1 + l2E) / (1 - l2E)));
}

/**
 * λ of the smoother kernel w_j ∝ λ^|j|: the root in (0, 1] of λ + 1/λ = 2 + Q I (see header).
 *
 * @param information I [1/m²]  @param stepVariance Q [m²]; null = no random walk (λ = 1)
 */
export function kernelFactor(information: number, stepVariance: number | null): number {
  const qi = stepVariance === null ? 0 : stepVariance * Math.max(information, 0);
  return 1 + qi / 2 - Math.sqrt(qi + (qi * qi) / 4);
}

/**
 * Per-epoch information of ZWD, north and east gradient: 1/(M⁻¹)_pp of the epoch's 3×3 (or
 * M_WW without gradients) [1/m²]; 0 when the epoch has no data or M is singular. Written into `out`
 * (called for every epoch: no array per call).
 */
export function epochInformation(
  solution: Pick<Solution, 'epochNormal'>,
  k: number,
  withGradients: boolean,
  out: Float64Array,
): Float64Array {
  const o = k * EPOCH_NORMAL_ENTRIES;
  const e = solution.epochNormal;
  const ww = e[o]!,
    wn = e[o + 1]!,
    we = e[o + 2]!,
    nn = e[o + 3]!,
    ne = e[o + 4]!,
    ee = e[o + 5]!;
  out[1] = out[2] = 0;
  if (!withGradients) {
    out[0] = ww;
    return out;
  }
  // Cofactors of the symmetric 3×3.
  const cWW = nn * ee - ne * ne;
  const cNN = ww * ee - we * we;
  const cEE = ww * nn - wn * wn;
  const det = ww * cWW - wn * (wn * ee - ne * we) + we * (wn * ne - nn * we);
  out[0] = 0;
  if (!(det > 0)) return out;
  out[0] = det / cWW;
  out[1] = det / cNN;
  out[2] = det / cEE;
  return out;
}

export interface NoiseInflation {
  /** Variance factor per epoch of ZWD, north, east (1 without correlated noise). */
  zwd: Float64Array;
  north: Float64Array;
  east: Float64Array;
  statistics: ZwdEstimationStatistics['noiseCorrelation'];
}

/**
 * The correlated-noise inflation of every epoch of one station (header); all 1 when switched off.
 * Shared by the single-station estimator and the network (one call per station, with the epoch's
 * information taken from the network's reduced normal matrix).
 *
 * @param solution post-fit residuals per design observation and the per-epoch normal entries
 */
export function noiseInflation(
  options: Pick<ZwdEstimationOptions, 'correlatedNoise' | 'zwd' | 'gradients'>,
  design: Pick<Design, 'epochStart' | 'epochMs' | 'observationVarianceM2' | 'satelliteIndex' | 'satelliteCount' | 'samplingMs'>,
  solution: Pick<Solution, 'fittedResidualM' | 'epochNormal'>,
  used: Uint8Array,
  withGradients: boolean,
  arrays: ArraySource = FRESH_ARRAYS,
): NoiseInflation {
  const epochs = design.epochMs.length;
  const ones = (role: string) => arrays.float64(role, epochs).fill(1);
  const out: NoiseInflation = { zwd: ones('noise.zwd'), north: ones('noise.north'), east: ones('noise.east'), statistics: null };
  if (options.correlatedNoise === false || epochs < 3) return out;
  const samplingMs = design.samplingMs;
  const rho = residualAutocorrelation(design, solution, used, samplingMs, arrays);
  const hours = samplingMs / 3_600_000;
  const stepVariance = (q: number | null) => (q === null ? null : q * q * hours);
  const qW = stepVariance(options.zwd.randomWalkMPerSqrtH);
  const qG = options.gradients ? stepVariance(options.gradients.randomWalkMPerSqrtH) : null;
  const sums = epochFactors(solution, withGradients, qW, qG, rho, out);
  const sumW = sums[0]!;
  const sumG = sums[1]!;
  const count = sums[2]!;
  out.statistics = {
    samplingS: samplingMs / 1000,
    autocorrelation: rho,
    zwdVarianceInflation: count ? sumW / count : 1,
    gradientVarianceInflation: withGradients && count ? sumG / count : 1,
  };
  return out;
}
