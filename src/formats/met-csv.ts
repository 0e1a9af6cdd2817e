/**
 * Reader of met records as CSV (RFC 4180, comma-separated, via csv-parse/sync): one header row with
 * the JSON field names, then one record per row. Columns: epoch (required), pressure_hpa,
 * temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa, in any order; unknown or
 * repeated columns make the whole table an error. An empty cell is a missing value. Numbers are
 * turned into numbers; anything else stays text, so the record's validation names the cell.
 *
 * Pure: text in, values out.
 */

import { parse } from 'csv-parse/sync';

export const MET_CSV_COLUMNS = ['epoch', 'pressure_hpa', 'temperature_c', 'relative_humidity_pct', 'dewpoint_c', 'vapour_pressure_hpa'] as const;

export class CsvFormatError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(`CSV line ${line}: ${message}`);
  }
}

export interface CsvRow {
  /** 1-based line in the text. */
  line: number;
  values: Record<string, string | number | undefined>;
}

export interface CsvRowProblem {
  line: number;
  reason: string;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * @param text the table
 * @param columns allowed column names; `required` must all be present
 * @returns the rows as objects keyed by column name, and the rows whose cell count is wrong
 * @throws CsvFormatError when the text is not a CSV table with an allowed header
 */
export function parseCsvTable(
  text: string,
  columns: readonly string[],
  required: readonly string[],
): { rows: CsvRow[]; problems: CsvRowProblem[] } {
  let parsed: { record: string[]; info: { lines: number } }[];
  try {
    parsed = parse(text, { info: true, skip_empty_lines: true, trim: true, relax_column_count: true, bom: true }) as unknown as typeof parsed;
  } catch (err) {
    const e = err as { lines?: number; message: string };
    throw new CsvFormatError(e.lines ?? 1, `not a CSV table (${e.message})`);
  }
  if (parsed.length === 0) throw new CsvFormatError(1, `empty; the first row must name the columns (${columns.join(', ')})`);
  const header = parsed[0]!.record.map((h) => h.toLowerCase());
  const headerLine = parsed[0]!.info.lines;
  for (const name of header) {
    if (!columns.includes(name)) {
      throw new CsvFormatError(headerLine, `unknown column "${name}"; the columns are ${columns.join(', ')}`);
    }
  }
  if (new Set(header).size !== header.length) throw new CsvFormatError(headerLine, 'a column appears twice in the header');
  for (const name of required) {
    if (!header.includes(name)) throw new CsvFormatError(headerLine, `the header must have a column "${name}"`);
  }
  const rows: CsvRow[] = [];
  const problems: CsvRowProblem[] = [];
  for (let k = 1; k < parsed.length; k++) {
    const { record, info } = parsed[k]!;
    if (record.length !== header.length) {
      problems.push({ line: info.lines, reason: `${record.length} cells where the header has ${header.length}` });
      continue;
    }
    const values: Record<string, string | number | undefined> = {};
    header.forEach((name, c) => {
      const cell = record[c]!;
      values[name] = cell === '' ? undefined : name !== 'epoch' && NUMBER.test(cell) ? Number(cell) : cell;
    });
    rows.push({ line: info.lines, values });
  }
  return { rows, problems };
}

/** Met table: the columns of MET_CSV_COLUMNS, epoch required. */
export function parseMetCsv(text: string): { rows: CsvRow[]; problems: CsvRowProblem[] } {
  return parseCsvTable(text, MET_CSV_COLUMNS, ['epoch']);
}

/** Quotes a CSV cell when it needs it (RFC 4180). */
export function csvCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return String(value);
  const s = String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
