import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { medianInPlace, selectInPlace } from '../../src/estimation/order-statistics.js';

/**
 * Reference: the order statistic read from a full numeric sort of the same values (Array.prototype.sort
 * with a numeric comparator; the definition of the k-th smallest, common practice). The selection must give
 * the very same number (not an approximation), because the estimator's rejection window and the residual
 * unit guard compare against medians that used to come from a sort.
 */
function sortedCopy(values: Float64Array): number[] {
  return Array.from(values).sort((a, b) => a - b);
}

/** Values with many ties (small integers) mixed with distinct reals, as residual deviations and spacings have. */
function randomValues(rand: () => number, n: number): Float64Array {
  return Float64Array.from({ length: n }, () => (rand() < 0.3 ? Math.floor(rand() * 4) : rand() * 10 - 5));
}

describe('Hoare selection against a full sort (common practice)', () => {
  it('gives the k-th smallest exactly, for every k, with ties and any count 1..60', () => {
    const rand = mulberry32(14);
    for (let trial = 0; trial < 400; trial++) {
      const n = 1 + Math.floor(rand() * 60);
      const values = randomValues(rand, n);
      const sorted = sortedCopy(values);
      for (let k = 0; k < n; k++) {
        const work = values.slice();
        expect(selectInPlace(work, n, k)).toBe(sorted[k]);
        // Everything before k is not larger (the property the even-count median relies on).
        for (let i = 0; i < k; i++) expect(work[i]!).toBeLessThanOrEqual(work[k]!);
      }
    }
  });

  it('gives the median of a sort: the middle value, or the mean of the two middle values for an even count', () => {
    const rand = mulberry32(15);
    for (let trial = 0; trial < 2000; trial++) {
      const n = 1 + Math.floor(rand() * 200);
      const values = randomValues(rand, n);
      const s = sortedCopy(values);
      const expected = n % 2 === 1 ? s[(n - 1) / 2]! : (s[n / 2 - 1]! + s[n / 2]!) / 2;
      expect(medianInPlace(values.slice(), n)).toBe(expected);
    }
  });

  it('uses only the first `count` values, and is NaN for none', () => {
    // median of 3, 1, 2 is 2 (the trailing 100 is outside the count)
    expect(medianInPlace(Float64Array.from([3, 1, 2, 100]), 3)).toBe(2);
    expect(medianInPlace(new Float64Array(4), 0)).toBeNaN();
  });

  it('handles a sorted, a reversed and a constant input of GPS-day size (26 000 values)', () => {
    const n = 26_000;
    const up = Float64Array.from({ length: n }, (_, i) => i);
    // sorted 0..25999: median (12999 + 13000) / 2
    expect(medianInPlace(up.slice(), n)).toBe(12_999.5);
    expect(medianInPlace(up.slice().reverse(), n)).toBe(12_999.5);
    expect(medianInPlace(new Float64Array(n).fill(0.25), n)).toBe(0.25);
  });
});
