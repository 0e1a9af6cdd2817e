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
 * Constraints: x_{j+1} − x_j = 0 ± q √((t_{j+1} − t_j)/1 h) (random walk between consecutive
 * states, whatever their spacing), x_0 = 0 ± σ_0 (a priori).
 *
 * solveOnce runs four named steps: assembleAndFactor (normal equations epoch by epoch into the
 * frontal factorisation), the solution and selected inverse, postFitResiduals (v, b̂, σ_v²) and
 * constraintResiduals (their share of Ω).
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
import { FrontalLdl } from './frontal-ldl.js';
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

/** Elements of N⁻¹ a solution provides: the diagonal, and get(p, q) on the solver's pattern. */
export interface InverseElements {
  readonly diagonal: Float64Array;
  /** (N⁻¹)_pq; throws outside the computed pattern. */
  get(p: number, q: number): number;
}

export interface Solution {
  x: Float64Array;
  /** Every pair of parameters that share an epoch, and consecutive states of one family, are on the pattern. */
  inverse: InverseElements;
  /** b̂_k per epoch [m]; NaN when the epoch has no used observation or biases are off. */
  biasM: Float64Array;
  /** Post-fit residual v_i per design observation [m] (0 for unused ones). */
  fittedResidualM: Float64Array;
  /** σ_v_i² per design observation [m²] (0 for unused ones). */
  residualVarianceM2: Float64Array;
  /** vᵀPv of the observations plus the weighted squares of the constraint residuals [-]. */
  weightedSquareSum: number;
  /** vᵀPv of the observations alone [-]. */
  observationSquareSum: number;
  /** Σ σ_v_i²/σ_i² over the used observations: their redundancy (degrees of freedom they carry) [-]. */
  observationRedundancy: number;
  /** Per epoch the centred 3×3 normal matrix entries (EPOCH_NORMAL_ENTRIES each) [1/m²]; 0 without data. */
  epochNormal: Float64Array;
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
  nodeMs: Float64Array;
  current: number;
}

/** Weight of the random-walk step between states at t_a and t_b [ms], 1/(q² (t_b − t_a)[h]) [1/m²]. */
export function randomWalkStepWeight(settings: PiecewiseLinearSettings, fromMs: number, toMs: number): number | null {
  return settings.randomWalkMPerSqrtH === null ? null : 1 / (settings.randomWalkMPerSqrtH ** 2 * ((toMs - fromMs) / 3_600_000));
}

export function constraintCount(layout: ParameterLayout, options: ZwdEstimationOptions): number {
  const perFamily = (count: number, s: PiecewiseLinearSettings) =>
    (s.aprioriSigmaM === null ? 0 : 1) + (s.randomWalkMPerSqrtH === null ? 0 : count - 1);
  return perFamily(layout.zwdCount, options.zwd) + (options.gradients ? 2 * perFamily(layout.gradientCount, options.gradients) : 0);
}

