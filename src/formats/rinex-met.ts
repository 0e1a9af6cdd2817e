/**
 * Reader of RINEX meteorological observation files, versions 2.10/2.11 and 3.00–3.05.
 *
 * Source: "RINEX: The Receiver Independent Exchange Format", version 2.11 (Gurtner & Estey, 2007),
 * Tables A3 (header) and A4 (data record), and version 3.0x (IGS/RTCM-SC104), the meteorological data
 * file tables. Header lines carry their label in columns 61–80. The file is recognised by its first
 * line, "RINEX VERSION / TYPE", with the version in columns 1–9 (F9.2) and the file type 'M' in
 * column 21.
 *
 *   # / TYPES OF OBSERV   I6, 9(4X,A2); continuation lines 6X, 9(4X,A2)
 *   data record, 2.x      1X,I2.2,5(1X,I2) epoch (2-digit year: 80–99 → 19xx, 00–79 → 20xx), mF7.1
 *   data record, 3.x      1X,I4,5(1X,I2)   epoch (4-digit year),                                mF7.1
 *   more than 8 values    continuation lines 4X,10F7.1
 *
 * Epochs in the format are GPS time ("not local time"); they are converted to UTC here with the
 * leap-second table of src/domain/time-scales.ts.
 *
 * Observation types used: PR pressure [mbar = hPa], TD dry temperature [°C], HR relative humidity [%].
 * Other types (ZW, ZD, ZT wet/dry/total zenith delay [mm], WD wind azimuth, WS wind speed, RI rain
 * increment, HI hail indicator, and any other code) are ignored; the reader counts their values in the records it accepts.
 * A blank field is a missing value. A record with neither PR nor TD is rejected, as is one with a
 * value that is not a number or lies outside the service's ranges (PR 300–1100 hPa, TD −90–60 °C,
 * HR 0–100 %). A header that breaks the format is an error for the whole file, and so is a
 * "# / TYPES OF OBSERV" line listing more codes than its count declares, a data record with values
 * past the declared types (the header lies about the types: no column is dropped silently), and a
 * partial last record (continuation lines missing at the end, or a last line without a line end that
 * stops inside a field). A UTF-8 byte-order mark before the first line is skipped.
 *
 * At most MAX_MET_RECORDS records (accepted and rejected): the reader stops at the next epoch line
 * with a RecordLimitError, without reading the rest of the text.
 *
 * Pure: text in, values out; no I/O.
 */

import { readNumber } from './number-text.js';
import { RecordLimitError } from './format-error.js';
import { gpsToUtcMs } from '../domain/time-scales.js';
import { MAX_MET_RECORDS } from '../limits.js';

export const USED_RINEX_MET_TYPES = ['PR', 'TD', 'HR'] as const;
export type UsedRinexMetType = (typeof USED_RINEX_MET_TYPES)[number];

const RANGES: Record<UsedRinexMetType, [number, number, string]> = {
  PR: [300, 1100, 'hPa'],
  TD: [-90, 60, '°C'],
  HR: [0, 100, '%'],
};

export interface RinexMetRecord {
  /** 1-based line of the record's epoch in the file. */
  line: number;
  /** UTC [ms]. */
  epochMs: number;
  pressureHpa: number | null;
  temperatureC: number | null;
  relativeHumidityPct: number | null;
}

export interface RinexMetSensor {
  model: string;
  type: string;
  accuracy: number | null;
  observationType: string;
  /** Ellipsoidal height of the sensor from SENSOR POS XYZ/H [m], when given. */
  heightM?: number;
}

export interface RinexMetFile {
  version: string;
  markerName: string | null;
  observationTypes: string[];
  sensors: RinexMetSensor[];
  records: RinexMetRecord[];
  rejected: { line: number; reason: string }[];
  /** Values of observation types that are not used, counted per type. */
  ignoredValues: Record<string, number>;
}

/** The file does not follow the format (bad header): nothing of it can be used. */
export class RinexFormatError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(`RINEX meteorological file, line ${line}: ${message}`);
  }
}

const label = (line: string) => line.slice(60, 80).trim();

