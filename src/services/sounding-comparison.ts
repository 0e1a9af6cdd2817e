/**
 * GNSS minus sounding precipitable water at one station: pairing and statistics.
 *
 * Pairing rule (documented in docs/workspace.md): for a sounding at epoch t_s, the GNSS PWV records
 * that count are those with a PWV whose quality is neither "met-missing" (no PWV) nor "delay-sigma-large"
 * (src/services/station-pwv.ts), one per epoch (the caller chooses the source). Then
 *   - when GNSS epochs t_a ≤ t_s ≤ t_b both lie within the window w of t_s (|t − t_s| ≤ w), the GNSS PWV is
 *     interpolated linearly in time between them ("interpolated"; t_a = t_s gives that record itself), and
 *     its σ is the larger of the two σ (a conservative bound: the two errors are correlated over minutes);
 *   - otherwise the GNSS epoch nearest to t_s within w is taken ("nearest");
 *   - otherwise the sounding stays unpaired (listed with the reason).
 * A radiosonde takes about an hour to cross the troposphere; the default window of 30 min on either side
 * of the nominal epoch spans that ascent (common practice).
 *
 * Statistics of the differences d_i = PWV_GNSS − PWV_sounding [mm] over the n pairs: bias = mean d_i,
 * SD = sample standard deviation √(Σ(d_i − bias)² / (n − 1)) (null for n < 2), RMS = √(Σ d_i² / n).
 */

/** Default half-width of the pairing window [ms]: 30 min (common practice). */
export const DEFAULT_PAIRING_WINDOW_MS = 30 * 60_000;
/** Largest accepted half-width [ms]: 6 h. */
export const MAX_PAIRING_WINDOW_MS = 6 * 3_600_000;

export interface GnssPwvPoint {
  epochMs: number;
  pwvMm: number;
  pwvSigmaMm: number | null;
}

export interface SoundingPoint {
  epochMs: number;
  pwvMm: number;
}

export type PairingKind = 'interpolated' | 'nearest';

export interface SoundingPair {
  soundingEpochMs: number;
  soundingPwvMm: number;
  gnssPwvMm: number;
  gnssPwvSigmaMm: number | null;
  /** GNSS − sounding [mm]. */
  differenceMm: number;
  pairing: PairingKind;
  /** The GNSS epochs used (one for "nearest" or an exact hit, two for "interpolated"). */
  gnssEpochsMs: number[];
}

export interface ComparisonStatistics {
  count: number;
  biasMm: number | null;
  sdMm: number | null;
  rmsMm: number | null;
}

export interface SoundingComparison {
  pairs: SoundingPair[];
  /** Soundings with no GNSS PWV within the window. */
  unpairedEpochsMs: number[];
  statistics: ComparisonStatistics;
}

/** Index of the first element of `epochs` (ascending) that is ≥ t. */
function lowerBound(points: readonly GnssPwvPoint[], t: number): number {
  let lo = 0;
  let hi = points.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (points[mid]!.epochMs < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** One sounding against the GNSS points (ascending, one per epoch); null when none lies within the window. */
export function pairSounding(sounding: SoundingPoint, gnss: readonly GnssPwvPoint[], windowMs: number): SoundingPair | null {
  const t = sounding.epochMs;
  const k = lowerBound(gnss, t);
  const after = gnss[k];
  const before = after?.epochMs === t ? after : gnss[k - 1];
  const within = (p: GnssPwvPoint | undefined): p is GnssPwvPoint => p !== undefined && Math.abs(p.epochMs - t) <= windowMs;
  const pair = (gnssPwvMm: number, gnssPwvSigmaMm: number | null, pairing: PairingKind, gnssEpochsMs: number[]): SoundingPair => ({
    soundingEpochMs: t,
    soundingPwvMm: sounding.pwvMm,
    gnssPwvMm,
    gnssPwvSigmaMm,
    differenceMm: gnssPwvMm - sounding.pwvMm,
    pairing,
    gnssEpochsMs,
  });
  if (within(before) && before.epochMs === t) return pair(before.pwvMm, before.pwvSigmaMm, 'interpolated', [t]);
  if (within(before) && within(after)) {
    const w = (t - before.epochMs) / (after.epochMs - before.epochMs);
    const sigma = before.pwvSigmaMm === null || after.pwvSigmaMm === null ? null : Math.max(before.pwvSigmaMm, after.pwvSigmaMm);
    return pair(before.pwvMm + w * (after.pwvMm - before.pwvMm), sigma, 'interpolated', [before.epochMs, after.epochMs]);
  }
  const nearest = [before, after].filter(within).sort((a, b) => Math.abs(a.epochMs - t) - Math.abs(b.epochMs - t))[0];
  return nearest ? pair(nearest.pwvMm, nearest.pwvSigmaMm, 'nearest', [nearest.epochMs]) : null;
}

/** Bias, SD and RMS of the differences (definitions in the module comment). */
export function differenceStatistics(differencesMm: readonly number[]): ComparisonStatistics {
  const n = differencesMm.length;
  if (n === 0) return { count: 0, biasMm: null, sdMm: null, rmsMm: null };
  let sum = 0;
  let sumSquares = 0;
  for (const d of differencesMm) {
    sum += d;
    sumSquares += d * d;
  }
  const bias = sum / n;
  let centred = 0;
  for (const d of differencesMm) centred += (d - bias) ** 2;
  return { count: n, biasMm: bias, sdMm: n > 1 ? Math.sqrt(centred / (n - 1)) : null, rmsMm: Math.sqrt(sumSquares / n) };
}

/**
 * @param soundings the station's soundings, any order
 * @param gnss GNSS PWV points, ascending by epoch, one per epoch, already filtered (see the module comment)
 * @param windowMs half-width of the pairing window [ms]
 */
export function compareSoundings(soundings: readonly SoundingPoint[], gnss: readonly GnssPwvPoint[], windowMs: number): SoundingComparison {
  const pairs: SoundingPair[] = [];
  const unpairedEpochsMs: number[] = [];
  for (const s of [...soundings].sort((a, b) => a.epochMs - b.epochMs)) {
    const p = pairSounding(s, gnss, windowMs);
    if (p) pairs.push(p);
    else unpairedEpochsMs.push(s.epochMs);
  }
  return { pairs, unpairedEpochsMs, statistics: differenceStatistics(pairs.map((p) => p.differenceMm)) };
}
