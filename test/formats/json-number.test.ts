/**
 * readJsonNumber / jsonNumberOf (src/formats/json-number.ts) against the references it promises to equal:
 * ECMAScript's Number() of the same text (ECMA-262 StringToNumber: the nearest double, ties to even, for
 * any number of digits) for the value, and JSON.parse (RFC 8259 §6 grammar) for what is a JSON number.
 * fast-check draws the texts: doubles printed by String, toPrecision, toExponential and toFixed, long
 * digit strings with exponents, and exact midpoints between two doubles (the ties the exact check must
 * leave to Number()) with their last digit moved by one either way. readJsonNumber reads the plain shape
 * (no exponent, up to 15 integer digits) by readPlainNumber first, so all of these go through it where
 * it answers; the last block holds readPlainNumber alone to Number() on the texts of observation columns
 * and checks it answers them (not leaving them all to the general path). BENCH-free: the counts below
 * are the test's; JSON_NUMBER_RUNS scales them (e.g. 10 for ten times as many).
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { jsonNumberOf, readJsonNumber, readPlainNumber } from '../../src/formats/json-number.js';

// A fixed seed keeps CI deterministic; change it locally to explore other cases.
const SCALE = Number(process.env.JSON_NUMBER_RUNS ?? 1);
const FC = (numRuns: number) => ({ numRuns: Math.round(numRuns * SCALE), seed: 20261203 });

/** JSON.parse's value of a JSON number text, or undefined when JSON.parse refuses it. */
function parsed(text: string): number | undefined {
  try {
    const v: unknown = JSON.parse(text);
    return typeof v === 'number' ? v : undefined;
  } catch {
    return undefined;
  }
}

/** The text is read exactly as Number() reads it (Object.is: −0 and 0 told apart). */
const sameAsNumber = (text: string) => Object.is(jsonNumberOf(text), Number(text));

const finite = fc.double({ noNaN: true, noDefaultInfinity: true });

/** The exact decimal text of the midpoint between the positive double x and the next one up (BigInt arithmetic). */
function midpointText(x: number): string {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigUint64(0);
  const exponent = Number((bits >> 52n) & 0x7ffn);
  const fraction = bits & ((1n << 52n) - 1n);
  const mantissa = exponent === 0 ? fraction : fraction | (1n << 52n);
  const e2 = (exponent === 0 ? 1 : exponent) - 1075; // x = mantissa · 2^e2
  // midpoint = (2 · mantissa + 1) · 2^(e2 − 1)
  const odd = 2n * mantissa + 1n;
  const e = e2 - 1;
  if (e >= 0) return (odd << BigInt(e)).toString();
  const digits = (odd * 5n ** BigInt(-e)).toString().padStart(-e + 1, '0'); // odd · 5^−e / 10^−e
  return `${digits.slice(0, digits.length + e)}.${digits.slice(digits.length + e)}`;
}

