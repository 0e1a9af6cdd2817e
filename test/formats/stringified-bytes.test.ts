/**
 * stringifiedBytes (src/formats/json-columns.ts) against what it replaces: the UTF-8 of JSON.stringify(value)
 * as TextEncoder writes it (ECMA-262 JSON.stringify; WHATWG Encoding Standard, UTF-8 encode). Byte for byte
 * (a speed change: equality with the code before it is the test) for long arrays cut at every piece boundary,
 * for what JSON.stringify leaves out or calls (undefined, functions, symbols, toJSON with its key or index,
 * BigInt), for any text, and over random objects (fast-check); and the thread's reused scratch buffer: answers
 * written back to back, longer then shorter, each its own bytes, none a view of the buffer written next.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ELEMENTS_PER_PIECE, SCRATCH_BYTES_MAX, stringifiedBytes } from '../../src/formats/json-columns.js';

const P = ELEMENTS_PER_PIECE;
const reference = (value: unknown) => Buffer.from(new TextEncoder().encode(JSON.stringify(value)));
const written = (value: object) => Buffer.from(stringifiedBytes(value));
const expectSame = (value: object, what: string) => expect(written(value).equals(reference(value)), what).toBe(true);

/** Rows like an answer's series: numbers of every JSON form, texts, a met field in some rows only. */
const rowsOf = (n: number, seed = 1) =>
  Array.from({ length: n }, (_, i) => ({
    epoch: new Date(1_780_000_000_000 + 30_000 * i).toISOString(),
    zwd_m: 0.1 + (i * seed) / 7,
    sigma_m: i % 5 === 0 ? 1e-21 * i : -0,
    big: i % 7 === 0 ? 1.7976931348623157e308 : NaN,
    zhd_source: i % 3 === 0 ? 'measured' : 'model',
    ...(i % 4 === 0 ? { pwv_mm: i / 3, tm_k: undefined } : {}),
  }));

