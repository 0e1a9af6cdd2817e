/**
 * Dense reference for the ZWD estimator: the same model (issue 3) solved the textbook way, with
 * every epoch bias b_k carried as an explicit unknown, the full normal matrix formed densely and
 * solved with ml-matrix's Cholesky decomposition, and the covariance as the full inverse.
 *
 * Shares no code with src/estimation (its own grouping, node layout, interpolation and residual
 * statistics); the mapping functions come from the synthetic generator, which implements them
 * from the published tables independently of src/domain. Cost O(u³) in the number of unknowns
 * u = nodes + epochs: fine for a few hundred epochs, slow for a day (that is the point of the
 * benchmark that imports it).
 */

import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { chenHerringMapping, niellWetMapping } from '../../scripts/synthetic-residuals.js';
import type { ZwdEstimationInput } from '../../src/estimation/types.js';

export interface DenseResult {
  zwdNodesM: number[];
  /** Unscaled formal sigmas √(N⁻¹)_jj [m]. */
  zwdNodeSigmaM: number[];
  northNodesM: number[];
  eastNodesM: number[];
  northNodeSigmaM: number[];
  eastNodeSigmaM: number[];
  epochMs: number[];
  epochCorrectionM: number[];
  epochSigmaM: number[];
  epochNorthM: number[];
  epochEastM: number[];
  biasM: number[];
  varianceFactor: number | null;
  degreesOfFreedom: number;
  unknowns: number;
  rmsM: number;
  /** Input indices of rejected observations, in the order of rejection. */
  rejected: number[];
  rejectedTau: number[];
}

interface Row {
  cols: number[];
  vals: number[];
  r: number;
  w: number;
  sigma: number;
  input: number;
}

export interface DenseOptions {
  /** Compute the full inverse (variances); false = solution only (the benchmark's lower bound). */
  covariance?: boolean;
}

