/**
 * One network epoch: its normal equations in the epoch's troposphere unknowns z and its clocks, and
 * the clocks eliminated (Schur complement), so that only z reaches the global system.
 *
 * Observation model of one zero-difference residual (station a, satellite k, epoch t):
 *
 *   r = mᵀ z_a + ρ_a + σ_k + ε,     m = (m_w(e), m_g(e) cos A, m_g(e) sin A)
 *
 * z_a = (δw, G_N, G_E) of station a at t (interpolated from its nodes: z_a = B_aᵀ x; δw only when
 * no gradients are estimated), ρ_a the receiver clock, σ_k the satellite clock (sign absorbed),
 * ε ~ N(0, 1/w). Mapping functions as in ../design.ts.
 *
 * Elimination in two stages (e.g. Koch (1999), Parameter Estimation and Hypothesis Testing in
 * Linear Models, ch. 3, from memory; common practice in GNSS network processing):
 *  1. Receiver clocks. ρ_a touches only station a's observations: with D_a = Σ w, the weighted means
 *     m̄_a, r̄_a over them, c = m − m̄_a and ω_ak = w_ak / D_a, eliminating ρ_a leaves
 *       N_zz = Σ w c cᵀ (block diagonal),   N_zσ[a, k] = w_ak c_ak,   g_z = Σ w c (r − r̄_a),
 *       N_σσ = diag(Σ_a w_ak) − Σ_a D_a ω_a ω_aᵀ,   g_σ[k] = Σ_a w_ak (r_ak − r̄_a),
 *     the centred form of the single-station code (no digits lost to clock offsets of 300 km).
 *  2. Satellite clocks (K of them, dense K×K). All clocks of a connected group of stations (linked
 *     by common satellites) can shift together: N_σσ is singular, one defect per group. The datum:
 *     the clock of the group's first satellite (in order of first appearance in the input) is fixed
 *     (removed from the unknowns). The troposphere does not depend on this choice; the clocks do.
 *     With S = N_σσ (datum removed), K_σ = S⁻¹ N_σz and t = S⁻¹ g_σ:
 *       R = N_zz − N_zσ K_σ,   r_z = g_z − N_zσ t.
 *  Receiver clocks are eliminated first because they are diagonal and a regional network has more
 *  stations than satellites in view: the dense stage costs O(K²·dS + K·(dS)²) per epoch.
 *  A satellite seen by one station only cancels its observation entirely (no clock information):
 *  such observations are left out beforehand and counted.
 *
 * Residual variances for screening (Q_v = Q_ℓ − A Q Aᵀ of the full system, through both stages;
 * for a nuisance block c eliminated from [y; c], fᵀQf = e_cᵀ N_cc⁻¹ e_c + uᵀ Q_yy u with
 * u = f_y − (N_cc⁻¹ N_cy)ᵀ e_c):
 *   σ_v² = σ² − 1/D_a − (e_k − ω_a)ᵀ S⁻¹ (e_k − ω_a) − u₂ᵀ Q_zz u₂,
 *   u₂ = E_a c − β_k + γ_a,   β_k = K_σᵀ e_k (row k of K_σ),   γ_a = K_σᵀ ω_a,
 * Q_zz the covariance of z from the global selected inverse (network-solve.ts). Terms of a stage
 * that is absent (receiver clocks off, satellite clocks known) drop out.
 */

import type { NetworkDesign } from './network-design.js';

