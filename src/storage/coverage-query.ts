/**
 * Data coverage of the stored delay series, computed in the database (both backends, one SQL text):
 * per station and source the first and last epoch and the record count (GROUP BY), and the gaps
 * between consecutive records longer than a threshold (LAG over the series, a window function of
 * SQLite ≥ 3.25 and PostgreSQL). Nothing row by row reaches JavaScript: a station-year at 30 s
 * (~1 M rows) comes back as one aggregate row per source plus at most `maxGaps` gap rows.
 *
 * Relies on: table delay_records with columns station_id, source, epoch_ms (the names the series
 * readers use).
 *
 * A gap is the span between two consecutive records of one station and source whose spacing is
 * longer than gapMinMs; spans before the first or after the last record of the range are not gaps
 * (first/last epoch say those). gapCount and gapTotalMs count every gap; `gaps` holds the longest
 * maxGaps of them (ties: the earlier first), in time order.
 */

export interface CoverageQuery {
  stationIds: readonly string[];
  /** Inclusive [ms]. */
  fromMs: number;
  /** Inclusive [ms]. */
  toMs: number;
  /** Spacing above which two consecutive records enclose a gap [ms]. */
  gapMinMs: number;
  /** Most gaps listed per station and source (the longest). */
  maxGaps: number;
}

export interface SeriesCoverage {
  source: string;
  firstMs: number;
  lastMs: number;
  recordCount: number;
  gapCount: number;
  /** Sum of the gaps' lengths (last record before → first record after) [ms]. */
  gapTotalMs: number;
  /** The longest gaps, in time order: [last record before, first record after] [ms]. */
  gaps: { fromMs: number; toMs: number }[];
}

/** SQL parameters: 1 stations, 2 from, 3 to (the spans statement uses these three), 4 gap threshold, 5 most gaps. */
export type CoverageParams = [stationIds: unknown, fromMs: number, toMs: number, gapMinMs: number, maxGaps: number];

/**
 * The two statements, for a backend whose parameter n is written `param(n)` and whose test "station_id
 * is one of parameter 1" is `stationFilter`.
 */
export function coverageSql(param: (n: number) => string, stationFilter: string): { spans: string; gaps: string } {
  const where = `${stationFilter} AND epoch_ms BETWEEN ${param(2)} AND ${param(3)}`;
  return {
    spans:
      'SELECT station_id, source, MIN(epoch_ms) AS first_ms, MAX(epoch_ms) AS last_ms, COUNT(*) AS n ' +
      `FROM delay_records WHERE ${where} GROUP BY station_id, source ORDER BY station_id, source`,
    gaps:
      'SELECT station_id, source, gap_from, gap_to, gap_count, gap_total FROM (' +
      ' SELECT station_id, source, prev AS gap_from, epoch_ms AS gap_to,' +
      '  ROW_NUMBER() OVER (PARTITION BY station_id, source ORDER BY epoch_ms - prev DESC, prev) AS k,' +
      '  COUNT(*) OVER (PARTITION BY station_id, source) AS gap_count,' +
      '  SUM(epoch_ms - prev) OVER (PARTITION BY station_id, source) AS gap_total' +
      ' FROM (SELECT station_id, source, epoch_ms, LAG(epoch_ms) OVER (PARTITION BY station_id, source ORDER BY epoch_ms) AS prev' +
      `  FROM delay_records WHERE ${where}) steps` +
      ` WHERE epoch_ms - prev > ${param(4)}` +
      `) g WHERE k <= ${param(5)} ORDER BY station_id, source, gap_from`,
  };
}

export const coverageParams = (q: CoverageQuery, stationIds: unknown): CoverageParams => [
  stationIds,
  q.fromMs,
  q.toMs,
  q.gapMinMs,
  q.maxGaps,
];

/** Rows as the two statements return them (numbers may arrive as text from PostgreSQL's BIGINT). */
export type SpanRow = [stationId: string, source: string, firstMs: unknown, lastMs: unknown, n: unknown];
export type GapRow = [stationId: string, source: string, fromMs: unknown, toMs: unknown, count: unknown, totalMs: unknown];

/** Station id → its series' coverage (sources by name; stations without records in the range absent). */
export function foldCoverage(spans: readonly SpanRow[], gaps: readonly GapRow[]): Map<string, SeriesCoverage[]> {
  const out = new Map<string, SeriesCoverage[]>();
  const bySeries = new Map<string, SeriesCoverage>();
  for (const [id, source, first, last, n] of spans) {
    const c: SeriesCoverage = {
      source,
      firstMs: Number(first),
      lastMs: Number(last),
      recordCount: Number(n),
      gapCount: 0,
      gapTotalMs: 0,
      gaps: [],
    };
    bySeries.set(JSON.stringify([id, source]), c);
    const list = out.get(id);
    if (list) list.push(c);
    else out.set(id, [c]);
  }
  for (const [id, source, from, to, count, total] of gaps) {
    const c = bySeries.get(JSON.stringify([id, source]));
    if (!c) continue; // a gap row always has its span row; kept safe for a write between the two statements
    c.gapCount = Number(count);
    c.gapTotalMs = Number(total);
    c.gaps.push({ fromMs: Number(from), toMs: Number(to) });
  }
  return out;
}
