/**
 * readJsonColumnsBody (src/formats/json-columns-reader.ts) against JSON.parse (ECMA-262 JSON.parse, RFC 8259):
 * whenever the reader answers, its columns hold the values JSON.parse gives (Object.is, −0 included) and
 * its rest is JSON.parse's object without the columns; for every body it must not read (invalid JSON, JSON
 * it leaves to the general path: escapes, duplicate columns, values out of range …) it answers undefined.
 * The column checks here are the test's own (a range, a set of texts), not the service's.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readJsonColumnsBody, type JsonColumnSpec } from '../../src/formats/json-columns-reader.js';

const SPECS: Record<string, JsonColumnSpec> = {
  t: { kind: 'text', required: true, accept: (text) => text.length >= 1 && text.length <= 8 },
  x: { kind: 'number', required: true, min: 0, max: 90, exclusiveMin: true, nullable: false },
  y: { kind: 'number', required: true, min: -1e6, max: 1e6, exclusiveMin: false, nullable: false },
  s: { kind: 'number', required: false, min: 0, max: 10, exclusiveMin: true, nullable: true },
};
const MAX_ROWS = 50;

const bytesOf = (text: string) => new Uint8Array(Buffer.from(text, 'utf8'));
const read = (text: string) => readJsonColumnsBody(bytesOf(text), 'observations', SPECS, MAX_ROWS);

/** What the reader must give for `text`, from JSON.parse. */
function expectedFrom(text: string) {
  const parsed = JSON.parse(text) as { observations: Record<string, unknown[]> } & Record<string, unknown>;
  const rest = { ...parsed, observations: 0 };
  const o = parsed.observations;
  return { rest, o };
}

function expectSameAsJsonParse(text: string): void {
  const got = read(text);
  expect(got, text).toBeDefined();
  const { rest, o } = expectedFrom(text);
  expect(got!.rest).toEqual(rest);
  expect(Object.keys(got!.rest)).toEqual(Object.keys(rest)); // member order kept (messages list keys in order)
  expect(got!.rows).toBe(o.t!.length);
  expect(got!.texts.t!.distinct.length).toBe(new Set(o.t).size);
  expect(Array.from(got!.texts.t!.index, (k) => got!.texts.t!.distinct[k])).toEqual(o.t);
  for (const name of ['x', 'y', 's']) {
    if (o[name] === undefined) {
      expect(got!.numbers[name]).toBeUndefined();
      continue;
    }
    const values = Array.from(got!.numbers[name]!, (v) => (Number.isNaN(v) ? null : v));
    values.forEach((v, i) => expect(Object.is(v, o[name]![i]), `${name}.${i}`).toBe(true));
    expect(got!.withNulls.has(name)).toBe(o[name]!.includes(null));
  }
}

const VALID = {
  site: { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 },
  observations: { t: ['G01', 'G02', 'G01'], x: [10.5, 45, 89.99999999999999], y: [-0, 1e-7, 123456.78901234567] },
  options: { gradients: null },
};

