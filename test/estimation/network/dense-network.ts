/**
 * Dense references for the network estimator, in the test code only (ml-matrix), sharing no code
 * with src/estimation: own node layout, interpolation, grouping; mapping functions from the
 * synthetic generator (scripts/synthetic-residuals.ts, independent of src/domain).
 *
 * - denseZeroDifference: every receiver and satellite clock of every epoch an explicit unknown,
 *   the datum by fixing the clock of the first station (input order) present at each epoch, the
 *   full normal matrix solved by Cholesky and inverted.
 * - denseDoubleDifference: per epoch, double differences against a base station and a pivot
 *   satellite, formed explicitly (D ℓ), weighted with their full covariance (D C_ℓ Dᵀ)⁻¹; only
 *   satellites seen by every station present at the epoch enter (with that, the double
 *   differences are a basis of all clock-free combinations). The caller arranges the data so.
 *
 * Both carry the random-walk and a-priori constraints as pseudo-observations, and add to every σ
 * the random walk's variance between the nodes as the estimator does (missingVariance below).
 */

import { CholeskyDecomposition, inverse, Matrix } from 'ml-matrix';
import { chenHerringMapping, niellWetMapping } from '../../../scripts/synthetic-residuals.js';
import type { NetworkEstimationInput } from '../../../src/estimation/network/types.js';

const RAD = 180 / Math.PI;

export interface DenseNetworkResult {
  /** [station][node] */
  zwdM: number[][];
  zwdSigmaM: number[][];
  northM: number[][];
  northSigmaM: number[][];
  /** σ(x_s,j − x_ref,j) [station][node]. */
  relativeSigmaM: number[][];
  /** Per network epoch: σ of the mean of all stations' δw(t). */
  meanSigmaM: number[];
  varianceFactor: number;
  degreesOfFreedom: number;
  /** Normalised residuals (Pope τ with σ̂0 = √variance factor) per input observation; NaN when not used. */
  tau: number[];
  /**
   * Median over epochs of corr(network-mean ZWD, χ), χ = mean over the observations of satellites
   * seen by ≥ 2 stations of (receiver clock + satellite clock).
   */
  clockCorrelation: number;
}

interface Layout {
  /** First ZWD node and first gradient node: multiples of the interval since 1970 (round UTC epochs). */
  t0: number;
  gradT0: number;
  zwdDt: number;
  zwdCount: number;
  gradDt: number;
  gradCount: number;
  per: number;
}

function layoutOf(input: NetworkEstimationInput, epochs: number[]): Layout {
  const first = epochs[0]!;
  const last = epochs[epochs.length - 1]!;
  const o = input.options;
  const start = (dtS: number) => Math.floor(first / (dtS * 1000) + 1e-9) * dtS * 1000;
  const count = (dtS: number) => Math.max(0, Math.ceil((last - start(dtS)) / (dtS * 1000) - 1e-9)) + 1;
  const zwdCount = count(o.zwd.intervalS);
  const gradCount = o.gradients ? count(o.gradients.intervalS) : 0;
  return {
    t0: start(o.zwd.intervalS),
    gradT0: o.gradients ? start(o.gradients.intervalS) : 0,
    zwdDt: o.zwd.intervalS * 1000,
    zwdCount,
    gradDt: (o.gradients?.intervalS ?? 1) * 1000,
    gradCount,
    per: zwdCount + 2 * gradCount,
  };
}

