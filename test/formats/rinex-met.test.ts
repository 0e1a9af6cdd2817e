/**
 * RINEX meteorological files against hand-written examples laid out as the published format
 * description prescribes: "RINEX: The Receiver Independent Exchange Format", version 2.11, Tables
 * A3/A4 (meteorological header and data record), and version 3.04, the meteorological tables.
 * Header labels in columns 61-80; file type 'M' in column 21; # / TYPES OF OBSERV I6,9(4X,A2);
 * data 1X,I2.2,5(1X,I2),mF7.1 (2.11) or 1X,I4,5(1X,I2),mF7.1 (3.x), continuation 4X,10F7.1;
 * epochs in GPS time. Station and sensor names are invented.
 */

import { describe, expect, it } from 'vitest';
import { looksLikeRinexMet, parseRinexMet, RinexFormatError } from '../../src/formats/rinex-met.js';
import { writeRinexMet } from '../../src/formats/rinex-met-writer.js';

/** GPS − UTC in 2026 and in 1996 [s] (IERS Bulletin C leap seconds; from memory). */
const GPS_MINUS_UTC_2026_S = 18;
const GPS_MINUS_UTC_1996_S = 11;

// prettier-ignore
const RINEX_211 = [
  '     2.11           METEOROLOGICAL DATA                     RINEX VERSION / TYPE',
  'HANDWRITTEN         TEST                01-APR-26 00:10     PGM / RUN BY / DATE ',
  'INVENTED STATION FOR TESTS                                  COMMENT             ',
  'FERNHOLT                                                    MARKER NAME         ',
  '     4    PR    TD    HR    WS                              # / TYPES OF OBSERV ',
  'BAROMODEL 1         DIGITAL BAROMETER             0.1    PR SENSOR MOD/TYPE/ACC ',
  'THERMOMODEL 7       PT100                         0.2    TD SENSOR MOD/TYPE/ACC ',
  '  4075580.0000   931850.0000  4801570.0000      612.5000 PR SENSOR POS XYZ/H    ',
  '                                                            END OF HEADER       ',
  ' 26  4  1  0  0  0  987.1   10.6   89.5    3.2',   // line 10
  ' 26  4  1  0  5  0  987.2   10.9           2.8',   // line 11: HR blank
  ' 26  4  1  0 10  0  9x7.2   10.9   90.0    2.8',   // line 12: not a number
  ' 26  4 31  0 15  0  987.2   10.9   90.0    2.8',   // line 13: 31 April
  ' 26  4  1  0 20  0 1200.0   10.9   90.0    2.8',   // line 14: PR out of range
  ' 96  4  1  0 25  0         -12.0',                 // line 15: TD only, 1996
  ' 26  4  1  0 30  0                         1.0',   // line 16: neither PR nor TD
].join('\n');

// prettier-ignore
const RINEX_304 = [
  '     3.04           METEOROLOGICAL DATA                     RINEX VERSION / TYPE',
  'HANDWRITTEN         TEST                20260401 001000 UTC PGM / RUN BY / DATE ',
  'BRACKENWOLD                                                 MARKER NAME         ',
  '    10    PR    TD    HR    ZW    ZD    ZT    WD    WS    RI# / TYPES OF OBSERV ',
  '          HI                                                # / TYPES OF OBSERV ',
  '                                                            END OF HEADER       ',
  ' 2026  4  1 12  0  0 1001.3   21.4   45.0  120.3 2290.1 2410.4  270.0    4.1',
  '        0.0    0.0',
  ' 2026  4  1 12  5  0 1001.4   21.5   44.8',
  '',
].join('\r\n');

