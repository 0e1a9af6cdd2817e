/**
 * The observation table of a ZWD estimation as CSV: a header row naming the columns
 * epoch,satellite,elevation_deg,azimuth_deg,residual_m[,sigma_m] in any order, then one observation
 * per row; lines starting with # are comments. Read by the one CSV reader (csv-table.ts), numbers by
 * readNumber. The rows become records keyed by the JSON field names, so that the request's schema
 * validates CSV and JSON alike and names the same fields (observations.N is data row N, 0-based,
 * i.e. line N + 2 of a file without comments). A cell that is not a numeral stays text for the
 * schema to refuse.
 *
 * Pure: text in, values out.
 */

import { CsvFormatError, readCsvTable } from './csv-table.js';
import { FormatError } from './format-error.js';
import { readNumber } from './number-text.js';
import { MAX_OBSERVATIONS } from '../limits.js';

export const OBSERVATION_CSV_REQUIRED_COLUMNS = ['epoch', 'satellite', 'elevation_deg', 'azimuth_deg', 'residual_m'] as const;
export const OBSERVATION_CSV_OPTIONAL_COLUMNS = ['sigma_m'] as const;
const NUMERIC_COLUMNS = new Set(['elevation_deg', 'azimuth_deg', 'residual_m', 'sigma_m']);

export type ObservationCsvRecord = Record<string, string | number>;

/**
 * @param options.leadingColumns required text columns besides the observation's own (e.g. `station`)
 * @returns one record per data row (text cells, numbers where a numeric column holds a numeral;
 *   an empty sigma_m is left out)
 * @throws FormatError naming `body` (not CSV, empty, a wrong header) or `observations.N[.column]`
 *   (a row with the wrong number of cells, an over-long cell)
 */
export function readObservationCsv(text: string, options: { leadingColumns?: readonly string[] } = {}): ObservationCsvRecord[] {
  // More required text columns before the observation's own (the network routes' `station`).
  const required: readonly string[] = [...(options.leadingColumns ?? []), ...OBSERVATION_CSV_REQUIRED_COLUMNS];
  const known: readonly string[] = [...required, ...OBSERVATION_CSV_OPTIONAL_COLUMNS];
  let table;
  try {
    table = readCsvTable(text, { comment: '#', maxRecords: { limit: MAX_OBSERVATIONS, what: 'observations' } });
  } catch (err) {
    if (err instanceof CsvFormatError) throw new FormatError('body', err.message.replace(/^CSV line \d+: /, ''));
    throw err;
  }
  const { header } = table;
  if (header.length === 0) {
    throw new FormatError(
      'body',
      `the CSV table is empty; it needs a header row (${required.join(',')}[,sigma_m]) and at least one observation`,
    );
  }
  const unknown = header.filter((c) => !known.includes(c));
  const missing = required.filter((c) => !header.includes(c));
  const repeated = header.filter((c, i) => header.indexOf(c) !== i);
  if (unknown.length || missing.length || repeated.length) {
    const parts = [
      missing.length ? `missing column(s) ${missing.join(', ')}` : '',
      unknown.length ? `unknown column(s) ${unknown.join(', ')}` : '',
      repeated.length ? `repeated column(s) ${repeated.join(', ')}` : '',
    ].filter(Boolean);
    throw new FormatError('body', `${parts.join('; ')}: the header row must name ${required.join(', ')} and optionally sigma_m`);
  }
  const problem = table.problems[0];
  if (problem) {
    const field = `observations.${problem.row}${problem.column ? `.${problem.column}` : ''}`;
    throw new FormatError(field, `line ${problem.line}: ${problem.reason}`);
  }
  const out = new Array<ObservationCsvRecord>(table.rows.length);
  for (let r = 0; r < table.rows.length; r++) {
    const cells = table.rows[r]!.cells;
    const obs: ObservationCsvRecord = {};
    for (let c = 0; c < header.length; c++) {
      const name = header[c]!;
      const cell = cells[c]!;
      if (name === 'sigma_m' && cell === '') continue;
      obs[name] = NUMERIC_COLUMNS.has(name) ? (readNumber(cell) ?? cell) : cell;
    }
    out[r] = obs;
  }
  return out;
}