/** Columns and values of the node partials of one observation (station s). */
function nodePartials(input: NetworkEstimationInput, L: Layout, s: number, i: number): { cols: number[]; vals: number[] } {
  const o = input.observations;
  const e = o.elevationRad[i]!;
  const az = o.azimuthRad[i]!;
  const latDeg = input.stations[s]!.latitudeRad * RAD;
  const mw = niellWetMapping(latDeg, e);
  const cols: number[] = [];
  const vals: number[] = [];
  const interp = (count: number, dt: number, offset: number, m: number, t0 = L.t0) => {
    if (count === 1) {
      cols.push(offset);
      vals.push(m);
      return;
    }
    const u = (o.epochMs[i]! - t0) / dt;
    const j = Math.min(Math.max(Math.floor(u), 0), count - 2);
    const a = u - j;
    cols.push(offset + j, offset + j + 1);
    vals.push((1 - a) * m, a * m);
  };
  const base = s * L.per;
  interp(L.zwdCount, L.zwdDt, base, mw);
  if (L.gradCount > 0) {
    const mg = chenHerringMapping(e);
    interp(L.gradCount, L.gradDt, base + L.zwdCount, mg * Math.cos(az), L.gradT0);
    interp(L.gradCount, L.gradDt, base + L.zwdCount + L.gradCount, mg * Math.sin(az), L.gradT0);
  }
  return { cols, vals };
}

function constraintRows(input: NetworkEstimationInput, L: Layout, add: (cols: number[], vals: number[], w: number) => void): number {
  const o = input.options;
  let count = 0;
  input.stations.forEach((_, s) => {
    const fams: [number, number, typeof o.zwd][] = [[s * L.per, L.zwdCount, o.zwd]];
    if (o.gradients) {
      fams.push([s * L.per + L.zwdCount, L.gradCount, o.gradients], [s * L.per + L.zwdCount + L.gradCount, L.gradCount, o.gradients]);
    }
    for (const [off, n, set] of fams) {
      if (set.aprioriSigmaM !== null) {
        add([off], [1], 1 / set.aprioriSigmaM ** 2);
        count++;
      }
      if (set.randomWalkMPerSqrtH !== null) {
        const w = 1 / (set.randomWalkMPerSqrtH ** 2 * (set.intervalS / 3600));
        for (let j = 0; j + 1 < n; j++) {
          add([off + j + 1, off + j], [1, -1], w);
          count++;
        }
      }
    }
  });
  return count;
}

function used(input: NetworkEstimationInput): number[] {
  const o = input.observations;
  return o.epochMs.flatMap((_, i) => (o.elevationRad[i]! >= input.options.elevationCutoffRad ? [i] : []));
}

function sigmaOf(input: NetworkEstimationInput, i: number): number {
  const o = input.observations;
  const given = o.sigmaM?.[i];
  if (given !== undefined && given !== null) return given;
  return input.options.weighting === 'elevation' ? input.options.sigma0M / Math.sin(o.elevationRad[i]!) : input.options.sigma0M;
}

/**
 * The random walk's variance that piecewise-linear nodes leave out, added to every reported σ as the
 * estimator does (docs/network-estimation.md, "Honest σ between nodes"; written out here, not
 * imported): q² Δ g(α), g = 0.0866 − 0.166 u + 1.464 u², u = α (1 − α), for each station
 * independently. The solves themselves are compared before it: it is added to both sides alike.
 */
function missingVariance(q: number | null, dtMs: number, count: number, alpha: number): number {
  if (q === null || count < 2) return 0;
  const u = alpha * (1 - alpha);
  return q * q * (dtMs / 3_600_000) * (0.0866 - 0.166 * u + 1.464 * u * u);
}

