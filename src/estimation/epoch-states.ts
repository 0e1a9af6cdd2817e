/**
 * One least-squares solution for states at every epoch (parametrisation "every-epoch" of the ZWD and
 * both gradient components, the default): the same system as least-squares.ts, solved as the block
 * tridiagonal system it is, instead of through the general frontal LDLᵀ (frontal-ldl.ts).
 *
 * With a state z_k = (δw, G_N, G_E) at every epoch k (the receiver clock b_k eliminated first,
 * least-squares.ts header), the normal matrix is block tridiagonal with 3×3 blocks:
 *     A_k = M_k + D_{k−1} + D_k (+ P_0 at k = 0),   A_{k,k+1} = −D_k,   right-hand side h_k,
 * M_k, h_k the epoch's bias-reduced (centred) sums, D_k = diag(w_W, w_G, w_G) the random-walk
 * weights of the step k → k+1 (1/(q² Δt), 0 after the last epoch) and P_0 the a-priori weights.
 * Its block LDLᵀ is the information form of the Kalman filter, its back substitution and selected
 * inverse the Rauch–Tung–Striebel smoother (Rauch, Tung & Striebel (1965), AIAA J. 3, 1445–1450;
 * e.g. Bierman (1977), Factorization Methods for Discrete Sequential Estimation; from memory):
 *     S_0 = A_0,  S_k = A_k − D_{k−1} S_{k−1}⁻¹ D_{k−1},   y_k = h_k + D_{k−1} u_{k−1},  u_k = S_k⁻¹ y_k
 *     x_{K−1} = u_{K−1},   x_k = u_k + G_k x_{k+1},   G_k = S_k⁻¹ D_k
 *     Z_{K−1} = S_{K−1}⁻¹,  Z_{k,k+1} = G_k Z_{k+1},  Z_k = S_k⁻¹ + Z_{k,k+1} G_kᵀ
 * (Z = N⁻¹: Z_k the 3×3 covariance of the epoch's states, Z_{k,k+1} of consecutive states).
 * The frontal solver eliminates the same parameters in the same order (δw_k, G_N,k, G_E,k, epoch
 * after epoch), so its pivots are those of the LDLᵀ of each S_k: the singularity test is the same
 * one (PIVOT_TOLERANCE against the parameter's own accumulated diagonal). On a small pivot this
 * solver gives up (returns null) and the caller runs the frontal solver, which names the parameter.
 *
 * The numbers equal the frontal solver's up to rounding (the same system; the epoch sums in one pass
 * about a reference observation, the products in another order): test/estimation/epoch-states.test.ts
 * compares the two (measured on the benchmark days: ZWD within 4e-14 m, σ within 1.4e-11 relative).
 *
 * Cost per solution: one pass over the observations for the sums and one for the residuals (with the
 * epoch means of the assembly; least-squares.ts takes two each), and a few dozen flops per epoch
 * instead of the front's slot bookkeeping per parameter.
 */

import type { Design } from './design.js';
import { PIVOT_TOLERANCE } from './frontal-ldl.js';
import {
  constraintCount,
  EPOCH_NORMAL_ENTRIES,
  parameterLayout,
  randomWalkStepWeight,
  type InverseElements,
  type Solution,
} from './least-squares.js';
import { FRESH_ARRAYS, type ArraySource } from './reused-arrays.js';
import type { ZwdEstimationOptions } from './types.js';

/** True when every family has a state at every epoch (and gradients are estimated): this solver applies. */
export function hasEpochStates(design: Design): boolean {
  const epochs = design.epochMs.length;
  return (
    !design.zwd.regular &&
    design.zwd.count === epochs &&
    design.gradients !== null &&
    !design.gradients.regular &&
    design.gradients.count === epochs
  );
}

/** Entries of a symmetric 3×3 block (WW, WN, WE, NN, NE, EE), as EPOCH_NORMAL_ENTRIES. */
const BLOCK = 6;

