/**
 * Paged reads of a station's series (keyset pagination), shared by both backends: the rows of
 * readMet / readSurfaceMet / readDelays / readZenithDelays in pages of at most `pageRows`, each page
 * one indexed statement that starts after the last key (epoch, source) of the page before it.
 *
 * Why: better-sqlite3 is synchronous, so one read of a station-year (about 105 000 rows at 5-min
 * sampling) holds the event loop for the whole statement. A page of a few thousand rows is a few
 * milliseconds, and the caller yields to the loop between pages (src/http/streamed-answer.ts).
 *
 * Consistency: each page is its own statement, so a write that lands between two pages may be seen
 * by the later pages only. Rows are keyed by (station, epoch, source), so a page never repeats or
 * skips a key that existed throughout the read; the answer is what a single read at some moment
 * between the first and the last page would give for each key.
 */

import type { PageReadOptions, SeriesPageKind, SeriesPageRows, TimeRange } from './repository.js';
import {
  DELAY_SELECT,
  MET_SELECT,
  SURFACE_MET_SELECT,
  ZENITH_DELAY_SELECT,
  delayFromArray,
  metFromArray,
  surfaceMetFromArray,
  zenithDelayFromArray,
  type MetArrayRow,
} from './rows.js';

const KINDS: {
  [K in SeriesPageKind]: { table: 'met_records' | 'delay_records'; columns: string; row: (r: unknown[]) => SeriesPageRows[K] };
} = {
  met: { table: 'met_records', columns: MET_SELECT, row: (r) => metFromArray(r as MetArrayRow) },
  'surface-met': { table: 'met_records', columns: SURFACE_MET_SELECT, row: surfaceMetFromArray },
  delays: { table: 'delay_records', columns: DELAY_SELECT, row: delayFromArray },
  'zenith-delays': { table: 'delay_records', columns: ZENITH_DELAY_SELECT, row: zenithDelayFromArray },
};

/** Bound values of one page, by name (SQLite `@name`; PostgreSQL `$n` in this order). */
export interface PageValues {
  station: string;
  /** Lower bound of epoch_ms for the index range: the range start, then the last epoch read [ms]. */
  lowMs: number;
  highMs: number;
  /** Rows after this key only: (afterMs, afterSource). */
  afterMs: number;
  afterSource: string;
  pageRows: number;
  source?: string;
}

const PARAM_ORDER = ['station', 'lowMs', 'highMs', 'afterMs', 'afterSource', 'pageRows', 'source'] as const;

/**
 * SQL of one page, ordered by (epoch, source). Every column list starts with epoch_ms, source (rows.ts),
 * which is the key the next page starts after. `table` and `columns` are this module's constants.
 */
export function pageReadSql(table: string, columns: string, bySource: boolean, dialect: 'sqlite' | 'postgres'): string {
  const p = (name: (typeof PARAM_ORDER)[number]) => (dialect === 'sqlite' ? `@${name}` : `$${PARAM_ORDER.indexOf(name) + 1}`);
  const source = bySource ? ` AND source = ${p('source')}` : '';
  return (
    `SELECT ${columns} FROM ${table} WHERE station_id = ${p('station')} AND epoch_ms BETWEEN ${p('lowMs')} AND ${p('highMs')}` +
    ` AND (epoch_ms > ${p('afterMs')} OR (epoch_ms = ${p('afterMs')} AND source > ${p('afterSource')}))${source}` +
    ` ORDER BY epoch_ms, source LIMIT ${p('pageRows')}`
  );
}

/** The values of `pageReadSql` as an array in `$n` order (PostgreSQL). */
export const positionalValues = (v: PageValues): unknown[] =>
  PARAM_ORDER.filter((k) => k !== 'source' || v.source !== undefined).map((k) => v[k]);

/**
 * The pages of a read. `fetchPage(sql, values)` runs one page statement on the backend and returns its
 * raw rows (arrays in the column order); a page shorter than pageRows is the last.
 */
export async function* seriesPages<K extends SeriesPageKind>(
  kind: K,
  stationId: string,
  range: TimeRange,
  options: PageReadOptions,
  dialect: 'sqlite' | 'postgres',
  fetchPage: (sql: string, values: PageValues) => Promise<unknown[][]> | unknown[][],
): AsyncGenerator<SeriesPageRows[K][], void, undefined> {
  if (!(Number.isInteger(options.pageRows) && options.pageRows >= 1)) throw new RangeError(`pageRows must be an integer ≥ 1`);
  const { table, columns, row } = KINDS[kind];
  const sql = pageReadSql(table, columns, options.source !== undefined, dialect);
  // Epochs are whole milliseconds, so "after fromMs − 1" is "from fromMs on", whatever the source.
  let afterMs = range.fromMs - 1;
  let afterSource = '';
  for (;;) {
    const raw = await fetchPage(sql, {
      station: stationId,
      lowMs: Math.max(range.fromMs, afterMs),
      highMs: range.toMs,
      afterMs,
      afterSource,
      pageRows: options.pageRows,
      ...(options.source !== undefined ? { source: options.source } : {}),
    });
    if (raw.length === 0) return;
    const last = raw[raw.length - 1]!;
    afterMs = Number(last[0]);
    afterSource = last[1] as string;
    yield raw.map(row);
    if (raw.length < options.pageRows) return;
  }
}
