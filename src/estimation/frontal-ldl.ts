/**
 * LDLᵀ factorisation of a symmetric positive definite system that is assembled in time order, in
 * which every parameter is used during one stretch of time only (piecewise-linear nodes): a
 * parameter enters a small dense "front" when it is first needed and is eliminated (one column of
 * L and one pivot of D) as soon as nothing later uses it. This is a band (more exactly, variable
 * band) Cholesky factorisation in the order in which parameters leave the time window: the fill-in
 * stays inside the front, so each column of L has at most (front size − 1) entries and the cost is
 * linear in the number of parameters and epochs, however the node intervals of different
 * parameters relate. Frontal elimination: Irons (1970), Int. J. Numer. Meth. Eng. 2, 5–32 (from
 * memory); the same thing as the sequential pre-elimination of GNSS parameters (common practice).
 *
 * After factorisation:
 * - solve(): forward substitution is done during elimination; back substitution in reverse order;
 * - selectedInverse(): the elements of N⁻¹ on the pattern of L (every pair of parameters that were
 *   in the front together), by the recursion of Takahashi, Fagan & Chen (1973), "Formation of a
 *   sparse bus impedance matrix and its application to short circuit study", Proc. 8th PICA
 *   Conference, 63–69 (from memory; Erisman & Tinney (1975), Commun. ACM 18, 177–179):
 *     Z_pq = −Σ_{r∈S_p} L_rp Z_rq  (q ∈ S_p),   Z_pp = 1/d_p − Σ_{q∈S_p} L_qp Z_pq,
 *   S_p the parameters still in the front when p was eliminated. Because S_p was a clique of the
 *   front, every Z_rq needed is itself on the pattern: linear time as well.
 *
 * For a wide front (the network: every epoch couples the nodes of all stations through the
 * eliminated clocks, so the front holds 6 S parameters and is dense), reverseSweep() evaluates the
 * same recursion in reverse elimination order while a dense "reverse front" holds Z for exactly the
 * parameters that were in the forward front at that moment: every Z_rq the recursion needs is a
 * lookup in a dense array (O(F²) per parameter, F the front size instead of O(F³) by searching the
 * pattern), and at each point of the forward assembly (a stamp = number of parameters eliminated
 * then) the caller can read the full covariance block of the parameters that were in the front
 * (`onStamp`): that is where the network code reads the covariance of every station's nodes at an
 * epoch. One solver serves the single-station estimator (front ≤ 6) and the network (front 6 S):
 * neighbour lists of any length are stored one after the other (compressed columns).
 *
 * A pivot that is not positive or below PIVOT_TOLERANCE times the parameter's own accumulated
 * diagonal (before any elimination) means the parameter is not determined by the data and
 * constraints: SingularParameterError names it.
 */

/** Relative pivot below which a parameter counts as undetermined (1e-10: ten digits lost). */
export const PIVOT_TOLERANCE = 1e-10;

export class SingularParameterError extends Error {
  override readonly name = 'SingularParameterError';
  constructor(readonly parameter: number) {
    super(`parameter ${parameter} is not determined`);
  }
}

export interface ReverseSweepVisitor {
  /** Called once for every pair (p, q) on the factor's pattern, p ≠ q, with Z_pq = (N⁻¹)_pq. */
  onPair?(p: number, q: number, zpq: number): void;
  /**
   * Called for every stamp c = P..0 after the reverse front holds the parameters that were in the
   * forward front when `eliminatedCount` was c; `get(p, q)` reads (N⁻¹)_pq for two of them.
   */
  onStamp?(stamp: number, get: (p: number, q: number) => number, view: ReverseFrontView): void;
}

/**
 * Direct access to the reverse front for bulk reads in `onStamp`: (N⁻¹)_pq = z[slot[p]·ld + slot[q]]
 * for two parameters in the front (slot ≥ 0); the same numbers as `get`, without a call per element.
 */
