// How the client cuts input files into the UTC days it uploads and resumes by. Expected days come from
// the calendar (UTC offsets per ISO 8601) and from the RINEX 2.11 and 3.0x met record layouts.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  csvFields,
  fileLineOf,
  InputFileError,
  isRinexMet,
  partText,
  splitCsvByDay,
  splitRinexMetByDay,
  utcDayOf,
} from '../../client/src/day-split.js';

describe('ISO 8601 epochs to UTC days (ISO 8601-1:2019 §4.3.13: a local time with its offset from UTC)', () => {
  it('converts an offset before taking the day', () => {
    expect(utcDayOf('2026-03-14T23:30:00-01:00')).toBe('2026-03-15'); // 23:30 − (−01:00) = 00:30 next day
    expect(utcDayOf('2026-03-15T00:30:00+02:00')).toBe('2026-03-14'); // 00:30 − 02:00 = 22:30 the day before
    expect(utcDayOf('2026-03-14T23:59:59.999Z')).toBe('2026-03-14');
    expect(utcDayOf('2024-02-29T12:00:00Z')).toBe('2024-02-29'); // a leap day
  });
  it('reads nothing from a text that is not a date-time', () => {
    expect(utcDayOf('yesterday')).toBeUndefined();
    expect(utcDayOf('1710374400')).toBeUndefined(); // seconds, not ISO 8601
    expect(utcDayOf('')).toBeUndefined();
  });
});

describe('CSV fields (RFC 4180 §2: quoted fields may hold commas, "" is a quote)', () => {
  it('splits quoted and plain fields', () => {
    expect(csvFields('a,"b,c",d')).toEqual(['a', 'b,c', 'd']);
    expect(csvFields('"say ""hi""",,x')).toEqual(['say "hi"', '', 'x']);
  });
});

describe('CSV tables split by the epoch column', () => {
  const table = [
    'satellite,epoch,residual_m',
    'G01,2026-03-15T00:00:00Z,0.1',
    'G02,2026-03-14T23:59:30Z,0.2',
    '',
    'G03,"2026-03-15T01:00:00+02:00",0.3',
    'G04,2026-03-16T00:00:00Z,0.4',
  ].join('\r\n');

  it('groups rows by UTC day in ascending order, keeps the header and the file line of every row', () => {
    const split = splitCsvByDay(table, 't.csv', 'refuse');
    expect(split.parts.map((p) => p.day)).toEqual(['2026-03-14', '2026-03-15', '2026-03-16']);
    // line 5: 01:00+02:00 is 23:00 UTC on the 14th; line 4 is blank and dropped
    expect(split.parts.map((p) => p.fileLines)).toEqual([[3, 5], [2], [6]]);
    const day14 = split.parts[0]!;
    expect(partText(split, day14)).toBe('satellite,epoch,residual_m\nG02,2026-03-14T23:59:30Z,0.2\nG03,"2026-03-15T01:00:00+02:00",0.3\n');
    // the service's line 3 of that part (header = line 1) is the file's line 5
    expect(fileLineOf(split, day14, 3)).toBe(5);
    expect(fileLineOf(split, day14, 1)).toBe(1);
  });

  it('refuses an unreadable epoch with its file line, or keeps it with the row before', () => {
    const bad = 'epoch,residual_m\n2026-03-14T00:00:00Z,1\nnoon,2\n';
    expect(() => splitCsvByDay(bad, 'bad.csv', 'refuse')).toThrow(/bad\.csv, line 3: epoch "noon" is not an ISO 8601/);
    expect(splitCsvByDay(bad, 'bad.csv', 'keep-with-previous').parts).toEqual([
      { day: '2026-03-14', lines: ['2026-03-14T00:00:00Z,1', 'noon,2'], fileLines: [2, 3] },
    ]);
  });

  it('refuses a table without an epoch column or without rows', () => {
    expect(() => splitCsvByDay('time,residual_m\n1,2\n', 'x.csv', 'refuse')).toThrow(InputFileError);
    expect(() => splitCsvByDay('time,residual_m\n1,2\n', 'x.csv', 'refuse')).toThrow(/no epoch column/);
    expect(() => splitCsvByDay('epoch,residual_m\n', 'x.csv', 'refuse')).toThrow(/no rows/);
    expect(() => splitCsvByDay('', 'x.csv', 'refuse')).toThrow(/empty/);
  });

  it('cuts the 3-day demo met table into 3 days of 24 hourly records', () => {
    const split = splitCsvByDay(readFileSync('fixtures/demo/BRACK-met.csv', 'utf8'), 'BRACK-met.csv', 'refuse');
    expect(split.parts.map((p) => [p.day, p.lines.length])).toEqual([
      ['2026-03-01', 24],
      ['2026-03-02', 24],
      ['2026-03-03', 24],
    ]);
  });
});

