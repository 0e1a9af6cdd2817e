/**
 * isoEpochText (src/formats/iso-epoch-text.ts) against Date.prototype.toISOString, the reference it
 * replaces (ECMA-262 §21.4.4.36, the Date Time String Format "YYYY-MM-DDTHH:mm:ss.sssZ", proleptic
 * Gregorian calendar): equal texts over the whole range of epochs, the day boundaries, leap days, the
 * ends of the fast path's range and what lies outside it (before 1970, six-digit years, fractional ms).
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isoEpochText } from '../../src/formats/iso-epoch-text.js';

const MS_PER_DAY = 86_400_000;
/** 8.64e15 ms: the largest time value of ECMA-262 (§21.4.1.22, TimeClip). */
const TIME_LIMIT_MS = 8.64e15;

describe('equal to toISOString (ECMA-262 Date Time String Format)', () => {
  it('named epochs: the Unix epoch, leap days (2000, 2024), not-leap 2100, the last ms of 9999, and beyond', () => {
    const epochs = [
      0,
      1,
      MS_PER_DAY - 1,
      Date.UTC(2000, 1, 29, 23, 59, 59, 999),
      Date.UTC(2024, 1, 29, 12, 0, 0, 0),
      Date.UTC(2100, 1, 28, 23, 59, 59, 999),
      Date.UTC(2100, 2, 1),
      Date.UTC(2026, 11, 31, 23, 59, 59, 999),
      253_402_300_799_999, // 9999-12-31T23:59:59.999Z
      253_402_300_800_000, // +010000-01-01T00:00:00.000Z
      -1, // 1969-12-31T23:59:59.999Z
      -62_198_755_200_000, // year 0
      TIME_LIMIT_MS,
      -TIME_LIMIT_MS,
      1_782_000_150_000.5, // fractional ms: truncated by Date
    ];
    for (const ms of epochs) expect(isoEpochText(ms), String(ms)).toBe(new Date(ms).toISOString());
  });

  it('consecutive epochs across day boundaries (the date part is kept between calls)', () => {
    for (let ms = Date.UTC(2026, 1, 27, 23, 0); ms < Date.UTC(2026, 2, 2, 1, 0); ms += 1_799_999) {
      expect(isoEpochText(ms)).toBe(new Date(ms).toISOString());
    }
  });

  it('any whole or fractional ms of the valid time range (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.integer({ min: -TIME_LIMIT_MS, max: TIME_LIMIT_MS }),
          fc.integer({ min: 0, max: 4_102_444_800_000 }),
          fc.double({ min: -TIME_LIMIT_MS, max: TIME_LIMIT_MS, noNaN: true }),
        ),
        (ms) => {
          expect(isoEpochText(ms)).toBe(new Date(ms).toISOString());
        },
      ),
      { numRuns: 20_000 },
    );
  });

  it('non-finite epochs throw as toISOString does (RangeError)', () => {
    for (const ms of [NaN, Infinity, -Infinity]) expect(() => isoEpochText(ms)).toThrow(RangeError);
  });
});
