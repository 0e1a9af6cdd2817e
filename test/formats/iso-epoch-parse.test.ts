/**
 * isoEpochMs (src/formats/iso-epoch.ts) against Date.parse, the reader it stands in for (ECMA-262 §21.4.1.32,
 * Date Time String Format, as V8 implements it: the reference here is the engine's own value for each text):
 * the same number, or NaN, for every text of the two forms it reads itself, with any digits in any place (so
 * months 00 and 13, day 00 and 31 of a short month, hour 24, minute 60, a leap second), for texts one character
 * off those forms, and for anything else (which it hands to Date.parse).
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isoEpochMs } from '../../src/formats/iso-epoch.js';

/** Object.is: NaN equals NaN, and a number must be the same double. */
const sameAsDateParse = (text: string): void => {
  expect(Object.is(isoEpochMs(text), Date.parse(text)), text).toBe(true);
};

const digits = (n: number) => fc.array(fc.integer({ min: 0, max: 9 }), { minLength: n, maxLength: n }).map((d) => d.join(''));
/** YYYY-MM-DDTHH:mm:ss[.sss]Z with any digits. */
const anyDigitsForm = fc
  .tuple(digits(4), digits(2), digits(2), digits(2), digits(2), digits(2), fc.option(digits(3), { nil: undefined }))
  .map(([y, mo, d, h, mi, s, ms]) => `${y}-${mo}-${d}T${h}:${mi}:${s}${ms === undefined ? '' : `.${ms}`}Z`);
/** Valid-looking fields in their ranges and just past them. */
const nearValidForm = fc
  .tuple(
    fc.integer({ min: 0, max: 9999 }),
    fc.integer({ min: 0, max: 13 }),
    fc.integer({ min: 0, max: 32 }),
    fc.integer({ min: 0, max: 24 }),
    fc.integer({ min: 0, max: 60 }),
    fc.integer({ min: 0, max: 60 }),
    fc.option(fc.integer({ min: 0, max: 999 }), { nil: undefined }),
  )
  .map(([y, mo, d, h, mi, s, ms]) => {
    const p = (v: number, w: number) => String(v).padStart(w, '0');
    return `${p(y, 4)}-${p(mo, 2)}-${p(d, 2)}T${p(h, 2)}:${p(mi, 2)}:${p(s, 2)}${ms === undefined ? '' : `.${p(ms, 3)}`}Z`;
  });

describe('isoEpochMs equals Date.parse (ECMA-262 §21.4.1.32, V8 as the reference)', () => {
  it('a GPS-like day at 30 s (the texts toISOString writes) and its neighbours', () => {
    for (let i = -5; i < 2890; i++) {
      const text = new Date(Date.UTC(2026, 5, 21) + i * 30_000).toISOString();
      sameAsDateParse(text);
      sameAsDateParse(text.replace('.000Z', 'Z'));
    }
  });

  it('edges: leap days, month ends rolled over by the engine, years 0000 and 9999, hour 24, leap second', () => {
    for (const text of [
      '2024-02-29T12:00:00Z',
      '2026-02-29T12:00:00Z',
      '2026-02-30T00:00:00.000Z',
      '2026-04-31T23:59:59.999Z',
      '2026-13-01T00:00:00Z',
      '2026-00-10T00:00:00Z',
      '2026-01-00T00:00:00Z',
      '0000-01-01T00:00:00Z',
      '9999-12-31T23:59:59.999Z',
      '2026-06-21T24:00:00Z',
      '2026-06-21T23:60:00Z',
      '2016-12-31T23:59:60Z',
      '1969-12-31T23:59:59.999Z',
    ])
      sameAsDateParse(text);
  });

  it('texts near the two forms and other forms (handed to Date.parse)', () => {
    for (const text of [
      '',
      'Z',
      '2026-06-21',
      '2026-06-21T06:30Z',
      '2026-06-21T06:30:00',
      '2026-06-21t06:30:00Z',
      '2026-06-21T06:30:00z',
      '2026-06-21T06:30:00.5Z',
      '2026-06-21T06:30:00.1234Z',
      '2026-06-21T06:30:00+00:00',
      '2026-06-21T06:30:00.000+02:00',
      '2026-06-21 06:30:00Z',
      '2026/06/21T06:30:00Z',
      '2026-06-21T06:30:00,000Z',
      '2026-06-21T06:3a:00Z',
      '+002026-06-21T06:30:00Z',
      '-000001-01-01T00:00:00Z',
      '2026-06-21T06:30:00.00aZ',
      ' 2026-06-21T06:30:00Z',
    ])
      sameAsDateParse(text);
  });

  it('any digits in both forms, fields near their ranges, and any text (fast-check)', () => {
    fc.assert(fc.property(anyDigitsForm, sameAsDateParse), { numRuns: 20_000 });
    fc.assert(fc.property(nearValidForm, sameAsDateParse), { numRuns: 20_000 });
    fc.assert(fc.property(fc.string({ unit: 'binary-ascii', maxLength: 30 }), sameAsDateParse), { numRuns: 5000 });
  });

  it('one date after another (the cached date part is not carried to the next text)', () => {
    const texts = [
      '2026-06-21T06:30:00Z',
      '2026-06-22T06:30:00Z',
      '2026-13-22T06:30:00Z',
      '2026-06-21T06:30:00Z',
      '2026-06-21T07:30:00.250Z',
    ];
    for (const text of [...texts, ...texts.reverse()]) sameAsDateParse(text);
  });
});