describe('the value: equal to Number() of the same text (ECMA-262 StringToNumber, round to nearest, ties to even)', () => {
  it('on the edge cases (values from memory, checked against Number())', () => {
    const cases = [
      '0',
      '-0',
      '-0.0',
      '0e5',
      '-0E-5',
      '1',
      '-1',
      '0.1',
      '0.3',
      '20.13886905015106',
      '100807.49848385264',
      '9007199254740992',
      '9007199254740993', // a tie between 2^53 and 2^53 + 2: even (2^53)
      '9007199254740995', // a tie: even (2^53 + 4)
      '9007199254740993.0000000001', // above the tie: 2^53 + 2
      '1125899906842624.125', // a tie of 19 digits below 2^51
      '1e22',
      '1e23',
      '123456789012345678e-5',
      '1.7976931348623157e308',
      '1.7976931348623159e308', // rounds to Infinity
      '5e-324',
      '2.4703282292062327e-324', // just below half the smallest subnormal: 0
      '2.4703282292062328e-324', // just above: the smallest subnormal
      '1e-400',
      '1e400',
      '-1e400',
      '1e999999999999',
      '0.000000000000000000000000000001',
      '123456789012345678901234567890',
      '1.00000000000000000000000000000000000000001',
      '4.9406564584124654e-324',
      '2.2250738585072011e-308',
      '2.2250738585072012e-308',
    ];
    for (const text of cases) expect([text, jsonNumberOf(text)]).toEqual([text, Number(text)]);
    expect(Object.is(jsonNumberOf('-0'), -0)).toBe(true); // JSON.parse('-0') is −0 (ECMA-262)
    expect(Object.is(jsonNumberOf('-0.0e7'), -0)).toBe(true);
  });

  it('doubles as String(x) writes them (shortest round trip, 1–17 digits)', () => {
    fc.assert(
      fc.property(finite, (x) => sameAsNumber(String(x))),
      FC(300_000),
    );
  });

  it('doubles by toPrecision(1..21), toExponential(0..25) and toFixed(0..25)', () => {
    fc.assert(
      fc.property(finite, fc.integer({ min: 1, max: 21 }), fc.integer({ min: 0, max: 25 }), (x, p, d) => {
        const texts = [x.toPrecision(p), x.toExponential(d), x.toExponential(Math.min(d, 20))];
        if (Math.abs(x) < 1e21) texts.push(x.toFixed(d));
        return texts.every((t) => sameAsNumber(t));
      }),
      FC(200_000),
    );
  });

  it('doubles of the magnitudes of observation columns (1e-6..1e7) by String and toPrecision(15..17)', () => {
    const magnitudes = fc.double({ min: 1e-6, max: 1e7, noNaN: true });
    fc.assert(
      fc.property(magnitudes, fc.boolean(), fc.integer({ min: 15, max: 17 }), (x, negative, p) => {
        const v = negative ? -x : x;
        return sameAsNumber(String(v)) && sameAsNumber(v.toPrecision(p));
      }),
      FC(300_000),
    );
  });

  it('digit strings of 1..40 digits, a point anywhere, exponents −400..400', () => {
    const digitString = fc.string({ unit: fc.constantFrom(...'0123456789'), minLength: 1, maxLength: 40 });
    fc.assert(
      fc.property(
        fc.boolean(),
        digitString,
        fc.option(digitString),
        fc.option(fc.integer({ min: -400, max: 400 })),
        (negative, whole, fraction, exponent) => {
          const integer = whole.replace(/^0+(?=\d)/, ''); // JSON: no leading zeros
          const text = `${negative ? '-' : ''}${integer}${fraction !== null ? `.${fraction}` : ''}${exponent !== null ? `e${exponent}` : ''}`;
          return sameAsNumber(text);
        },
      ),
      FC(200_000),
    );
  });

  it('exact midpoints between neighbouring doubles (ties to even) and their last digit ±1 (the near-ties)', () => {
    const positive = fc.double({ min: 1e-30, max: 1e30, noNaN: true });
    fc.assert(
      fc.property(positive, (x) => {
        const mid = midpointText(x);
        const last = Number(mid[mid.length - 1]);
        const body = mid.slice(0, -1);
        const texts = [mid, `${body}${(last + 1) % 10}`, `${body}${(last + 9) % 10}`, `-${mid}`];
        // the 19-digit window of the exact check: the midpoint cut to 17..19 significant digits
        const digits = mid.replace('.', '').replace(/^0+/, '');
        if (digits.length > 19 && !mid.includes('.')) texts.push(`${digits.slice(0, 19)}e${digits.length - 19}`);
        return texts.every((t) => sameAsNumber(t));
      }),
      FC(100_000),
    );
  });

  it('integers of 16..20 digits (2^53 and above: every odd one is a tie between two doubles)', () => {
    fc.assert(
      fc.property(fc.bigInt({ min: 1n << 53n, max: 10n ** 20n }), fc.integer({ min: -22, max: 22 }), (w, e) => {
        const text = `${w}e${e}`;
        return sameAsNumber(text) && sameAsNumber(w.toString());
      }),
      FC(200_000),
    );
  });
});

describe('the grammar: a JSON number exactly when JSON.parse reads one (RFC 8259 §6)', () => {
  it.each(['01', '-01', '1.', '.5', '+1', '1e', '1e+', '-', '--1', '0x10', 'Infinity', 'NaN', '1.5.3', '1e5.5', '', '١', 'İ'])(
    'refuses %j as JSON.parse does',
    (text) => {
      expect(parsed(text)).toBeUndefined();
      expect(jsonNumberOf(text)).toBeUndefined();
    },
  );

  it('stops where the number ends, as a JSON reader must (what follows is the caller’s to check)', () => {
    const bytes = new TextEncoder().encode('[12.5e1,-0.25]');
    const out = new Float64Array(2);
    const view = new DataView(bytes.buffer);
    const end = readJsonNumber(bytes, view, 1, out, 0);
    expect([end, out[0]]).toEqual([7, 125]);
    expect([readJsonNumber(bytes, view, end + 1, out, 1), out[1]]).toEqual([13, -0.25]);
  });

  it('a number followed by what may follow it in JSON (, ] } space) and more bytes: its value, and its end', () => {
    const after = fc.string({ unit: fc.constantFrom(...',]} \n\t\r0123456789.e+-*/:;<=>?@[\\^_`'), minLength: 1, maxLength: 8 });
    fc.assert(
      fc.property(
        finite,
        fc.integer({ min: 1, max: 21 }),
        fc.constantFrom(',', ']', '}', ' ', '\n', '\t', '\r'),
        after,
        (x, p, stop, tail) => {
          const texts = [String(x), x.toPrecision(p)];
          return texts.every((text) => {
            const bytes = new TextEncoder().encode(`${text}${stop}${tail}`);
            const out = new Float64Array(1);
            const end = readJsonNumber(bytes, new DataView(bytes.buffer), 0, out, 0);
            return end === text.length && Object.is(out[0], Number(text));
          });
        },
      ),
      FC(200_000),
    );
  });

  it('random ASCII texts: a value exactly when JSON.parse reads a number, and the same value', () => {
    const unit = fc.constantFrom(...'0123456789.eE+-x');
    fc.assert(
      fc.property(fc.string({ unit, maxLength: 12 }), (text) => Object.is(jsonNumberOf(text), parsed(text))),
      FC(200_000),
    );
  });
});

