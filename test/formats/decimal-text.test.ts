/**
 * roundedDecimalText against the independent reference it promises to equal: the JavaScript
 * built-in number-to-text conversion of the rounded value, String(Math.round(x·10^d) / 10^d)
 * (ECMA-262 Number::toString, shortest round-trip digits).
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roundedDecimalText } from '../../src/formats/decimal-text.js';

const builtIn = (x: number, digits: number) => String(Math.round(x * 10 ** digits) / 10 ** digits);

// A fixed seed keeps CI deterministic; change it locally to explore other cases.
const FC = { numRuns: 20_000, seed: 20261201 };

describe('roundedDecimalText equals String(Math.round(x·10^d)/10^d) (ECMA-262 Number::toString)', () => {
  it('on the edge cases: zeros, halves, exponent forms, 15+ digit integers, non-finite values', () => {
    // eslint-disable-next-line no-loss-of-precision -- 18 significant digits on purpose: more than a double holds
    const eighteenDigits = 123456789.123456789;
    const cases = [
      0,
      -0,
      0.5,
      -0.5,
      0.00005,
      -0.00005,
      1e-9,
      -1e-9,
      1.5e-8,
      1e-7,
      1e-6,
      eighteenDigits,
      1e15,
      1e16,
      1e21,
      -1e21,
      NaN,
      Infinity,
      -Infinity,
    ];
    for (const x of cases) for (let d = 0; d <= 8; d++) expect(roundedDecimalText(x, d), `x = ${x}, d = ${d}`).toBe(builtIn(x, d));
  });

  it('on random doubles of every magnitude from 1e-12 to 1e12, 0..8 decimals', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e12, max: 1e12, noNaN: true }),
        fc.integer({ min: 0, max: 8 }),
        (x, d) => roundedDecimalText(x, d) === builtIn(x, d),
      ),
      FC,
    );
  });

  it('on values like the PWV output (pressure, delays, Π) at their output decimals', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -2, max: 1100, noNaN: true }),
        fc.constantFrom(4, 6, 8),
        (x, d) => roundedDecimalText(x, d) === builtIn(x, d),
      ),
      FC,
    );
  });
});