/** Per network epoch, the clocks eliminated; buffers sized for the largest epoch and reused. */
export class EpochClockSystem {
  /** Unknowns per station in z: 3 with gradients, 1 without. */
  readonly d: number;
  /** Stations with used observations at this epoch, local index a → station. */
  readonly present: Int32Array;
  presentCount = 0;
  readonly localOf: Int32Array;
  /** Local satellites: first entry and count of each (entries are sorted by satellite). */
  readonly satFirst: Int32Array;
  readonly satCount: Int32Array;
  satellites = 0;
  /** Datum (fixed) clock of each local satellite. */
  readonly satDatum: Uint8Array;
  datums = 0;
  /** Included entries (used, and with a satellite clock: seen by ≥ 2 stations). */
  readonly included: Uint8Array;
  /**
   * Per entry of the epoch (offset from its first entry): local station, local satellite, weight,
   * partials m and c = m − m̄_a, residual r − r̄_a.
   */
  readonly entryLocal: Int32Array;
  readonly entrySat: Int32Array;
  readonly entryWeight: Float64Array;
  readonly entryMapping: Float64Array;
  readonly entryCentred: Float64Array;
  readonly entryResidual: Float64Array;
  /** Per local station: D_a = Σ w, m̄_a (3), r̄_a (0 without receiver clocks). */
  readonly stationD: Float64Array;
  readonly stationMeanMapping: Float64Array;
  readonly stationMeanResidual: Float64Array;
  /** Entries of local station a: stationEntry[stationStart[a] .. stationStart[a+1]). */
  readonly stationStart: Int32Array;
  readonly stationEntry: Int32Array;
  /** N_σz = N_zσᵀ (K×dS', row k at k·dS'), S⁻¹ (K×K, zero rows/columns for datum clocks), K_σ = S⁻¹ N_σz (K×dS'), t = S⁻¹ g_σ. */
  readonly nzs: Float64Array;
  readonly sInv: Float64Array;
  readonly ks: Float64Array;
  readonly t: Float64Array;
  /** Reduced normal matrix R (dS'×dS', packed lower triangle: R_pq at p(p+1)/2 + q, q ≤ p) and right-hand side. */
  readonly r: Float64Array;
  readonly rz: Float64Array;
  /** Own-diagonal contribution Σ w m_f² per local station and family (singularity test, before any elimination). */
  readonly direct: Float64Array;
  private readonly sss: Float64Array;
  private readonly gs: Float64Array;
  private readonly work: Float64Array;
  private readonly parent: Int32Array;
  private readonly counter: Int32Array;
  private readonly maxSats: number;

  constructor(
    private readonly net: NetworkDesign,
    maxEntries: number,
  ) {
    const S = net.stations.length;
    const K = Math.max(1, Math.min(maxEntries, net.satellites.length));
    this.maxSats = K;
    this.d = net.gradients ? 3 : 1;
    this.present = new Int32Array(S);
    this.localOf = new Int32Array(S).fill(-1);
    this.satFirst = new Int32Array(K + 1);
    this.satCount = new Int32Array(K + 1);
    this.satDatum = new Uint8Array(K);
    this.included = new Uint8Array(maxEntries);
    this.entryLocal = new Int32Array(maxEntries);
    this.entrySat = new Int32Array(maxEntries);
    this.entryWeight = new Float64Array(maxEntries);
    this.entryMapping = new Float64Array(3 * maxEntries);
    this.entryCentred = new Float64Array(3 * maxEntries);
    this.entryResidual = new Float64Array(maxEntries);
    this.stationD = new Float64Array(S);
    this.stationMeanMapping = new Float64Array(3 * S);
    this.stationMeanResidual = new Float64Array(S);
    this.stationStart = new Int32Array(S + 1);
    this.stationEntry = new Int32Array(maxEntries);
    const dz = this.d * S;
    this.nzs = new Float64Array(dz * K);
    this.sInv = new Float64Array(K * K);
    this.ks = new Float64Array(K * dz);
    this.t = new Float64Array(K);
    this.r = new Float64Array((dz * (dz + 1)) / 2);
    this.rz = new Float64Array(dz);
    this.direct = new Float64Array(dz);
    this.sss = new Float64Array(K * K);
    this.gs = new Float64Array(K);
    this.work = new Float64Array(K * K);
    this.parent = new Int32Array(K);
    this.counter = new Int32Array(S);
  }

