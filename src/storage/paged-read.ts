/**
 * Paged reads of a station's series (keyset pagination), shared by both backends: the rows of
 * readMet / readSurfaceMet / readDelays / readZenithDelays in pages of at most `pageRows`, each page
 * one indexed statement that starts after the last epoch of the page before it. Rows are clustered
 * by (station, source, epoch) (migration 4), so a read without a source reads each source in its own
 * pages and merges them into pages ordered by (epoch, source).
 *
 * Why: better-sqlite3 is synchronous, so one read of a station-year (about 105 000 rows at 5-min
 * sampling) holds the event loop for the whole statement. A page of a few thousand rows is a few
 * milliseconds, and the caller yields to the loop between pages (src/http/streamed-answer.ts).
 *
 * Consistency: each page is its own statement, so a write that lands between two pages may be seen
 * by the later pages only. Rows are keyed by (station, source, epoch), so a page never repeats or
 * skips a key that existed throughout the read (a source that first appears in the range after the
 * read started is not read); the answer is what a single read at some moment
 * between the first and the last page would give for each key.
 */

import type { PageReadOptions, SeriesPageKind, SeriesPageRows, TimeRange } from './repository.js';
import {
  DELAY_SELECT,
  MET_SELECT,
  READ_RELATION,
  SURFACE_MET_SELECT,
  ZENITH_DELAY_SELECT,
  delayFromArray,
  metFromArray,
  surfaceMetFromArray,
  zenithDelayFromArray,
  type MetArrayRow,
  type SeriesTable,
} from './rows.js';

const KINDS: {
  [K in SeriesPageKind]: { table: SeriesTable; columns: string; row: (r: unknown[]) => SeriesPageRows[K] };
} = {
  met: { table: 'met_records', columns: MET_SELECT, row: (r) => metFromArray(r as MetArrayRow) },
  'surface-met': { table: 'met_records', columns: SURFACE_MET_SELECT, row: surfaceMetFromArray },
  delays: { table: 'delay_records', columns: DELAY_SELECT, row: delayFromArray },
  'zenith-delays': { table: 'delay_records', columns: ZENITH_DELAY_SELECT, row: zenithDelayFromArray },
};

/** Bound values of one page of one source, by name (SQLite `@name`; PostgreSQL `$n` in this order). */
export interface PageValues {
  station: string;
  source: string;
  /** Rows after this epoch only: the range start − 1, then the last epoch read [ms]. */
  afterMs: number;
  highMs: number;
  pageRows: number;
}

const PARAM_ORDER = ['station', 'source', 'afterMs', 'highMs', 'pageRows'] as const;

/**
 * SQL of one page of one source, ordered by epoch: one range of the primary key (station_id, source,
 * epoch_ms). Every column list starts with epoch_ms, source (rows.ts). `table` and `columns` are this
 * module's constants.
 */
export function pageReadSql(table: SeriesTable, columns: string, dialect: 'sqlite' | 'postgres'): string {
  const p = (name: (typeof PARAM_ORDER)[number]) => (dialect === 'sqlite' ? `@${name}` : `$${PARAM_ORDER.indexOf(name) + 1}`);
  return (
    `SELECT ${columns} FROM ${READ_RELATION[table]} WHERE station_id = ${p('station')} AND source = ${p('source')}` +
    ` AND epoch_ms > ${p('afterMs')} AND epoch_ms <= ${p('highMs')} ORDER BY epoch_ms LIMIT ${p('pageRows')}`
  );
}

/** The values of `pageReadSql` as an array in `$n` order (PostgreSQL). */
export const positionalValues = (v: PageValues): unknown[] => PARAM_ORDER.map((k) => v[k]);

/** What a backend gives the paged read. */
export interface PageSource {
  /** The sources of the station whose rows may fall in the range, ascending (rows.ts sourcesSql). */
  sources(table: SeriesTable, stationId: string, range: TimeRange): Promise<string[]> | string[];
  /** Runs one page statement and returns its raw rows (arrays in the column order). */
  fetchPage(sql: string, values: PageValues): Promise<unknown[][]> | unknown[][];
}

/** One source's read position: rows fetched but not yet given out, and where the next fetch starts. */
interface SourceCursor {
  source: string;
  buffered: unknown[][];
  afterMs: number;
  exhausted: boolean;
}

/**
 * The pages of a read: each source of the station is read in its own keyset pages (rows of a source
 * are contiguous in the primary key), and the sources are merged into pages ordered by (epoch, source).
 * Before a page is merged, every source that is not exhausted holds at least pageRows rows, so no
 * source can run dry inside a page while it still has rows stored.
 */
export async function* seriesPages<K extends SeriesPageKind>(
  kind: K,
  stationId: string,
  range: TimeRange,
  options: PageReadOptions,
  dialect: 'sqlite' | 'postgres',
  backend: PageSource,
): AsyncGenerator<SeriesPageRows[K][], void, undefined> {
  if (!(Number.isInteger(options.pageRows) && options.pageRows >= 1)) throw new RangeError(`pageRows must be an integer ≥ 1`);
  const { table, columns, row } = KINDS[kind];
  const sql = pageReadSql(table, columns, dialect);
  const sources = options.source !== undefined ? [options.source] : await backend.sources(table, stationId, range);
  // Epochs are whole milliseconds, so "after fromMs − 1" is "from fromMs on".
  const cursors: SourceCursor[] = sources.map((source) => ({ source, buffered: [], afterMs: range.fromMs - 1, exhausted: false }));
  for (;;) {
    for (const c of cursors) {
      if (c.exhausted || c.buffered.length >= options.pageRows) continue;
      const raw = await backend.fetchPage(sql, {
        station: stationId,
        source: c.source,
        afterMs: c.afterMs,
        highMs: range.toMs,
        pageRows: options.pageRows,
      });
      if (raw.length > 0) c.afterMs = Number(raw[raw.length - 1]![0]);
      c.exhausted = raw.length < options.pageRows;
      for (const r of raw) c.buffered.push(r);
    }
    const page = takeMerged(cursors, options.pageRows);
    if (page.length === 0) return;
    yield page.map(row);
  }
}

/** Takes up to `n` rows in (epoch, source) order from the cursors' buffers (sources ascending). */
function takeMerged(cursors: SourceCursor[], n: number): unknown[][] {
  if (cursors.length === 1) return cursors[0]!.buffered.splice(0, n);
  const taken = cursors.map(() => 0);
  const page: unknown[][] = [];
  while (page.length < n) {
    let best = -1;
    let bestMs = Infinity;
    for (let k = 0; k < cursors.length; k++) {
      const r = cursors[k]!.buffered[taken[k]!];
      if (r !== undefined && Number(r[0]) < bestMs) {
        best = k;
        bestMs = Number(r[0]);
      }
    }
    if (best < 0) break;
    page.push(cursors[best]!.buffered[taken[best]!++]!);
  }
  cursors.forEach((c, k) => c.buffered.splice(0, taken[k]));
  return page;
}