export interface ReverseFrontView {
  readonly z: Float64Array;
  readonly ld: number;
  readonly slot: Int32Array;
}

export class FrontalLdl {
  private readonly slotOf: Int32Array;
  private readonly paramAt: Int32Array;
  /**
   * The dense front (maxFront × maxFront, by slot). The assembly adds to both halves, but only the
   * lower triangle (row ≥ column) is kept up to date by eliminate() and read: the upper half is stale.
   */
  private readonly front: Float64Array;
  private readonly rhsFront: Float64Array;
  /** Scratch: the occupied front slots during one elimination, and the pivot's column there. */
  private readonly activeSlots: Int32Array;
  private readonly columnScratch: Float64Array;
  private readonly directDiagonal: Float64Array;
  private readonly activation: Int32Array;
  private readonly position: Int32Array;
  private readonly order: Int32Array;
  private readonly pivot: Float64Array;
  private readonly forward: Float64Array;
  private readonly neighbourStart: Int32Array;
  private neighbour: Int32Array;
  private factor: Float64Array;
  private stored = 0;
  private eliminated = 0;
  /** Diagonal of N⁻¹ after reverseSweep(). */
  readonly inverseDiagonal: Float64Array;

  /**
   * @param parameters number of unknowns
   * @param maxFront largest number of parameters in the front at one time
   * @param factorCapacity entries of L to reserve at once (default: up to 1 M, grown by half when
   *        full); a caller that knows the size saves the copies of growing a large factor
   */
  constructor(
    readonly parameters: number,
    readonly maxFront: number,
    factorCapacity?: number,
  ) {
    this.slotOf = new Int32Array(parameters).fill(-1);
    this.paramAt = new Int32Array(maxFront).fill(-1);
    this.front = new Float64Array(maxFront * maxFront);
    this.rhsFront = new Float64Array(maxFront);
    this.activeSlots = new Int32Array(maxFront);
    this.columnScratch = new Float64Array(maxFront);
    this.directDiagonal = new Float64Array(parameters);
    this.activation = new Int32Array(parameters).fill(-1);
    this.position = new Int32Array(parameters).fill(-1);
    this.order = new Int32Array(parameters);
    this.pivot = new Float64Array(parameters);
    this.forward = new Float64Array(parameters);
    this.neighbourStart = new Int32Array(parameters + 1);
    const initial = Math.max(16, factorCapacity ?? Math.min(parameters * (maxFront - 1), 1 << 20));
    this.neighbour = new Int32Array(initial);
    this.factor = new Float64Array(initial);
    this.inverseDiagonal = new Float64Array(parameters);
  }

  /** Number of parameters eliminated so far (the stamp of the current assembly point). */
  get eliminatedCount(): number {
    return this.eliminated;
  }

  isActive(p: number): boolean {
    return this.slotOf[p]! >= 0;
  }

  slot(p: number): number {
    const s = this.slotOf[p]!;
    if (s < 0) throw new Error(`parameter ${p} is not in the front`);
    return s;
  }

  activate(p: number): void {
    if (this.activation[p]! >= 0) throw new Error(`parameter ${p} was activated before`);
    let s = 0;
    while (s < this.maxFront && this.paramAt[s]! >= 0) s++;
    if (s === this.maxFront) throw new Error('front is full');
    this.paramAt[s] = p;
    this.slotOf[p] = s;
    this.activation[p] = this.eliminated;
    const mf = this.maxFront;
    for (let t = 0; t < mf; t++) {
      this.front[s * mf + t] = 0;
      this.front[t * mf + s] = 0;
    }
    this.rhsFront[s] = 0;
  }

  /** Adds v to N_pq and N_qp (once to N_pp when p = q), by front slots. */
  addAtSlots(sp: number, sq: number, v: number): void {
    this.front[sp * this.maxFront + sq]! += v;
    if (sp !== sq) this.front[sq * this.maxFront + sp]! += v;
  }