/**
 * N⁻¹ of the block tridiagonal system on its pattern: the 3×3 block of every epoch and the
 * covariance of consecutive states of one family. Parameter ids as least-squares.ts: δw_k = k,
 * G_N,k = K + k, G_E,k = 2K + k.
 */
export class EpochStateInverse implements InverseElements {
  constructor(
    private readonly epochs: number,
    readonly diagonal: Float64Array,
    /** Z_k per epoch, BLOCK entries each. */
    readonly block: Float64Array,
    /** Cov(x_{f,k}, x_{f,k+1}) per epoch and family (W, N, E), 3 entries each. */
    readonly next: Float64Array,
  ) {}

  get(p: number, q: number): number {
    if (p === q) return this.diagonal[p]!;
    const K = this.epochs;
    const fp = Math.floor(p / K);
    const fq = Math.floor(q / K);
    const kp = p - fp * K;
    const kq = q - fq * K;
    if (kp === kq) {
      const a = Math.min(fp, fq);
      const b = Math.max(fp, fq);
      // (W,N) 1, (W,E) 2, (N,E) 4.
      return this.block[kp * BLOCK + (a === 0 ? b : 4)]!;
    }
    if (fp === fq && Math.abs(kp - kq) === 1) return this.next[Math.min(kp, kq) * 3 + fp]!;
    throw new Error(`element (${p}, ${q}) of the inverse is outside the computed pattern`);
  }
}

/**
 * One solution with fresh arrays (see EpochStateSolver).
 *
 * @param used 1 for each design observation that takes part (0 = rejected)
 * @returns the solution, or null when a pivot is below the tolerance (the caller then runs the
 *          frontal solver, which throws SingularParameterError naming the parameter)
 */
export function solveEpochStates(design: Design, options: ZwdEstimationOptions, used: Uint8Array): Solution | null {
  return new EpochStateSolver(design, options).solve(used);
}

/**
 * The solver of one design, for the solutions of the screening loop one after the other: its arrays
 * (2 × 8 bytes per observation and 29 × 8 per epoch) are allocated once and each solve() writes its
 * solution into them, so a solution's arrays are valid until the next solve() (the loop never looks
 * back). Allocating them per solution made garbage collection a tenth of a four-constellation day.
 * Two pairs share their storage (the recursions read each epoch's entry before they overwrite it):
 * Z_k is written over S_k⁻¹ and x_k over u_k by the backward sweep.
 */
export class EpochStateSolver {
  // The solver's arrays (written by solveInto; a solution's arrays are some of them).
  readonly epochs: number;
  readonly stepW: Float64Array;
  readonly stepG: Float64Array;
  readonly epochNormal: Float64Array;
  readonly epochWeight: Float64Array;
  readonly means: Float64Array;
  /** S_k⁻¹ after the forward sweep, Z_k after the backward one (BLOCK entries per epoch). */
  readonly block: Float64Array;
  /** u_k after the forward sweep, x_k after the backward one (parameter order: δw_k = k, G_N,k = K + k, G_E,k = 2K + k). */
  readonly x: Float64Array;
  readonly diagonal: Float64Array;
  readonly next: Float64Array;
  readonly biasM: Float64Array;
  readonly fittedResidualM: Float64Array;
  readonly residualVarianceM2: Float64Array;
  /** h_k per epoch (W, N, E), the used observations per epoch, and the used flags the sums were taken with. */
  readonly epochRhs: Float64Array;
  readonly epochUsed: Int32Array;
  readonly sumsUsed: Uint8Array;
  /** design.weightsRevision of the epoch sums held; −1: none held. */
  sumsRevision = -1;

