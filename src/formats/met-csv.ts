/**
 * Reader of met records as CSV (csv-table.ts): one header row with the JSON field names, then one
 * record per row. Columns: epoch (required), source, pressure_hpa, temperature_c,
 * relative_humidity_pct, dewpoint_c, vapour_pressure_hpa, in any order; unknown or repeated columns
 * make the whole table an error. An empty cell is a missing value. Numbers are turned into numbers
 * (readNumber); anything else stays text, so the record's validation names the cell. `epoch` and
 * `source` stay text. These are the columns GET /v1/stations/{id}/met?format=csv writes, so a met
 * CSV the service wrote uploads back unchanged (a row's `source` names its producer).
 *
 * Pure: text in, values out.
 */

import { CsvFormatError, readCsvTable, type CsvRowProblem } from './csv-table.js';
import { readNumber } from './number-text.js';
import { MAX_MET_RECORDS } from '../limits.js';

export { CsvFormatError, csvCell, type CsvRowProblem } from './csv-table.js';

export const MET_CSV_COLUMNS = [
  'epoch',
  'source',
  'pressure_hpa',
  'temperature_c',
  'relative_humidity_pct',
  'dewpoint_c',
  'vapour_pressure_hpa',
] as const;

export interface CsvRow {
  /** 1-based line in the text. */
  line: number;
  values: Record<string, string | number | undefined>;
}

/**
 * @param text the table
 * @param columns allowed column names; `required` must all be present
 * @returns the rows as objects keyed by column name, and the rows that could not be read
 * @throws CsvFormatError when the text is not a CSV table with an allowed header
 * @throws RecordLimitError (format-error.ts) when the table has more than `maxRecords` data rows
 */
export function parseCsvTable(
  text: string,
  columns: readonly string[],
  required: readonly string[],
  maxRecords?: { limit: number; what: string },
): { rows: CsvRow[]; problems: CsvRowProblem[] } {
  const table = readCsvTable(text, { lowercaseHeader: true, ...(maxRecords ? { maxRecords } : {}) });
  if (table.header.length === 0) throw new CsvFormatError(1, `empty; the first row must name the columns (${columns.join(', ')})`);
  const { header, headerLine } = table;
  for (const name of header) {
    if (!columns.includes(name)) throw new CsvFormatError(headerLine, `unknown column "${name}"; the columns are ${columns.join(', ')}`);
  }
  if (new Set(header).size !== header.length) throw new CsvFormatError(headerLine, 'a column appears twice in the header');
  for (const name of required) {
    if (!header.includes(name)) throw new CsvFormatError(headerLine, `the header must have a column "${name}"`);
  }
  const rows: CsvRow[] = new Array(table.rows.length);
  table.rows.forEach(({ line, cells }, k) => {
    const values: Record<string, string | number | undefined> = {};
    for (let c = 0; c < header.length; c++) {
      const name = header[c]!;
      const cell = cells[c]!;
      values[name] = cell === '' ? undefined : name === 'epoch' || name === 'source' ? cell : (readNumber(cell) ?? cell);
    }
    rows[k] = { line, values };
  });
  return { rows, problems: table.problems.map(({ line, reason }) => ({ line, reason })) };
}

/** Met table: the columns of MET_CSV_COLUMNS, epoch required, at most MAX_MET_RECORDS rows (RecordLimitError past them). */
export function parseMetCsv(text: string): { rows: CsvRow[]; problems: CsvRowProblem[] } {
  return parseCsvTable(text, MET_CSV_COLUMNS, ['epoch'], { limit: MAX_MET_RECORDS, what: 'met records' });
}