describe('bodies it reads: the values and the rest of JSON.parse', () => {
  it.each([
    ['compact', JSON.stringify(VALID)],
    ['pretty, whitespace everywhere JSON allows it', JSON.stringify(VALID, null, '\t').replace(/\n/g, '\r\n ')],
    ['observations first', JSON.stringify({ observations: VALID.observations, site: VALID.site })],
    ['nothing but observations', JSON.stringify({ observations: VALID.observations })],
    ['a duplicate key in the rest: the last one wins', `{"a":1,"observations":${JSON.stringify(VALID.observations)},"a":2}`],
    [
      'escapes and non-ASCII text in the rest',
      `{"n\\u0061me":"Zürich \\"\\u00e9\\"","observations":${JSON.stringify(VALID.observations)}}`,
    ],
    ['the columns under an escaped member name', `{"observ\\u0061tions":${JSON.stringify(VALID.observations)}}`],
    ['deep nesting in the rest', `{"deep":${'['.repeat(500)}${']'.repeat(500)},"observations":${JSON.stringify(VALID.observations)}}`],
    ['σ with nulls', JSON.stringify({ observations: { ...VALID.observations, s: [null, 0.5, null] } })],
    ['σ all null', JSON.stringify({ observations: { ...VALID.observations, s: [null, null, null] } })],
    ['numbers in every JSON form', `{"observations":{"t":["a","b","c"],"x":[1E1,2.5e+0,9e-1],"y":[-0.0,-1e6,1000000]}}`],
    [
      'numbers of 17–25 digits',
      `{"observations":{"t":["a","b","c"],"x":[12.345678901234567,1.2345678901234567890123,89.999999999999999999],"y":[1e-400,-0.1e-320,999999.99999999999]}}`,
    ],
  ])('%s', (_name, text) => expectSameAsJsonParse(text));

  it('random bodies (fast-check): the reader answers with JSON.parse’s values, or not at all', () => {
    // Mostly values each column accepts, now and then one it refuses (the reader must then answer nothing).
    const number = fc.oneof(
      { arbitrary: fc.double({ min: Number.MIN_VALUE, max: 10, noNaN: true }), weight: 30 },
      { arbitrary: fc.double({ min: -2e6, max: 2e6, noNaN: true }), weight: 1 },
      { arbitrary: fc.constantFrom(null, '1', -0, 0), weight: 1 },
    );
    const text = fc.oneof(
      { arbitrary: fc.constantFrom('G01', 'G02', 'E11', 'R24'), weight: 20 },
      { arbitrary: fc.string({ maxLength: 10 }), weight: 1 },
      { arbitrary: fc.constant(5), weight: 1 },
    );
    const columns = fc.integer({ min: 1, max: 8 }).chain((n) =>
      fc.record(
        {
          t: fc.array(text, { minLength: n, maxLength: n }),
          x: fc.array(number, { minLength: n, maxLength: n }),
          y: fc.array(number, { minLength: n, maxLength: n + (n % 5 === 0 ? 1 : 0) }),
          s: fc.array(number, { minLength: n, maxLength: n }),
          z: fc.array(number, { maxLength: 2 }),
        },
        { requiredKeys: ['t', 'x'] },
      ),
    );
    const spaced = (json: string, gaps: number[]) =>
      json.replace(/[,:[\]{}]/g, (c, at: number) => (gaps[at % gaps.length]! % 4 === 0 ? ` ${c}\n` : c));
    let answered = 0;
    fc.assert(
      fc.property(columns, fc.anything(), fc.array(fc.nat(), { minLength: 1, maxLength: 5 }), (o, extra, gaps) => {
        const body = spaced(JSON.stringify({ extra, observations: o }), gaps);
        const got = read(body);
        if (got === undefined) return true;
        answered++;
        expectSameAsJsonParse(body);
        return true;
      }),
      { numRuns: 3000, seed: 20261203 },
    );
    expect(answered).toBeGreaterThan(30); // the valid bodies among them were read, not all left to the general path
  });
});

describe('bodies it leaves to the general path (undefined): invalid JSON, and JSON it does not read', () => {
  const obs = JSON.stringify(VALID.observations);
  it.each([
    ['a byte-order mark', `\uFEFF${JSON.stringify(VALID)}`],
    ['truncated', JSON.stringify(VALID).slice(0, -5)],
    ['trailing text', `${JSON.stringify(VALID)} x`],
    ['two bodies', `${JSON.stringify(VALID)}{}`],
    ['no observations', JSON.stringify({ site: VALID.site })],
    ['observations twice', `{"observations":${obs},"observations":${obs}}`],
    ['observations twice, once escaped', `{"observations":${obs},"observ\\u0061tions":${obs}}`],
    ['observations as objects', JSON.stringify({ observations: [{ t: 'a', x: 1, y: 2 }] })],
    ['a column twice', '{"observations":{"t":["a"],"x":[1],"y":[1],"x":[2]}}'],
    ['an unknown column', '{"observations":{"t":["a"],"x":[1],"y":[1],"q":[2]}}'],
    ['a missing column', '{"observations":{"t":["a"],"x":[1]}}'],
    ['ragged columns (shorter)', '{"observations":{"t":["a","b"],"x":[1,2],"y":[1]}}'],
    ['ragged columns (longer)', '{"observations":{"t":["a"],"x":[1,2],"y":[1]}}'],
    ['empty columns', '{"observations":{"t":[],"x":[],"y":[]}}'],
    ['more rows than allowed', JSON.stringify({ observations: { t: Array(51).fill('a'), x: Array(51).fill(1), y: Array(51).fill(1) } })],
    ['a value out of range', '{"observations":{"t":["a"],"x":[0],"y":[1]}}'],
    ['a huge exponent (Infinity)', '{"observations":{"t":["a"],"x":[1],"y":[1e400]}}'],
    ['a tiny exponent (0 where 0 is out of range)', '{"observations":{"t":["a"],"x":[1e-400],"y":[1]}}'],
    ['null where not allowed', '{"observations":{"t":["a"],"x":[null],"y":[1]}}'],
    ['a string for a number', '{"observations":{"t":["a"],"x":["1"],"y":[1]}}'],
    ['a number for a text', '{"observations":{"t":[1],"x":[1],"y":[1]}}'],
    ['an escape in a text', '{"observations":{"t":["G\\u0030"],"x":[1],"y":[1]}}'],
    ['non-ASCII in a text', '{"observations":{"t":["Gé"],"x":[1],"y":[1]}}'],
    ['a text refused by its check', '{"observations":{"t":["a-much-too-long-name"],"x":[1],"y":[1]}}'],
    ['a bad number: leading zero', '{"observations":{"t":["a"],"x":[01],"y":[1]}}'],
    ['a bad number: two points', '{"observations":{"t":["a"],"x":[1.5.3],"y":[1]}}'],
    ['a bad number: NaN', '{"observations":{"t":["a"],"x":[NaN],"y":[1]}}'],
    ['a bad number: a plus sign', '{"observations":{"t":["a"],"x":[+1],"y":[1]}}'],
    ['a trailing comma', '{"observations":{"t":["a"],"x":[1,],"y":[1]}}'],
    ['invalid JSON in the rest', `{"site":{"a":tru},"observations":${obs}}`],
    ['an unterminated string in the rest', `{"site":"abc,"observations":${obs}}`],
    ['a control character in the rest', `{"site":"a\u0001b","observations":${obs}}`],
    ['a lone value', '[1,2]'],
    ['empty', ''],
  ])('%s', (_name, text) => {
    expect(read(text)).toBeUndefined();
  });
});