  /** @param arrays where its arrays come from (reused-arrays.ts); a solution is then valid until the next estimation too */
  constructor(
    private readonly design: Design,
    private readonly options: ZwdEstimationOptions,
    arrays: ArraySource = FRESH_ARRAYS,
  ) {
    const K = design.epochMs.length;
    const n = design.residualM.length;
    this.epochs = K;
    // Random-walk weights of the steps k → k+1 (0 after the last epoch), the same in every solution.
    this.stepW = arrays.float64('epochStates.stepW', K);
    this.stepG = arrays.float64('epochStates.stepG', K);
    for (let k = 0; k + 1 < K; k++) {
      this.stepW[k] = randomWalkStepWeight(options.zwd, design.epochMs[k]!, design.epochMs[k + 1]!)!;
      this.stepG[k] = randomWalkStepWeight(options.gradients!, design.epochMs[k]!, design.epochMs[k + 1]!)!;
    }
    this.epochNormal = arrays.float64('epochStates.epochNormal', K * EPOCH_NORMAL_ENTRIES);
    this.epochWeight = arrays.float64('epochStates.epochWeight', K);
    this.means = arrays.float64('epochStates.means', K * 4);
    this.block = arrays.float64('epochStates.block', K * BLOCK);
    this.x = arrays.float64('epochStates.x', 3 * K);
    this.diagonal = arrays.float64('epochStates.diagonal', 3 * K);
    this.next = arrays.float64('epochStates.next', K * 3);
    this.biasM = arrays.float64('epochStates.biasM', K);
    this.fittedResidualM = arrays.float64('epochStates.fittedResidualM', n);
    this.residualVarianceM2 = arrays.float64('epochStates.residualVarianceM2', n);
    this.epochRhs = arrays.float64('epochStates.epochRhs', K * 3);
    this.epochUsed = arrays.int32('epochStates.epochUsed', K);
    this.sumsUsed = arrays.uint8('epochStates.sumsUsed', n);
  }

  /**
   * @param used 1 for each design observation that takes part (0 = rejected)
   * @returns the solution (its arrays are overwritten by the next call), or null when a pivot is
   *          below the tolerance (the caller then runs the frontal solver, which names the parameter)
   */
  solve(used: Uint8Array): Solution | null {
    return solveInto(this.design, this.options, used, this);
  }
}

