/**
 * Soundings next to the GNSS series of a station: the GNSS PWV around the stored soundings (the
 * retrieval of station-pwv.ts with the source preference of network-pwv.ts) and the comparison of
 * sounding-comparison.ts.
 */

import { DEFAULT_MAX_MET_GAP_MS } from '../domain/meteo/met-interpolation.js';
import type { Repository, SoundingRow, Station, TimeRange } from '../storage/repository.js';
import { networkStationPwv, type SourceChoice } from './network-pwv.js';
import { compareSoundings, type GnssPwvPoint, type SoundingComparison } from './sounding-comparison.js';
import type { PwvQuality } from './station-pwv.js';

/** GNSS PWV records of these qualities take no part in a comparison (no PWV, or a ZTD σ above the limit). */
export const COMPARISON_EXCLUDED_QUALITIES: readonly PwvQuality[] = ['met-missing', 'delay-sigma-large'];

export interface StationSoundingComparison extends SoundingComparison {
  soundings: SoundingRow[];
  /** Delay sources read, in preference order. */
  sources: string[];
  /** GNSS records left out by quality. */
  excludedGnssRecords: number;
  warnings: string[];
}

/**
 * @param range soundings in this range are compared; GNSS delays are read over it ± the window
 * @param choice delay source: the preferred one per epoch (network-pwv.ts) or one named source
 * @param windowMs half-width of the pairing window [ms]
 */
export async function compareStationSoundings(
  repository: Repository,
  station: Station,
  range: TimeRange,
  choice: Extract<SourceChoice, { kind: 'preferred' | 'one' }>,
  windowMs: number,
): Promise<StationSoundingComparison> {
  const soundings = await repository.readSoundings(station.stationId, range);
  if (soundings.length === 0) {
    return { soundings, sources: [], excludedGnssRecords: 0, warnings: [], ...compareSoundings([], [], windowMs) };
  }
  const gnssRange = { fromMs: soundings[0]!.epochMs - windowMs, toMs: soundings[soundings.length - 1]!.epochMs + windowMs };
  const delays = await repository.readZenithDelays(station.stationId, gnssRange, choice.kind === 'one' ? choice.source : undefined);
  const maxMetGapMs = DEFAULT_MAX_MET_GAP_MS;
  const met = delays.length
    ? await repository.readSurfaceMet(station.stationId, {
        fromMs: delays[0]!.epochMs - maxMetGapMs,
        toMs: delays[delays.length - 1]!.epochMs + maxMetGapMs,
      })
    : [];
  const pwv = networkStationPwv(station, delays, met, choice, { maxMetGapMs });
  const gnss: GnssPwvPoint[] = [];
  let excludedGnssRecords = 0;
  for (const r of pwv.records) {
    if (r.pwvMm === null || COMPARISON_EXCLUDED_QUALITIES.includes(r.quality)) excludedGnssRecords++;
    else gnss.push({ epochMs: r.epochMs, pwvMm: r.pwvMm, pwvSigmaMm: r.pwvSigmaMm });
  }
  const comparison = compareSoundings(
    soundings.map((s) => ({ epochMs: s.epochMs, pwvMm: s.pwvMm })),
    gnss,
    windowMs,
  );
  return { ...comparison, soundings, sources: pwv.sources, excludedGnssRecords, warnings: pwv.warnings };
}