export function denseZwdEstimate(input: ZwdEstimationInput, denseOptions: DenseOptions = {}): DenseResult {
  const withCovariance = denseOptions.covariance ?? true;
  const opt = input.options;
  const o = input.observations;
  const latDeg = (input.latitudeRad * 180) / Math.PI;

  const kept: number[] = [];
  for (let i = 0; i < o.epochMs.length; i++) if (o.elevationRad[i]! >= opt.elevationCutoffRad) kept.push(i);
  const epochList = [...new Set(kept.map((i) => o.epochMs[i]!))].sort((a, b) => a - b);
  const epochIndex = new Map(epochList.map((t, k) => [t, k]));
  const t0 = epochList[0]!;
  const tLast = epochList[epochList.length - 1]!;
  const nodesFor = (intervalS: number) => Math.max(0, Math.ceil((tLast - t0) / (intervalS * 1000) - 1e-9)) + 1;
  const nW = nodesFor(opt.zwd.intervalS);
  const nG = opt.gradients ? nodesFor(opt.gradients.intervalS) : 0;
  const nK = opt.epochBias ? epochList.length : 0;
  const u = nW + 2 * nG + nK;

  // Interpolation weights of the nodes around t: [[node, weight], ...].
  const hat = (t: number, intervalS: number, count: number): Array<[number, number]> => {
    if (count === 1) return [[0, 1]];
    const pos = (t - t0) / (intervalS * 1000);
    const j = Math.min(Math.floor(pos), count - 2);
    return [
      [j, 1 - (pos - j)],
      [j + 1, pos - j],
    ];
  };

  const rows: Row[] = kept.map((i) => {
    const e = o.elevationRad[i]!;
    const a = o.azimuthRad[i]!;
    const sigma = o.sigmaM?.[i] ?? (opt.weighting === 'elevation' ? opt.sigma0M / Math.sin(e) : opt.sigma0M);
    const cols: number[] = [];
    const vals: number[] = [];
    for (const [j, h] of hat(o.epochMs[i]!, opt.zwd.intervalS, nW)) {
      cols.push(j);
      vals.push(h * niellWetMapping(latDeg, e));
    }
    if (opt.gradients) {
      const mg = chenHerringMapping(e);
      for (const [l, h] of hat(o.epochMs[i]!, opt.gradients.intervalS, nG)) {
        cols.push(nW + l, nW + nG + l);
        vals.push(h * mg * Math.cos(a), h * mg * Math.sin(a));
      }
    }
    if (opt.epochBias) {
      cols.push(nW + 2 * nG + epochIndex.get(o.epochMs[i]!)!);
      vals.push(1);
    }
    return { cols, vals, r: o.residualM[i]!, w: 1 / (sigma * sigma), sigma, input: i };
  });

  // Pseudo-observations: value 0 with weight, on a linear combination of unknowns.
  const constraints: Array<{ cols: number[]; vals: number[]; w: number }> = [];
  const family = (offset: number, count: number, s: { intervalS: number; randomWalkMPerSqrtH: number | null; aprioriSigmaM: number | null }) => {
    if (s.aprioriSigmaM !== null) constraints.push({ cols: [offset], vals: [1], w: 1 / s.aprioriSigmaM ** 2 });
    if (s.randomWalkMPerSqrtH !== null) {
      const w = 1 / (s.randomWalkMPerSqrtH ** 2 * (s.intervalS / 3600));
      for (let j = 0; j + 1 < count; j++) constraints.push({ cols: [offset + j, offset + j + 1], vals: [-1, 1], w });
    }
  };
  family(0, nW, opt.zwd);
  if (opt.gradients) {
    family(nW, nG, opt.gradients);
    family(nW + nG, nG, opt.gradients);
  }

  const active = rows.map(() => true);
  const rejected: number[] = [];
  const rejectedTau: number[] = [];
  for (;;) {
    const n = Matrix.zeros(u, u);
    const g = Matrix.zeros(u, 1);
    const add = (cols: number[], vals: number[], w: number, r: number) => {
      for (let a = 0; a < cols.length; a++) {
        g.set(cols[a]!, 0, g.get(cols[a]!, 0) + w * vals[a]! * r);
        for (let b = 0; b <= a; b++) {
          const value = w * vals[a]! * vals[b]!;
          n.set(cols[a]!, cols[b]!, n.get(cols[a]!, cols[b]!) + value);
          if (b !== a) n.set(cols[b]!, cols[a]!, n.get(cols[b]!, cols[a]!) + value);
        }
      }
    };
    rows.forEach((row, k) => active[k] && add(row.cols, row.vals, row.w, row.r));
    for (const c of constraints) add(c.cols, c.vals, c.w, 0);
    const chol = new CholeskyDecomposition(n);
    if (!chol.isPositiveDefinite()) throw new Error('dense normal matrix is not positive definite');
    const x = chol.solve(g).getColumn(0);
    const q = withCovariance ? chol.solve(Matrix.eye(u)) : null;

    let omega = 0;
    let sumV2 = 0;
    let used = 0;
    const v = rows.map((row, k) => {
      if (!active[k]) return 0;
      let fit = 0;
      for (let a = 0; a < row.cols.length; a++) fit += row.vals[a]! * x[row.cols[a]!]!;
      const res = row.r - fit;
      omega += row.w * res * res;
      sumV2 += res * res;
      used++;
      return res;
    });
    for (const c of constraints) {
      let val = 0;
      for (let a = 0; a < c.cols.length; a++) val += c.vals[a]! * x[c.cols[a]!]!;
      omega += c.w * val * val;
    }
    const epochsUsed = opt.epochBias ? new Set(rows.filter((_, k) => active[k]).map((r) => r.cols[r.cols.length - 1])).size : 0;
    const unknowns = nW + 2 * nG + epochsUsed;
    const dof = used + constraints.length - unknowns;
    const vf = dof > 0 ? omega / dof : null;

    let worst = -1;
    let worstTau = 0;
    if (opt.outlierThreshold !== null && q) {
      rows.forEach((row, k) => {
        if (!active[k]) return;
        let aqa = 0;
        for (let a = 0; a < row.cols.length; a++) for (let b = 0; b < row.cols.length; b++) aqa += row.vals[a]! * q.get(row.cols[a]!, row.cols[b]!) * row.vals[b]!;
        const qv = row.sigma * row.sigma - aqa;
        if (!(qv > 1e-8 * row.sigma * row.sigma)) return;
        const tau = v[k]! / (Math.sqrt(vf ?? 1) * Math.sqrt(qv));
        if (Math.abs(tau) > Math.abs(worstTau)) {
          worstTau = tau;
          worst = k;
        }
      });
    }
    if (worst >= 0 && Math.abs(worstTau) > opt.outlierThreshold! && rejected.length < opt.maxRejections) {
      active[worst] = false;
      rejected.push(rows[worst]!.input);
      rejectedTau.push(worstTau);
      continue;
    }

    const sd = (j: number) => (q ? Math.sqrt(q.get(j, j)) : Number.NaN);
    const combo = (pairs: Array<[number, number]>) => {
      let value = 0;
      let variance = 0;
      for (const [j, h] of pairs) {
        value += h * x[j]!;
        if (q) for (const [l, k] of pairs) variance += h * k * q.get(j, l);
      }
      return { value, sigma: q ? Math.sqrt(variance) : Number.NaN };
    };
    const shift = (pairs: Array<[number, number]>, offset: number) => pairs.map(([j, h]) => [j + offset, h] as [number, number]);
    const perEpoch = epochList.map((t) => ({
      w: combo(hat(t, opt.zwd.intervalS, nW)),
      n: opt.gradients ? combo(shift(hat(t, opt.gradients.intervalS, nG), nW)) : null,
      e: opt.gradients ? combo(shift(hat(t, opt.gradients.intervalS, nG), nW + nG)) : null,
    }));
    return {
      zwdNodesM: x.slice(0, nW),
      zwdNodeSigmaM: Array.from({ length: nW }, (_, j) => sd(j)),
      northNodesM: x.slice(nW, nW + nG),
      eastNodesM: x.slice(nW + nG, nW + 2 * nG),
      northNodeSigmaM: Array.from({ length: nG }, (_, l) => sd(nW + l)),
      eastNodeSigmaM: Array.from({ length: nG }, (_, l) => sd(nW + nG + l)),
      epochMs: epochList,
      epochCorrectionM: perEpoch.map((p) => p.w.value),
      epochSigmaM: perEpoch.map((p) => p.w.sigma),
      epochNorthM: perEpoch.map((p) => p.n?.value ?? Number.NaN),
      epochEastM: perEpoch.map((p) => p.e?.value ?? Number.NaN),
      biasM: x.slice(nW + 2 * nG),
      varianceFactor: vf,
      degreesOfFreedom: dof,
      unknowns,
      rmsM: Math.sqrt(sumV2 / used),
      rejected,
      rejectedTau,
    };
  }
}
