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

export class FrontalLdl {
  private readonly slotOf: Int32Array;
  private readonly paramAt: Int32Array;
  private readonly front: Float64Array;
  private readonly rhsFront: Float64Array;
  private readonly directDiagonal: Float64Array;
  private readonly width: number;
  private readonly position: Int32Array;
  private readonly order: Int32Array;
  private eliminated = 0;
  private readonly pivot: Float64Array;
  private readonly forward: Float64Array;
  private readonly neighbourCount: Uint8Array;
  private readonly neighbour: Int32Array;
  private readonly factor: Float64Array;

  /**
   * @param parameters number of unknowns
   * @param maxFront largest number of parameters in the front at one time
   */
  constructor(
    readonly parameters: number,
    readonly maxFront: number,
  ) {
    this.width = maxFront - 1;
    this.slotOf = new Int32Array(parameters).fill(-1);
    this.paramAt = new Int32Array(maxFront).fill(-1);
    this.front = new Float64Array(maxFront * maxFront);
    this.rhsFront = new Float64Array(maxFront);
    this.directDiagonal = new Float64Array(parameters);
    this.position = new Int32Array(parameters).fill(-1);
    this.order = new Int32Array(parameters);
    this.pivot = new Float64Array(parameters);
    this.forward = new Float64Array(parameters);
    this.neighbourCount = new Uint8Array(parameters);
    this.neighbour = new Int32Array(parameters * this.width);
    this.factor = new Float64Array(parameters * this.width);
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
    if (this.slotOf[p]! >= 0 || this.position[p]! >= 0) throw new Error(`parameter ${p} was activated before`);
    let s = 0;
    while (s < this.maxFront && this.paramAt[s]! >= 0) s++;
    if (s === this.maxFront) throw new Error('front is full');
    this.paramAt[s] = p;
    this.slotOf[p] = s;
    const row = s * this.maxFront;
    for (let t = 0; t < this.maxFront; t++) {
      this.front[row + t] = 0;
      this.front[t * this.maxFront + s] = 0;
    }
    this.rhsFront[s] = 0;
  }

  /** Adds v to N_pq and N_qp (once to N_pp when p = q), by front slots. */
  addAtSlots(sp: number, sq: number, v: number): void {
    this.front[sp * this.maxFront + sq]! += v;
    if (sp !== sq) this.front[sq * this.maxFront + sp]! += v;
  }

  addRhsAtSlot(sp: number, v: number): void {
    this.rhsFront[sp]! += v;
  }

  /** Records the parameter's own diagonal contribution (for the singularity test). */
  addDirectDiagonal(p: number, v: number): void {
    this.directDiagonal[p]! += v;
  }

  /** Adds a pseudo-observation x_p − x_q = 0 ± σ (weight w = 1/σ²): N += w [1 −1; −1 1]. */
  addDifferenceConstraint(p: number, q: number, weight: number): void {
    const sp = this.slot(p);
    const sq = this.slot(q);
    this.front[sp * this.maxFront + sp]! += weight;
    this.front[sq * this.maxFront + sq]! += weight;
    this.front[sp * this.maxFront + sq]! -= weight;
    this.front[sq * this.maxFront + sp]! -= weight;
    this.directDiagonal[p]! += weight;
    this.directDiagonal[q]! += weight;
  }

  /** Adds a pseudo-observation x_p = 0 ± σ (weight w = 1/σ²). */
  addValueConstraint(p: number, weight: number): void {
    const sp = this.slot(p);
    this.front[sp * this.maxFront + sp]! += weight;
    this.directDiagonal[p]! += weight;
  }

  /** Eliminates p from the front: one pivot and one column of L. */
  eliminate(p: number): void {
    const s = this.slot(p);
    const mf = this.maxFront;
    const d = this.front[s * mf + s]!;
    if (!(d > PIVOT_TOLERANCE * this.directDiagonal[p]!) || !(d > 0)) throw new SingularParameterError(p);
    const base = p * this.width;
    let count = 0;
    const gs = this.rhsFront[s]!;
    for (let t = 0; t < mf; t++) {
      const q = this.paramAt[t]!;
      if (t === s || q < 0) continue;
      const l = this.front[t * mf + s]! / d;
      this.neighbour[base + count] = q;
      this.factor[base + count] = l;
      count++;
      // Schur complement: N_tu −= l_t N_su for every other active u (symmetric).
      for (let u = 0; u < mf; u++) {
        if (u === s || this.paramAt[u]! < 0) continue;
        this.front[t * mf + u]! -= l * this.front[s * mf + u]!;
      }
      this.rhsFront[t]! -= l * gs;
    }
    this.neighbourCount[p] = count;
    this.pivot[p] = d;
    this.forward[p] = gs;
    this.position[p] = this.eliminated;
    this.order[this.eliminated++] = p;
    this.paramAt[s] = -1;
    this.slotOf[p] = -1;
  }

  /** Eliminates whatever is left in the front (in slot order). */
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
      const base = p * this.width;
      let v = this.forward[p]! / this.pivot[p]!;
      for (let c = 0; c < this.neighbourCount[p]!; c++) v -= this.factor[base + c]! * x[this.neighbour[base + c]!]!;
      x[p] = v;
    }
    return x;
  }

  /** Elements of N⁻¹ on the pattern of L (Takahashi recursion, see module comment). */
  selectedInverse(): SelectedInverse {
    const diagonal = new Float64Array(this.parameters);
    const offDiagonal = new Float64Array(this.parameters * this.width);
    const inverse = new SelectedInverse(this.position, this.neighbourCount, this.neighbour, diagonal, offDiagonal, this.width);
    const z = new Float64Array(this.width);
    for (let k = this.parameters - 1; k >= 0; k--) {
      const p = this.order[k]!;
      const base = p * this.width;
      const count = this.neighbourCount[p]!;
      for (let a = 0; a < count; a++) {
        const q = this.neighbour[base + a]!;
        let v = 0;
        for (let b = 0; b < count; b++) v -= this.factor[base + b]! * inverse.get(this.neighbour[base + b]!, q);
        z[a] = v;
      }
      let zpp = 1 / this.pivot[p]!;
      for (let a = 0; a < count; a++) {
        offDiagonal[base + a] = z[a]!;
        zpp -= this.factor[base + a]! * z[a]!;
      }
      diagonal[p] = zpp;
    }
    return inverse;
  }
}

/** N⁻¹ on the pattern of the factor: covariances of parameters that shared the front. */
export class SelectedInverse {
  constructor(
    private readonly position: Int32Array,
    private readonly neighbourCount: Uint8Array,
    private readonly neighbour: Int32Array,
    readonly diagonal: Float64Array,
    private readonly offDiagonal: Float64Array,
    private readonly width: number,
  ) {}

  /** (N⁻¹)_pq; throws when p and q never shared the front (the element is not computed). */
  get(p: number, q: number): number {
    if (p === q) return this.diagonal[p]!;
    // The one eliminated first holds the element (no array destructuring: this is a hot path).
    const pFirst = this.position[p]! < this.position[q]!;
    const first = pFirst ? p : q;
    const second = pFirst ? q : p;
    const base = first * this.width;
    for (let c = 0; c < this.neighbourCount[first]!; c++) {
      if (this.neighbour[base + c] === second) return this.offDiagonal[base + c]!;
    }
    throw new Error(`element (${p}, ${q}) of the inverse is outside the computed pattern`);
  }
}