function solveInto(design: Design, options: ZwdEstimationOptions, used: Uint8Array, solver: EpochStateSolver): Solution | null {
  const gradients = options.gradients!;
  const K = design.epochMs.length;
  const bias = options.epochBias;
  const wet = design.wetMapping;
  const north = design.northMapping;
  const east = design.eastMapping;
  const variance = design.observationVarianceM2;
  const residual = design.residualM;
  const epochStart = design.epochStart;

  // Per epoch: Σw and the weighted means r̄, m̄ (for the residual pass), S_k⁻¹, u_k, the step weights.
  // S_k⁻¹ and u_k are stored where the backward sweep puts Z_k and x_k (EpochStateSolver).
  // The epoch sums (M_k, h_k, Σw, the means) are kept from solution to solution: an epoch whose used
  // flags are those of the sums held, with weights of the same revision, keeps them (after a rejection
  // only the rejected observations' epochs are summed again; the residuals and partials never change).
  const epochNormal = solver.epochNormal;
  const epochWeight = solver.epochWeight;
  const epochRhs = solver.epochRhs;
  const epochUsed = solver.epochUsed;
  const sumsUsed = solver.sumsUsed;
  const allEpochs = solver.sumsRevision !== design.weightsRevision;
  solver.sumsRevision = -1; // until every epoch's sums are there (a small pivot returns before)
  const means = solver.means;
  const sInv = solver.block;
  const u = solver.x;
  const stepW = solver.stepW;
  const stepG = solver.stepG;
  const aprioriW = options.zwd.aprioriSigmaM === null ? 0 : 1 / options.zwd.aprioriSigmaM ** 2;
  const aprioriG = gradients.aprioriSigmaM === null ? 0 : 1 / gradients.aprioriSigmaM ** 2;

  let observationsUsed = 0;
  let epochsUsed = 0;
  for (let k = 0; k < K; k++) {
    const start = epochStart[k]!;
    const end = epochStart[k + 1]!;
    if (allEpochs || !sameFlags(used, sumsUsed, start, end)) {
      epochSums(design, bias, used, k, epochNormal, epochWeight, epochRhs, epochUsed, means);
      sumsUsed.set(used.subarray(start, end), start);
    }
    const o = k * EPOCH_NORMAL_ENTRIES;
    const mWW = epochNormal[o]!,
      mWN = epochNormal[o + 1]!,
      mWE = epochNormal[o + 2]!,
      mNN = epochNormal[o + 3]!,
      mNE = epochNormal[o + 4]!,
      mEE = epochNormal[o + 5]!;
    const hW = epochRhs[3 * k]!,
      hN = epochRhs[3 * k + 1]!,
      hE = epochRhs[3 * k + 2]!;
    let dW = 0,
      dN = 0,
      dE = 0;
    const count = epochUsed[k]!;
    if (count > 0) {
      epochsUsed++;
      observationsUsed += count;
      // Σ w m² (the parameter's own diagonal for the singularity test): the centred sum plus Σw m̄².
      const sw = epochWeight[k]!;
      const mW = means[4 * k + 1]!;
      const mN = means[4 * k + 2]!;
      const mE = means[4 * k + 3]!;
      dW = mWW + sw * mW * mW;
      dN = mNN + sw * mN * mN;
      dE = mEE + sw * mE * mE;
    }

    // S_k = A_k − D_{k−1} S_{k−1}⁻¹ D_{k−1}, y_k = h_k + D_{k−1} u_{k−1}.
    const pW = k > 0 ? stepW[k - 1]! : 0;
    const pG = k > 0 ? stepG[k - 1]! : 0;
    const nW = stepW[k]!;
    const nG = stepG[k]!;
    const ownW = dW + pW + nW + (k === 0 ? aprioriW : 0);
    const ownN = dN + pG + nG + (k === 0 ? aprioriG : 0);
    const ownE = dE + pG + nG + (k === 0 ? aprioriG : 0);
    let sWW = mWW + pW + nW + (k === 0 ? aprioriW : 0);
    let sWN = mWN;
    let sWE = mWE;
    let sNN = mNN + pG + nG + (k === 0 ? aprioriG : 0);
    let sNE = mNE;
    let sEE = mEE + pG + nG + (k === 0 ? aprioriG : 0);
    let yW = hW;
    let yN = hN;
    let yE = hE;
    if (k > 0) {
      const b = (k - 1) * BLOCK;
      sWW -= pW * pW * sInv[b]!;
      sWN -= pW * pG * sInv[b + 1]!;
      sWE -= pW * pG * sInv[b + 2]!;
      sNN -= pG * pG * sInv[b + 3]!;
      sNE -= pG * pG * sInv[b + 4]!;
      sEE -= pG * pG * sInv[b + 5]!;
      yW += pW * u[k - 1]!;
      yN += pG * u[K + k - 1]!;
      yE += pG * u[2 * K + k - 1]!;
    }
    // Pivots of the LDLᵀ of S_k in the frontal order δw, G_N, G_E: the singularity test of frontal-ldl.ts.
    const lNW = sWN / sWW;
    const lEW = sWE / sWW;
    const dNpiv = sNN - lNW * sWN;
    const sENpiv = sNE - lEW * sWN;
    const dEpiv = sEE - lEW * sWE - (sENpiv * sENpiv) / dNpiv;
    if (
      !(sWW > PIVOT_TOLERANCE * ownW && sWW > 0) ||
      !(dNpiv > PIVOT_TOLERANCE * ownN && dNpiv > 0) ||
      !(dEpiv > PIVOT_TOLERANCE * ownE && dEpiv > 0)
    ) {
      return null;
    }
    // S_k⁻¹ by cofactors (det = product of the pivots).
    const det = sWW * dNpiv * dEpiv;
    const iWW = (sNN * sEE - sNE * sNE) / det;
    const iWN = (sNE * sWE - sWN * sEE) / det;
    const iWE = (sWN * sNE - sNN * sWE) / det;
    const iNN = (sWW * sEE - sWE * sWE) / det;
    const iNE = (sWN * sWE - sWW * sNE) / det;
    const iEE = (sWW * sNN - sWN * sWN) / det;
    const b = k * BLOCK;
    sInv[b] = iWW;
    sInv[b + 1] = iWN;
    sInv[b + 2] = iWE;
    sInv[b + 3] = iNN;
    sInv[b + 4] = iNE;
    sInv[b + 5] = iEE;
    u[k] = iWW * yW + iWN * yN + iWE * yE;
    u[K + k] = iWN * yW + iNN * yN + iNE * yE;
    u[2 * K + k] = iWE * yW + iNE * yN + iEE * yE;
  }

  // Back substitution and selected inverse (RTS smoother), last epoch first, in place: epoch k reads
  // its own u_k and S_k⁻¹ and the x_{k+1}, Z_{k+1} written just before, then overwrites u_k with x_k
  // and S_k⁻¹ with Z_k (x_{K−1} = u_{K−1} and Z_{K−1} = S_{K−1}⁻¹ are there already).
  const x = u;
  const block = sInv;
  const diagonal = solver.diagonal;
  const next = solver.next;
  const last = K - 1;
  for (let k = last - 1; k >= 0; k--) {
    const b = k * BLOCK;
    const iWW = sInv[b]!,
      iWN = sInv[b + 1]!,
      iWE = sInv[b + 2]!,
      iNN = sInv[b + 3]!,
      iNE = sInv[b + 4]!,
      iEE = sInv[b + 5]!;
    const dW = stepW[k]!;
    const dG = stepG[k]!;
    // G = S⁻¹ D (rows W, N, E).
    const gWW = iWW * dW,
      gWN = iWN * dG,
      gWE = iWE * dG;
    const gNW = iWN * dW,
      gNN = iNN * dG,
      gNE = iNE * dG;
    const gEW = iWE * dW,
      gEN = iNE * dG,
      gEE = iEE * dG;
    const xW = x[k + 1]!;
    const xN = x[K + k + 1]!;
    const xE = x[2 * K + k + 1]!;
    x[k] = u[k]! + gWW * xW + gWN * xN + gWE * xE;
    x[K + k] = u[K + k]! + gNW * xW + gNN * xN + gNE * xE;
    x[2 * K + k] = u[2 * K + k]! + gEW * xW + gEN * xN + gEE * xE;
    // C = G Z_{k+1} = Z_{k,k+1}.
    const z = b + BLOCK;
    const zWW = block[z]!,
      zWN = block[z + 1]!,
      zWE = block[z + 2]!,
      zNN = block[z + 3]!,
      zNE = block[z + 4]!,
      zEE = block[z + 5]!;
    const cWW = gWW * zWW + gWN * zWN + gWE * zWE;
    const cWN = gWW * zWN + gWN * zNN + gWE * zNE;
    const cWE = gWW * zWE + gWN * zNE + gWE * zEE;
    const cNW = gNW * zWW + gNN * zWN + gNE * zWE;
    const cNN = gNW * zWN + gNN * zNN + gNE * zNE;
    const cNE = gNW * zWE + gNN * zNE + gNE * zEE;
    const cEW = gEW * zWW + gEN * zWN + gEE * zWE;
    const cEN = gEW * zWN + gEN * zNN + gEE * zNE;
    const cEE = gEW * zWE + gEN * zNE + gEE * zEE;
    next[3 * k] = cWW;
    next[3 * k + 1] = cNN;
    next[3 * k + 2] = cEE;
    // Z_k = S⁻¹ + C Gᵀ.
    block[b] = iWW + cWW * gWW + cWN * gWN + cWE * gWE;
    block[b + 1] = iWN + cWW * gNW + cWN * gNN + cWE * gNE;
    block[b + 2] = iWE + cWW * gEW + cWN * gEN + cWE * gEE;
    block[b + 3] = iNN + cNW * gNW + cNN * gNN + cNE * gNE;
    block[b + 4] = iNE + cNW * gEW + cNN * gEN + cNE * gEE;
    block[b + 5] = iEE + cEW * gEW + cEN * gEN + cEE * gEE;
  }
  solver.sumsRevision = design.weightsRevision;
  for (let k = 0; k < K; k++) {
    diagonal[k] = block[k * BLOCK]!;
    diagonal[K + k] = block[k * BLOCK + 3]!;
    diagonal[2 * K + k] = block[k * BLOCK + 5]!;
  }
  const inverse = new EpochStateInverse(K, diagonal, block, next);

  // Post-fit residuals v, biases b̂ and σ_v² (least-squares.ts, postFitResiduals) from the epoch means of the assembly.
  // Rejected observations get 0 and 0, epochs without observations or biases NaN (written here, not filled first).
  const biasM = solver.biasM;
  const fittedResidualM = solver.fittedResidualM;
  const residualVarianceM2 = solver.residualVarianceM2;
  let observationSquareSum = 0;
  let observationRedundancy = 0;
  let residualSquareSumM2 = 0;
  for (let k = 0; k < K; k++) {
    const sw = epochWeight[k]!;
    const start = epochStart[k]!;
    const end = epochStart[k + 1]!;
    biasM[k] = Number.NaN;
    if (sw === 0) {
      fittedResidualM.fill(0, start, end);
      residualVarianceM2.fill(0, start, end);
      continue;
    }
    const xW = x[k]!;
    const xN = x[K + k]!;
    const xE = x[2 * K + k]!;
    const mr = means[4 * k]!;
    const mW = means[4 * k + 1]!;
    const mN = means[4 * k + 2]!;
    const mE = means[4 * k + 3]!;
    // b̂ = Σ w (r − mᵀx) / Σ w = r̄ − m̄ᵀx, so v = r − mᵀx − b̂ = (r − r̄) − (m − m̄)ᵀx in one pass.
    if (bias) biasM[k] = mr - (mW * xW + mN * xN + mE * xE);
    const b = k * BLOCK;
    const qWW = block[b]!,
      qWN = block[b + 1]!,
      qWE = block[b + 2]!,
      qNN = block[b + 3]!,
      qNE = block[b + 4]!,
      qEE = block[b + 5]!;
    const biasVariance = bias ? 1 / sw : 0;
    for (let s = start; s < end; s++) {
      if (!used[s]) {
        fittedResidualM[s] = 0;
        residualVarianceM2[s] = 0;
        continue;
      }
      const cw = wet[s]! - mW;
      const cn = north[s]! - mN;
      const ce = east[s]! - mE;
      const v = residual[s]! - mr - (cw * xW + cn * xN + ce * xE);
      fittedResidualM[s] = v;
      const w = 1 / variance[s]!;
      observationSquareSum += w * v * v;
      residualSquareSumM2 += v * v;
      const quad = qWW * cw * cw + 2 * (qWN * cw * cn + qWE * cw * ce + qNE * cn * ce) + qNN * cn * cn + qEE * ce * ce;
      const sigma = Math.sqrt(variance[s]!);
      const qv = sigma * sigma - biasVariance - quad;
      residualVarianceM2[s] = qv;
      observationRedundancy += qv * w;
    }
  }

  // Ω share of the constraints, family after family (as least-squares.ts).
  let constraintSquareSum = 0;
  for (let f = 0; f < 3; f++) {
    const settings = f === 0 ? options.zwd : gradients;
    const steps = f === 0 ? stepW : stepG;
    const o = f * K;
    if (settings.aprioriSigmaM !== null) constraintSquareSum += (x[o]! / settings.aprioriSigmaM) ** 2;
    for (let k = 0; k + 1 < K; k++) constraintSquareSum += steps[k]! * (x[o + k + 1]! - x[o + k]!) ** 2;
  }

  return {
    x,
    inverse,
    biasM,
    fittedResidualM,
    residualVarianceM2,
    weightedSquareSum: observationSquareSum + constraintSquareSum,
    observationSquareSum,
    observationRedundancy,
    residualSquareSumM2,
    observationsUsed,
    epochsUsed,
    epochNormal,
    constraints: constraintCount(parameterLayout(design), options),
  };
}