function summarise(input: NetworkEstimationInput, L: Layout, epochs: number[], x: number[], Q: Matrix, reference: number) {
  const S = input.stations.length;
  const zq = input.options.zwd.randomWalkMPerSqrtH;
  const gq = input.options.gradients?.randomWalkMPerSqrtH ?? null;
  const zwdNode = missingVariance(zq, L.zwdDt, L.zwdCount, 0);
  const gradientNode = missingVariance(gq, L.gradDt, L.gradCount, 0);
  const pick = (off: number, n: number, f: (p: number) => number) =>
    Array.from({ length: S }, (_, s) => Array.from({ length: n }, (_, j) => f(s * L.per + off + j)));
  const meanSigmaM = epochs.map((t) => {
    const u = (t - L.t0) / L.zwdDt;
    const j = L.zwdCount === 1 ? 0 : Math.min(Math.max(Math.floor(u), 0), L.zwdCount - 2);
    const a = L.zwdCount === 1 ? 0 : u - j;
    const c: [number, number][] = [];
    for (let s = 0; s < S; s++) {
      c.push([s * L.per + j, (1 - a) / S]);
      if (L.zwdCount > 1) c.push([s * L.per + j + 1, a / S]);
    }
    let v = 0;
    for (const [p, wp] of c) for (const [q, wq] of c) v += wp * wq * Q.get(p, q);
    return Math.sqrt(v + missingVariance(zq, L.zwdDt, L.zwdCount, a) / S);
  });
  return {
    zwdM: pick(0, L.zwdCount, (p) => x[p]!),
    zwdSigmaM: pick(0, L.zwdCount, (p) => Math.sqrt(Q.get(p, p) + zwdNode)),
    northM: pick(L.zwdCount, L.gradCount, (p) => x[p]!),
    northSigmaM: pick(L.zwdCount, L.gradCount, (p) => Math.sqrt(Q.get(p, p) + gradientNode)),
    relativeSigmaM: Array.from({ length: S }, (_, s) =>
      Array.from({ length: L.zwdCount }, (_, j) => {
        const p = s * L.per + j;
        const r = reference * L.per + j;
        return s === reference ? 0 : Math.sqrt(Math.max(Q.get(p, p) + Q.get(r, r) - 2 * Q.get(p, r), 0) + 2 * zwdNode);
      }),
    ),
    meanSigmaM,
  };
}

