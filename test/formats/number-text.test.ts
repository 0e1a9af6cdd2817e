/**
 * readNumber (src/formats/number-text.ts), the one number reader of every format. References: the
 * grammar of a decimal literal as JSON and C write it (common practice) and the FORTRAN D exponent
 * of RINEX (RINEX 3.05 §5.1, from memory), and ECMAScript's Number() for the value of every text
 * the grammar accepts. The time of the old pattern on a long digit string grows with its square;
 * the test below would take seconds with it (the answer is checked, not the time).
 */

import { describe, expect, it } from 'vitest';
import { MAX_NUMBER_CHARS, readNumber } from '../../src/formats/number-text.js';

const OLD_PATTERN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/; // the replaced pattern, as the reference grammar for short texts

describe('readNumber: the decimal literal grammar (common practice)', () => {
  it.each([
    ['0', 0],
    ['-12.5', -12.5],
    ['+3', 3],
    ['1.', 1],
    ['.5', 0.5],
    ['1e3', 1000],
    ['1E-3', 0.001],
    ['-2.5e+2', -250],
    ['007', 7],
  ])('reads %s as %d', (text, value) => {
    expect(readNumber(text)).toBe(value);
  });

  it.each(['', '.', '+', '-', 'e5', '1e', '1e+', '1.2.3', '1,5', ' 1', '1 ', 'NaN', 'Infinity', '0x10', '1d3', '--1', '1e5.5'])(
    'refuses %j',
    (text) => {
      expect(readNumber(text)).toBeUndefined();
    },
  );

  it('reads the FORTRAN D exponent only when asked (RINEX, from memory)', () => {
    expect(readNumber('1.5D2', { fortranExponent: true })).toBe(150);
    expect(readNumber('-1.0d-1', { fortranExponent: true })).toBe(-0.1);
    expect(readNumber('1.5D2')).toBeUndefined();
  });

  it('agrees with the old pattern and Number() on 20 000 random short texts of digits, signs, points and exponents', () => {
    let seed = 12345;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648), seed / 2147483648);
    const alphabet = '0123456789+-.eE';
    for (let k = 0; k < 20_000; k++) {
      const n = 1 + Math.floor(rand() * 8);
      let text = '';
      for (let i = 0; i < n; i++) text += alphabet[Math.floor(rand() * alphabet.length)];
      const expected = OLD_PATTERN.test(text) ? Number(text) : undefined;
      expect(readNumber(text), text).toBe(expected);
    }
  });

  it(`refuses text longer than ${MAX_NUMBER_CHARS} characters, and a 200 000-digit text at once`, () => {
    expect(readNumber('1'.repeat(MAX_NUMBER_CHARS))).toBe(Number('1'.repeat(MAX_NUMBER_CHARS)));
    expect(readNumber('1'.repeat(MAX_NUMBER_CHARS + 1))).toBeUndefined();
    expect(readNumber('1'.repeat(200_000) + 'x')).toBeUndefined();
  });
});
