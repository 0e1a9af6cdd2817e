/**
 * The one CSV reader of the service (RFC 4180 via csv-parse/sync): the observation table of an
 * estimation (observation-csv.ts) and the met table of a series upload (met-csv.ts) are both read
 * here. It returns the header, the data rows as text cells with their line numbers, and the rows it
 * could not take (wrong cell count, a cell longer than MAX_CELL_CHARS). Every cell is length-checked
 * here, before any pattern runs on it; numbers are read by readNumber (number-text.ts) only.
 *
 * Pure: text in, values out.
 */

import { CsvError, parse } from 'csv-parse/sync';
import { MAX_CELL_CHARS, MAX_CSV_COLUMNS } from '../limits.js';
import { RecordLimitError } from './format-error.js';

/** The text is not a table at all (a syntax error, no header); `line` is 1-based. */
export class CsvFormatError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(`CSV line ${line}: ${message}`);
  }
}

export interface CsvTextRow {
  /** 1-based line of the row in the text. */
  line: number;
  /** 0-based index among the data rows (after the header; empty and comment lines do not count). */
  row: number;
  cells: string[];
}

export interface CsvRowProblem {
  line: number;
  reason: string;
  /** 0-based data-row index and the column of the offending cell, when one cell is the problem. */
  row?: number;
  column?: string;
}

export interface CsvTable {
  header: string[];
  headerLine: number;
  rows: CsvTextRow[];
  problems: CsvRowProblem[];
}

export interface CsvReadOptions {
  /** Lines starting with this character are skipped (comments). */
  comment?: string;
  /** Header names are compared in lower case. */
  lowercaseHeader?: boolean;
  /**
   * Data rows the table may hold: reading stops at row maxRecords + 1 (the rest of the text is not
   * parsed) with a RecordLimitError naming `what`.
   */
  maxRecords?: { limit: number; what: string };
}

/**
 * Separators in the first line that is not empty or a comment, counted up to MAX_CSV_COLUMNS: a
 * header with more columns is refused before the parser builds it. Commas inside quotes count too,
 * so this can only over-count a header that quotes commas in its names, which no accepted header does.
 */
function checkHeaderWidth(text: string, comment: string | undefined): void {
  let start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  for (let line = 1; start <= text.length; line++) {
    const end = text.indexOf('\n', start);
    const stop = end < 0 ? text.length : end;
    const lineText = text.slice(start, stop).trim();
    if (lineText !== '' && !(comment && lineText.startsWith(comment))) {
      let commas = 0;
      for (let k = lineText.indexOf(','); k >= 0; k = lineText.indexOf(',', k + 1)) {
        if (++commas >= MAX_CSV_COLUMNS)
          throw new CsvFormatError(line, `the header has more than ${MAX_CSV_COLUMNS} columns; a table has at most ${MAX_CSV_COLUMNS}`);
      }
      return;
    }
    if (end < 0) return;
    start = end + 1;
  }
}

/**
 * @returns the table; an empty text (no header row) gives an empty `header`
 * @throws CsvFormatError for text that is not CSV or a header wider than MAX_CSV_COLUMNS
 * @throws RecordLimitError when options.maxRecords is given and the table holds more data rows
 */
export function readCsvTable(text: string, options: CsvReadOptions = {}): CsvTable {
  checkHeaderWidth(text, options.comment);
  const max = options.maxRecords;
  let parsed: { record: string[]; info: { lines: number } }[];
  try {
    parsed = parse(text, {
      // header + limit + 1 data rows: one more than allowed is enough to refuse, and the parser stops there
      ...(max ? { to: max.limit + 2 } : {}),
      info: true,
      skip_empty_lines: true,
      trim: true,
      relax_column_count: true,
      bom: true,
      ...(options.comment ? { comment: options.comment } : {}),
    }) as unknown as typeof parsed;
  } catch (err) {
    if (err instanceof CsvError) {
      const e = err as CsvError & { lines?: number };
      throw new CsvFormatError(e.lines ?? 1, `not a valid CSV table (${e.message})`);
    }
    throw err;
  }
  if (max && parsed.length > max.limit + 1) throw new RecordLimitError(max.limit, parsed[max.limit + 1]!.info.lines, max.what);
  const first = parsed[0];
  if (!first) return { header: [], headerLine: 1, rows: [], problems: [] };
  const header = first.record.map((h) =>
    h.length > MAX_CELL_CHARS ? h.slice(0, 40) + '…' : options.lowercaseHeader ? h.toLowerCase() : h,
  );
  const rows: CsvTextRow[] = [];
  const problems: CsvRowProblem[] = [];
  for (let k = 1; k < parsed.length; k++) {
    const { record, info } = parsed[k]!;
    const row = k - 1;
    if (record.length !== header.length) {
      problems.push({ line: info.lines, row, reason: `${record.length} cells where the header has ${header.length}` });
      continue;
    }
    const long = record.findIndex((cell) => cell.length > MAX_CELL_CHARS);
    if (long >= 0) {
      problems.push({
        line: info.lines,
        row,
        column: header[long]!,
        reason: `${header[long]}: a cell of ${record[long]!.length} characters; at most ${MAX_CELL_CHARS}`,
      });
      continue;
    }
    rows.push({ line: info.lines, row, cells: record });
  }
  return { header, headerLine: first.info.lines, rows, problems };
}

/** Quotes a CSV cell when it needs it (RFC 4180). */
export function csvCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return String(value);
  const s = String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