  /**
   * Forms and reduces the epoch's normal equations.
   * @param used per station, 1 for each design observation that takes part
   * @param reduce false when only the clock elimination is wanted (K_σ, t, S⁻¹ and the entry data,
   *        for residuals in the reverse sweep): R and r_z are then left unreduced, which saves the
   *        O(K·(dS)²) product, the largest cost of an epoch
   * @returns false when nothing of the epoch is left
   */
  build(epoch: number, used: readonly Uint8Array[], reduce = true): boolean {
    const net = this.net;
    const d = this.d;
    const rc = net.receiverClocks;
    const sc = net.satelliteClocks;
    const a0 = net.entryStart[epoch]!;
    const a1 = net.entryStart[epoch + 1]!;
    for (let a = 0; a < this.presentCount; a++) this.localOf[this.present[a]!] = -1;
    this.presentCount = 0;
    this.satellites = 0;
    // Satellites, included entries, present stations.
    for (let e = a0; e < a1;) {
      let f = e;
      let usedCount = 0;
      while (f < a1 && net.entrySatellite[f] === net.entrySatellite[e]) {
        if (used[net.entryStation[f]!]![net.entryObservation[f]!]) usedCount++;
        f++;
      }
      const keep = usedCount >= (sc ? 2 : 1);
      for (let x = e; x < f; x++) {
        const inc = keep && used[net.entryStation[x]!]![net.entryObservation[x]!] ? 1 : 0;
        this.included[x - a0] = inc;
        this.entrySat[x - a0] = this.satellites;
        if (inc && this.localOf[net.entryStation[x]!]! < 0) {
          this.localOf[net.entryStation[x]!] = this.presentCount;
          this.present[this.presentCount++] = net.entryStation[x]!;
        }
      }
      if (keep) {
        this.satFirst[this.satellites] = e;
        this.satCount[this.satellites] = f - e;
        this.satellites++;
      }
      e = f;
    }
    const Sp = this.presentCount;
    if (Sp === 0) return false;
    const K = sc ? this.satellites : 0;
    const dz = d * Sp;
    const eL = this.entryLocal;
    const eW = this.entryWeight;
    const eM = this.entryMapping;
    const eC = this.entryCentred;
    const eR = this.entryResidual;
    const D = this.stationD;
    const mbar = this.stationMeanMapping;
    const rbar = this.stationMeanResidual;
    const start = this.stationStart;
    D.fill(0, 0, Sp);
    mbar.fill(0, 0, 3 * Sp);
    rbar.fill(0, 0, Sp);
    start.fill(0, 0, Sp + 1);

    // Entry data; station sums.
    for (let e = a0; e < a1; e++) {
      const x = e - a0;
      if (!this.included[x]) continue;
      const s = net.entryStation[e]!;
      const i = net.entryObservation[e]!;
      const st = net.stations[s]!;
      const design = st.design;
      const w = 1 / design.observationVarianceM2[i]!;
      const a = this.localOf[s]!;
      eL[x] = a;
      eW[x] = w;
      eR[x] = st.reducedResidualM[i]!;
      eM[3 * x] = design.wetMapping[i]!;
      eM[3 * x + 1] = d === 3 ? design.northMapping[i]! : 0;
      eM[3 * x + 2] = d === 3 ? design.eastMapping[i]! : 0;
      start[a + 1]!++;
      D[a]! += w;
      if (rc) {
        mbar[3 * a]! += w * eM[3 * x]!;
        mbar[3 * a + 1]! += w * eM[3 * x + 1]!;
        mbar[3 * a + 2]! += w * eM[3 * x + 2]!;
        rbar[a]! += w * eR[x]!;
      }
    }
    for (let a = 0; a < Sp; a++) start[a + 1]! += start[a]!;
    const fill = this.counter;
    for (let a = 0; a < Sp; a++) fill[a] = start[a]!;
    for (let x = 0; x < a1 - a0; x++) if (this.included[x]) this.stationEntry[fill[eL[x]!]!++] = x;
    if (rc) {
      for (let a = 0; a < Sp; a++) {
        const inv = 1 / D[a]!;
        mbar[3 * a]! *= inv;
        mbar[3 * a + 1]! *= inv;
        mbar[3 * a + 2]! *= inv;
        rbar[a]! *= inv;
      }
    }

    // Stage 1: receiver clocks eliminated (centred sums).
    const R = this.r;
    const rz = this.rz;
    R.fill(0, 0, (dz * (dz + 1)) / 2);
    rz.fill(0, 0, dz);
    this.direct.fill(0, 0, dz);
    const nzs = this.nzs;
    const sss = this.sss;
    const gs = this.gs;
    if (sc) {
      nzs.fill(0, 0, dz * K);
      sss.fill(0, 0, K * K);
      gs.fill(0, 0, K);
    }
    for (let x = 0; x < a1 - a0; x++) {
      if (!this.included[x]) continue;
      const a = eL[x]!;
      const w = eW[x]!;
      const dr = eR[x]! - rbar[a]!;
      eR[x] = dr;
      for (let p = 0; p < 3; p++) eC[3 * x + p] = eM[3 * x + p]! - mbar[3 * a + p]!;
      const za = d * a;
      for (let p = 0; p < d; p++) {
        const cp = eC[3 * x + p]!;
        const row = ((za + p) * (za + p + 1)) / 2 + za;
        for (let q = 0; q <= p; q++) R[row + q]! += w * cp * eC[3 * x + q]!;
        rz[za + p]! += w * cp * dr;
        this.direct[za + p]! += w * eM[3 * x + p]! * eM[3 * x + p]!;
      }
      if (sc) {
        const k = this.entrySat[x]!;
        for (let p = 0; p < d; p++) nzs[k * dz + za + p]! += w * eC[3 * x + p]!;
        gs[k]! += w * dr;
        sss[k * K + k]! += w;
      }
    }
    if (!sc) {
      this.datums = 0;
      return true;
    }
    if (rc) {
      // N_σσ −= Σ_a w_ak w_ak' / D_a over pairs of the station's satellites.
      for (let a = 0; a < Sp; a++) {
        const inv = 1 / D[a]!;
        for (let u = start[a]!; u < start[a + 1]!; u++) {
          const x = this.stationEntry[u]!;
          const wx = eW[x]! * inv;
          const row = this.entrySat[x]! * K;
          for (let v = start[a]!; v < start[a + 1]!; v++) {
            const y = this.stationEntry[v]!;
            sss[row + this.entrySat[y]!]! -= wx * eW[y]!;
          }
        }
      }
    }

    // Stage 2: satellite clocks, one datum clock per connected group.
    this.findDatum(K);
    invertWithDatum(sss, K, this.satDatum, this.sInv, this.work);
    const sInv = this.sInv;
    const ks = this.ks;
    const t = this.t;
    // K_σ = S⁻¹ N_σz (K×dz), t = S⁻¹ g_σ.
    ks.fill(0, 0, K * dz);
    for (let k = 0; k < K; k++) {
      let tv = 0;
      const rowK = k * dz;
      for (let l = 0; l < K; l++) {
        const v = sInv[k * K + l]!;
        if (v === 0) continue;
        tv += v * gs[l]!;
        const rowL = l * dz;
        for (let q = 0; q < dz; q++) ks[rowK + q]! += v * nzs[rowL + q]!;
      }
      t[k] = tv;
    }
    if (!reduce) return true;
    // R −= N_zσ K_σ, r_z −= N_zσ t; R is symmetric and kept as its packed lower triangle.
    for (let p = 0; p < dz; p++) {
      let v = rz[p]!;
      for (let k = 0; k < K; k++) v -= nzs[k * dz + p]! * t[k]!;
      rz[p] = v;
    }
    reduceByClocks(R, nzs, ks, dz, K);
    return true;
  }

