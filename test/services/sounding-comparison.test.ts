import { mean, rootMeanSquare, sampleStandardDeviation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { compareSoundings, differenceStatistics, pairSounding } from '../../src/services/sounding-comparison.js';

const MIN = 60_000;
const gnss = [
  { epochMs: 0, pwvMm: 10, pwvSigmaMm: 0.8 },
  { epochMs: 10 * MIN, pwvMm: 14, pwvSigmaMm: 1.2 },
  { epochMs: 60 * MIN, pwvMm: 20, pwvSigmaMm: null },
];

describe('pairing rule (docs/workspace.md; worked by hand)', () => {
  it('on a GNSS epoch: that record', () => {
    expect(pairSounding({ epochMs: 10 * MIN, pwvMm: 13 }, gnss, 30 * MIN)).toMatchObject({
      gnssPwvMm: 14,
      differenceMm: 1,
      pairing: 'interpolated',
      gnssEpochsMs: [10 * MIN],
    });
  });
  it('between two GNSS epochs within the window: linear in time, σ the larger', () => {
    // 2.5 min of 10: 10 + 0.25 · 4 = 11 mm
    expect(pairSounding({ epochMs: 2.5 * MIN, pwvMm: 12 }, gnss, 30 * MIN)).toMatchObject({
      gnssPwvMm: 11,
      gnssPwvSigmaMm: 1.2,
      differenceMm: -1,
      pairing: 'interpolated',
    });
  });
  it('one side outside the window: the nearest within it', () => {
    // 40 min: 10 min → 30 min away, 60 min → 20 min away; window 25 min leaves only the later one
    expect(pairSounding({ epochMs: 40 * MIN, pwvMm: 18 }, gnss, 25 * MIN)).toMatchObject({
      gnssPwvMm: 20,
      pairing: 'nearest',
      gnssPwvSigmaMm: null,
    });
    // before the first GNSS epoch
    expect(pairSounding({ epochMs: -5 * MIN, pwvMm: 9 }, gnss, 30 * MIN)).toMatchObject({ gnssPwvMm: 10, pairing: 'nearest' });
  });
  it('nothing within the window: unpaired', () => {
    expect(pairSounding({ epochMs: 100 * MIN, pwvMm: 18 }, gnss, 30 * MIN)).toBeNull();
    expect(compareSoundings([{ epochMs: 100 * MIN, pwvMm: 18 }], gnss, 30 * MIN).unpairedEpochsMs).toEqual([100 * MIN]);
  });
});

describe('statistics against simple-statistics (independent npm library)', () => {
  const d = [1.3, -0.4, 2.2, 0.7, -1.1, 0.05];
  it('bias = mean, SD = sample standard deviation (n − 1), RMS', () => {
    const s = differenceStatistics(d);
    expect(s.count).toBe(6);
    expect(s.biasMm).toBeCloseTo(mean(d), 12);
    expect(s.sdMm).toBeCloseTo(sampleStandardDeviation(d), 12);
    expect(s.rmsMm).toBeCloseTo(rootMeanSquare(d), 12);
  });
  it('one pair has no SD; none has nothing', () => {
    expect(differenceStatistics([0.5])).toEqual({ count: 1, biasMm: 0.5, sdMm: null, rmsMm: 0.5 });
    expect(differenceStatistics([])).toEqual({ count: 0, biasMm: null, sdMm: null, rmsMm: null });
  });
});
