/**
 * negativeZwdWarning (src/services/unit-guards.ts): a warning when the median of the finite ZWD values is below
 * −10 mm (NEGATIVE_ZWD_LIMIT_M), its text naming that median in mm. Checked against an independent median here
 * (the finite values filtered, a full sort, the mean of the two middle ones for an even count: the textbook
 * definition), on arrays and typed arrays alike, with NaN and ±Infinity mixed in (they are not ZWD values and
 * do not count). The −10 mm threshold itself is common practice (a ZWD is never negative; a few mm below zero
 * is within the noise of a dry atmosphere).
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { NEGATIVE_ZWD_LIMIT_M, negativeZwdWarning } from '../../src/services/unit-guards.js';

/** Median of the finite values by a sort (textbook); NaN when there are none. */
function textbookFiniteMedian(values: readonly number[]): number {
  const v = values.filter((x) => Number.isFinite(x)).sort((a, b) => a - b);
  if (v.length === 0) return NaN;
  const h = v.length >> 1;
  return v.length % 2 ? v[h]! : (v[h - 1]! + v[h]!) / 2;
}

const zwdValue = fc.oneof(
  { weight: 8, arbitrary: fc.double({ min: -0.5, max: 0.5, noNaN: true }) },
  { weight: 1, arbitrary: fc.constantFrom(NaN, Infinity, -Infinity) },
);

describe('negativeZwdWarning', () => {
  it('warns exactly when the textbook median of the finite values is below −10 mm, naming it (arrays and typed arrays)', () => {
    fc.assert(
      fc.property(fc.array(zwdValue, { maxLength: 60 }), (values) => {
        const m = textbookFiniteMedian(values);
        for (const input of [values, Float64Array.from(values)]) {
          const w = negativeZwdWarning(input);
          if (m < NEGATIVE_ZWD_LIMIT_M) {
            expect(w?.code).toBe('zwd-negative');
            expect(w?.text).toContain(`the estimated ZWD is ${(m * 1000).toFixed(1)} mm (median over the series)`);
          } else expect(w).toBeNull();
        }
      }),
      { numRuns: 400 },
    );
  });

  it('counts only finite values: non-finite values do not move the median (hand-checked cases)', () => {
    // Median of −0.03, −0.02, 0.2 is −0.02 m (−20.0 mm) whatever NaN and Infinity stand around them.
    expect(negativeZwdWarning([NaN, -0.03, Infinity, 0.2, -Infinity, -0.02])?.text).toContain('-20.0 mm');
    // An even count: the mean of −0.012 and −0.008 is −0.010 m, not below −10 mm.
    expect(negativeZwdWarning(Float64Array.from([-0.012, NaN, -0.008, 0.3, -0.3]))).toBeNull();
    // No finite value at all: no median, no warning.
    expect(negativeZwdWarning([NaN, Infinity])).toBeNull();
    expect(negativeZwdWarning(new Float64Array(0))).toBeNull();
  });
});