  /**
   * Datum of the satellite clocks: with receiver clocks estimated, every connected group of
   * satellites (linked through stations that see both) has one defect; its first satellite's clock
   * is fixed. Without receiver clocks there is no defect.
   */
  private findDatum(K: number): void {
    this.satDatum.fill(0, 0, K);
    this.datums = 0;
    if (!this.net.receiverClocks) return;
    const parent = this.parent;
    for (let k = 0; k < K; k++) parent[k] = k;
    const root = (k: number): number => {
      while (parent[k] !== k) {
        parent[k] = parent[parent[k]!]!;
        k = parent[k]!;
      }
      return k;
    };
    for (let a = 0; a < this.presentCount; a++) {
      const u0 = this.stationStart[a]!;
      const first = this.entrySat[this.stationEntry[u0]!]!;
      for (let u = u0 + 1; u < this.stationStart[a + 1]!; u++) {
        const ra = root(this.entrySat[this.stationEntry[u]!]!);
        const rb = root(first);
        if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
      }
    }
    for (let k = 0; k < K; k++) {
      if (root(k) === k) {
        this.satDatum[k] = 1;
        this.datums++;
      }
    }
  }

  /** Number of satellite clocks (0 without satellite clocks). */
  get satelliteClockCount(): number {
    return this.net.satelliteClocks ? this.satellites : 0;
  }