export function denseZeroDifference(input: NetworkEstimationInput, reference: number): DenseNetworkResult {
  const o = input.observations;
  const rows = used(input);
  const epochs = [...new Set(rows.map((i) => o.epochMs[i]!))].sort((a, b) => a - b);
  const L = layoutOf(input, epochs);
  const stationIdx = new Map(input.stations.map((s, i) => [s.name, i]));
  // Clock unknowns.
  const clockCol = new Map<string, number>();
  let nextCol = input.stations.length * L.per;
  for (const t of epochs) {
    const here = rows.filter((i) => o.epochMs[i] === t);
    const st = [...new Set(here.map((i) => stationIdx.get(o.station[i]!)!))].sort((a, b) => a - b);
    for (const s of st.slice(1)) clockCol.set(`r${t}/${s}`, nextCol++);
    for (const sat of new Set(here.map((i) => o.satellite[i]!))) clockCol.set(`s${t}/${sat}`, nextCol++);
  }
  const n = nextCol;
  const N = new Matrix(n, n);
  const g = new Array<number>(n).fill(0);
  const A: { cols: number[]; vals: number[]; r: number; w: number; i: number }[] = [];
  const add = (cols: number[], vals: number[], w: number, r = 0, i = -1) => {
    for (let a = 0; a < cols.length; a++) {
      g[cols[a]!]! += w * vals[a]! * r;
      for (let b = 0; b < cols.length; b++) N.set(cols[a]!, cols[b]!, N.get(cols[a]!, cols[b]!) + w * (vals[a]! * vals[b]!));
    }
    if (i >= 0) A.push({ cols, vals, r, w, i });
  };
  for (const i of rows) {
    const s = stationIdx.get(o.station[i]!)!;
    const { cols, vals } = nodePartials(input, L, s, i);
    const rc = clockCol.get(`r${o.epochMs[i]}/${s}`);
    if (rc !== undefined) {
      cols.push(rc);
      vals.push(1);
    }
    cols.push(clockCol.get(`s${o.epochMs[i]}/${o.satellite[i]}`)!);
    vals.push(1);
    const sigma = sigmaOf(input, i);
    add(cols, vals, 1 / sigma ** 2, o.residualM[i]!, i);
  }
  const constraints = constraintRows(input, L, (c, v, w) => add(c, v, w));
  symmetrise(N);
  const chol = new CholeskyDecomposition(N);
  const x = chol.solve(Matrix.columnVector(g)).to1DArray();
  const Q = inverse(N);
  let vpv = 0;
  const residual = new Map<number, number>();
  for (const row of A) {
    let v = row.r;
    row.cols.forEach((c, a) => (v -= row.vals[a]! * x[c]!));
    residual.set(row.i, v);
    vpv += row.w * v * v;
  }
  input.stations.forEach((_, s) => {
    const fams: [number, number, typeof input.options.zwd][] = [[s * L.per, L.zwdCount, input.options.zwd]];
    if (input.options.gradients) {
      fams.push(
        [s * L.per + L.zwdCount, L.gradCount, input.options.gradients],
        [s * L.per + L.zwdCount + L.gradCount, L.gradCount, input.options.gradients],
      );
    }
    for (const [off, cnt, set] of fams) {
      if (set.aprioriSigmaM !== null) vpv += (x[off]! / set.aprioriSigmaM) ** 2;
      if (set.randomWalkMPerSqrtH !== null) {
        const w = 1 / (set.randomWalkMPerSqrtH ** 2 * (set.intervalS / 3600));
        for (let j = 0; j + 1 < cnt; j++) vpv += w * (x[off + j + 1]! - x[off + j]!) ** 2;
      }
    }
  });
  const dof = rows.length + constraints - n;
  const varianceFactor = vpv / dof;
  const tau = new Array<number>(o.epochMs.length).fill(Number.NaN);
  for (const row of A) {
    let q = 0;
    for (let a = 0; a < row.cols.length; a++)
      for (let b = 0; b < row.cols.length; b++) q += row.vals[a]! * row.vals[b]! * Q.get(row.cols[a]!, row.cols[b]!);
    const qv = 1 / row.w - q;
    if (qv > 1e-8 / row.w) tau[row.i] = residual.get(row.i)! / (Math.sqrt(varianceFactor) * Math.sqrt(qv));
  }
  // χ and ζ per epoch.
  const S = input.stations.length;
  const correlations = epochs.map((t) => {
    const here = rows.filter((i) => o.epochMs[i] === t);
    const perSat = new Map<string, number>();
    for (const i of here) perSat.set(o.satellite[i]!, (perSat.get(o.satellite[i]!) ?? 0) + 1);
    const informative = here.filter((i) => perSat.get(o.satellite[i]!)! >= 2);
    const f = new Map<number, number>();
    for (const i of informative) {
      const s = stationIdx.get(o.station[i]!)!;
      for (const key of [`r${t}/${s}`, `s${t}/${o.satellite[i]}`]) {
        const c = clockCol.get(key);
        if (c !== undefined) f.set(c, (f.get(c) ?? 0) + 1 / informative.length);
      }
    }
    const u = (t - L.t0) / L.zwdDt;
    const j = L.zwdCount === 1 ? 0 : Math.min(Math.max(Math.floor(u), 0), L.zwdCount - 2);
    const a = L.zwdCount === 1 ? 0 : u - j;
    const lambda = new Map<number, number>();
    for (let s = 0; s < S; s++) {
      lambda.set(s * L.per + j, (1 - a) / S);
      if (L.zwdCount > 1) lambda.set(s * L.per + j + 1, a / S);
    }
    const quad = (x1: Map<number, number>, x2: Map<number, number>) => {
      let v = 0;
      for (const [p, wp] of x1) for (const [q, wq] of x2) v += wp * wq * Q.get(p, q);
      return v;
    };
    return quad(f, lambda) / Math.sqrt(quad(f, f) * quad(lambda, lambda));
  });
  const sorted = correlations.slice().sort((p, q) => p - q);
  const h = Math.floor(sorted.length / 2);
  const clockCorrelation = sorted.length % 2 ? sorted[h]! : (sorted[h - 1]! + sorted[h]!) / 2;
  return { ...summarise(input, L, epochs, x, Q, reference), varianceFactor, degreesOfFreedom: dof, tau, clockCorrelation };
}