describe('RINEX meteorological files ("RINEX: The Receiver Independent Exchange Format" 2.11, Tables A3/A4; 3.0x met tables)', () => {
  // 2.11 data record: 1X,I2.2,5(1X,I2),mF7.1, more than 8 values continued on 4X,10F7.1 lines;
  // two-digit years 80–99 are 19xx, 00–79 20xx.
  const header2 = [
    '     2.11           METEOROLOGICAL DATA                     RINEX VERSION / TYPE',
    '    10    PR    TD    HR    PR    TD    HR    PR    TD    HR# / TYPES OF OBSERV',
    '                                                            END OF HEADER',
  ];
  const values8 = '  990.1   12.3   55.0  990.1   12.3   55.0  990.1   12.3';
  const rinex2 = [
    ...header2,
    ` 99 12 31 23 59 30${values8}`,
    '     55.0',
    ` 00  1  1  0  0  0${values8}`,
    '     55.0',
    ` 00  1  1  1  0  0${values8}`,
    '     55.0',
  ].join('\n');

  it('recognises a met file by its first header line (type M in column 21)', () => {
    expect(isRinexMet(rinex2)).toBe(true);
    expect(isRinexMet(rinex2.replace('METEOROLOGICAL', 'OBSERVATION   ').replace(/^(.{20})M/, '$1O'))).toBe(false);
    expect(isRinexMet('epoch,pressure_hpa\n')).toBe(false);
  });

  it('splits epochs by day, year 99 → 1999 and 00 → 2000, continuation lines with their epoch, header in every part', () => {
    const split = splitRinexMetByDay(rinex2, 'm.99m');
    expect(split.header).toHaveLength(3);
    expect(split.parts.map((p) => [p.day, p.lines.length])).toEqual([
      ['1999-12-31', 2],
      ['2000-01-01', 4],
    ]);
    expect(split.parts[1]!.fileLines).toEqual([6, 7, 8, 9]);
    expect(partText(split, split.parts[0]!).split('\n').slice(0, 3)).toEqual(header2);
  });

  it('reads 3.0x four-digit years (1X,I4,5(1X,I2))', () => {
    const rinex3 = [
      '     3.04           METEOROLOGICAL DATA                     RINEX VERSION / TYPE',
      '                                                            END OF HEADER',
      ' 2026  7 10 23  0  0  991.0   22.0',
      ' 2026  7 11  0  0  0  991.2   21.5',
    ].join('\n');
    expect(splitRinexMetByDay(rinex3, 'm.rnx').parts.map((p) => p.day)).toEqual(['2026-07-10', '2026-07-11']);
  });

  it('cuts the 2-day demo file (RINEX 2.11) into its two days of 24 hourly records', () => {
    const split = splitRinexMetByDay(readFileSync('fixtures/demo/SALTM-met-days1-2.26m', 'utf8'), 'SALTM');
    expect(split.parts.map((p) => [p.day, p.lines.length])).toEqual([
      ['2026-03-01', 24],
      ['2026-03-02', 24],
    ]);
  });

  it('refuses a header without END OF HEADER', () => {
    expect(() => splitRinexMetByDay(header2[0]!, 'm.26m')).toThrow(/END OF HEADER/);
  });
});