  /**
   * Adds B R Bᵀ for `count` local parameters (lower triangle of the front): N[slot_i, slot_j] += c_i c_j R[row_i, row_j] and
   * g[slot_i] += c_i r[row_i] (R symmetric as its packed lower triangle, R_pq at p(p+1)/2 + q for
   * q ≤ p; rows non-decreasing in i; slots distinct).
   */
  addProjected(count: number, slots: Int32Array, c: Float64Array, rows: Int32Array, R: Float64Array, r: Float64Array): void {
    const mf = this.maxFront;
    const front = this.front;
    for (let i = 0; i < count; i++) {
      const si = slots[i]!;
      const ci = c[i]!;
      const rowR = (rows[i]! * (rows[i]! + 1)) / 2;
      this.rhsFront[si]! += ci * r[rows[i]!]!;
      const rowF = si * mf;
      // Into the lower triangle only (the half eliminate() reads).
      for (let j = 0; j < i; j++) {
        const sj = slots[j]!;
        const v = ci * c[j]! * R[rowR + rows[j]!]!;
        if (sj < si) front[rowF + sj]! += v;
        else front[sj * mf + si]! += v;
      }
      front[rowF + si]! += ci * ci * R[rowR + rows[i]!]!;
    }
  }

  addRhsAtSlot(sp: number, v: number): void {
    this.rhsFront[sp]! += v;
  }

  /** The parameter's own diagonal contribution before any elimination (for the singularity test). */
  addDirectDiagonal(p: number, v: number): void {
    this.directDiagonal[p]! += v;
  }

  /** Pseudo-observation x_p − x_q = 0 ± σ with weight w = 1/σ². */
  addDifferenceConstraint(p: number, q: number, weight: number): void {
    const sp = this.slot(p);
    const sq = this.slot(q);
    const mf = this.maxFront;
    this.front[sp * mf + sp]! += weight;
    this.front[sq * mf + sq]! += weight;
    this.front[sp * mf + sq]! -= weight;
    this.front[sq * mf + sp]! -= weight;
    this.directDiagonal[p]! += weight;
    this.directDiagonal[q]! += weight;
  }

  /** Pseudo-observation x_p = 0 ± σ with weight w = 1/σ². */
  addValueConstraint(p: number, weight: number): void {
    const sp = this.slot(p);
    this.front[sp * this.maxFront + sp]! += weight;
    this.directDiagonal[p]! += weight;
  }

  private reserve(extra: number): void {
    if (this.stored + extra <= this.neighbour.length) return;
    const size = Math.max(this.stored + extra, Math.ceil(this.neighbour.length * 1.5));
    const n = new Int32Array(size);
    n.set(this.neighbour.subarray(0, this.stored));
    const f = new Float64Array(size);
    f.set(this.factor.subarray(0, this.stored));
    this.neighbour = n;
    this.factor = f;
  }

  /** Eliminates p: one pivot, one column of L, Schur complement into the rest of the front. */
  eliminate(p: number): void {
    const s = this.slot(p);
    const mf = this.maxFront;
    const front = this.front;
    const paramAt = this.paramAt;
    const rhs = this.rhsFront;
    const d = front[s * mf + s]!;
    if (!(d > PIVOT_TOLERANCE * this.directDiagonal[p]!) || !(d > 0)) throw new SingularParameterError(p);
    this.reserve(mf);
    const neighbour = this.neighbour;
    const factor = this.factor;
    const base = this.stored;
    let count = 0;
    const gs = rhs[s]!;
    const rowS = s * mf;
    // The occupied slots other than s, once, in increasing slot order, with column s of the front
    // (N_ts, read from the lower triangle: slot t > s in row t, t < s in row s).
    const active = this.activeSlots;
    const column = this.columnScratch;
    let n = 0;
    for (let t = 0; t < mf; t++) {
      if (t === s || paramAt[t]! < 0) continue;
      column[n] = t > s ? front[t * mf + s]! : front[rowS + t]!;
      active[n++] = t;
    }
    // Schur complement N_tu −= N_ts N_su / d on the lower triangle only (u ≤ t): half the work of
    // the full square, the larger cost of a wide front.
    for (let i = 0; i < n; i++) {
      const t = active[i]!;
      const l = column[i]! / d;
      neighbour[base + count] = paramAt[t]!;
      factor[base + count] = l;
      count++;
      if (l !== 0) {
        const rowT = t * mf;
        for (let j = 0; j <= i; j++) front[rowT + active[j]!]! -= l * column[j]!;
        rhs[t]! -= l * gs;
      }
    }
    this.stored += count;
    this.neighbourStart[this.eliminated] = base;
    this.neighbourStart[this.eliminated + 1] = base + count;
    this.pivot[p] = d;
    this.forward[p] = gs;
    this.position[p] = this.eliminated;
    this.order[this.eliminated++] = p;
    paramAt[s] = -1;
    this.slotOf[p] = -1;
  }

