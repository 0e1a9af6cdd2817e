/**
 * Linear interpolation in time of a surface met series (pressure, temperature, humidity) to the
 * epochs of a delay series, never across a gap longer than a limit.
 *
 * Pressure and temperature vary smoothly over hours, so linear interpolation between two records
 * that bracket an epoch is adequate (common practice); across a longer gap (a sensor outage) the
 * value is reported missing instead, and a delay epoch before the first or after the last record
 * is missing too (no extrapolation).
 */

/** Default longest gap interpolated across [ms]: 3 h (documented in the README). */
export const DEFAULT_MAX_MET_GAP_MS = 3 * 3600 * 1000;

export interface TimedValue {
  /** Epoch [ms since 1970, UTC]. */
  epochMs: number;
  value: number;
}

export type InterpolationQuality = 'measured' | 'interpolated' | 'missing';

export interface Interpolated {
  value: number | null;
  quality: InterpolationQuality;
}

/**
 * @param series records sorted by epoch, strictly increasing
 * @param epochsMs epochs to interpolate at, sorted ascending [ms]
 * @param maxGapMs longest gap between two records to interpolate across [ms]
 * @returns one result per epoch: the exact record ('measured'), a linear interpolation
 *          ('interpolated'), or null ('missing')
 */
export function interpolateSeries(
  series: readonly TimedValue[],
  epochsMs: readonly number[],
  maxGapMs = DEFAULT_MAX_MET_GAP_MS,
): Interpolated[] {
  const out: Interpolated[] = new Array(epochsMs.length);
  let j = 0;
  for (let i = 0; i < epochsMs.length; i++) {
    const t = epochsMs[i]!;
    while (j + 1 < series.length && series[j + 1]!.epochMs <= t) j++;
    const a = series[j];
    if (!a || t < a.epochMs) {
      out[i] = { value: null, quality: 'missing' };
      continue;
    }
    if (a.epochMs === t) {
      out[i] = { value: a.value, quality: 'measured' };
      continue;
    }
    const b = series[j + 1];
    if (!b || b.epochMs - a.epochMs > maxGapMs) {
      out[i] = { value: null, quality: 'missing' };
      continue;
    }
    const w = (t - a.epochMs) / (b.epochMs - a.epochMs);
    out[i] = { value: a.value + w * (b.value - a.value), quality: 'interpolated' };
  }
  return out;
}
