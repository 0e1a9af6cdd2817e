/** Met CSV tables (RFC 4180 via csv-parse): header row of the JSON field names (common practice). */
import { describe, expect, it } from 'vitest';
import { CsvFormatError, csvCell, parseMetCsv } from '../../src/formats/met-csv.js';

describe('met CSV reader (RFC 4180 tables with the JSON field names as header)', () => {
  it('reads columns in any order, numbers as numbers, empty cells as missing, with line numbers', () => {
    const text =
      'temperature_c,epoch,pressure_hpa\r\n12.5,2026-03-14T00:00:00Z,1001.2\r\n\r\n,2026-03-14T00:05:00Z,1e3\r\n13,2026-03-14T00:10:00Z,abc\r\n1,2\r\n';
    const { rows, problems } = parseMetCsv(text);
    expect(rows).toEqual([
      { line: 2, values: { temperature_c: 12.5, epoch: '2026-03-14T00:00:00Z', pressure_hpa: 1001.2 } },
      { line: 4, values: { temperature_c: undefined, epoch: '2026-03-14T00:05:00Z', pressure_hpa: 1000 } },
      { line: 5, values: { temperature_c: 13, epoch: '2026-03-14T00:10:00Z', pressure_hpa: 'abc' } },
    ]);
    expect(problems).toEqual([{ line: 6, reason: '2 cells where the header has 3' }]);
  });

  it('refuses a table with an unknown or missing column as a whole', () => {
    expect(() => parseMetCsv('epoch,pressure\n2026-03-14T00:00:00Z,1000\n')).toThrow(/unknown column "pressure"/);
    expect(() => parseMetCsv('pressure_hpa\n1000\n')).toThrow(/must have a column "epoch"/);
    expect(() => parseMetCsv('')).toThrow(CsvFormatError);
    expect(() => parseMetCsv('epoch,"unterminated\n')).toThrow(CsvFormatError);
  });

  it('quotes cells that need it', () => {
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "x"')).toBe('"say ""x"""');
    expect(csvCell(null)).toBe('');
    expect(csvCell(1.5)).toBe('1.5');
  });
});