  eliminateAll(): void {
    for (let s = 0; s < this.maxFront; s++) {
      const p = this.paramAt[s]!;
      if (p >= 0) this.eliminate(p);
    }
    if (this.eliminated !== this.parameters) throw new Error(`${this.parameters - this.eliminated} parameters were never eliminated`);
  }

  /** Solution of N x = g (after eliminateAll). */
  solve(): Float64Array {
    const x = new Float64Array(this.parameters);
    for (let k = this.parameters - 1; k >= 0; k--) {
      const p = this.order[k]!;
      let v = this.forward[p]! / this.pivot[p]!;
      for (let c = this.neighbourStart[k]!; c < this.neighbourStart[k + 1]!; c++) v -= this.factor[c]! * x[this.neighbour[c]!]!;
      x[p] = v;
    }
    return x;
  }

  /**
   * Elements of N⁻¹ on the pattern of L (Takahashi recursion, see module comment), kept for reading
   * with SelectedInverse.get. Evaluated by the reverse sweep: every Z_rq of the recursion is a lookup in
   * the dense reverse front instead of a search of the pattern (the same products in the same order,
   * so the same numbers).
   */
  selectedInverse(): SelectedInverse {
    const offDiagonal = new Float64Array(this.stored);
    this.sweep({}, offDiagonal);
    return new SelectedInverse(this.position, this.neighbourStart, this.neighbour, this.inverseDiagonal, offDiagonal);
  }

  /** Selected inverse by the reverse sweep (module comment); fills inverseDiagonal. */
  reverseSweep(visitor: ReverseSweepVisitor = {}): void {
    this.sweep(visitor, null);
  }

