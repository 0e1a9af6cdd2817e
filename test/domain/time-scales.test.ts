import { describe, expect, it } from 'vitest';
import { gpsMinusUtcSeconds, gpsToUtcMs, utcToGpsMs } from '../../src/domain/time-scales.js';

/** GPS − UTC: 0 s at 1980-01-06, 17 s from 2015-07-01, 18 s from 2017-01-01 (IERS Bulletin C; from memory). */
describe('GPS − UTC (IERS Bulletin C leap seconds, from memory)', () => {
  it('is 0 s at the start of GPS time and 18 s since 2017', () => {
    expect(gpsMinusUtcSeconds(Date.UTC(1980, 0, 6))).toBe(0);
    expect(gpsMinusUtcSeconds(Date.UTC(2016, 11, 31, 23, 59, 59))).toBe(17);
    expect(gpsMinusUtcSeconds(Date.UTC(2017, 0, 1))).toBe(18);
    expect(gpsMinusUtcSeconds(Date.UTC(2026, 5, 1))).toBe(18);
    expect(gpsMinusUtcSeconds(Date.UTC(2008, 11, 31))).toBe(14);
  });

  it('converts both ways', () => {
    const utc = Date.UTC(2026, 2, 14, 12);
    expect(utcToGpsMs(utc) - utc).toBe(18_000);
    expect(gpsToUtcMs(utcToGpsMs(utc))).toBe(utc);
    expect(() => gpsToUtcMs(Date.UTC(1979, 0, 1))).toThrow(/1980-01-06/);
  });
});
