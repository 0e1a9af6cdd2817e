/**
 * One network epoch: its normal equations in the epoch's troposphere unknowns z and its clocks, and
 * the clocks eliminated (Schur complement), so that only z reaches the global system.
 *
 * Observation model of one zero-difference residual (station a, satellite k, epoch t):
 *
 *   r = mᵀ z_a + ρ_a + σ_k + ε,     m = (m_w(e), m_g(e) cos A, m_g(e) sin A)
 *
 * z_a = (δw, G_N, G_E) of station a at t (interpolated from its nodes: z_a = B_aᵀ x), ρ_a the
 * receiver clock, σ_k the satellite clock (sign absorbed), ε ~ N(0, 1/w). Mapping functions as in
 * ../design.ts.
 *
 * Elimination, in two stages, for unknowns w = [z; ρ] and σ:
 *  1. Each satellite clock touches only the observations of that satellite: with D_k = Σ w_i,
 *     G_k = Σ w_i r_i and h_k = Σ w_i f_i (f_i the partials of observation i in w), eliminating σ_k
 *     is the rank-one downdate  N_ww −= h_k h_kᵀ / D_k,  g_w −= h_k G_k / D_k.
 *     A satellite seen by one station only cancels its observation entirely (no clock information);
 *     such observations are left out beforehand and counted.
 *  2. The receiver clocks: S = N_ρρ (after stage 1). With satellite clocks estimated, all clocks
 *     of a connected group of stations (linked by common satellites) can shift together: S is
 *     singular, one defect per group. The datum: the clock of the first station of each group (in
 *     station order) is fixed to zero (removed from the unknowns). The troposphere estimates do not
 *     depend on this choice (only the clocks do). With K = S⁻¹ N_ρz:
 *       R = N_zz − N_zρ K,   g_z' = g_z − N_zρ S⁻¹ g_ρ.
 *
 * Residual variances for screening (Q_v = Q_ℓ − A Q Aᵀ of the full system, evaluated through the two
 * stages; for a nuisance block c eliminated from [y; c], fᵀQf = e_cᵀ N_cc⁻¹ e_c + uᵀ Q_yy u with
 * u = f_y − (N_cc⁻¹ N_cy)ᵀ e_c):
 *   σ_v² = σ² − 1/D_k − u₁ρᵀ S⁻¹ u₁ρ − u₂ᵀ Q_zz u₂,
 *   u₁ = f − h_k/D_k,   u₂ = u₁z − Kᵀ u₁ρ = E_a m − β_a − γ_k,
 * β_a = Kᵀe_a (row a of K), γ_k = h̃_kz − Kᵀ h̃_kρ (h̃ = h/D), Q_zz the covariance of z from the
 * global selected inverse. Terms without a satellite clock (satellite clocks known) drop out.
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
  readonly satD: Float64Array;
  readonly satG: Float64Array;
  satellites = 0;
  /** Included entries (used, and with a satellite clock: seen by ≥ 2 stations). */
  readonly included: Uint8Array;
  /** Datum (fixed) receiver clock of each local station. */
  readonly datum: Uint8Array;
  datums = 0;
  /** Dense matrices over w = [z (d·S'); ρ (S')] (row-major, leading dimension ld). */
  readonly n: Float64Array;
  readonly g: Float64Array;
  /** S⁻¹ (S'×S', zero rows/columns for datum clocks), K = S⁻¹ N_ρz (S'×dS'), t = S⁻¹ g_ρ. */
  readonly sInv: Float64Array;
  readonly k: Float64Array;
  readonly t: Float64Array;
  /** Reduced normal matrix R (dS'×dS') and right-hand side. */
  readonly r: Float64Array;
  readonly rz: Float64Array;
  /** Own-diagonal contribution Σ w m_f² per local station and family (singularity test). */
  readonly direct: Float64Array;
  private readonly ld: number;
  private readonly work: Float64Array;
  private readonly parent: Int32Array;

  constructor(
    private readonly net: NetworkDesign,
    maxEntries: number,
  ) {
    const S = net.stations.length;
    this.d = net.gradients ? 3 : 1;
    this.present = new Int32Array(S);
    this.localOf = new Int32Array(S).fill(-1);
    this.satFirst = new Int32Array(maxEntries + 1);
    this.satCount = new Int32Array(maxEntries + 1);
    this.satD = new Float64Array(maxEntries + 1);
    this.satG = new Float64Array(maxEntries + 1);
    this.included = new Uint8Array(maxEntries);
    this.datum = new Uint8Array(S);
    this.ld = (this.d + 1) * S;
    this.n = new Float64Array(this.ld * this.ld);
    this.g = new Float64Array(this.ld);
    this.sInv = new Float64Array(S * S);
    this.k = new Float64Array(S * this.d * S);
    this.t = new Float64Array(S);
    this.r = new Float64Array(this.d * S * this.d * S);
    this.rz = new Float64Array(this.d * S);
    this.direct = new Float64Array(this.d * S);
    this.work = new Float64Array(S * S);
    this.parent = new Int32Array(S);
  }

  /** Partials m of design observation i of station s, into out[0..d). */
  mapping(s: number, i: number, out: Float64Array): void {
    const design = this.net.stations[s]!.design;
    out[0] = design.wetMapping[i]!;
    if (this.d === 3) {
      out[1] = design.northMapping[i]!;
      out[2] = design.eastMapping[i]!;
    }
  }

  /**
   * Forms and reduces the epoch's normal equations.
   * @param used per station, 1 for each design observation that takes part
   * @returns false when nothing of the epoch is left
   */
  build(epoch: number, used: readonly Uint8Array[]): boolean {
    const net = this.net;
    const d = this.d;
    const a0 = net.entryStart[epoch]!;
    const a1 = net.entryStart[epoch + 1]!;
    for (let a = 0; a < this.presentCount; a++) this.localOf[this.present[a]!] = -1;
    this.presentCount = 0;
    this.satellites = 0;
    // Satellites and included entries.
    for (let e = a0; e < a1; ) {
      let f = e;
      let usedCount = 0;
      while (f < a1 && net.entrySatellite[f] === net.entrySatellite[e]) {
        if (used[net.entryStation[f]!]![net.entryObservation[f]!]) usedCount++;
        f++;
      }
      const keep = usedCount >= (net.satelliteClocks ? 2 : 1);
      for (let x = e; x < f; x++) {
        const inc = keep && used[net.entryStation[x]!]![net.entryObservation[x]!] ? 1 : 0;
        this.included[x - a0] = inc;
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
    const dz = d * Sp;
    const nw = net.receiverClocks ? dz + Sp : dz;
    const ld = this.ld;
    const N = this.n;
    const g = this.g;
    for (let i = 0; i < nw; i++) {
      g[i] = 0;
      N.fill(0, i * ld, i * ld + nw);
    }
    this.direct.fill(0, 0, dz);
    const m = new Float64Array(3);
    const h = new Float64Array(4);

    for (let e = a0; e < a1; e++) {
      if (!this.included[e - a0]) continue;
      const s = net.entryStation[e]!;
      const i = net.entryObservation[e]!;
      const st = net.stations[s]!;
      const w = st.design.weight[i]!;
      const r = st.reducedResidualM[i]!;
      const a = this.localOf[s]!;
      this.mapping(s, i, m);
      const za = d * a;
      for (let p = 0; p < d; p++) {
        const wp = w * m[p]!;
        for (let q = 0; q < d; q++) N[(za + p) * ld + za + q]! += wp * m[q]!;
        g[za + p]! += wp * r;
        this.direct[za + p]! += wp * m[p]!;
        if (net.receiverClocks) {
          N[(za + p) * ld + dz + a]! += wp;
          N[(dz + a) * ld + za + p]! += wp;
        }
      }
      if (net.receiverClocks) {
        N[(dz + a) * ld + dz + a]! += w;
        g[dz + a]! += w * r;
      }
    }

    // Stage 1: satellite clocks (rank-one downdates over the satellite's observations).
    if (net.satelliteClocks) {
      for (let k = 0; k < this.satellites; k++) {
        const e0 = this.satFirst[k]!;
        const e1 = e0 + this.satCount[k]!;
        let D = 0;
        let G = 0;
        for (let e = e0; e < e1; e++) {
          if (!this.included[e - a0]) continue;
          const st = net.stations[net.entryStation[e]!]!;
          const i = net.entryObservation[e]!;
          D += st.design.weight[i]!;
          G += st.design.weight[i]! * st.reducedResidualM[i]!;
        }
        this.satD[k] = D;
        this.satG[k] = G;
        for (let e = e0; e < e1; e++) {
          if (!this.included[e - a0]) continue;
          const s = net.entryStation[e]!;
          const i = net.entryObservation[e]!;
          const w = net.stations[s]!.design.weight[i]!;
          this.mapping(s, i, m);
          for (let p = 0; p < d; p++) h[p] = w * m[p]!;
          h[d] = w;
          const a = this.localOf[s]!;
          // Rows of observation e against every observation of the satellite.
          for (let f = e0; f < e1; f++) {
            if (!this.included[f - a0]) continue;
            const s2 = net.entryStation[f]!;
            const i2 = net.entryObservation[f]!;
            const w2 = net.stations[s2]!.design.weight[i2]! / D;
            this.mapping(s2, i2, m);
            const b = this.localOf[s2]!;
            for (let p = 0; p <= d; p++) {
              if (p === d && !net.receiverClocks) continue;
              const row = (p < d ? d * a + p : dz + a) * ld;
              const hp = h[p]!;
              for (let q = 0; q < d; q++) N[row + d * b + q]! -= hp * w2 * m[q]!;
              if (net.receiverClocks) N[row + dz + b]! -= hp * w2;
            }
          }
          for (let p = 0; p <= d; p++) {
            if (p === d && !net.receiverClocks) continue;
            g[p < d ? d * a + p : dz + a]! -= (h[p]! * G) / D;
          }
        }
      }
    }

    // Stage 2: receiver clocks, one datum clock per connected group of stations.
    const rd = this.r;
    const rz = this.rz;
    if (!net.receiverClocks) {
      for (let p = 0; p < dz; p++) {
        rz[p] = g[p]!;
        for (let q = 0; q < dz; q++) rd[p * dz + q] = N[p * ld + q]!;
      }
      this.datums = 0;
      return true;
    }
    this.findDatum(a0, a1);
    const sInv = this.sInv;
    invertWithDatum(N, ld, dz, Sp, this.datum, sInv, this.work);
    // K = S⁻¹ N_ρz, t = S⁻¹ g_ρ.
    const K = this.k;
    for (let a = 0; a < Sp; a++) {
      let tv = 0;
      for (let q = 0; q < dz; q++) K[a * dz + q] = 0;
      for (let b = 0; b < Sp; b++) {
        const v = sInv[a * Sp + b]!;
        if (v === 0) continue;
        const row = (dz + b) * ld;
        for (let q = 0; q < dz; q++) K[a * dz + q]! += v * N[row + q]!;
        tv += v * g[dz + b]!;
      }
      this.t[a] = tv;
    }
    // R = N_zz − N_zρ K, g_z' = g_z − N_zρ t.
    for (let p = 0; p < dz; p++) {
      let v = g[p]!;
      for (let a = 0; a < Sp; a++) v -= N[p * ld + dz + a]! * this.t[a]!;
      rz[p] = v;
      for (let q = 0; q < dz; q++) {
        let x = N[p * ld + q]!;
        for (let a = 0; a < Sp; a++) x -= N[p * ld + dz + a]! * K[a * dz + q]!;
        rd[p * dz + q] = x;
      }
    }
    return true;
  }

  /** Union–find over stations linked by a common satellite; the first station of each group is the datum. */
  private findDatum(a0: number, a1: number): void {
    const net = this.net;
    const Sp = this.presentCount;
    const parent = this.parent;
    for (let a = 0; a < Sp; a++) parent[a] = a;
    const root = (a: number): number => {
      while (parent[a] !== a) {
        parent[a] = parent[parent[a]!]!;
        a = parent[a]!;
      }
      return a;
    };
    this.datum.fill(0, 0, Sp);
    this.datums = 0;
    if (!net.satelliteClocks) return;
    for (let k = 0; k < this.satellites; k++) {
      let firstLocal = -1;
      for (let e = this.satFirst[k]!; e < this.satFirst[k]! + this.satCount[k]!; e++) {
        if (!this.included[e - a0]) continue;
        const a = this.localOf[net.entryStation[e]!]!;
        if (firstLocal < 0) firstLocal = a;
        else {
          const ra = root(a);
          const rb = root(firstLocal);
          if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
        }
      }
    }
    void a1;
    // The datum station of a group: the one with the smallest station index.
    const best = new Int32Array(Sp).fill(-1);
    for (let a = 0; a < Sp; a++) {
      const r = root(a);
      if (best[r]! < 0 || this.present[a]! < this.present[best[r]!]!) best[r] = a;
    }
    for (let a = 0; a < Sp; a++) {
      if (best[a]! >= 0) {
        this.datum[best[a]!] = 1;
        this.datums++;
      }
    }
  }
}

/**
 * S⁻¹ of the receiver-clock block N[dz.., dz..] (S'×S') with the datum clocks removed (their rows
 * and columns of the result are zero): Cholesky of the remaining block and its inverse.
 */
function invertWithDatum(N: Float64Array, ld: number, dz: number, Sp: number, datum: Uint8Array, out: Float64Array, work: Float64Array): void {
  const idx: number[] = [];
  for (let a = 0; a < Sp; a++) if (!datum[a]) idx.push(a);
  const n = idx.length;
  out.fill(0, 0, Sp * Sp);
  if (n === 0) return;
  // Cholesky L (lower) in work (n×n).
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let v = N[(dz + idx[i]!) * ld + dz + idx[j]!]!;
      for (let q = 0; q < j; q++) v -= work[i * n + q]! * work[j * n + q]!;
      if (i === j) {
        if (!(v > 0)) throw new Error('receiver-clock block is not positive definite');
        work[i * n + i] = Math.sqrt(v);
      } else work[i * n + j] = v / work[j * n + j]!;
    }
  }
  // Inverse: solve L Lᵀ X = I column by column.
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
    for (let i = 0; i < n; i++) out[idx[i]! * Sp + idx[c]!] = col[i]!;
  }
}