describe('stringifiedBytes: the bytes of JSON.stringify encoded by TextEncoder', () => {
  it('arrays cut at every piece boundary (common practice: the edges of a chunked loop)', () => {
    for (const n of [0, 1, P - 1, P, P + 1, 2 * P - 1, 2 * P, 2 * P + 1, 5 * P + 3]) {
      expectSame({ series: rowsOf(n), count: n }, `${n} rows`);
      expectSame({ count: n, series: rowsOf(n), rejected: rowsOf(n, 3), warnings: [] }, `${n} rows in two tables`);
    }
  });

  it('long arrays of numbers, texts, nulls, holes, undefined and functions (written as null)', () => {
    const holes = new Array<unknown>(3 * P + 1);
    holes[P] = 1;
    const mixed = Array.from({ length: 2 * P + 5 }, (_, i) => [i, `t${i}`, null, undefined, () => i, Symbol('s'), [i], { i }][i % 8]);
    expectSame({ holes, mixed, numbers: Array.from({ length: 3 * P }, (_, i) => i / 3) }, 'mixed elements');
  });

  it('members left out or called as JSON.stringify does', () => {
    const withKey = { toJSON: (key: string) => `member ${key}` };
    const indexed = Array.from({ length: P + 2 }, (_, i) => (i === P + 1 ? { toJSON: (key: string) => `index ${key}` } : { i }));
    expectSame({}, 'empty');
    expectSame({ gone: undefined, f: () => 1, s: Symbol('s'), kept: 1 }, 'first members without JSON text');
    expectSame({ kept: 1, gone: undefined, also: 2, f: () => 1 }, 'later members without JSON text');
    expectSame({ a: withKey, rows: rowsOf(P + 1), b: withKey }, 'toJSON gets the member key');
    expectSame({ rows: indexed }, 'toJSON of an element gets its index in the whole array');
    expectSame({ rows: Object.assign(rowsOf(P + 1), { toJSON: () => 'array toJSON' }) }, 'an array with a toJSON');
    expectSame({ 2: 'b', 1: 'a', z: rowsOf(P + 1), ['__proto__']: 'own key' }, 'key order and a __proto__ key');
    expectSame({ toJSON: () => ({ replaced: rowsOf(P + 1) }) }, 'the value with a toJSON');
    expect(Buffer.from(stringifiedBytes(rowsOf(P + 1))).equals(reference(rowsOf(P + 1))), 'a top-level array').toBe(true);
  });

  it('text that is not ASCII: Latin-1, BMP, astral, lone surrogates (escaped by JSON.stringify), in rows and members', () => {
    const texts = ['é', '°', '≥ 30 s', '😀', '\ud800', 'x\udc00y', '\u007f', '\u0000'];
    const rows = Array.from({ length: 2 * P + 1 }, (_, i) => ({ i, text: texts[i % texts.length]! }));
    expectSame({ warnings: texts, rows, [texts.join('')]: 1 }, 'non-ASCII text');
  });

  it('throws what JSON.stringify throws: a cycle through a piece, a BigInt in a row', () => {
    const cyclic: Record<string, unknown> = { rows: rowsOf(P + 1) };
    (cyclic.rows as Record<string, unknown>[])[P] = cyclic;
    expect(() => JSON.stringify(cyclic)).toThrow(TypeError);
    expect(() => stringifiedBytes(cyclic)).toThrow(TypeError);
    const big = { rows: [...rowsOf(P), { n: 1n }] };
    expect(() => stringifiedBytes(big)).toThrow(TypeError);
  });

  it('any object of JSON values and long arrays (fast-check)', () => {
    const longArray = fc.array(fc.oneof(fc.jsonValue(), fc.dictionary(fc.string(), fc.jsonValue({ maxDepth: 1 }))), {
      minLength: P - 2,
      maxLength: 3 * P + 2,
    });
    fc.assert(
      fc.property(
        fc.dictionary(fc.string({ unit: 'binary' }), fc.oneof(fc.jsonValue({ maxDepth: 2 }), longArray), { maxKeys: 6 }),
        (value) => {
          expect(written(value).equals(reference(value))).toBe(true);
        },
      ),
      { numRuns: 100 },
    );
  });

  it('the reused scratch buffer: answers back to back, each its own bytes, owning its buffer exactly (common practice)', () => {
    const long = { series: rowsOf(40 * P, 1), warnings: ['long'] };
    const short = { series: rowsOf(2, 2), warnings: ['short'] };
    const other = { series: rowsOf(3 * P + 7, 5), rejected: rowsOf(P + 1, 9) };
    const first = stringifiedBytes(long);
    const firstCopy = Buffer.from(first);
    const second = stringifiedBytes(short); // shorter than what the buffer holds from the first
    const third = stringifiedBytes(other);
    expect(Buffer.from(second).equals(reference(short)), 'shorter after longer: no tail of the first').toBe(true);
    expect(Buffer.from(third).equals(reference(other))).toBe(true);
    expect(Buffer.from(first).equals(firstCopy), 'the first answer unchanged by the next ones').toBe(true);
    expect(firstCopy.equals(reference(long))).toBe(true);
    for (const bytes of [first, second, third]) expect([bytes.byteOffset, bytes.byteLength]).toEqual([0, bytes.buffer.byteLength]);
    expect(new Set([first.buffer, second.buffer, third.buffer]).size).toBe(3);
  });

  it('an answer longer than the scratch buffer (written whole), then a small one; a toJSON that writes an answer meanwhile', () => {
    const huge = { series: rowsOf(Math.ceil(SCRATCH_BYTES_MAX / 100)) };
    const hugeBytes = stringifiedBytes(huge);
    expect(hugeBytes.byteLength).toBeGreaterThan(SCRATCH_BYTES_MAX);
    expect(Buffer.from(hugeBytes).equals(reference(huge))).toBe(true);
    expectSame({ series: rowsOf(P + 1) }, 'after an answer written whole');
    let inner: Uint8Array | undefined;
    const nested = {
      before: rowsOf(P + 1),
      member: { toJSON: () => ((inner = stringifiedBytes({ inner: rowsOf(P + 2) })), 'called') },
      after: rowsOf(P + 3),
    };
    expectSame(nested, 'outer answer with an answer written inside a toJSON');
    expect(Buffer.from(inner!).equals(reference({ inner: rowsOf(P + 2) }))).toBe(true);
  });
});
