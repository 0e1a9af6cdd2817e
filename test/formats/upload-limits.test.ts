/**
 * Limits of the upload readers, enforced while reading: MAX_MET_RECORDS (100 000) records of a met
 * CSV table or a RINEX meteorological file, MAX_OBSERVATIONS rows of an observation table, and
 * MAX_CSV_COLUMNS columns of any CSV header (src/limits.ts). "Before parsing finishes" is checked
 * without a clock: text placed after the first record past the limit would make the reader throw a
 * different error (a CSV syntax error, a partial RINEX record) if it were read.
 * RINEX layout: version 2.11, Tables A3/A4 (data 1X,I2.2,5(1X,I2),mF7.1). Data are a seeded
 * synthetic series (pressure 900 hPa + index/1000, temperature 10 °C); station names invented.
 */

import { describe, expect, it } from 'vitest';
import { CsvFormatError, readCsvTable } from '../../src/formats/csv-table.js';
import { RecordLimitError } from '../../src/formats/format-error.js';
import { parseMetCsv } from '../../src/formats/met-csv.js';
import { readObservationCsv } from '../../src/formats/observation-csv.js';
import { parseRinexMet } from '../../src/formats/rinex-met.js';
import { MAX_CSV_COLUMNS, MAX_MET_RECORDS, MAX_OBSERVATIONS } from '../../src/limits.js';

const T0 = Date.UTC(2026, 0, 1);

export function metCsv(rows: number, tail = ''): string {
  const out = ['epoch,pressure_hpa,temperature_c'];
  for (let k = 0; k < rows; k++) out.push(`${new Date(T0 + k * 30_000).toISOString()},${(900 + k / 1000).toFixed(3)},10`);
  return out.join('\n') + '\n' + tail;
}

const RINEX_HEADER = [
  '     2.11           METEOROLOGICAL DATA                     RINEX VERSION / TYPE',
  'OXLEY HOLLOW                                                MARKER NAME         ',
  '     2    PR    TD                                          # / TYPES OF OBSERV ',
  '                                                            END OF HEADER       ',
];

/** 2.11 data line: epoch 1X,I2.2,5(1X,I2) then 2F7.1 (RINEX 2.11 Table A4). */
function rinexLine(k: number): string {
  const d = new Date(T0 + k * 30_000);
  const two = (n: number) => String(n).padStart(2, ' ');
  const epoch = ` ${String(d.getUTCFullYear() % 100).padStart(2, '0')} ${two(d.getUTCMonth() + 1)} ${two(d.getUTCDate())} ${two(d.getUTCHours())} ${two(d.getUTCMinutes())} ${two(d.getUTCSeconds())}`;
  return epoch + (900 + (k % 100) / 10).toFixed(1).padStart(7) + '   10.0';
}

export function rinexMet(records: number, tail = ''): string {
  const out = [...RINEX_HEADER];
  for (let k = 0; k < records; k++) out.push(rinexLine(k));
  return out.join('\n') + '\n' + tail;
}

describe('record limit of the met CSV reader (MAX_MET_RECORDS = 100 000)', () => {
  it('takes exactly the limit', () => {
    expect(MAX_MET_RECORDS).toBe(100_000);
    const { rows, problems } = parseMetCsv(metCsv(MAX_MET_RECORDS));
    expect(rows).toHaveLength(MAX_MET_RECORDS);
    expect(problems).toEqual([]);
  }, 60_000);

  it('refuses 1.1 M rows at row 100 001, naming the limit, without reading what follows', () => {
    // An unterminated quote after the rows: a CsvFormatError if the reader went on.
    const text = metCsv(1_100_000, 'x,"unterminated\n');
    expect(() => readCsvTable(metCsv(3, 'x,"unterminated\n'))).toThrow(CsvFormatError);
    let err: unknown;
    try {
      parseMetCsv(text);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RecordLimitError);
    expect((err as RecordLimitError).limit).toBe(100_000);
    expect((err as RecordLimitError).line).toBe(100_002); // header on line 1
    expect((err as Error).message).toMatch(/more than 100000 met records/);
  }, 120_000);
});

describe('record limit of the RINEX met reader (MAX_MET_RECORDS = 100 000)', () => {
  it('takes exactly the limit', () => {
    const file = parseRinexMet(rinexMet(MAX_MET_RECORDS));
    expect(file.records).toHaveLength(MAX_MET_RECORDS);
    expect(file.rejected).toEqual([]);
  }, 60_000);

  it('refuses 1.1 M records at record 100 001, naming the limit, without reading what follows', () => {
    // A last line cut inside a field (no line end): a partial record if the reader went on.
    const cut = rinexLine(0).slice(0, 22);
    expect(() => parseRinexMet(rinexMet(3, cut))).toThrow(/partial/);
    let err: unknown;
    try {
      parseRinexMet(rinexMet(1_100_000, cut));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RecordLimitError);
    expect((err as RecordLimitError).limit).toBe(100_000);
    expect((err as RecordLimitError).line).toBe(RINEX_HEADER.length + 100_001);
  }, 120_000);
});

describe('record limit of the observation CSV reader (MAX_OBSERVATIONS)', () => {
  it('refuses the first row past the limit', () => {
    const row = '2026-01-01T00:00:00Z,G01,45,90,0.001';
    const text =
      ['epoch,satellite,elevation_deg,azimuth_deg,residual_m', ...new Array<string>(MAX_OBSERVATIONS + 1).fill(row)].join('\n') +
      '\nx,"unterminated\n';
    expect(() => readObservationCsv(text)).toThrow(new RecordLimitError(MAX_OBSERVATIONS, MAX_OBSERVATIONS + 2, 'observations'));
  }, 180_000);
});

describe('column limit of every CSV header (MAX_CSV_COLUMNS)', () => {
  it('refuses a header of 10^6 columns before parsing, naming the limit', () => {
    // A syntax error on line 2: reached only if the table were parsed.
    const header = Array.from({ length: 1_000_000 }, (_, k) => `c${k}`).join(',');
    expect(() => readCsvTable(`${header}\n"broken\n`)).toThrow(new RegExp(`more than ${MAX_CSV_COLUMNS} columns`));
    expect(() => parseMetCsv(`${header}\n`)).toThrow(CsvFormatError);
    expect(() => readObservationCsv(`# comment\n${header}\n`)).toThrow(/more than 64 columns/);
  });

  it('takes a header of exactly the limit (after comments and blank lines, with a BOM)', () => {
    const header = Array.from({ length: MAX_CSV_COLUMNS }, (_, k) => `c${k}`).join(',');
    const table = readCsvTable(`\uFEFF# note, with, commas\n\n${header}\n${'1,'.repeat(MAX_CSV_COLUMNS - 1)}1\n`, { comment: '#' });
    expect(table.header).toHaveLength(MAX_CSV_COLUMNS);
    expect(table.rows).toHaveLength(1);
  });
});