export function denseDoubleDifference(
  input: NetworkEstimationInput,
  reference: number,
): Omit<DenseNetworkResult, 'tau' | 'varianceFactor' | 'degreesOfFreedom' | 'clockCorrelation'> {
  const o = input.observations;
  const rows = used(input);
  const epochs = [...new Set(rows.map((i) => o.epochMs[i]!))].sort((a, b) => a - b);
  const L = layoutOf(input, epochs);
  const S = input.stations.length;
  const stationIdx = new Map(input.stations.map((s, i) => [s.name, i]));
  const n = S * L.per;
  const N = new Matrix(n, n);
  const g = Matrix.zeros(n, 1);
  for (const t of epochs) {
    const here = rows.filter((i) => o.epochMs[i] === t);
    const present = [...new Set(here.map((i) => stationIdx.get(o.station[i]!)!))].sort((a, b) => a - b);
    if (present.length < 2) continue;
    const bySat = new Map<string, Map<number, number>>();
    for (const i of here) {
      const m = bySat.get(o.satellite[i]!) ?? new Map<number, number>();
      m.set(stationIdx.get(o.station[i]!)!, i);
      bySat.set(o.satellite[i]!, m);
    }
    const common = [...bySat.entries()]
      .filter(([, m]) => m.size === present.length)
      .map(([sat]) => sat)
      .sort();
    if (common.length < 2) continue;
    // Observations (common satellites only) and their node partials.
    const obsIdx: number[] = [];
    const pos = new Map<string, number>();
    for (const sat of common) {
      for (const s of present) {
        pos.set(`${sat}/${s}`, obsIdx.length);
        obsIdx.push(bySat.get(sat)!.get(s)!);
      }
    }
    const m = obsIdx.length;
    const Aobs = new Matrix(m, n);
    const l = new Matrix(m, 1);
    const Cl = new Matrix(m, m);
    obsIdx.forEach((i, r) => {
      const s = stationIdx.get(o.station[i]!)!;
      const { cols, vals } = nodePartials(input, L, s, i);
      cols.forEach((c, a) => Aobs.set(r, c, Aobs.get(r, c) + vals[a]!));
      l.set(r, 0, o.residualM[i]!);
      Cl.set(r, r, sigmaOf(input, i) ** 2);
    });
    // D: (ℓ_s,k − ℓ_b,k) − (ℓ_s,k0 − ℓ_b,k0), b = first present station, k0 = first common satellite.
    const b = present[0]!;
    const k0 = common[0]!;
    const D = new Matrix((present.length - 1) * (common.length - 1), m);
    let row = 0;
    for (const s of present.slice(1)) {
      for (const k of common.slice(1)) {
        D.set(row, pos.get(`${k}/${s}`)!, 1);
        D.set(row, pos.get(`${k}/${b}`)!, -1);
        D.set(row, pos.get(`${k0}/${s}`)!, -1);
        D.set(row, pos.get(`${k0}/${b}`)!, 1);
        row++;
      }
    }
    const Add = D.mmul(Aobs);
    const dd = D.mmul(l);
    const W = inverse(D.mmul(Cl).mmul(D.transpose()));
    const AtW = Add.transpose().mmul(W);
    N.add(AtW.mmul(Add));
    g.add(AtW.mmul(dd));
  }
  constraintRows(input, L, (cols, vals, w) => {
    for (let a = 0; a < cols.length; a++)
      for (let c = 0; c < cols.length; c++) N.set(cols[a]!, cols[c]!, N.get(cols[a]!, cols[c]!) + w * (vals[a]! * vals[c]!));
  });
  symmetrise(N);
  const x = new CholeskyDecomposition(N).solve(g).to1DArray();
  const Q = inverse(N);
  return summarise(input, L, epochs, x, Q, reference);
}

/** (N + Nᵀ)/2: products formed in different orders differ in the last bit. */
function symmetrise(N: Matrix): void {
  for (let i = 0; i < N.rows; i++) {
    for (let j = 0; j < i; j++) {
      const v = (N.get(i, j) + N.get(j, i)) / 2;
      N.set(i, j, v);
      N.set(j, i, v);
    }
  }
}
