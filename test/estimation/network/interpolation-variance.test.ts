/**
 * The random walk's variance that piecewise-linear nodes leave out (src/estimation/network/
 * interpolation-variance.ts), reproduced here independently: the exact error variance of a
 * least-squares piecewise-linear fit (ml-matrix for the normal matrix) to a random walk, in the
 * limit of dense precise data, against the helper's q² Δ g(α). The Brownian-bridge variance
 * q² Δ α (1 − α) between two tied points is textbook probability (Karatzas & Shreve, Brownian Motion
 * and Stochastic Calculus, §5.6.B; from memory); the dense-limit g is our derivation, and this test
 * is its check.
 */

import { inverse, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { interpolationVariance } from '../../../src/estimation/network/interpolation-variance.js';

/**
 * Error variance of the fit at the epochs of one interval in the middle, in units of q² Δ: y_i =
 * x(t_i) + ε_i (σ per epoch), x a random walk of density q from x(0) ~ N(0, s0²), nodes every Δ
 * with the random-walk constraint between them and the a-priori constraint on the first.
 */
function fitErrorProfile(
  samplingS: number,
  hours: number,
  intervalS: number,
  sigmaM: number,
): { alpha: number[]; g: number[]; formal: number[] } {
  const q = 0.01;
  const s0 = 0.5;
  const n = Math.round((hours * 3600) / samplingS) + 1;
  const step = Math.round(intervalS / samplingS);
  const m = Math.floor((n - 1) / step) + 1;
  const dtH = samplingS / 3600;
  const deltaH = intervalS / 3600;
  const node = (i: number) => Math.min(Math.floor(i / step), m - 2);
  const frac = (i: number) => (i - node(i) * step) / step;
  const N = new Matrix(m, m);
  for (let i = 0; i < n; i++) {
    const j = node(i);
    const a = frac(i);
    const w = 1 / sigmaM ** 2;
    N.set(j, j, N.get(j, j) + (1 - a) * (1 - a) * w);
    N.set(j, j + 1, N.get(j, j + 1) + (1 - a) * a * w);
    N.set(j + 1, j, N.get(j + 1, j) + (1 - a) * a * w);
    N.set(j + 1, j + 1, N.get(j + 1, j + 1) + a * a * w);
  }
  N.set(0, 0, N.get(0, 0) + 1 / s0 ** 2);
  const wc = 1 / (q * q * deltaH);
  for (let j = 0; j + 1 < m; j++) {
    N.set(j, j, N.get(j, j) + wc);
    N.set(j + 1, j + 1, N.get(j + 1, j + 1) + wc);
    N.set(j, j + 1, N.get(j, j + 1) - wc);
    N.set(j + 1, j, N.get(j + 1, j) - wc);
  }
  const Q = inverse(N);
  const rowA = (i: number): [number, number, number] => [node(i), 1 - frac(i), frac(i)];
  const mid = Math.floor(m / 2);
  const alpha: number[] = [];
  const g: number[] = [];
  const formal: number[] = [];
  const c = new Float64Array(n);
  for (let i = mid * step; i <= (mid + 1) * step; i++) {
    // e_i = Σ_a c_a (x_a + ε_a) with c = row i of A N⁻¹ Aᵀ W minus the unit vector at i.
    const [j, wa, wb] = rowA(i);
    formal.push((wa * wa * Q.get(j, j) + 2 * wa * wb * Q.get(j, j + 1) + wb * wb * Q.get(j + 1, j + 1)) / (q * q * deltaH));
    for (let k = 0; k < n; k++) {
      const [l, va, vb] = rowA(k);
      const qa = wa * Q.get(j, l) + wb * Q.get(j + 1, l);
      const qb = wa * Q.get(j, l + 1) + wb * Q.get(j + 1, l + 1);
      c[k] = (qa * va + qb * vb) / sigmaM ** 2;
    }
    let noise = 0;
    for (let k = 0; k < n; k++) noise += c[k]! ** 2 * sigmaM ** 2;
    c[i]! -= 1;
    // cᵀ Σ_x c with Σ_x = s0² + q² min(t_a, t_b): s0² (Σ c)² + q² Σ_k Δt (Σ_{a ≥ k} c_a)².
    let tail = 0;
    let walk = 0;
    for (let k = n - 1; k >= 1; k--) {
      tail += c[k]!;
      walk += dtH * tail * tail;
    }
    const total = tail + c[0]!;
    alpha.push((i - mid * step) / step);
    g.push((s0 * s0 * total * total + q * q * walk + noise) / (q * q * deltaH));
  }
  return { alpha, g, formal };
}

describe('the random walk between piecewise-linear nodes (dense limit)', () => {
  const dense = fitErrorProfile(20, 6, 1800, 1e-5);

  it('on a node and mid-interval: g(0) = 0.0866, g(½) = 0.1366 (the numbers of the derivation)', () => {
    const at = (a: number) => dense.g[dense.alpha.findIndex((x) => Math.abs(x - a) < 1e-9)]!;
    expect(Math.abs(at(0) - 0.0866)).toBeLessThan(0.002);
    expect(Math.abs(at(0.5) - 0.1366)).toBeLessThan(0.002);
    // Not the pure bridge: the nodes carry part of it (zero there for the bridge), mid-interval less.
    expect(at(0)).toBeGreaterThan(0.05);
    expect(at(0.5)).toBeLessThan(0.25 - 0.05);
  });

  it('the helper follows the exact profile across the interval within 0.003 q² Δ', () => {
    const q = 0.01;
    const deltaH = 0.5;
    dense.alpha.forEach((a, i) => {
      expect(Math.abs(interpolationVariance(q, deltaH, a) / (q * q * deltaH) - dense.g[i]!)).toBeLessThan(0.003);
    });
    expect(interpolationVariance(null, deltaH, 0.5)).toBe(0);
  });

  it('formal σ plus the term is honest from precise to weak data: NEES 0.8–1.15 at every epoch of an interval', () => {
    // 30-s data, σ per epoch 1–30 mm, nodes every 5–60 min (the check quoted in the module comment).
    let lo = Infinity;
    let hi = 0;
    for (const sigmaM of [0.001, 0.003, 0.01, 0.03]) {
      for (const intervalS of [300, 900, 3600]) {
        const p = fitErrorProfile(30, 8, intervalS, sigmaM);
        p.alpha.forEach((a, i) => {
          const nees = p.g[i]! / (p.formal[i]! + interpolationVariance(0.01, intervalS / 3600, a) / (0.01 * 0.01 * (intervalS / 3600)));
          lo = Math.min(lo, nees);
          hi = Math.max(hi, nees);
        });
        // Without the term the formal σ alone is far too small with precise data on long intervals.
        if (sigmaM === 0.001 && intervalS === 3600) expect(p.g[0]! / p.formal[0]!).toBeGreaterThan(50);
      }
    }
    expect(lo).toBeGreaterThan(0.8);
    expect(hi).toBeLessThan(1.15);
  });
});