  get maxSatellites(): number {
    return this.maxSats;
  }
}

/**
 * S⁻¹ of the K×K satellite-clock block with the datum clocks removed (their rows and columns of
 * the result are zero): Cholesky of the remaining block and its inverse.
 */
function invertWithDatum(S: Float64Array, K: number, datum: Uint8Array, out: Float64Array, work: Float64Array): void {
  const idx: number[] = [];
  for (let k = 0; k < K; k++) if (!datum[k]) idx.push(k);
  const n = idx.length;
  out.fill(0, 0, K * K);
  if (n === 0) return;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let v = S[idx[i]! * K + idx[j]!]!;
      for (let q = 0; q < j; q++) v -= work[i * n + q]! * work[j * n + q]!;
      if (i === j) {
        if (!(v > 0)) throw new Error('satellite-clock block is not positive definite');
        work[i * n + i] = Math.sqrt(v);
      } else work[i * n + j] = v / work[j * n + j]!;
    }
  }
  const col = new Float64Array(n);
  for (let c = 0; c < n; c++) {
    col.fill(0);
    col[c] = 1;
    for (let i = 0; i < n; i++) {
      let v = col[i]!;
      for (let q = 0; q < i; q++) v -= work[i * n + q]! * col[q]!;
      col[i] = v / work[i * n + i]!;
    }
    for (let i = n - 1; i >= 0; i--) {
      let v = col[i]!;
      for (let q = i + 1; q < n; q++) v -= work[q * n + i]! * col[q]!;
      col[i] = v / work[i * n + i]!;
    }
    for (let i = 0; i < n; i++) out[idx[i]! * K + idx[c]!] = col[i]!;
  }
}

/**
 * R −= N_zσ K_σ on the packed lower triangle of R (dz×dz), N_σz and K_σ both K×dz by rows: four
 * satellites per pass over R, so each element of R is read and written once for four products (the
 * largest cost of forming an epoch: K·dz²/2 multiply-adds).
 */
function reduceByClocks(R: Float64Array, nsz: Float64Array, ks: Float64Array, dz: number, K: number): void {
  let k = 0;
  for (; k + 3 < K; k += 4) {
    const r0 = k * dz;
    const r1 = r0 + dz;
    const r2 = r1 + dz;
    const r3 = r2 + dz;
    for (let p = 0; p < dz; p++) {
      const c0 = nsz[r0 + p]!;
      const c1 = nsz[r1 + p]!;
      const c2 = nsz[r2 + p]!;
      const c3 = nsz[r3 + p]!;
      const rowR = (p * (p + 1)) / 2;
      for (let q = 0; q <= p; q++) R[rowR + q]! -= c0 * ks[r0 + q]! + c1 * ks[r1 + q]! + c2 * ks[r2 + q]! + c3 * ks[r3 + q]!;
    }
  }
  for (; k < K; k++) {
    const r0 = k * dz;
    for (let p = 0; p < dz; p++) {
      const c0 = nsz[r0 + p]!;
      if (c0 === 0) continue;
      const rowR = (p * (p + 1)) / 2;
      for (let q = 0; q <= p; q++) R[rowR + q]! -= c0 * ks[r0 + q]!;
    }
  }
}