/** True when used[start..end) equals held[start..end). */
function sameFlags(used: Uint8Array, held: Uint8Array, start: number, end: number): boolean {
  for (let s = start; s < end; s++) if (used[s] !== held[s]) return false;
  return true;
}

/**
 * The sums of epoch k into the solver's arrays: M_k (centred, EPOCH_NORMAL_ENTRIES), h_k, Σw, the
 * weighted means r̄, m̄, and the number of used observations; zeros (means untouched) when none is used.
 */
function epochSums(
  design: Design,
  bias: boolean,
  used: Uint8Array,
  k: number,
  epochNormal: Float64Array,
  epochWeight: Float64Array,
  epochRhs: Float64Array,
  epochUsed: Int32Array,
  means: Float64Array,
): void {
  const wet = design.wetMapping;
  const north = design.northMapping;
  const east = design.eastMapping;
  const variance = design.observationVarianceM2;
  const residual = design.residualM;
  const start = design.epochStart[k]!;
  const end = design.epochStart[k + 1]!;
  // One pass: sums of w d, w d dᵀ with d = (m − m_ref, r − r_ref) taken from the epoch's first used
  // observation (so that ±300 km receiver clocks in r cost no digits), centred afterwards:
  // M = Σ w d dᵀ − (Σ w d)(Σ w d)ᵀ/Σ w = Σ w (m − m̄)(m − m̄)ᵀ, h likewise (least-squares.ts takes two passes).
  let first = start;
  while (first < end && !used[first]) first++;
  let mWW = 0,
    mWN = 0,
    mWE = 0,
    mNN = 0,
    mNE = 0,
    mEE = 0;
  let hW = 0,
    hN = 0,
    hE = 0;
  let sw = 0;
  let count = 0;
  if (first < end) {
    const rRef = bias ? residual[first]! : 0;
    const wRef = bias ? wet[first]! : 0;
    const nRef = bias ? north[first]! : 0;
    const eRef = bias ? east[first]! : 0;
    let sR = 0,
      sW = 0,
      sN = 0,
      sE = 0;
    for (let s = first; s < end; s++) {
      if (!used[s]) continue;
      count++;
      const w = 1 / variance[s]!;
      const dr = residual[s]! - rRef;
      const cw = wet[s]! - wRef;
      const cn = north[s]! - nRef;
      const ce = east[s]! - eRef;
      const wcw = w * cw;
      const wcn = w * cn;
      const wce = w * ce;
      sw += w;
      sR += w * dr;
      sW += wcw;
      sN += wcn;
      sE += wce;
      mWW += wcw * cw;
      mWN += wcw * cn;
      mWE += wcw * ce;
      mNN += wcn * cn;
      mNE += wcn * ce;
      mEE += wce * ce;
      hW += wcw * dr;
      hN += wcn * dr;
      hE += wce * dr;
    }
    let aR = 0,
      aW = 0,
      aN = 0,
      aE = 0;
    if (bias) {
      aR = sR / sw;
      aW = sW / sw;
      aN = sN / sw;
      aE = sE / sw;
      mWW -= sW * aW;
      mWN -= sW * aN;
      mWE -= sW * aE;
      mNN -= sN * aN;
      mNE -= sN * aE;
      mEE -= sE * aE;
      hW -= sW * aR;
      hN -= sN * aR;
      hE -= sE * aR;
    }
    means[4 * k] = rRef + aR;
    means[4 * k + 1] = wRef + aW;
    means[4 * k + 2] = nRef + aN;
    means[4 * k + 3] = eRef + aE;
  }
  epochWeight[k] = sw;
  epochUsed[k] = count;
  const o = k * EPOCH_NORMAL_ENTRIES;
  epochNormal[o] = mWW;
  epochNormal[o + 1] = mWN;
  epochNormal[o + 2] = mWE;
  epochNormal[o + 3] = mNN;
  epochNormal[o + 4] = mNE;
  epochNormal[o + 5] = mEE;
  epochRhs[3 * k] = hW;
  epochRhs[3 * k + 1] = hN;
  epochRhs[3 * k + 2] = hE;
}
