/**
 * Dense reference for the ZWD estimator: the same model (issues 3 and 10: states at every epoch or
 * piecewise-linear nodes on round UTC epochs, random walk between consecutive states, weights
 * σ0/sin e, σ0 or a² + b²/sin²e) solved the textbook way, with
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
  const everyEpoch = (opt.parametrisation ?? 'every-epoch') === 'every-epoch';
  // Regular nodes on round UTC epochs: multiples of Δ since 1970 from the last one at or before the
  // first epoch to the first one at or after the last.
  const roundNodes = (intervalS: number) => {
    const d = intervalS * 1000;
    const first = Math.floor(t0 / d + 1e-9) * d;
    const count = Math.max(0, Math.ceil((tLast - first) / d - 1e-9)) + 1;
    return Array.from({ length: count }, (_, j) => first + j * d);
  };
  // States of the solution: one per epoch, or the regular nodes.
  const stateTimes = (intervalS: number) => (everyEpoch ? epochList : roundNodes(intervalS));
  const zwdTimes = stateTimes(opt.zwd.intervalS);
  const gradientTimes = opt.gradients ? stateTimes(opt.gradients.intervalS) : [];
  const nW = zwdTimes.length;
  const nG = gradientTimes.length;
  const nK = opt.epochBias ? epochList.length : 0;
  const u = nW + 2 * nG + nK;

  // Interpolation weights of the states around t: [[state, weight], ...] (linear search: small cases).
  const hat = (t: number, times: readonly number[]): Array<[number, number]> => {
    if (times.length === 1) return [[0, 1]];
    let j = 0;
    while (j < times.length - 2 && times[j + 1]! <= t) j++;
    const alpha = (t - times[j]!) / (times[j + 1]! - times[j]!);
    return [
      [j, 1 - alpha],
      [j + 1, alpha],
    ];
  };
  const sigmaOf = (e: number) => {
    const s0 = opt.sigma0M;
    if (opt.weighting === 'uniform') return s0;
    if (opt.weighting === 'elevation') return s0 / Math.sin(e);
    const a = opt.sigmaConstantM ?? s0 / 3;
    return Math.sqrt(a * a + (s0 * s0) / Math.sin(e) ** 2);
  };
  if ((opt.wetMapping?.model ?? 'niell') !== 'niell') throw new Error('the dense reference knows the Niell wet mapping only');

  const rows: Row[] = kept.map((i) => {
    const e = o.elevationRad[i]!;
    const a = o.azimuthRad[i]!;
    const sigma = o.sigmaM?.[i] ?? sigmaOf(e);
    const cols: number[] = [];
    const vals: number[] = [];
    for (const [j, h] of hat(o.epochMs[i]!, zwdTimes)) {
      cols.push(j);
      vals.push(h * niellWetMapping(latDeg, e));
    }
    if (opt.gradients) {
      const mg = chenHerringMapping(e);
      for (const [l, h] of hat(o.epochMs[i]!, gradientTimes)) {
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
  const family = (offset: number, times: readonly number[], s: { randomWalkMPerSqrtH: number | null; aprioriSigmaM: number | null }) => {
    if (s.aprioriSigmaM !== null) constraints.push({ cols: [offset], vals: [1], w: 1 / s.aprioriSigmaM ** 2 });
    if (s.randomWalkMPerSqrtH !== null) {
      for (let j = 0; j + 1 < times.length; j++) {
        const w = 1 / (s.randomWalkMPerSqrtH ** 2 * ((times[j + 1]! - times[j]!) / 3_600_000));
        constraints.push({ cols: [offset + j, offset + j + 1], vals: [-1, 1], w });
      }
    }
  };
  family(0, zwdTimes, opt.zwd);
  if (opt.gradients) {
    family(nW, gradientTimes, opt.gradients);
    family(nW + nG, gradientTimes, opt.gradients);
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
        for (let a = 0; a < row.cols.length; a++)
          for (let b = 0; b < row.cols.length; b++) aqa += row.vals[a]! * q.get(row.cols[a]!, row.cols[b]!) * row.vals[b]!;
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
      w: combo(hat(t, zwdTimes)),
      n: opt.gradients ? combo(shift(hat(t, gradientTimes), nW)) : null,
      e: opt.gradients ? combo(shift(hat(t, gradientTimes), nW + nG)) : null,
    }));
    // Output nodes on round UTC epochs: the states there; between every-epoch states the straight
    // line plus the Brownian-bridge variance q² Δt α(1 − α), beyond the ends the end state plus q² |Δt|.
    const outputNodes = (intervalS: number, times: readonly number[], offset: number, qRw: number | null) =>
      roundNodes(intervalS).map((t) => {
        const qq = qRw === null ? Infinity : qRw * qRw;
        if (t < times[0]! || t > times[times.length - 1]!) {
          const end = t < times[0]! ? 0 : times.length - 1;
          const c = combo([[offset + end, 1]]);
          return { value: c.value, sigma: Math.sqrt(c.sigma ** 2 + (qq * Math.abs(t - times[end]!)) / 3_600_000) };
        }
        const pairs = hat(t, times);
        const c = combo(shift(pairs, offset));
        const alpha = pairs.length > 1 ? pairs[1]![1] : 0;
        const j = pairs[0]![0];
        const bridge = everyEpoch && alpha > 0 && alpha < 1 ? qq * ((times[j + 1]! - times[j]!) / 3_600_000) * alpha * (1 - alpha) : 0;
        return { value: c.value, sigma: Math.sqrt(c.sigma ** 2 + bridge) };
      });
    const zwdOut = outputNodes(opt.zwd.intervalS, zwdTimes, 0, opt.zwd.randomWalkMPerSqrtH);
    const northOut = opt.gradients ? outputNodes(opt.gradients.intervalS, gradientTimes, nW, opt.gradients.randomWalkMPerSqrtH) : [];
    const eastOut = opt.gradients ? outputNodes(opt.gradients.intervalS, gradientTimes, nW + nG, opt.gradients.randomWalkMPerSqrtH) : [];
    return {
      zwdNodesM: zwdOut.map((c) => c.value),
      zwdNodeSigmaM: zwdOut.map((c) => c.sigma),
      northNodesM: northOut.map((c) => c.value),
      eastNodesM: eastOut.map((c) => c.value),
      northNodeSigmaM: northOut.map((c) => c.sigma),
      eastNodeSigmaM: eastOut.map((c) => c.sigma),
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
