/**
 * The random walk between the network's nodes: the variance the piecewise-linear solution leaves
 * out, added to every epoch's and node's σ (docs/network-estimation.md, "Honest σ between nodes").
 *
 * The truth x(t) is a random walk of density q (x(t + Δt) − x(t) ~ N(0, q² Δt): the estimator's own
 * prior). Between nodes t_j and t_j + Δ, at t = t_j + αΔ,
 *
 *   x(t) = (1 − α) x(t_j) + α x(t_j + Δ) + b(t),
 *
 * where b is a Brownian bridge of variance q² Δ α (1 − α), independent of the node values and of the
 * bridges of the other intervals (textbook probability: e.g. Karatzas & Shreve, Brownian Motion and
 * Stochastic Calculus, §5.6.B; from memory). The piecewise-linear model has no b, so it misses
 *
 * 1. at the epoch itself, b(t): the bridge term above (zero on the nodes);
 * 2. in the node estimates, the part of b that the observations pass into them (b is unmodelled
 *    signal in the residuals), which the formal covariance N⁻¹ does not contain.
 *
 * The exact error variance is N⁻¹ + N⁻¹ Aᵀ W Σ_b W A N⁻¹ plus the bridge, which would cost a dense
 * pass over the network's front per interval. Two limits frame it:
 *
 * - no data near the interval: the nodes carry no b, and the missing variance is the bridge,
 *   q² Δ α (1 − α);
 * - dense precise data (the fit follows the path, N⁻¹ → 0): the error is that of the least-squares
 *   projection of a random walk onto continuous piecewise-linear functions, q² Δ g(α) with
 *   g(α) = G0 + G1 u + G2 u², u = α (1 − α): g = 0.0866 on the nodes, 0.1366 mid-interval, less
 *   than the bridge inside the interval and more on the nodes (our derivation: the coefficients are
 *   a fit, to within 1e-6, of the exact error variance of that least-squares fit, 10-s data over
 *   12 h of 30-min intervals; reproduced independently by
 *   test/estimation/network/interpolation-variance.test.ts).
 *
 * The term added is q² Δ g(α): exact in the dense limit. In a one-dimensional check (exact error
 * covariance of the piecewise-linear least squares with a random-walk truth; σ per epoch 1–30 mm,
 * q = 10 mm/√h, 30-s data, Δ = 5–60 min) it gave NEES 0.83–1.11 on the nodes, mid-interval and
 * over all epochs (every single epoch within 0.8–1.15: interpolation-variance.test.ts); the pure
 * bridge term gave NEES up to 600 on the nodes with precise data (it is
 * zero there), no term up to 1 500. Where the data are weak the missing variance moves towards the
 * bridge (less on the nodes, more mid-interval): NEES 0.83 on the nodes to 1.11 mid-interval there.
 */

/** g(α) = G0 + G1 u + G2 u², u = α (1 − α): the dense-limit missing variance in units of q² Δ (module comment). */
export const INTERPOLATION_VARIANCE_G0 = 0.0866;
export const INTERPOLATION_VARIANCE_G1 = -0.166;
export const INTERPOLATION_VARIANCE_G2 = 1.464;

/**
 * Variance the piecewise-linear model leaves out at fraction α of an interval [m²].
 * @param q random-walk density [m/√h]; null (no random walk) → 0
 * @param spanH node spacing Δ [h]
 * @param alpha position in the interval, [0, 1] (0 and 1 on the nodes)
 */
export function interpolationVariance(q: number | null, spanH: number, alpha: number): number {
  if (q === null || !(spanH > 0)) return 0;
  const a = Math.min(Math.max(alpha, 0), 1);
  const u = a * (1 - a);
  return q * q * spanH * (INTERPOLATION_VARIANCE_G0 + u * (INTERPOLATION_VARIANCE_G1 + INTERPOLATION_VARIANCE_G2 * u));
}
