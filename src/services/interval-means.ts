/**
 * Regular-interval means of a PWV/ZTD series (e.g. hourly values to compare with a weather model).
 *
 * Intervals are [start, start + Δ) with start a multiple of Δ counted from 1970-01-01T00:00:00Z, so
 * hourly intervals start on the hour and daily ones at 00 UTC (Δ must divide one day). Each interval
 * of a station with at least one record gives:
 *
 *   count           records whose PWV enters the mean: quality ok, met-interpolated or
 *                   delay-sigma-unknown. Left out and counted apart (`excluded_count`): met-missing
 *                   (no PWV) and delay-sigma-large (σ_ZTD above the limit).
 *   pwv_mm          arithmetic mean of the PWV values x̄ = Σxᵢ/n (unweighted: the σᵢ of one station
 *                   within an hour are nearly equal, and weighting would favour no epoch in particular)
 *   pwv_sigma_mm    σ of the mean, from the records' σᵢ, taking their errors as fully correlated within
 *                   the interval: σ_x̄ = Σσᵢ/n (the mean σ). Errors of neighbouring epochs are strongly
 *                   correlated (the ZWD is a random walk estimated from overlapping data, and the met is
 *                   interpolated from the same hourly records), so the independent-error formula
 *                   √(Σσᵢ²)/n would shrink σ by √n (≈ 11 for 120 epochs of 30 s) and overstate the
 *                   precision. Null when any σᵢ of the interval is unknown.
 *   pwv_sd_mm       sample standard deviation of the values (n − 1), the variability inside the
 *                   interval; null for n < 2
 *   ztd_m, ztd_sigma_m, ztd_sd_m   the same for ZTD over every record except delay-sigma-large
 *                   (`ztd_count` of them): ZTD needs no met.
 *   quality_counts  records per quality flag, all of them.
 *   warning codes   the codes of recordWarningCell found among the interval's records, in the order
 *                   of PWV_RECORD_WARNING_CODES (the `warnings` column of the interval CSV).
 */

import {
  PWV_QUALITY_FLAGS,
  PWV_RECORD_WARNING_CODES,
  recordWarningCell,
  type PwvQuality,
  type PwvRecordWarning,
  type StationPwvRecord,
} from './station-pwv.js';

export interface IntervalMean {
  startMs: number;
  count: number;
  excludedCount: number;
  pwvMm: number | null;
  pwvSigmaMm: number | null;
  pwvSdMm: number | null;
  ztdCount: number;
  ztdM: number | null;
  ztdSigmaM: number | null;
  ztdSdM: number | null;
  sources: string[];
  qualityCounts: Record<PwvQuality, number>;
  warningCodes: PwvRecordWarning[];
}

/** Quality flags whose PWV enters an interval mean. */
export const MEAN_QUALITIES: readonly PwvQuality[] = ['ok', 'met-interpolated', 'delay-sigma-unknown'];

class Accumulator {
  n = 0;
  sum = 0;
  sumSq = 0;
  sigmaSum = 0;
  sigmaKnown = true;
  add(x: number, sigma: number | null): void {
    this.n++;
    this.sum += x;
    this.sumSq += x * x;
    if (sigma === null) this.sigmaKnown = false;
    else this.sigmaSum += sigma;
  }
  mean(): number | null {
    return this.n === 0 ? null : this.sum / this.n;
  }
  sigmaOfMean(): number | null {
    return this.n === 0 || !this.sigmaKnown ? null : this.sigmaSum / this.n;
  }
  sd(): number | null {
    if (this.n < 2) return null;
    const m = this.sum / this.n;
    return Math.sqrt(Math.max(0, (this.sumSq - this.n * m * m) / (this.n - 1)));
  }
}

/** @param records one station's records sorted by epoch; @param intervalMs Δ [ms], divides 86 400 000 */
export function intervalMeans(records: readonly StationPwvRecord[], intervalMs: number): IntervalMean[] {
  const out: IntervalMean[] = [];
  let i = 0;
  while (i < records.length) {
    const startMs = Math.floor(records[i]!.epochMs / intervalMs) * intervalMs;
    const endMs = startMs + intervalMs;
    const pwv = new Accumulator();
    const ztd = new Accumulator();
    const sources = new Set<string>();
    const qualityCounts = Object.fromEntries(PWV_QUALITY_FLAGS.map((q) => [q, 0])) as Record<PwvQuality, number>;
    let excludedCount = 0;
    const warned = new Set<string>();
    for (; i < records.length && records[i]!.epochMs < endMs; i++) {
      const r = records[i]!;
      const cell = recordWarningCell(r);
      if (cell !== '') for (const code of cell.split(';')) warned.add(code);
      qualityCounts[r.quality]++;
      sources.add(r.source);
      if (r.quality !== 'delay-sigma-large') ztd.add(r.ztdM, r.ztdSigmaM);
      if (MEAN_QUALITIES.includes(r.quality) && r.pwvMm !== null) pwv.add(r.pwvMm, r.pwvSigmaMm);
      else excludedCount++;
    }
    out.push({
      startMs,
      count: pwv.n,
      excludedCount,
      pwvMm: pwv.mean(),
      pwvSigmaMm: pwv.sigmaOfMean(),
      pwvSdMm: pwv.sd(),
      ztdCount: ztd.n,
      ztdM: ztd.mean(),
      ztdSigmaM: ztd.sigmaOfMean(),
      ztdSdM: ztd.sd(),
      sources: [...sources].sort(),
      qualityCounts,
      warningCodes: PWV_RECORD_WARNING_CODES.filter((c) => warned.has(c)),
    });
  }
  return out;
}
