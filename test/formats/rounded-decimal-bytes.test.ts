/**
 * The fixed-decimal number writer (src/formats/rounded-decimal-bytes.ts) against two references outside it,
 * the JavaScript engine's own number formatting (ECMA-262):
 * - Number.prototype.toFixed (ECMA-262 §21.1.3.3: the exact decimal of the double, rounded to d places) of
 *   the rounded value Math.round(x·10^d)/10^d, with its trailing zeros (and a bare point) cut: the same text,
 *   character for character;
 * - JSON.stringify of the same rounded value (Number::toString, the shortest round-trip text): the same
 *   number once parsed (the texts differ only where JSON.stringify writes an exponent, 1e-7 for 0.0000001).
 * Over a seeded sweep of magnitudes 1e-12 .. 1e12 and both signs for every decimal count 0..15 the service
 * could use, halves, values at the int32 and 2^53 boundaries, -0, non-finite values (common practice: the
 * cases where hand-written number printers go wrong).
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { MAX_ROUNDED_DECIMAL_BYTES, writeRoundedDecimal, writeRoundedDecimalList } from '../../src/formats/rounded-decimal-bytes.js';

/** The writer's text of x with d decimals. */
function written(x: number, d: number): string {
  // '?' shows a byte written outside the number's place (bytes after the returned end, within its place, are scratch)
  const bytes = new Uint8Array(MAX_ROUNDED_DECIMAL_BYTES + 8).fill(0x3f);
  const end = writeRoundedDecimal(bytes, 4, x, d);
  // Plain checks, not expect(): this runs half a million times.
  if (end - 4 > MAX_ROUNDED_DECIMAL_BYTES || bytes[3] !== 0x3f || bytes[4 + MAX_ROUNDED_DECIMAL_BYTES] !== 0x3f)
    throw new Error(`${x}: wrote outside its place`);
  return Buffer.from(bytes.subarray(4, end)).toString('latin1');
}

/** toFixed of the value rounded as roundTo rounds, trailing zeros cut; "0" for a zero of either sign. */
function toFixedReference(x: number, d: number): string {
  const rounded = Math.round(x * 10 ** d) / 10 ** d;
  if (rounded === 0) return '0';
  const fixed = rounded.toFixed(d);
  return d === 0 ? fixed : fixed.replace(/0+$/, '').replace(/\.$/, '');
}

const uniform = mulberry32(7319);
const sweep = Float64Array.from({ length: 20_000 }, () => (uniform() - 0.5) * 2 * 10 ** (24 * uniform() - 12));

/** Values where printers go wrong (common practice): halves, carries, boundaries of int32 and of exact integers. */
const EDGES = [
  0.5, -0.5, 1.5, 2.5, -2.5, 0.125, -0.125, 1.005, -1.005, 0.999_999_5, 0.999_999_49, 9.999_999_999, -9.999_999_999, 1, -1, 10, 100, 0.1,
  0.2, 0.3, 0.7, 1e-6, 5e-7, 4.9e-7, -5e-7, -5.1e-7, 1e-8, 1e-9, 2_147_483_647, 2_147_483_648, -2_147_483_648, 2_147_483_647.5,
  21.474_836_47, 21.474_836_48, 4_294_967_296.123, 123_456_789.987_654_3, 9_007_199.254_740_991, 12.605_846, 3.201_893,
];

describe('writeRoundedDecimal against Number.prototype.toFixed of the rounded value (ECMA-262 §21.1.3.3)', () => {
  for (let d = 0; d <= 15; d++) {
    it(`${d} decimals: the same text over the sweep and the edge cases`, () => {
      // Where Math.round(x·10^d) reaches 2^53 the writer hands over to JSON.stringify (tested below).
      const inRange = (x: number) => Math.abs(Math.round(x * 10 ** d)) < 2 ** 53 && Math.abs(x) < 1e21;
      let compared = 0;
      for (const x of [...EDGES, ...EDGES.map((e) => e / 1000), ...sweep]) {
        if (!inRange(x)) continue;
        const got = written(x, d);
        if (got !== toFixedReference(x, d)) expect(`${x} → ${got}`).toBe(`${x} → ${toFixedReference(x, d)}`);
        compared++;
      }
      expect(compared).toBeGreaterThan(5_000); // the sweep is not all out of range
    });
  }
});

describe('writeRoundedDecimal against JSON.stringify of the rounded value (ECMA-262 Number::toString)', () => {
  for (const d of [0, 2, 4, 6, 8, 12]) {
    it(`${d} decimals: the same number once parsed, including beyond 2^53 units`, () => {
      const wide = [...sweep.map((x) => x * 1e9), 9.1e9, -9.1e9, 1e15, 2 ** 60, -(2 ** 60), 1.7976931348623157e308];
      for (const x of [...EDGES, ...sweep, ...wide]) {
        const rounded = Math.round(x * 10 ** d) / 10 ** d;
        const parsed = JSON.parse(written(x, d)) as number;
        if (parsed !== JSON.parse(JSON.stringify(rounded))) expect(`${x} → ${parsed}`).toBe(`${x} → ${rounded}`);
      }
    });
  }

  it('-0 and negatives that round to zero are "0"; non-finite values are null, as JSON.stringify writes them', () => {
    expect([-0, -1e-9, 1e-9, -4.9e-7].map((x) => written(x, 6))).toEqual(['0', '0', '0', '0']);
    expect([NaN, Infinity, -Infinity].map((x) => written(x, 6))).toEqual(['null', 'null', 'null']);
    expect(JSON.stringify([NaN, Infinity, -Infinity])).toBe('[null,null,null]');
  });

  it('the examples of the README answer: 6 decimals of 12.6058462…, and 8 of a mapping factor', () => {
    expect(written(12.605_846_2, 6)).toBe('12.605846');
    expect(written(5.123_456_785, 8)).toBe('5.12345679'); // halves towards +∞ at the 8th decimal… of the double 5.123456785
    expect(written(-5.123_456_785, 8)).toBe(toFixedReference(-5.123_456_785, 8));
    expect(written(0.000_000_01, 8)).toBe('0.00000001'); // JSON.stringify writes 1e-8; the same number
  });
});

describe('writeRoundedDecimalList: a column as comma-separated values', () => {
  it('is the values as writeRoundedDecimal writes them, joined by commas, and JSON.parse reads the toFixed values back', () => {
    const values = Float64Array.from([...EDGES, ...sweep.subarray(0, 2000), NaN, -0]);
    const bytes = new Uint8Array(values.length * (MAX_ROUNDED_DECIMAL_BYTES + 1));
    const end = writeRoundedDecimalList(bytes, 0, values, 6);
    const text = Buffer.from(bytes.subarray(0, end)).toString('latin1');
    expect(text).toBe(Array.from(values, (x) => written(x, 6)).join(','));
    const parsed = JSON.parse(`[${text}]`) as (number | null)[];
    expect(parsed.slice(0, -2)).toEqual(Array.from(values.subarray(0, -2), (x) => Number(toFixedReference(x, 6))));
    expect(parsed.slice(-2)).toEqual([null, 0]);
  });
});