/** True when the text starts like a RINEX meteorological file (first line label and type 'M'). */
export function looksLikeRinexMet(text: string): boolean {
  const first = withoutBom(text).slice(0, 200).split(/\r?\n/, 1)[0] ?? '';
  return label(first) === 'RINEX VERSION / TYPE' && first[20] === 'M';
}

const withoutBom = (text: string) => (text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);

/** The lines of a text one at a time (\n or \r\n), so that a reader that stops early never splits the rest. */
class LineCursor {
  private pos = 0;
  /** 1-based number of the line returned last. */
  lineNo = 0;
  /** The line returned last ended with a line break. */
  terminated = false;
  constructor(private readonly text: string) {}
  next(): string | undefined {
    if (this.pos > this.text.length) return undefined;
    const end = this.text.indexOf('\n', this.pos);
    const stop = end < 0 ? this.text.length : end;
    const line = this.text.slice(this.pos, stop > this.pos && this.text.charCodeAt(stop - 1) === 13 ? stop - 1 : stop);
    this.terminated = end >= 0;
    this.pos = end < 0 ? this.text.length + 1 : end + 1;
    this.lineNo++;
    return line;
  }
}

function parseField(raw: string): number | null | 'bad' {
  const s = raw.trim();
  if (s === '') return null;
  return readNumber(s, { fortranExponent: true }) ?? 'bad';
}

/**
 * @throws RinexFormatError when the file breaks the format (header, a lying type count, a partial last record)
 * @throws RecordLimitError at record MAX_MET_RECORDS + 1
 */