function families(design: Design, layout: ParameterLayout, options: ZwdEstimationOptions): Family[] {
  const out: Family[] = [{ offset: 0, count: layout.zwdCount, settings: options.zwd, nodeMs: design.zwd.nodeMs, current: -1 }];
  if (options.gradients && design.gradients) {
    out.push({
      offset: layout.northOffset,
      count: layout.gradientCount,
      settings: options.gradients,
      nodeMs: design.gradients.nodeMs,
      current: -1,
    });
    out.push({
      offset: layout.eastOffset,
      count: layout.gradientCount,
      settings: options.gradients,
      nodeMs: design.gradients.nodeMs,
      current: -1,
    });
  }
  return out;
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

/** Per epoch, the six distinct entries of the centred 3×3 normal matrix M (WW, WN, WE, NN, NE, EE). */
export const EPOCH_NORMAL_ENTRIES = 6;

/**
 * @param used 1 for each design observation that takes part (0 = rejected)
 * @throws SingularParameterError when a node is not determined by the data and constraints
 */
export function solveOnce(design: Design, options: ZwdEstimationOptions, used: Uint8Array): Solution {
  const layout = parameterLayout(design);
  const fams = families(design, layout, options);
  const assembled = assembleAndFactor(design, layout, fams, options.epochBias, used);
  const x = assembled.solver.solve();
  const inverse = assembled.solver.selectedInverse();
  const residuals = postFitResiduals(design, layout, options.epochBias, used, x, inverse);
  const constraintSquareSum = constraintResiduals(fams, x);
  return {
    x,
    inverse,
    biasM: residuals.biasM,
    fittedResidualM: residuals.fittedResidualM,
    residualVarianceM2: residuals.residualVarianceM2,
    weightedSquareSum: residuals.observationSquareSum + constraintSquareSum,
    observationSquareSum: residuals.observationSquareSum,
    observationRedundancy: residuals.observationRedundancy,
    residualSquareSumM2: residuals.residualSquareSumM2,
    observationsUsed: assembled.observationsUsed,
    epochsUsed: assembled.epochsUsed,
    epochNormal: assembled.epochNormal,
    constraints: constraintCount(layout, options),
  };
}

/**
 * Normal equations epoch by epoch into the frontal factorisation: the constraints of each node as
 * it enters the front, then the epoch's bias-reduced 3×3 sums mapped to its nodes (N_k = B M Bᵀ).
 */
function assembleAndFactor(design: Design, layout: ParameterLayout, fams: Family[], bias: boolean, used: Uint8Array) {
  const withGradients = layout.gradientCount > 0;
  const nLocal = withGradients ? LOCAL_PARAMETERS : 2;
  const solver = new FrontalLdl(layout.parameters, nLocal);

  const rwConstraint = (f: Family, j: number) => {
    const w = randomWalkStepWeight(f.settings, f.nodeMs[j - 1]!, f.nodeMs[j]!);
    if (w !== null) solver.addDifferenceConstraint(f.offset + j, f.offset + j - 1, w);
  };
  const advance = (f: Family, interval: number) => {
    if (f.current < 0) {
      solver.activate(f.offset);
      if (f.settings.aprioriSigmaM !== null) solver.addValueConstraint(f.offset, 1 / f.settings.aprioriSigmaM ** 2);
      if (f.count > 1) {
        solver.activate(f.offset + 1);
        rwConstraint(f, 1);
      }
      f.current = 0;
    }
    while (f.current < interval) {
      solver.eliminate(f.offset + f.current);
      solver.activate(f.offset + f.current + 2);
      rwConstraint(f, f.current + 2);
      f.current++;
    }
  };

  const epochs = design.epochMs.length;
  const wet = design.wetMapping;
  const north = design.northMapping;
  const east = design.eastMapping;
  const ids = new Int32Array(LOCAL_PARAMETERS);
  const slots = new Int32Array(LOCAL_PARAMETERS);
  const interp = new Float64Array(LOCAL_PARAMETERS);
  const epochNormal = new Float64Array(epochs * EPOCH_NORMAL_ENTRIES);
  const m3 = new Float64Array(9);
  const h3 = new Float64Array(3);
  const d3 = new Float64Array(3);
  let observationsUsed = 0;
  let epochsUsed = 0;

  for (let k = 0; k < epochs; k++) {
    advance(fams[0]!, design.zwdInterval[k]!);
    for (let f = 1; f < fams.length; f++) advance(fams[f]!, design.gradientInterval[k]!);
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
      const w = 1 / design.observationVarianceM2[s]!;
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
    let mWW = 0,
      mWN = 0,
      mWE = 0,
      mNN = 0,
      mNE = 0,
      mEE = 0;
    let hW = 0,
      hN = 0,
      hE = 0;
    let dW = 0,
      dN = 0,
      dE = 0;
    for (let s = start; s < end; s++) {
      if (!used[s]) continue;
      observationsUsed++;
      const w = 1 / design.observationVarianceM2[s]!;
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
    const o = k * EPOCH_NORMAL_ENTRIES;
    epochNormal[o] = mWW;
    epochNormal[o + 1] = mWN;
    epochNormal[o + 2] = mWE;
    epochNormal[o + 3] = mNN;
    epochNormal[o + 4] = mNE;
    epochNormal[o + 5] = mEE;
    // N_k = B M Bᵀ, g_k = B h, added to the front. A local parameter of weight 0 (the second state of an
    // interval at its own epoch: every-epoch states) adds nothing and is skipped.
    m3[0] = mWW;
    m3[1] = m3[3] = mWN;
    m3[2] = m3[6] = mWE;
    m3[4] = mNN;
    m3[5] = m3[7] = mNE;
    m3[8] = mEE;
    h3[0] = hW;
    h3[1] = hN;
    h3[2] = hE;
    d3[0] = dW;
    d3[1] = dN;
    d3[2] = dE;
    epochParameters(design, layout, k, ids, interp);
    for (let p = 0; p < nLocal; p++) slots[p] = ids[p]! >= 0 && interp[p] !== 0 ? solver.slot(ids[p]!) : -1;
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
  return { solver, observationsUsed, epochsUsed, epochNormal };
}

/**
 * Post-fit residuals v_i, epoch biases b̂_k and residual variances σ_v_i² (header), with the
 * observations' share of Ω (vᵀPv) and their redundancy Σ σ_v_i²/σ_i².
 */
function postFitResiduals(
  design: Design,
  layout: ParameterLayout,
  bias: boolean,
  used: Uint8Array,
  x: Float64Array,
  inverse: InverseElements,
) {
  const withGradients = layout.gradientCount > 0;
  const nLocal = withGradients ? LOCAL_PARAMETERS : 2;
  const epochs = design.epochMs.length;
  const wet = design.wetMapping;
  const north = design.northMapping;
  const east = design.eastMapping;
  const ids = new Int32Array(LOCAL_PARAMETERS);
  const interp = new Float64Array(LOCAL_PARAMETERS);
  const biasM = new Float64Array(epochs).fill(Number.NaN);
  const fittedResidualM = new Float64Array(design.residualM.length);
  const residualVarianceM2 = new Float64Array(design.residualM.length);
  const local = new Int32Array(LOCAL_PARAMETERS);
  const xf = new Float64Array(3);
  const q3 = new Float64Array(9);
  let observationSquareSum = 0;
  let observationRedundancy = 0;
  let residualSquareSumM2 = 0;
  for (let k = 0; k < epochs; k++) {
    epochParameters(design, layout, k, ids, interp);
    // Interpolated values (Bᵀx) and their covariance Bᵀ Q B, over the local parameters of non-zero
    // weight (every-epoch states: the epoch's own three).
    let nonZero = 0;
    for (let p = 0; p < nLocal; p++) if (ids[p]! >= 0 && interp[p] !== 0) local[nonZero++] = p;
    xf.fill(0);
    for (let a = 0; a < nonZero; a++) xf[FAMILY[local[a]!]!]! += interp[local[a]!]! * x[ids[local[a]!]!]!;
    const start = design.epochStart[k]!;
    const end = design.epochStart[k + 1]!;
    let sw = 0;
    let swe = 0;
    let swW = 0;
    let swN = 0;
    let swE = 0;
    for (let s = start; s < end; s++) {
      if (!used[s]) continue;
      const w = 1 / design.observationVarianceM2[s]!;
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
    q3.fill(0);
    for (let a = 0; a < nonZero; a++) {
      const p = local[a]!;
      for (let c = 0; c < nonZero; c++) {
        const r = local[c]!;
        q3[FAMILY[p]! * 3 + FAMILY[r]!]! += interp[p]! * inverse.get(ids[p]!, ids[r]!) * interp[r]!;
      }
    }
    const qWW = q3[0]!,
      qWN = q3[1]!,
      qWE = q3[2]!,
      qNN = q3[4]!,
      qNE = q3[5]!,
      qEE = q3[8]!;
    const biasVariance = bias ? 1 / sw : 0;
    for (let s = start; s < end; s++) {
      if (!used[s]) continue;
      const v = fittedResidualM[s]! - b;
      fittedResidualM[s] = v;
      const w = 1 / design.observationVarianceM2[s]!;
      observationSquareSum += w * v * v;
      residualSquareSumM2 += v * v;
      const cw = wet[s]! - mW;
      let quad = qWW * cw * cw;
      if (withGradients) {
        const cn = north[s]! - mN;
        const ce = east[s]! - mE;
        quad += 2 * (qWN * cw * cn + qWE * cw * ce + qNE * cn * ce) + qNN * cn * cn + qEE * ce * ce;
      }
      const sigma = Math.sqrt(design.observationVarianceM2[s]!);
      const qv = sigma * sigma - biasVariance - quad;
      residualVarianceM2[s] = qv;
      observationRedundancy += qv * w;
    }
  }
  return { biasM, fittedResidualM, residualVarianceM2, observationSquareSum, observationRedundancy, residualSquareSumM2 };
}

/** Ω share of the constraints: Σ w (x_{j+1} − x_j)² and (x_0/σ_0)². */
function constraintResiduals(fams: Family[], x: Float64Array): number {
  let sum = 0;
  for (const f of fams) {
    if (f.settings.aprioriSigmaM !== null) sum += (x[f.offset]! / f.settings.aprioriSigmaM) ** 2;
    for (let j = 0; j + 1 < f.count; j++) {
      const w = randomWalkStepWeight(f.settings, f.nodeMs[j]!, f.nodeMs[j + 1]!);
      if (w !== null) sum += w * (x[f.offset + j + 1]! - x[f.offset + j]!) ** 2;
    }
  }
  return sum;
}
