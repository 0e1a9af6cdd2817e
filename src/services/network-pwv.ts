/**
 * PWV and ZTD of many stations in one call: one value per (station, epoch) by a documented source
 * preference, then the retrieval of src/services/station-pwv.ts per station (not duplicated here).
 *
 * Source preference (the default, `source` not given): a station's sources are ranked by the number
 * of delay rows they have over the whole UTC day(s) of the requested range (most first; ties by
 * source name), so a one-epoch call and a call for the whole day rank alike; at each epoch the row
 * of the highest-ranked source present is kept. A station with one
 * continuous producer therefore gets that producer's series, and gaps in it are filled from the
 * next source rather than left empty; the ranking used is reported per station (`sources`).
 * `source=all` keeps every row (two sources at one epoch give two records); `source=<name>` reads
 * that source only.
 */

import type { Station, SurfaceMetRow, ZenithDelayRow } from '../storage/repository.js';
import { stationPrecipitableWater, type StationPwvOptions, type StationPwvRecord } from './station-pwv.js';

export type SourceChoice = { kind: 'preferred' } | { kind: 'all' } | { kind: 'one'; source: string };

/** Sources ranked by row count (most first), ties by name. */
export function rankSources(counts: ReadonlyMap<string, number>): string[] {
  return [...counts.entries()].sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0)).map(([s]) => s);
}

/** One row per epoch: the row of the best-ranked source at that epoch. Rows sorted by (epoch, source). */
export function onePerEpoch<T extends { epochMs: number; source: string }>(rows: readonly T[], ranking: readonly string[]): T[] {
  const rank = new Map(ranking.map((s, i) => [s, i]));
  const out: T[] = [];
  for (const r of rows) {
    const last = out[out.length - 1];
    if (last && last.epochMs === r.epochMs) {
      if (rank.get(r.source)! < rank.get(last.source)!) out[out.length - 1] = r;
    } else {
      out.push(r);
    }
  }
  return out;
}

export interface NetworkStationPwv {
  station: Station;
  /** Sources of the delay rows read, in preference order. */
  sources: string[];
  /** The delay rows behind the records (after the source choice). */
  delays: ZenithDelayRow[];
  records: StationPwvRecord[];
  warnings: string[];
}

/**
 * @param delays rows of the station sorted by (epoch, source)
 * @param met met rows of the station sorted by (epoch, source), covering the delays ± the gap limit
 */
export function networkStationPwv(
  station: Station,
  delays: readonly ZenithDelayRow[],
  met: readonly SurfaceMetRow[],
  choice: SourceChoice,
  options: StationPwvOptions,
  /** Rows per source over the ranking window; default: counted in `delays`. */
  sourceCounts?: ReadonlyMap<string, number>,
): NetworkStationPwv {
  const counts = new Map<string, number>();
  for (const r of delays) counts.set(r.source, sourceCounts?.get(r.source) ?? (counts.get(r.source) ?? 0) + 1);
  const sources = rankSources(counts);
  const chosen = choice.kind === 'preferred' ? onePerEpoch(delays, sources) : [...delays];
  const { records, warnings } = stationPrecipitableWater(station, chosen, met, options);
  return { station, sources, delays: chosen, records, warnings: warnings.map((w) => `${station.stationId}: ${w}`) };
}