export function parseRinexMet(text: string): RinexMetFile {
  const lines = new LineCursor(withoutBom(text));
  const first = lines.next() ?? '';
  if (label(first) !== 'RINEX VERSION / TYPE') {
    throw new RinexFormatError(1, 'the first line must carry the label "RINEX VERSION / TYPE" in columns 61-80');
  }
  if (first[20] !== 'M') {
    throw new RinexFormatError(1, `file type in column 21 is "${first[20] ?? ''}", a meteorological file has "M"`);
  }
  const versionText = first.slice(0, 9).trim();
  const version = Number(versionText);
  const major = Math.floor(version);
  if (!Number.isFinite(version) || !((version >= 2.1 && version < 3) || (version >= 3 && version < 3.06))) {
    throw new RinexFormatError(1, `version "${versionText}" is not supported; versions 2.10, 2.11 and 3.00-3.05 are`);
  }

  let markerName: string | null = null;
  const types: string[] = [];
  let declaredTypes: number | null = null;
  const sensors: RinexMetSensor[] = [];
  let endOfHeader = false;
  for (let line = lines.next(); line !== undefined; line = lines.next()) {
    const lineNo = lines.lineNo;
    const what = label(line);
    if (what === 'END OF HEADER') {
      endOfHeader = true;
      break;
    }
    if (what === 'MARKER NAME') markerName = line.slice(0, 60).trim() || null;
    else if (what === '# / TYPES OF OBSERV') {
      const countText = line.slice(0, 6).trim();
      if (countText !== '') {
        if (declaredTypes !== null) throw new RinexFormatError(lineNo, '"# / TYPES OF OBSERV" appears twice');
        declaredTypes = Number(countText);
        if (!Number.isInteger(declaredTypes) || declaredTypes < 1 || declaredTypes > 99) {
          throw new RinexFormatError(lineNo, `number of observation types "${countText}" must be an integer 1-99 (I6, columns 1-6)`);
        }
      } else if (declaredTypes === null) {
        throw new RinexFormatError(lineNo, 'a continuation of "# / TYPES OF OBSERV" before its first line');
      }
      const typesBefore = types.length;
      for (let k = 0; k < 9 && types.length < declaredTypes; k++) {
        const code = line.slice(10 + 6 * k, 12 + 6 * k).trim();
        if (!/^[A-Z]{2}$/.test(code)) {
          throw new RinexFormatError(
            lineNo,
            `observation type ${types.length + 1} "${code}" is not a two-letter code (4X,A2 fields from column 7)`,
          );
        }
        types.push(code);
      }
      const extra = listedCodes(line).length - (types.length - typesBefore);
      if (extra > 0) {
        throw new RinexFormatError(
          lineNo,
          `the line lists ${extra} observation type(s) more than the declared ${declaredTypes} ("# / TYPES OF OBSERV" count, columns 1-6); the header must declare every type`,
        );
      }
    } else if (what === 'SENSOR MOD/TYPE/ACC') {
      const accuracy = parseField(line.slice(46, 53));
      sensors.push({
        model: line.slice(0, 20).trim(),
        type: line.slice(20, 40).trim(),
        accuracy: typeof accuracy === 'number' ? accuracy : null,
        observationType: line.slice(57, 59).trim(),
      });
    } else if (what === 'SENSOR POS XYZ/H') {
      const h = parseField(line.slice(42, 56));
      const type = line.slice(57, 59).trim();
      const sensor = sensors.find((s) => s.observationType === type);
      if (sensor && typeof h === 'number') sensor.heightM = h;
    }
  }
  if (!endOfHeader) throw new RinexFormatError(lines.lineNo, 'no "END OF HEADER" line');
  const headerEnd = lines.lineNo;
  if (declaredTypes === null || types.length !== declaredTypes) {
    throw new RinexFormatError(
      headerEnd,
      `the header must declare the observation types ("# / TYPES OF OBSERV"); found ${types.length} of ${declaredTypes ?? 0}`,
    );
  }
  if (!types.some((t) => t === 'PR' || t === 'TD')) {
    throw new RinexFormatError(
      headerEnd,
      `the file has neither PR (pressure) nor TD (dry temperature) among its types (${types.join(', ')})`,
    );
  }

  const epochWidth = major === 2 ? 18 : 20;
  const continuationLines = types.length > 8 ? Math.ceil((types.length - 8) / 10) : 0;
  const records: RinexMetRecord[] = [];
  const rejected: { line: number; reason: string }[] = [];
  const ignoredValues: Record<string, number> = {};

  let recordCount = 0;
  for (let line = lines.next(); line !== undefined; line = lines.next()) {
    const lineNo = lines.lineNo;
    if (line.trim() === '') continue;
    if (++recordCount > MAX_MET_RECORDS) throw new RecordLimitError(MAX_MET_RECORDS, lineNo, 'met records');
    const fields: string[] = [];
    const onFirstLine = Math.min(8, types.length);
    for (let k = 0; k < onFirstLine; k++) fields.push(line.slice(epochWidth + 7 * k, epochWidth + 7 * (k + 1)));
    checkNothingPast(line, epochWidth + 7 * onFirstLine, lineNo, types.length);
    const recordLines = [{ text: line, lineNo, start: epochWidth }];
    for (let c = 0; c < continuationLines; c++) {
      const next = lines.next();
      if (next === undefined) {
        throw new RinexFormatError(
          lineNo,
          `the last record is partial: ${continuationLines - c} of its ${continuationLines} continuation line(s) are missing at the end of the file`,
        );
      }
      const before = fields.length;
      for (let k = 0; k < 10 && fields.length < types.length; k++) fields.push(next.slice(4 + 7 * k, 4 + 7 * (k + 1)));
      checkNothingPast(next, 4 + 7 * (fields.length - before), lines.lineNo, types.length);
      recordLines.push({ text: next, lineNo: lines.lineNo, start: 4 });
    }
    const cut = recordLines.find((l) => endsInsideField(l.text, l.start));
    if (cut && !lines.terminated && cut === recordLines[recordLines.length - 1]) {
      throw new RinexFormatError(
        cut.lineNo,
        `the last record is partial: the file ends inside a field (${cut.text.trimEnd().length} characters; fields are F7.1 from column ${cut.start + 1})`,
      );
    }
    if (cut) {
      rejected.push({
        line: lineNo,
        reason: `line ${cut.lineNo} stops inside a field (${cut.text.trimEnd().length} characters; right-aligned F7.1 fields from column ${cut.start + 1}): the line was cut`,
      });
      continue;
    }

    const epoch = parseEpoch(line.slice(0, epochWidth), major);
    if (typeof epoch === 'string') {
      rejected.push({ line: lineNo, reason: epoch });
      continue;
    }
    let epochMs: number;
    try {
      epochMs = gpsToUtcMs(epoch);
    } catch (err) {
      rejected.push({ line: lineNo, reason: (err as Error).message });
      continue;
    }

    const values: Partial<Record<UsedRinexMetType, number>> = {};
    const ignoredHere: string[] = [];
    let problem: string | null = null;
    types.forEach((type, k) => {
      if (problem) return;
      const v = parseField(fields[k] ?? '');
      if (v === 'bad') {
        problem = `${type} value "${(fields[k] ?? '').trim()}" is not a number (F7.1)`;
        return;
      }
      if (v === null) return;
      if (type === 'PR' || type === 'TD' || type === 'HR') {
        const [min, max, unit] = RANGES[type];
        if (!(v >= min && v <= max)) problem = `${type} ${v} ${unit} is outside ${min}..${max} ${unit}`;
        else values[type] = v;
      } else {
        ignoredHere.push(type);
      }
    });
    if (problem) {
      rejected.push({ line: lineNo, reason: problem });
      continue;
    }
    if (values.PR === undefined && values.TD === undefined) {
      rejected.push({ line: lineNo, reason: 'the record has neither a PR (pressure) nor a TD (temperature) value' });
      continue;
    }
    for (const type of ignoredHere) ignoredValues[type] = (ignoredValues[type] ?? 0) + 1;
    records.push({
      line: lineNo,
      epochMs,
      pressureHpa: values.PR ?? null,
      temperatureC: values.TD ?? null,
      relativeHumidityPct: values.HR ?? null,
    });
  }

  return { version: versionText, markerName, observationTypes: types, sensors, records, rejected, ignoredValues };
}

