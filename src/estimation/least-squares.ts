/**
 * One least-squares solution of the ZWD model (design.ts) with random-walk constraints, the epoch
 * biases pre-eliminated epoch by epoch, and the post-fit residuals with their standard deviations.
 *
 * Parameters: ZWD nodes x_0..x_J (ids 0..J), then north gradient nodes, then east gradient nodes.
 *
 * Bias pre-elimination (Schur complement of b_k, per epoch k; e.g. Koch (1999), Parameter
 * Estimation and Hypothesis Testing in Linear Models, ch. 3; from memory): with s = Σ w_i,
 * ū = Σ w_i a_i / s and r̄ = Σ w_i r_i / s over the epoch,
 *     N_k = Σ w_i (a_i − ū)(a_i − ū)ᵀ,   g_k = Σ w_i (a_i − ū)(r_i − r̄),
 * written in this centred two-pass form so that biases of hundreds of kilometres (receiver clocks)
 * cost no digits. The node estimates equal those of the full system with b_k as unknowns; the
 * biases follow as b̂_k = Σ w_i (r_i − a_iᵀx̂) / s.
 *
 * Constraints: x_{j+1} − x_j = 0 ± q √(Δ/1 h) (random walk), x_0 = 0 ± σ_0 (a priori).
 *
 * Structure used for speed: the partials of an observation are a = B m, with
 * m = (m_w(e), m_g(e) cos a, m_g(e) sin a) and B the epoch's 6×3 matrix of interpolation weights
 * (1 − α, α for ZWD nodes j, j+1; 1 − β, β for gradient nodes l, l+1). So per observation only the
 * 3×3 sums Σ w (m − m̄)(m − m̄)ᵀ are accumulated, and N_k = B M Bᵀ once per epoch; likewise
 * (a − ū)ᵀ Q (a − ū) = (m − m̄)ᵀ (Bᵀ Q B) (m − m̄) for the residual variances.
 *
 * Residual standard deviations (for screening): Q_v = Q_ℓ − Ā Q_x̄ Āᵀ of the full system, which
 * with the biases eliminated is, per observation,
 *     σ_v² = σ_i² − 1/s − (a_i − ū)ᵀ Q (a_i − ū)      (without bias: σ_i² − a_iᵀ Q a_i)
 * with Q = N⁻¹ of the reduced system restricted to the epoch's parameters (selected inverse).
 */

import type { Design } from './design.js';
import { FrontalLdl, type SelectedInverse } from './frontal-ldl.js';
import type { PiecewiseLinearSettings, ZwdEstimationOptions } from './types.js';

/** Parameters touched by one epoch: ZWD nodes j, j+1 and, with gradients, north l, l+1 and east l, l+1. */
export const LOCAL_PARAMETERS = 6;

/** Redundancy σ_v²/σ² below which an observation cannot be tested (or rejected): it alone determines something. */
export const MIN_TESTABLE_REDUNDANCY = 1e-8;

export interface ParameterLayout {
  zwdCount: number;
  gradientCount: number;
  northOffset: number;
  eastOffset: number;
  parameters: number;
}

export function parameterLayout(design: Design): ParameterLayout {
  const zwdCount = design.zwd.count;
  const gradientCount = design.gradients?.count ?? 0;
  return { zwdCount, gradientCount, northOffset: zwdCount, eastOffset: zwdCount + gradientCount, parameters: zwdCount + 2 * gradientCount };
}

export interface Solution {
  x: Float64Array;
  inverse: SelectedInverse;
  /** b̂_k per epoch [m]; NaN when the epoch has no used observation or biases are off. */
  biasM: Float64Array;
  /** Post-fit residual v_i per design observation [m] (0 for unused ones). */
  fittedResidualM: Float64Array;
  /** σ_v_i² per design observation [m²] (0 for unused ones). */
  residualVarianceM2: Float64Array;
  /** vᵀPv of the observations plus the weighted squares of the constraint residuals [-]. */
  weightedSquareSum: number;
  /** Σ v_i² of the used observations [m²]. */
  residualSquareSumM2: number;
  observationsUsed: number;
  /** Epochs with at least one used observation. */
  epochsUsed: number;
  constraints: number;
}

