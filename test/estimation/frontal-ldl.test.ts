import { Matrix, inverse, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { FrontalLdl, SingularParameterError } from '../../src/estimation/frontal-ldl.js';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';

/**
 * A system assembled in time order like the estimator's: two interleaved chains of parameters
 * (a fast one, like ZWD nodes, and a slow one, like gradient nodes) with random positive
 * definite blocks added while they share the front. Reference: ml-matrix's dense solve and
 * inverse of the same matrix (independent computation).
 */
function randomChainSystem(seed: number, fastCount: number, slowEvery: number) {
  const rand = mulberry32(seed);
  const slowCount = Math.ceil((fastCount - 1) / slowEvery) + 1;
  const n = fastCount + slowCount;
  const dense = Matrix.zeros(n, n);
  const rhs = Matrix.zeros(n, 1);
  const ldl = new FrontalLdl(n, 4);
  const slow = (l: number) => fastCount + l;
  const addBlock = (ids: number[]) => {
    // A random rank-2 positive semidefinite block plus a small ridge: like a few observations.
    const u = ids.map(() => rand() - 0.5);
    const v = ids.map(() => rand() - 0.5);
    const g = ids.map(() => rand() - 0.5);
    ids.forEach((p, a) => {
      ldl.addDirectDiagonal(p, u[a]! * u[a]! + v[a]! * v[a]! + 0.01);
      ldl.addRhsAtSlot(ldl.slot(p), g[a]!);
      rhs.set(p, 0, rhs.get(p, 0) + g[a]!);
      ids.forEach((q, b) => {
        if (b > a) return;
        const value = u[a]! * u[b]! + v[a]! * v[b]! + (a === b ? 0.01 : 0);
        ldl.addAtSlots(ldl.slot(p), ldl.slot(q), value);
        dense.set(p, q, dense.get(p, q) + value);
        if (p !== q) dense.set(q, p, dense.get(q, p) + value);
      });
    });
  };
  ldl.activate(0);
  ldl.activate(1);
  ldl.activate(slow(0));
  ldl.activate(slow(1));
  let currentSlow = 0;
  for (let j = 0; j + 1 < fastCount; j++) {
    const l = Math.floor(j / slowEvery);
    if (j > 0) {
      ldl.eliminate(j - 1);
      ldl.activate(j + 1);
    }
    while (currentSlow < l) {
      ldl.eliminate(slow(currentSlow));
      ldl.activate(slow(currentSlow + 2));
      currentSlow++;
    }
    addBlock([j, j + 1, slow(l), slow(l + 1)]);
    addBlock([j, j + 1, slow(l), slow(l + 1)]);
  }
  ldl.eliminateAll();
  return { ldl, dense, rhs, n, fastCount, slowCount };
}

describe('frontal LDLᵀ against a dense solve and inverse (ml-matrix; independent computation)', () => {
  const TOLERANCE = 1e-9; // relative to the largest element of the reference

  it('solves N x = g like the dense solve', () => {
    const { ldl, dense, rhs } = randomChainSystem(7, 40, 5);
    const x = ldl.solve();
    const reference = solve(dense, rhs).getColumn(0);
    const scale = Math.max(...reference.map(Math.abs));
    reference.forEach((r, i) => expect(Math.abs(x[i]! - r) / scale).toBeLessThan(TOLERANCE));
  });

  it('gives the elements of N⁻¹ on the pattern (Takahashi recursion): every pair that shared the front', () => {
    const { ldl, dense, fastCount, slowCount } = randomChainSystem(11, 30, 4);
    const z = ldl.selectedInverse();
    const reference = inverse(dense);
    const scale = Math.max(...reference.diag().map(Math.abs));
    for (let j = 0; j < fastCount; j++) {
      expect(Math.abs(z.get(j, j) - reference.get(j, j)) / scale).toBeLessThan(TOLERANCE);
      if (j + 1 < fastCount) expect(Math.abs(z.get(j, j + 1) - reference.get(j, j + 1)) / scale).toBeLessThan(TOLERANCE);
      const l = Math.min(Math.floor(j / 4), slowCount - 2);
      for (const s of [fastCount + l, fastCount + l + 1]) {
        expect(Math.abs(z.get(j, s) - reference.get(j, s)) / scale).toBeLessThan(TOLERANCE);
      }
    }
    // Elements outside the pattern are not computed, and say so.
    expect(() => z.get(0, fastCount - 1)).toThrow(/outside the computed pattern/);
  });

  it('the reverse sweep (dense reverse front) gives the same N⁻¹ diagonal and pattern elements, and whole front blocks at each stamp', () => {
    const { ldl, dense, n } = randomChainSystem(13, 30, 4);
    const reference = inverse(dense);
    const scale = Math.max(...reference.diag().map(Math.abs));
    let pairs = 0;
    let blocks = 0;
    ldl.reverseSweep({
      onPair(p, q, zpq) {
        pairs++;
        expect(Math.abs(zpq - reference.get(p, q)) / scale).toBeLessThan(TOLERANCE);
      },
      onStamp(_stamp, get, view) {
        // Every pair of parameters in the reverse front, by call and by the direct view.
        const inFront = Array.from({ length: n }, (_, p) => p).filter((p) => view.slot[p]! >= 0);
        for (const p of inFront) {
          for (const q of inFront) {
            expect(Math.abs(get(p, q) - reference.get(p, q)) / scale).toBeLessThan(TOLERANCE);
            expect(view.z[view.slot[p]! * view.ld + view.slot[q]!]).toBe(get(p, q));
          }
        }
        if (inFront.length > 0) blocks++;
      },
    });
    for (let p = 0; p < n; p++) expect(Math.abs(ldl.inverseDiagonal[p]! - reference.get(p, p)) / scale).toBeLessThan(TOLERANCE);
    expect(pairs).toBeGreaterThan(n);
    expect(blocks).toBeGreaterThan(n / 2);
  });

  it('names a parameter that nothing determines (zero pivot)', () => {
    const ldl = new FrontalLdl(2, 2);
    ldl.activate(0);
    ldl.activate(1);
    ldl.addAtSlots(ldl.slot(0), ldl.slot(0), 1);
    ldl.addDirectDiagonal(0, 1);
    ldl.eliminate(0);
    expect(() => ldl.eliminate(1)).toThrow(SingularParameterError);
  });

  it('names a parameter that is a copy of another (pivot lost to cancellation)', () => {
    // N = [[1, 1], [1, 1]]: x_0 and x_1 enter only as their sum.
    const ldl = new FrontalLdl(2, 2);
    ldl.activate(0);
    ldl.activate(1);
    for (const [p, q] of [
      [0, 0],
      [1, 0],
      [1, 1],
    ] as const) {
      ldl.addAtSlots(ldl.slot(p), ldl.slot(q), 1);
    }
    ldl.addDirectDiagonal(0, 1);
    ldl.addDirectDiagonal(1, 1);
    ldl.eliminate(0);
    try {
      ldl.eliminate(1);
      expect.unreachable('a singular system was factorised');
    } catch (err) {
      expect(err).toBeInstanceOf(SingularParameterError);
      expect((err as SingularParameterError).parameter).toBe(1);
    }
  });
});