describe('RINEX 2.11 meteorological file (RINEX 2.11, Tables A3 and A4)', () => {
  const file = parseRinexMet(RINEX_211);

  it('is recognised by its first header line', () => {
    expect(looksLikeRinexMet(RINEX_211)).toBe(true);
    expect(file.version).toBe('2.11');
    expect(file.markerName).toBe('FERNHOLT');
    expect(file.observationTypes).toEqual(['PR', 'TD', 'HR', 'WS']);
  });

  it('reads the sensor lines (A20,A20,6X,F7.1,4X,A2,1X and 3F14.4,F14.4,1X,A2,1X)', () => {
    expect(file.sensors).toEqual([
      { model: 'BAROMODEL 1', type: 'DIGITAL BAROMETER', accuracy: 0.1, observationType: 'PR', heightM: 612.5 },
      { model: 'THERMOMODEL 7', type: 'PT100', accuracy: 0.2, observationType: 'TD' },
    ]);
  });

  it('reads PR, TD, HR by column, converts GPS time to UTC, and keeps blanks missing', () => {
    expect(file.records).toEqual([
      {
        line: 10,
        epochMs: Date.UTC(2026, 3, 1, 0, 0, 0) - GPS_MINUS_UTC_2026_S * 1000,
        pressureHpa: 987.1,
        temperatureC: 10.6,
        relativeHumidityPct: 89.5,
      },
      {
        line: 11,
        epochMs: Date.UTC(2026, 3, 1, 0, 5, 0) - GPS_MINUS_UTC_2026_S * 1000,
        pressureHpa: 987.2,
        temperatureC: 10.9,
        relativeHumidityPct: null,
      },
      // two-digit year 96 is 1996 (80-99 → 19xx)
      {
        line: 15,
        epochMs: Date.UTC(1996, 3, 1, 0, 25, 0) - GPS_MINUS_UTC_1996_S * 1000,
        pressureHpa: null,
        temperatureC: -12,
        relativeHumidityPct: null,
      },
    ]);
  });

  it('rejects bad records one by one, by line, naming the reason', () => {
    expect(file.rejected.map((r) => r.line)).toEqual([12, 13, 14, 16]);
    expect(file.rejected[0]!.reason).toMatch(/PR value "9x7.2" is not a number/);
    expect(file.rejected[1]!.reason).toMatch(/not a valid date/);
    expect(file.rejected[2]!.reason).toMatch(/PR 1200 hPa is outside 300..1100 hPa/);
    expect(file.rejected[3]!.reason).toMatch(/neither a PR .* nor a TD/);
  });

  it('counts the values of types it does not use (WS here)', () => {
    // WS values of the accepted records on lines 10 and 11 (line 15 has none; rejected records are not counted)
    expect(file.ignoredValues).toEqual({ WS: 2 });
  });
});

describe('RINEX 3.04 meteorological file (RINEX 3.04, meteorological tables): 10 types, continuation lines', () => {
  const file = parseRinexMet(RINEX_304);

  it('reads the 4-digit-year epoch, the first 8 values and the 4X,10F7.1 continuation line', () => {
    expect(file.version).toBe('3.04');
    expect(file.observationTypes).toEqual(['PR', 'TD', 'HR', 'ZW', 'ZD', 'ZT', 'WD', 'WS', 'RI', 'HI']);
    expect(file.rejected).toEqual([]);
    expect(file.records).toEqual([
      {
        line: 7,
        epochMs: Date.UTC(2026, 3, 1, 12, 0, 0) - GPS_MINUS_UTC_2026_S * 1000,
        pressureHpa: 1001.3,
        temperatureC: 21.4,
        relativeHumidityPct: 45,
      },
      {
        line: 9,
        epochMs: Date.UTC(2026, 3, 1, 12, 5, 0) - GPS_MINUS_UTC_2026_S * 1000,
        pressureHpa: 1001.4,
        temperatureC: 21.5,
        relativeHumidityPct: 44.8,
      },
    ]);
    // ZW ZD ZT WD WS of the first record and RI HI of its continuation line are ignored and counted.
    expect(file.ignoredValues).toEqual({ ZW: 1, ZD: 1, ZT: 1, WD: 1, WS: 1, RI: 1, HI: 1 });
  });
});

describe('files that are not what they claim stop as a whole (RINEX 2.11 §5: header rules)', () => {
  const replaceLine = (text: string, index: number, line: string) =>
    text
      .split('\n')
      .map((l, k) => (k === index ? line : l))
      .join('\n');

  it('a text without the RINEX VERSION / TYPE line', () => {
    expect(looksLikeRinexMet('epoch,pressure_hpa\n')).toBe(false);
    expect(() => parseRinexMet('epoch,pressure_hpa\n')).toThrow(/RINEX VERSION \/ TYPE/);
  });

  it('an observation file (type O in column 21)', () => {
    const obs = replaceLine(RINEX_211, 0, '     2.11           OBSERVATION DATA    G (GPS)             RINEX VERSION / TYPE');
    expect(looksLikeRinexMet(obs)).toBe(false);
    expect(() => parseRinexMet(obs)).toThrow(/file type in column 21 is "O"/);
  });

  it('an unsupported version', () => {
    expect(() => parseRinexMet(replaceLine(RINEX_211, 0, RINEX_211.split('\n')[0]!.replace('2.11', '4.00')))).toThrow(
      /version "4.00" is not supported/,
    );
  });

  it('a header without END OF HEADER, or with a type count that does not match', () => {
    expect(() => parseRinexMet(RINEX_211.replace('END OF HEADER', 'END OF HEADEX'))).toThrow(RinexFormatError);
    expect(() => parseRinexMet(RINEX_211.replace('     4    PR', '     5    PR'))).toThrow(
      /observation type 5 "" is not a two-letter code/,
    );
  });

  it('a file with neither PR nor TD', () => {
    expect(() => parseRinexMet(RINEX_211.replace('    PR    TD    HR    WS', '    HR    WS    WD    RI'))).toThrow(/neither PR .* nor TD/);
  });
});

