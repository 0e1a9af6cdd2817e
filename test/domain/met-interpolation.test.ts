import { describe, expect, it } from 'vitest';
import { interpolateSeries } from '../../src/domain/meteo/met-interpolation.js';

const H = 3600_000;

describe('met interpolation in time (linear, no extrapolation, not across long gaps; common practice)', () => {
  const series = [
    { epochMs: 0, value: 1000 },
    { epochMs: 1 * H, value: 1002 },
    { epochMs: 6 * H, value: 990 }, // a 5 h outage before this record
  ];

  it('returns the record itself at its epoch and the straight line between two records', () => {
    const r = interpolateSeries(series, [0, 0.25 * H, 1 * H]);
    expect(r[0]).toEqual({ value: 1000, quality: 'measured' });
    expect(r[1]!.quality).toBe('interpolated');
    expect(r[1]!.value).toBeCloseTo(1000.5, 12); // 1000 + 0.25 · 2
    expect(r[2]).toEqual({ value: 1002, quality: 'measured' });
  });

  it('does not interpolate across a gap longer than the limit (default 3 h), nor outside the series', () => {
    const r = interpolateSeries(series, [-1, 2 * H, 7 * H]);
    expect(r.map((x) => x.quality)).toEqual(['missing', 'missing', 'missing']);
    expect(interpolateSeries(series, [2 * H], 6 * H)[0]!.value).toBeCloseTo(1002 - (12 / 5) * 1, 9); // limit raised to 6 h
  });

  it('handles an empty series', () => {
    expect(interpolateSeries([], [0])).toEqual([{ value: null, quality: 'missing' }]);
  });
});