  /** The reverse sweep; `offDiagonal` (when given) receives Z_pq at the index of L_qp (the pattern's order). */
  private sweep(visitor: ReverseSweepVisitor, offDiagonal: Float64Array | null): void {
    const P = this.parameters;
    const mf = this.maxFront;
    const z = new Float64Array(mf * mf);
    const rslot = new Int32Array(P).fill(-1);
    const rparam = new Int32Array(mf).fill(-1);
    // Parameters by activation stamp, to leave the reverse front when the sweep passes it.
    const byActivation = new Int32Array(P + 2);
    for (let p = 0; p < P; p++) byActivation[this.activation[p]! + 1]!++;
    for (let c = 1; c < P + 2; c++) byActivation[c]! += byActivation[c - 1]!;
    const activatedAt = new Int32Array(P);
    const fill = byActivation.slice();
    for (let p = 0; p < P; p++) activatedAt[fill[this.activation[p]!]!++] = p;
    const get = (p: number, q: number): number => {
      const a = rslot[p]!;
      const b = rslot[q]!;
      if (a < 0 || b < 0) throw new Error(`element (${p}, ${q}) of the inverse is not in the reverse front`);
      return z[a * mf + b]!;
    };
    const view: ReverseFrontView = { z, ld: mf, slot: rslot };
    const zrow = new Float64Array(mf);
    const nslots = new Int32Array(mf);
    const lcol = new Float64Array(mf);
    for (let c = P; c >= 0; c--) {
      if (c + 1 <= P) {
        for (let i = byActivation[c + 1]!; i < byActivation[c + 2]!; i++) {
          const q = activatedAt[i]!;
          const s = rslot[q]!;
          if (s >= 0) {
            rslot[q] = -1;
            rparam[s] = -1;
          }
        }
      }
      if (c < P) {
        const p = this.order[c]!;
        const start = this.neighbourStart[c]!;
        const count = this.neighbourStart[c + 1]! - start;
        const neighbour = this.neighbour;
        const factor = this.factor;
        for (let a = 0; a < count; a++) {
          nslots[a] = rslot[neighbour[start + a]!]!;
          lcol[a] = factor[start + a]!;
        }
        let zpp = 1 / this.pivot[p]!;
        // zrow = −Z l over the neighbours, four rows per pass (each l_b and slot loaded once for four).
        let a = 0;
        for (; a + 3 < count; a += 4) {
          const r0 = nslots[a]! * mf;
          const r1 = nslots[a + 1]! * mf;
          const r2 = nslots[a + 2]! * mf;
          const r3 = nslots[a + 3]! * mf;
          let v0 = 0;
          let v1 = 0;
          let v2 = 0;
          let v3 = 0;
          for (let b = 0; b < count; b++) {
            const l = lcol[b]!;
            const t = nslots[b]!;
            v0 -= l * z[r0 + t]!;
            v1 -= l * z[r1 + t]!;
            v2 -= l * z[r2 + t]!;
            v3 -= l * z[r3 + t]!;
          }
          zrow[a] = v0;
          zrow[a + 1] = v1;
          zrow[a + 2] = v2;
          zrow[a + 3] = v3;
        }
        for (; a < count; a++) {
          const row = nslots[a]! * mf;
          let v = 0;
          for (let b = 0; b < count; b++) v -= lcol[b]! * z[row + nslots[b]!]!;
          zrow[a] = v;
        }
        for (let b = 0; b < count; b++) zpp -= lcol[b]! * zrow[b]!;
        let s = 0;
        while (rparam[s]! >= 0) s++;
        rparam[s] = p;
        rslot[p] = s;
        z[s * mf + s] = zpp;
        this.inverseDiagonal[p] = zpp;
        for (let a = 0; a < count; a++) {
          const t = nslots[a]!;
          z[s * mf + t] = zrow[a]!;
          z[t * mf + s] = zrow[a]!;
          if (offDiagonal) offDiagonal[start + a] = zrow[a]!;
          visitor.onPair?.(p, this.neighbour[start + a]!, zrow[a]!);
        }
      }
      visitor.onStamp?.(c, get, view);
    }
  }
}

/** N⁻¹ on the pattern of the factor: covariances of parameters that shared the front. */
export class SelectedInverse {
  constructor(
    private readonly position: Int32Array,
    private readonly neighbourStart: Int32Array,
    private readonly neighbour: Int32Array,
    readonly diagonal: Float64Array,
    private readonly offDiagonal: Float64Array,
  ) {}

  /** (N⁻¹)_pq; throws when p and q never shared the front (the element is not computed). */
  get(p: number, q: number): number {
    if (p === q) return this.diagonal[p]!;
    // The one eliminated first holds the element (no array destructuring: this is a hot path).
    const pFirst = this.position[p]! < this.position[q]!;
    const k = pFirst ? this.position[p]! : this.position[q]!;
    const second = pFirst ? q : p;
    for (let c = this.neighbourStart[k]!; c < this.neighbourStart[k + 1]!; c++) {
      if (this.neighbour[c] === second) return this.offDiagonal[c]!;
    }
    throw new Error(`element (${p}, ${q}) of the inverse is outside the computed pattern`);
  }
}
