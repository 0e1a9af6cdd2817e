/**
 * The one-pass JSON writer of column arrays (src/formats/json-columns.ts) against JSON.stringify of the
 * values rounded as the precision table rounds them (roundTo, output-precision.ts): the same numbers once
 * parsed, over a seeded sweep of magnitudes and signs, and the edge cases JSON.stringify defines
 * (non-finite → null, -0 → 0). The reference is the JavaScript engine's own number formatting (ECMA-262
 * Number::toString, the shortest round-trip text), not the code under test.
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { columnsJsonBytes, jsonWithRawMembers } from '../../src/formats/json-columns.js';
import { roundTo } from '../../src/formats/output-precision.js';

const text = (bytes: Uint8Array) => Buffer.from(bytes).toString('utf8');
/** What the answer held before: JSON.stringify of roundTo's values, parsed back (-0 → 0, non-finite → null). */
const reference = (xs: ArrayLike<number>, d: number) =>
  JSON.parse(JSON.stringify(Array.from(xs, (x) => roundTo(x, d)))) as (number | null)[];

describe('columnsJsonBytes against JSON.stringify of the rounded values (ECMA-262 Number::toString)', () => {
  const uniform = mulberry32(1402);
  // Magnitudes 1e-9 .. 1e9 and both signs: every decimal count the table uses (0, 2, 4, 6, 8).
  const values = Float64Array.from({ length: 20_000 }, () => (uniform() - 0.5) * 10 ** (18 * uniform() - 9));
  values.set([0.5, -0.5, 2.5, -2.5, 0.125, -0.125, 1.005, -1.005], 0); // halves: Math.round goes towards +∞

  for (const decimals of [0, 2, 4, 6, 8]) {
    it(`${decimals} decimals: the same numbers once parsed`, () => {
      const parsed = JSON.parse(text(columnsJsonBytes({ x: { values, decimals } }))) as { x: number[] };
      expect(parsed.x).toEqual(reference(values, decimals));
    });
  }

  it('the text of the rounded value: no trailing zeros, no exponent, "0" for -0 and tiny negatives', () => {
    const bytes = columnsJsonBytes({ a: { values: [1.5, -2.25, 0.000001, -0, -1e-9, 100, 12.3456789], decimals: 6 } });
    expect(text(bytes)).toBe('{"a":[1.5,-2.25,0.000001,0,0,100,12.345679]}');
  });

  it('non-finite values are null, as JSON.stringify writes them; beyond 2^53 units the engine formats the value', () => {
    const bytes = columnsJsonBytes({ a: { values: [NaN, Infinity, -Infinity, 1e12], decimals: 6 } });
    expect(JSON.parse(text(bytes))).toEqual({ a: [null, null, null, 1e12] });
  });

  it('a column without decimals (text) is written by JSON.stringify; several columns in their order', () => {
    const bytes = columnsJsonBytes({ id: { values: ['G01', 'E"5'], decimals: undefined }, v: { values: [1, 2], decimals: 2 } });
    expect(JSON.parse(text(bytes))).toEqual({ id: ['G01', 'E"5'], v: [1, 2] });
    expect(text(bytes).indexOf('"id"')).toBeLessThan(text(bytes).indexOf('"v"'));
  });
});

describe('jsonWithRawMembers: raw JSON bytes in the place of some keys', () => {
  it('keeps the key order and the rest of the answer', () => {
    const raw = new TextEncoder().encode('{"x":[1,2]}');
    const out = JSON.parse(text(jsonWithRawMembers({ a: 1, slants: null, b: 'é', c: [] }, { c: raw, slants: raw })));
    expect(out).toEqual({ a: 1, slants: { x: [1, 2] }, b: 'é', c: { x: [1, 2] } });
    expect(Object.keys(out)).toEqual(['a', 'slants', 'b', 'c']);
  });
});

describe('bytes from a caller-given source (a pool): content left over by earlier use does not show', () => {
  // A source whose buffers are larger than asked and full of 0xff, as a reused pooled buffer can be.
  const leftovers = (size: number) => new Uint8Array(new ArrayBuffer(size + 4096), 0, size).fill(0xff);
  const columns = {
    id: { values: ['G01', 'R24'], decimals: undefined },
    x: { values: Float64Array.from([1.5, -0, 2.000001, 9.1e-7, 1e-9, 100, 12.30000049]), decimals: 6 },
    y: { values: [0.5, Number.NaN], decimals: 2 },
  };

  it('columnsJsonBytes and jsonWithRawMembers write the same bytes as with new buffers', () => {
    const fresh = columnsJsonBytes(columns);
    const reused = columnsJsonBytes(columns, leftovers);
    expect(Buffer.from(reused).equals(Buffer.from(fresh))).toBe(true);
    const answer = { zenith: { ztd_m: 2.4 }, slants: null, warnings: ['é'] };
    const whole = jsonWithRawMembers(answer, { slants: reused }, leftovers);
    expect(Buffer.from(whole).equals(Buffer.from(jsonWithRawMembers(answer, { slants: fresh })))).toBe(true);
    expect(JSON.parse(text(whole))).toEqual({ zenith: { ztd_m: 2.4 }, slants: JSON.parse(text(fresh)) as unknown, warnings: ['é'] });
  });
});