/** The type codes a "# / TYPES OF OBSERV" line lists (4X,A2 fields from column 7, up to the label). */
function listedCodes(line: string): string[] {
  const codes: string[] = [];
  for (let k = 0; k < 9; k++) {
    const code = line.slice(10 + 6 * k, 12 + 6 * k).trim();
    if (code !== '') codes.push(code);
  }
  return codes;
}

/** A data line carries nothing past its declared fields, else the header lies about the number of types. */
function checkNothingPast(line: string, end: number, lineNo: number, declared: number): void {
  if (line.length > end && line.slice(end).trim() !== '') {
    throw new RinexFormatError(
      lineNo,
      `values past the ${declared} declared observation types (from column ${end + 1}); the header's "# / TYPES OF OBSERV" must list every type of the records`,
    );
  }
}

/**
 * The line stops inside its epoch or inside an F7.1 field (fields start at column `start` + 1), i.e.
 * it was cut; values are right-aligned, so a whole line ends on a field boundary.
 */
function endsInsideField(line: string, start: number): boolean {
  const end = line.trimEnd().length;
  return end === 0 ? false : end < start || (end - start) % 7 !== 0;
}

/** @returns the GPS calendar reading encoded as UTC ms, or the reason it is not an epoch */
function parseEpoch(text: string, major: number): number | string {
  const parts =
    major === 2
      ? [text.slice(1, 3), text.slice(4, 6), text.slice(7, 9), text.slice(10, 12), text.slice(13, 15), text.slice(16, 18)]
      : [text.slice(1, 5), text.slice(6, 8), text.slice(9, 11), text.slice(12, 14), text.slice(15, 17), text.slice(18, 20)];
  if (!parts.every((p) => /^\s*\d+$/.test(p))) {
    return `epoch "${text.trim()}" does not follow the format (${major === 2 ? '1X,I2.2,5(1X,I2)' : '1X,I4,5(1X,I2)'})`;
  }
  const [y, mo, d, h, mi, s] = parts.map((p) => Number(p)) as [number, number, number, number, number, number];
  const year = major === 2 ? (y >= 80 ? 1900 + y : 2000 + y) : y;
  const ms = Date.UTC(year, mo - 1, d, h, mi, s);
  const back = new Date(ms);
  if (mo < 1 || mo > 12 || back.getUTCDate() !== d || h > 23 || mi > 59 || s > 59) {
    return `epoch "${text.trim()}" is not a valid date and time`;
  }
  return ms;
}
