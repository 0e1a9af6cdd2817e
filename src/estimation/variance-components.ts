/**
 * Variance-component estimation of the observation weights, shared by the single-station estimator
 * (estimate.ts, one part) and the network estimator (network/estimate-network.ts, one part per
 * station: one set of components for the whole network).
 */

import type { Design } from './design.js';
import type { WeightingScheme } from './types.js';

/** One station's observations: its design (sigmas, elevations), post-fit residuals and σ_v², used flags. */
export interface VarianceComponentPart {
  design: Pick<Design, 'observationVarianceM2' | 'givenSigmaM' | 'sinElevationSquared'>;
  fittedResidualM: Float64Array;
  residualVarianceM2: Float64Array;
  used: Uint8Array;
}

/** Relative change of an observation variance component below which the weights are kept. */
export const REWEIGHTING_TOLERANCE = 0.05;

/**
 * Variance-component estimation of the observation weights (the random-walk and a-priori
 * constraints keep their sigmas): E[v_i²] = r_i σ_i² with r_i = σ_v_i²/σ_i² the redundancy
 * number, so for σ_i² = θ_a + θ_b/sin²e the components follow from
 *     Σ_i ω_i (v_i² − r_i (θ_a + θ_b g_i))² → min,  g_i = 1/sin²e_i,  ω_i = 1/(r_i σ_i²)²
 * (a weighted fit of the squared residuals; equivalent at convergence to Helmert's and Förstner's
 * iterative estimates, Koch (1999) ch. 3.6; Förstner (1979), AVN 86, 446–453; from memory).
 * One component ("elevation": θ_b only; "uniform": θ_a only) reduces to θ = σ² vᵀPv / Σ r_i,
 * the variance factor of the observations alone. A negative component is set to 0 and the other
 * refitted. Observations with their own sigma get one common factor vᵀPv/Σ r_i of their own.
 * Observations that screening would reject (|τ| > k) are left out, so that gross errors do not
 * inflate the weights before they are rejected (their share is below 1e-4 for Gaussian noise at
 * k = 4; a robust choice, common practice).
 */
export function varianceComponents(
  parts: readonly VarianceComponentPart[],
  scheme: WeightingScheme,
  current: { a: number; b: number },
  givenScale: number,
  bound: number,
): { changed: boolean; weighting: { a: number; b: number }; givenScale: number } {
  // Normal equations of the fit (sums for θ_a, θ_b) and the given-sigma factor, part after part.
  const sums = new Float64Array(SUMS);
  for (const part of parts) {
    for (let start = 0; start < part.used.length; start += SUMS_CHUNK) {
      addPartSums(part, start, Math.min(start + SUMS_CHUNK, part.used.length), bound, sums);
    }
  }
  const saa = sums[0]!,
    sab = sums[1]!,
    sbb = sums[2]!,
    sa = sums[3]!,
    sb = sums[4]!,
    givenOmega = sums[5]!,
    givenRedundancy = sums[6]!;
  let thetaA = current.a ** 2;
  let thetaB = current.b ** 2;
  if (scheme === 'elevation' && sbb > 0) thetaB = sb / sbb;
  else if (scheme === 'uniform' && saa > 0) thetaA = sa / saa;
  else if (scheme === 'elevation-components' && saa > 0 && sbb > 0) {
    const det = saa * sbb - sab * sab;
    thetaA = (sbb * sa - sab * sb) / det;
    thetaB = (saa * sb - sab * sa) / det;
    if (!(thetaA >= 0)) [thetaA, thetaB] = [0, sb / sbb];
    else if (!(thetaB >= 0)) [thetaA, thetaB] = [sa / saa, 0];
  }
  const nextGiven = givenRedundancy > 0 ? (givenScale * givenOmega) / givenRedundancy : givenScale;
  const rel = (next: number, now: number) => (now > 0 ? Math.abs(next / now - 1) : next > 0 ? Infinity : 0);
  const changed =
    Math.max(rel(thetaA, current.a ** 2), rel(thetaB, current.b ** 2), rel(nextGiven, givenScale)) > REWEIGHTING_TOLERANCE &&
    thetaA + thetaB > 0;
  return { changed, weighting: { a: Math.sqrt(thetaA), b: Math.sqrt(thetaB) }, givenScale: nextGiven };
}

/** Sums of varianceComponents: saa, sab, sbb, sa, sb, given-sigma Σ v²/σ², given-sigma Σ r. */
const SUMS = 7;

/** Observations per call of addPartSums. */
const SUMS_CHUNK = 256;

/**
 * The terms of a part's observations start..end−1 added to the sums, in order (the same additions, in the
 * same order, as one loop over all). A short loop in a function of its own: V8 optimises it whole after a
 * few calls, with type feedback for every statement. As one long loop inside varianceComponents, it was
 * compiled by on-stack replacement during its first run, before the statements after it had ever run; that
 * code deoptimised there on every later call ("insufficient type feedback") and the loop mostly ran
 * unoptimised, boxing every double (issue 14: ~10 MB of heap numbers a GPS-like request when it happened).
 */
function addPartSums(part: VarianceComponentPart, start: number, end: number, bound: number, sums: Float64Array): void {
  const { design, fittedResidualM, residualVarianceM2, used } = part;
  const givenSigmaM = design.givenSigmaM;
  const variance = design.observationVarianceM2;
  const sinElevationSquared = design.sinElevationSquared;
  let saa = sums[0]!,
    sab = sums[1]!,
    sbb = sums[2]!,
    sa = sums[3]!,
    sb = sums[4]!,
    givenOmega = sums[5]!,
    givenRedundancy = sums[6]!;
  for (let s = start; s < end; s++) {
    if (!used[s]) continue;
    // σ_i² as (√σ_i²)²: the square of σ_i as the sigma column held it (the same double as before).
    const sigma2 = Math.sqrt(variance[s]!) ** 2;
    const r = residualVarianceM2[s]! / sigma2;
    if (!(r > 1e-6)) continue;
    const v2 = fittedResidualM[s]! ** 2;
    if (v2 > bound * residualVarianceM2[s]!) continue; // a rejection candidate: not noise
    if (givenSigmaM !== null && !Number.isNaN(givenSigmaM[s]!)) {
      givenOmega += v2 / sigma2;
      givenRedundancy += r;
      continue;
    }
    const g = 1 / sinElevationSquared[s]!;
    const omega = 1 / (r * sigma2) ** 2;
    const ua = r;
    const ub = r * g;
    saa += omega * ua * ua;
    sab += omega * ua * ub;
    sbb += omega * ub * ub;
    sa += omega * ua * v2;
    sb += omega * ub * v2;
  }
  sums[0] = saa;
  sums[1] = sab;
  sums[2] = sbb;
  sums[3] = sa;
  sums[4] = sb;
  sums[5] = givenOmega;
  sums[6] = givenRedundancy;
}

/** (k σ̂0)²: |v| above k σ̂0 σ_v is a rejection candidate; Infinity without screening. */
export function screeningBound(threshold: number | null, varianceFactor: number | null): number {
  return threshold === null ? Infinity : threshold * threshold * (varianceFactor ?? 1);
}