describe('texts made to collide in the hash table are left to the general path (bounded look-ups)', () => {
  /** FNV-1a (32 bits) of an ASCII text, as the reader hashes the bytes of a text. */
  const fnv1a = (text: string) => {
    let h = 0x811c9dc5;
    for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
    return h;
  };

  it('200 distinct 7-character texts sharing the low 16 bits of their hash: undefined; 200 ordinary ones: read', () => {
    const colliding: string[] = [];
    const target = fnv1a('Xa00000') & 0xffff;
    for (let k = 0; colliding.length < 200; k++) {
      const text = `X${k.toString(36).padStart(6, '0')}`;
      if ((fnv1a(text) & 0xffff) === target) colliding.push(text);
    }
    const body = (texts: string[]) => JSON.stringify({ observations: { t: texts, x: texts.map(() => 1), y: texts.map(() => 2) } });
    const specs = { ...SPECS, t: { kind: 'text' as const, required: true, accept: () => true } };
    expect(readJsonColumnsBody(bytesOf(body(colliding)), 'observations', specs, 1000)).toBeUndefined();
    const ordinary = colliding.map((_, k) => `Y${k.toString(36).padStart(6, '0')}`);
    expect(readJsonColumnsBody(bytesOf(body(ordinary)), 'observations', specs, 1000)?.texts.t!.distinct).toEqual(ordinary);
  });
});

describe('texts told apart by their first word (up to three bytes) or by the row before (eight bytes at a time)', () => {
  const specs: Record<string, JsonColumnSpec> = { t: { kind: 'text', required: true, accept: () => true } };
  const EPOCH = '2026-06-21T00:00:30.000Z';

  it('short texts of 0..5 bytes and epochs differing in one byte anywhere, in runs, with and without spaces: JSON.parse’s texts', () => {
    const short = fc.string({ unit: fc.constantFrom(...'G0145 ,]:'), maxLength: 5 });
    const epoch = fc
      .tuple(fc.nat({ max: EPOCH.length - 1 }), fc.constantFrom(...'0123456789:TZ.-'))
      .map(([at, c]) => `${EPOCH.slice(0, at)}${c}${EPOCH.slice(at + 1)}`);
    const runs = fc.array(fc.tuple(fc.oneof(short, epoch, fc.constant(EPOCH)), fc.integer({ min: 1, max: 4 })), {
      minLength: 1,
      maxLength: 30,
    });
    fc.assert(
      fc.property(runs, fc.boolean(), (r, spaced) => {
        const texts = r.flatMap(([text, n]) => Array<string>(n).fill(text));
        const body = `{"observations":{"t":[${texts.map((t) => JSON.stringify(t)).join(spaced ? ' , ' : ',')}]}}`;
        const got = readJsonColumnsBody(bytesOf(body), 'observations', specs, 1000);
        expect(got, body).toBeDefined();
        expect(Array.from(got!.texts.t!.index, (k) => got!.texts.t!.distinct[k])).toEqual(texts);
        expect(got!.texts.t!.distinct).toEqual([...new Set(texts)]);
      }),
      { numRuns: 2000, seed: 20261203 },
    );
  });

  it('bodies cut anywhere (a text’s first word or eight bytes running past the end): undefined, nothing thrown', () => {
    const body = `{"observations":{"t":["G04","G0","${EPOCH}","${EPOCH}","G04",""]}}`;
    for (let end = 0; end < body.length; end++)
      expect(readJsonColumnsBody(bytesOf(body.slice(0, end)), 'observations', specs, 10)).toBeUndefined();
    expect(readJsonColumnsBody(bytesOf(body), 'observations', specs, 10)?.texts.t!.distinct).toEqual(['G04', 'G0', EPOCH, '']);
  });
});