interface Family {
  offset: number;
  count: number;
  settings: PiecewiseLinearSettings;
  current: number;
}

/** Weight of a random-walk step between adjacent nodes, 1/(q² Δ[h]) [1/m²]. */
export const randomWalkWeight = (settings: PiecewiseLinearSettings): number | null =>
  settings.randomWalkMPerSqrtH === null ? null : 1 / (settings.randomWalkMPerSqrtH ** 2 * (settings.intervalS / 3600));

export function constraintCount(layout: ParameterLayout, options: ZwdEstimationOptions): number {
  const perFamily = (count: number, s: PiecewiseLinearSettings) => (s.aprioriSigmaM === null ? 0 : 1) + (s.randomWalkMPerSqrtH === null ? 0 : count - 1);
  return perFamily(layout.zwdCount, options.zwd) + (options.gradients ? 2 * perFamily(layout.gradientCount, options.gradients) : 0);
}

/**
 * Local parameter ids of epoch k and the interpolation matrix B (6×3, stored as the weight of each
 * local parameter and its family): the partials of an observation are a = B m with
 * m = (m_w, m_g cos a, m_g sin a), so a local parameter p has a_p = interp[p] · m[family[p]].
 */
function epochParameters(design: Design, layout: ParameterLayout, k: number, ids: Int32Array, interp: Float64Array): void {
  const j = design.zwdInterval[k]!;
  const alpha = design.zwdAlpha[k]!;
  ids[0] = j;
  ids[1] = layout.zwdCount > 1 ? j + 1 : -1;
  interp[0] = 1 - alpha;
  interp[1] = alpha;
  if (layout.gradientCount > 0) {
    const l = design.gradientInterval[k]!;
    const beta = design.gradientAlpha[k]!;
    const two = layout.gradientCount > 1;
    ids[2] = layout.northOffset + l;
    ids[3] = two ? layout.northOffset + l + 1 : -1;
    ids[4] = layout.eastOffset + l;
    ids[5] = two ? layout.eastOffset + l + 1 : -1;
    interp[2] = interp[4] = 1 - beta;
    interp[3] = interp[5] = beta;
  } else {
    ids[2] = ids[3] = ids[4] = ids[5] = -1;
  }
}

/** Family (0 ZWD, 1 north, 2 east) of each local parameter. */
const FAMILY = [0, 0, 1, 1, 2, 2] as const;

/**
 * @param used 1 for each design observation that takes part (0 = rejected)
 * @throws SingularParameterError when a node is not determined by the data and constraints
 */