describe('RINEX met writer: output follows the same published layout', () => {
  const epochs = [Date.UTC(2026, 3, 1, 0, 0, 0), Date.UTC(2026, 3, 1, 0, 5, 0)];

  it('writes 2.11 header and data lines column for column like the hand-written example', () => {
    const text = writeRinexMet({
      version: '2.11',
      markerName: 'FERNHOLT',
      program: 'HANDWRITTEN',
      runBy: 'TEST',
      createdAt: new Date(Date.UTC(2026, 3, 1, 0, 10)),
      comments: ['INVENTED STATION FOR TESTS'],
      observationTypes: ['PR', 'TD', 'HR', 'WS'],
      sensors: [
        {
          model: 'BAROMODEL 1',
          type: 'DIGITAL BAROMETER',
          accuracy: 0.1,
          observationType: 'PR',
          xyzM: [4075580, 931850, 4801570],
          heightM: 612.5,
        },
        { model: 'THERMOMODEL 7', type: 'PT100', accuracy: 0.2, observationType: 'TD' },
      ],
      records: [
        { epochMs: epochs[0]! - GPS_MINUS_UTC_2026_S * 1000, values: [987.1, 10.6, 89.5, 3.2] },
        { epochMs: epochs[1]! - GPS_MINUS_UTC_2026_S * 1000, values: [987.2, 10.9, null, 2.8] },
      ],
    });
    expect(text.split('\n').slice(0, 11)).toEqual(RINEX_211.split('\n').slice(0, 11));
  });

  it('writes 3.04 with continuation lines that the reader reads back', () => {
    const types = ['PR', 'TD', 'HR', 'ZW', 'ZD', 'ZT', 'WD', 'WS', 'RI', 'HI'];
    const text = writeRinexMet({
      version: '3.04',
      markerName: 'BRACKENWOLD',
      program: 'HANDWRITTEN',
      runBy: 'TEST',
      createdAt: new Date(Date.UTC(2026, 3, 1, 0, 10)),
      observationTypes: types,
      records: [{ epochMs: Date.UTC(2026, 3, 1, 12, 0, 0) - 18_000, values: [1001.3, 21.4, 45, 120.3, 2290.1, 2410.4, 270, 4.1, 0, 0] }],
    });
    expect(text.split('\n').slice(3, 5)).toEqual(RINEX_304.split('\r\n').slice(3, 5));
    expect(text.split('\n').slice(6, 8)).toEqual(RINEX_304.split('\r\n').slice(6, 8));
    expect(parseRinexMet(text).records[0]).toMatchObject({ pressureHpa: 1001.3, temperatureC: 21.4, relativeHumidityPct: 45 });
  });
});

describe('RINEX met reader: a lying type count, a BOM, a partial last record (issue 11, lower items)', () => {
  const lines = RINEX_211.split('\n');
  const TYPES_LINE = 4; // 0-based: "     4    PR    TD    HR    WS ... # / TYPES OF OBSERV"

  it('refuses a "# / TYPES OF OBSERV" line that lists more codes than its count, naming the line', () => {
    const lying = lines.map((l, k) => (k === TYPES_LINE ? '     3' + l.slice(6) : l)).join('\n');
    expect(() => parseRinexMet(lying)).toThrow(/line 5: the line lists 1 observation type\(s\) more than the declared 3/);
  });

  it('refuses a data record with values past the declared types, naming the line', () => {
    const extra = [...lines.slice(0, 10), lines[10] + '   55.5'].join('\n');
    expect(() => parseRinexMet(extra)).toThrow(/line 11: values past the 4 declared observation types/);
  });

  it('accepts a UTF-8 byte-order mark before the first line', () => {
    const withBom = '\uFEFF' + RINEX_211;
    expect(looksLikeRinexMet(withBom)).toBe(true);
    expect(parseRinexMet(withBom)).toEqual(parseRinexMet(RINEX_211));
  });

  it('refuses a last record cut inside a field or missing its continuation line, naming the line', () => {
    const cut = [...lines.slice(0, 10), lines[10]!.slice(0, 30)].join('\n'); // 18 + 12 characters: inside the 2nd F7.1 field
    expect(() => parseRinexMet(cut)).toThrow(/line 11: the last record is partial/);
    // The same line with a line end (not at the end of the file): that record is rejected, not read as TD 10.
    const file = parseRinexMet(cut + '\n' + lines[10]);
    expect(file.rejected).toEqual([{ line: 11, reason: expect.stringMatching(/line 11 stops inside a field/) }]);
    expect(file.records.map((r) => r.line)).toEqual([10, 12]);
    const noContinuation = RINEX_304.split('\r\n').slice(0, 7).join('\r\n'); // 10 types: one continuation line is due
    expect(() => parseRinexMet(noContinuation)).toThrow(/line 7: the last record is partial: 1 of its 1 continuation line/);
  });
});