/** readPlainNumber of the whole of `text`: its value, or undefined when it leaves the text to the general path. */
function plainOf(text: string): number | undefined {
  const bytes = new TextEncoder().encode(`${text},`); // as in a column: a delimiter after the number
  const out = new Float64Array(1);
  const end = readPlainNumber(bytes, new DataView(bytes.buffer), 0, out, 0);
  if (end < 0) return undefined;
  if (end !== text.length) throw new Error(`${text}: read to ${end}`);
  return out[0];
}

describe('readPlainNumber (the plain shape read first): Number()’s value whenever it answers, and it answers the plain texts', () => {
  /** Texts without exponent of up to 15 integer digits. */
  const plain = (texts: string[]) => texts.filter((t) => !/e/i.test(t) && t.replace(/^-?/, '').split('.')[0]!.length <= 15);
  /** The text and its last digit moved by one either way: the decisions next to a half gap (where an ulp off would show). */
  const withNeighbours = (text: string) => {
    const last = Number(text[text.length - 1]);
    const body = text.slice(0, -1);
    return [text, `${body}${(last + 1) % 10}`, `${body}${(last + 9) % 10}`];
  };

  it('doubles of the magnitudes of observation columns (1e-3..1e7, both signs) by String, toPrecision(15..17), toFixed(0..20), and their neighbours', () => {
    let texts = 0; // of up to 17 significant digits (String, toPrecision): what it is for
    let answered = 0;
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1e7, noNaN: true }),
        fc.boolean(),
        fc.integer({ min: 15, max: 17 }),
        fc.integer({ min: 0, max: 20 }),
        (x, negative, p, d) => {
          const v = negative ? -x : x;
          for (const t of plain([String(v), v.toPrecision(p)]).flatMap(withNeighbours)) {
            texts++;
            const read = plainOf(t);
            if (read !== undefined) answered++;
            if (read !== undefined && !Object.is(read, Number(t))) return false;
          }
          return plain([v.toFixed(d)]).every((t) => {
            const read = plainOf(t);
            return read === undefined || Object.is(read, Number(t));
          });
        },
      ),
      FC(100_000),
    );
    // left to the general path: near-ties, and texts of more than 15 digits after the first four of the fraction
    expect(answered / texts).toBeGreaterThan(0.99);
  });

  it('exact midpoints between neighbouring doubles and their last digit ±1, where plain: Number()’s value or no answer', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-5, max: 1e12, noNaN: true }), fc.integer({ min: 16, max: 22 }), (x, digits) => {
        const mid = midpointText(x);
        const cut = mid.includes('.') ? mid.slice(0, Math.max(mid.indexOf('.') + 2, digits + 1)) : mid;
        return [...withNeighbours(cut), `-${cut}`].every((t) => {
          const v = plainOf(t);
          return v === undefined || Object.is(v, Number(t));
        });
      }),
      FC(50_000),
    );
  });

  it('digit strings: up to 15 integer digits, 1..22 fraction digits (W from 1 to 10^37): Number()’s value where it answers', () => {
    const digits = (min: number, max: number) => fc.string({ unit: fc.constantFrom(...'0123456789'), minLength: min, maxLength: max });
    let answered = 0;
    fc.assert(
      fc.property(fc.boolean(), digits(1, 15), digits(1, 22), (negative, whole, fraction) => {
        const text = `${negative ? '-' : ''}${whole.replace(/^0+(?=\d)/, '')}.${fraction}`;
        const v = plainOf(text);
        if (v !== undefined) answered++;
        return v === undefined || Object.is(v, Number(text));
      }),
      FC(100_000),
    );
    expect(answered).toBeGreaterThan(FC(100_000).numRuns / 4);
  });

  it.each([
    ['1e5', 'an exponent'],
    ['1.5E-3', 'an exponent'],
    ['01', 'a leading zero'],
    ['1.', 'no fraction digit'],
    ['-', 'no digit'],
    ['+1', 'a plus sign'],
    ['.5', 'no integer digit'],
    ['1234567890123456', '16 integer digits'],
    ['1234567890123456.5', '16 integer digits'],
    ['0.00000000000000000000001', '23 fraction digits'],
    ['1.2345678901234567890123', '20 fraction digits after the first four'],
  ])('leaves %j to the general path (%s)', (text) => {
    expect(plainOf(text)).toBeUndefined();
    expect(jsonNumberOf(text)).toEqual(parsed(text)); // which reads it as JSON.parse does
  });

  it('stops where the number ends: at the end of the bytes, and before what is not a digit', () => {
    const out = new Float64Array(1);
    for (const [text, end, value] of [
      ['12', 2, 12],
      ['-0.5', 4, -0.5],
      ['7.25]', 4, 7.25],
      ['3.0001x', 6, 3.0001],
      ['1.5.3', 3, 1.5],
    ] as const) {
      const bytes = new TextEncoder().encode(text);
      expect([text, readPlainNumber(bytes, new DataView(bytes.buffer), 0, out, 0), out[0]]).toEqual([text, end, value]);
    }
  });
});