export function solveOnce(design: Design, options: ZwdEstimationOptions, used: Uint8Array): Solution {
  const layout = parameterLayout(design);
  const withGradients = layout.gradientCount > 0;
  const nLocal = withGradients ? LOCAL_PARAMETERS : 2;
  const solver = new FrontalLdl(layout.parameters, nLocal);
  const families: Family[] = [{ offset: 0, count: layout.zwdCount, settings: options.zwd, current: -1 }];
  if (options.gradients) {
    families.push({ offset: layout.northOffset, count: layout.gradientCount, settings: options.gradients, current: -1 });
    families.push({ offset: layout.eastOffset, count: layout.gradientCount, settings: options.gradients, current: -1 });
  }

  const advance = (f: Family, interval: number) => {
    const rw = randomWalkWeight(f.settings);
    if (f.current < 0) {
      solver.activate(f.offset);
      if (f.settings.aprioriSigmaM !== null) solver.addValueConstraint(f.offset, 1 / f.settings.aprioriSigmaM ** 2);
      if (f.count > 1) {
        solver.activate(f.offset + 1);
        if (rw !== null) solver.addDifferenceConstraint(f.offset + 1, f.offset, rw);
      }
      f.current = 0;
    }
    while (f.current < interval) {
      solver.eliminate(f.offset + f.current);
      solver.activate(f.offset + f.current + 2);
      if (rw !== null) solver.addDifferenceConstraint(f.offset + f.current + 2, f.offset + f.current + 1, rw);
      f.current++;
    }
  };

  const epochs = design.epochMs.length;
  const bias = options.epochBias;
  const wet = design.wetMapping;
  const north = design.northMapping;
  const east = design.eastMapping;
  const ids = new Int32Array(LOCAL_PARAMETERS);
  const slots = new Int32Array(LOCAL_PARAMETERS);
  const interp = new Float64Array(LOCAL_PARAMETERS);
  let observationsUsed = 0;
  let epochsUsed = 0;

  for (let k = 0; k < epochs; k++) {
    advance(families[0]!, design.zwdInterval[k]!);
    for (let f = 1; f < families.length; f++) advance(families[f]!, design.gradientInterval[k]!);
    const start = design.epochStart[k]!;
    const end = design.epochStart[k + 1]!;

    // Pass 1: weighted means over the epoch (for the bias elimination).
    let sw = 0;
    let swr = 0;
    let swW = 0;
    let swN = 0;
    let swE = 0;
    for (let s = start; s < end; s++) {
      if (!used[s]) continue;
      const w = design.weight[s]!;
      sw += w;
      swr += w * design.residualM[s]!;
      swW += w * wet[s]!;
      swN += w * north[s]!;
      swE += w * east[s]!;
    }
    if (sw === 0) continue;
    epochsUsed++;
    const mr = bias ? swr / sw : 0;
    const mW = bias ? swW / sw : 0;
    const mN = bias ? swN / sw : 0;
    const mE = bias ? swE / sw : 0;

    // Pass 2: centred 3×3 normal matrix M = Σ w (m − m̄)(m − m̄)ᵀ and h = Σ w (m − m̄)(r − r̄).
    let mWW = 0, mWN = 0, mWE = 0, mNN = 0, mNE = 0, mEE = 0;
    let hW = 0, hN = 0, hE = 0;
    let dW = 0, dN = 0, dE = 0;
    for (let s = start; s < end; s++) {
      if (!used[s]) continue;
      observationsUsed++;
      const w = design.weight[s]!;
      const dr = design.residualM[s]! - mr;
      const cw = wet[s]! - mW;
      const cn = north[s]! - mN;
      const ce = east[s]! - mE;
      const wcw = w * cw;
      mWW += wcw * cw;
      hW += wcw * dr;
      dW += w * wet[s]! * wet[s]!;
      if (withGradients) {
        const wcn = w * cn;
        const wce = w * ce;
        mWN += wcw * cn;
        mWE += wcw * ce;
        mNN += wcn * cn;
        mNE += wcn * ce;
        mEE += wce * ce;
        hN += wcn * dr;
        hE += wce * dr;
        dN += w * north[s]! * north[s]!;
        dE += w * east[s]! * east[s]!;
      }
    }
    // N_k = B M Bᵀ, g_k = B h, added to the front.
    const m3 = [mWW, mWN, mWE, mWN, mNN, mNE, mWE, mNE, mEE];
    const h3 = [hW, hN, hE];
    const d3 = [dW, dN, dE];
    epochParameters(design, layout, k, ids, interp);
    for (let p = 0; p < nLocal; p++) slots[p] = ids[p]! >= 0 ? solver.slot(ids[p]!) : -1;
    for (let p = 0; p < nLocal; p++) {
      if (slots[p]! < 0) continue;
      const fp = FAMILY[p]!;
      const bp = interp[p]!;
      solver.addDirectDiagonal(ids[p]!, bp * bp * d3[fp]!);
      solver.addRhsAtSlot(slots[p]!, bp * h3[fp]!);
      for (let q = 0; q <= p; q++) {
        if (slots[q]! < 0) continue;
        solver.addAtSlots(slots[p]!, slots[q]!, bp * interp[q]! * m3[fp * 3 + FAMILY[q]!]!);
      }
    }
  }
  solver.eliminateAll();
  const x = solver.solve();
  const inverse = solver.selectedInverse();

  // Residuals, biases and residual variances.
  const biasM = new Float64Array(epochs).fill(Number.NaN);
  const fittedResidualM = new Float64Array(design.residualM.length);
  const residualVarianceM2 = new Float64Array(design.residualM.length);
  const q6 = new Float64Array(LOCAL_PARAMETERS * LOCAL_PARAMETERS);
  const q3 = new Float64Array(9);
  let weightedSquareSum = 0;
  let residualSquareSumM2 = 0;
  for (let k = 0; k < epochs; k++) {
    epochParameters(design, layout, k, ids, interp);
    // Interpolated values (Bᵀx) and their covariance Bᵀ Q B.
    const xf = [0, 0, 0];
    for (let p = 0; p < nLocal; p++) if (ids[p]! >= 0) xf[FAMILY[p]!]! += interp[p]! * x[ids[p]!]!;
    const start = design.epochStart[k]!;
    const end = design.epochStart[k + 1]!;
    let sw = 0;
    let swe = 0;
    let swW = 0;
    let swN = 0;
    let swE = 0;
    for (let s = start; s < end; s++) {
      if (!used[s]) continue;
      const w = design.weight[s]!;
      const e = design.residualM[s]! - wet[s]! * xf[0]! - north[s]! * xf[1]! - east[s]! * xf[2]!;
      fittedResidualM[s] = e;
      sw += w;
      swe += w * e;
      swW += w * wet[s]!;
      swN += w * north[s]!;
      swE += w * east[s]!;
    }
    if (sw === 0) continue;
    const b = bias ? swe / sw : 0;
    if (bias) biasM[k] = b;
    const mW = bias ? swW / sw : 0;
    const mN = bias ? swN / sw : 0;
    const mE = bias ? swE / sw : 0;
    for (let p = 0; p < nLocal; p++) {
      for (let r = 0; r <= p; r++) {
        const v = ids[p]! >= 0 && ids[r]! >= 0 ? inverse.get(ids[p]!, ids[r]!) : 0;
        q6[p * LOCAL_PARAMETERS + r] = v;
        q6[r * LOCAL_PARAMETERS + p] = v;
      }
    }
    q3.fill(0);
    for (let p = 0; p < nLocal; p++) {
      for (let r = 0; r < nLocal; r++) q3[FAMILY[p]! * 3 + FAMILY[r]!]! += interp[p]! * q6[p * LOCAL_PARAMETERS + r]! * interp[r]!;
    }
    const qWW = q3[0]!, qWN = q3[1]!, qWE = q3[2]!, qNN = q3[4]!, qNE = q3[5]!, qEE = q3[8]!;
    const biasVariance = bias ? 1 / sw : 0;
    for (let s = start; s < end; s++) {
      if (!used[s]) continue;
      const v = fittedResidualM[s]! - b;
      fittedResidualM[s] = v;
      weightedSquareSum += design.weight[s]! * v * v;
      residualSquareSumM2 += v * v;
      const cw = wet[s]! - mW;
      let quad = qWW * cw * cw;
      if (withGradients) {
        const cn = north[s]! - mN;
        const ce = east[s]! - mE;
        quad += 2 * (qWN * cw * cn + qWE * cw * ce + qNE * cn * ce) + qNN * cn * cn + qEE * ce * ce;
      }
      const sigma = design.sigmaM[s]!;
      residualVarianceM2[s] = sigma * sigma - biasVariance - quad;
    }
  }

  // Constraint residuals.
  for (const f of families) {
    if (f.settings.aprioriSigmaM !== null) weightedSquareSum += (x[f.offset]! / f.settings.aprioriSigmaM) ** 2;
    const rw = randomWalkWeight(f.settings);
    if (rw !== null) {
      for (let j = 0; j + 1 < f.count; j++) weightedSquareSum += rw * (x[f.offset + j + 1]! - x[f.offset + j]!) ** 2;
    }
  }

  return {
    x,
    inverse,
    biasM,
    fittedResidualM,
    residualVarianceM2,
    weightedSquareSum,
    residualSquareSumM2,
    observationsUsed,
    epochsUsed,
    constraints: constraintCount(layout, options),
  };
}
