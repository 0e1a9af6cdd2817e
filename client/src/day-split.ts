/**
 * Splits an input file into UTC days, the unit in which uploads are sent and resumed: a CSV table by its
 * `epoch` column, a RINEX meteorological file by its epoch lines (the header repeated in each day's part),
 * JSON records by their `epoch` field. Each part keeps the 1-based line numbers (or indices) its rows had
 * in the file, so a row the service rejects is reported where the user can find it.
 */

export class InputFileError extends Error {
  override name = 'InputFileError';
}

/** The rows of one UTC day and where they stood in the file. */
export interface DayPart {
  /** YYYY-MM-DD (UTC; for RINEX, the day of the file's own time scale, GPS time). */
  day: string;
  /** The day's data lines (CSV, RINEX) without the header. */
  lines: string[];
  /** 1-based file line of each entry of `lines`. */
  fileLines: number[];
}

export interface SplitText {
  /** The header lines repeated at the top of every part. */
  header: string[];
  /** The days in ascending order. */
  parts: DayPart[];
}

/**
 * What to do with a row whose epoch cannot be read: refuse the file, or send it with the row before it
 * (the service then rejects it with its reason).
 */
export type UnreadableEpoch = 'refuse' | 'keep-with-previous';

/** The UTC day (YYYY-MM-DD) of an ISO 8601 date-time, or undefined when it cannot be read. */
export function utcDayOf(epoch: string): string | undefined {
  const ms = Date.parse(epoch);
  return Number.isFinite(ms) && /^\d{4}-\d\d-\d\d/.test(epoch.trim()) ? new Date(ms).toISOString().slice(0, 10) : undefined;
}

/** The fields of one CSV line (RFC 4180 quoting: "a,b" is one field, "" inside quotes is a quote). */
export function csvFields(line: string): string[] {
  const fields: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i]!;
    if (quoted && c === '"' && line[i + 1] === '"') {
      field += '"';
      i++;
    } else if (c === '"') {
      quoted = !quoted;
    } else if (c === ',' && !quoted) {
      fields.push(field);
      field = '';
    } else {
      field += c;
    }
  }
  fields.push(field);
  return fields;
}

/** Lines of a text without a byte-order mark, CR of CRLF, or a final empty line. */
function linesOf(text: string): string[] {
  const lines = text.replace(/^\uFEFF/, '').split('\n');
  if (lines.at(-1) === '') lines.pop();
  return lines.map((l) => (l.endsWith('\r') ? l.slice(0, -1) : l));
}

/** Groups (line, file line, day) triples into ascending days. */
function partsOf(rows: Array<{ line: string; fileLine: number; day: string }>): DayPart[] {
  const byDay = new Map<string, DayPart>();
  for (const row of rows) {
    let part = byDay.get(row.day);
    if (!part) byDay.set(row.day, (part = { day: row.day, lines: [], fileLines: [] }));
    part.lines.push(row.line);
    part.fileLines.push(row.fileLine);
  }
  return [...byDay.values()].sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0));
}

/**
 * A CSV table (header row with an `epoch` column) split into UTC days. Blank lines are dropped.
 * @throws InputFileError without a header or an `epoch` column, or (with `refuse`) at the first unreadable epoch
 */
export function splitCsvByDay(text: string, fileName: string, unreadable: UnreadableEpoch): SplitText {
  const lines = linesOf(text);
  const headerIndex = lines.findIndex((l) => l.trim() !== '');
  if (headerIndex < 0) throw new InputFileError(`${fileName} is empty: expected a header row with an epoch column`);
  const header = lines[headerIndex]!;
  const epochColumn = csvFields(header).findIndex((name) => name.trim() === 'epoch');
  if (epochColumn < 0) throw new InputFileError(`${fileName}, line ${headerIndex + 1}: the header has no epoch column (${header})`);
  const rows: Array<{ line: string; fileLine: number; day: string }> = [];
  // every satellite of an epoch repeats the epoch text: read each text once
  let lastEpoch: string | undefined;
  let lastDay: string | undefined;
  for (let i = headerIndex + 1; i < lines.length; i++) {
    const line = lines[i]!;
    if (line.trim() === '') continue;
    const epoch = (line.includes('"') ? csvFields(line)[epochColumn] : line.split(',', epochColumn + 1)[epochColumn])?.trim() ?? '';
    if (epoch !== lastEpoch) {
      lastEpoch = epoch;
      lastDay = utcDayOf(epoch);
    }
    const day = lastDay ?? (unreadable === 'keep-with-previous' ? rows.at(-1)?.day : undefined);
    if (day === undefined)
      throw new InputFileError(
        `${fileName}, line ${i + 1}: epoch ${JSON.stringify(epoch)} is not an ISO 8601 date-time such as 2026-03-14T00:00:00Z`,
      );
    rows.push({ line, fileLine: i + 1, day });
  }
  if (rows.length === 0) throw new InputFileError(`${fileName} has a header but no rows`);
  return { header: [header], parts: partsOf(rows) };
}

/** True when the text's first line is a RINEX header line of a meteorological file (type M in column 21). */
export function isRinexMet(text: string): boolean {
  const first = linesOf(text.slice(0, 400))[0] ?? '';
  return first.slice(60, 80).trim() === 'RINEX VERSION / TYPE' && first[20] === 'M';
}

// An epoch line: 1X,I2.2,5(1X,I2) in RINEX 2.x, 1X,I4,5(1X,I2) in 3.x ("RINEX" 2.11 Table A4; 3.0x met tables).
// Continuation lines start with 4X, so their second and third columns are blank.
const RINEX_EPOCH_LINE = /^ (\d{4}|\d{2}) ([ \d]\d) ([ \d]\d) /;

/**
 * A RINEX meteorological file split into days of its epochs: the header (through END OF HEADER) heads
 * every part, each epoch line takes its continuation lines with it. Two-digit years 80–99 are 19xx,
 * 00–79 20xx (RINEX 2.11). Lines before the first epoch line (none in a valid file) go with the first day.
 * @throws InputFileError without END OF HEADER or without any epoch line
 */
export function splitRinexMetByDay(text: string, fileName: string): SplitText {
  const lines = linesOf(text);
  const end = lines.findIndex((l) => l.slice(60, 80).trim() === 'END OF HEADER');
  if (end < 0) throw new InputFileError(`${fileName}: the RINEX header has no END OF HEADER line`);
  const rows: Array<{ line: string; fileLine: number; day: string | undefined }> = [];
  let day: string | undefined;
  for (let i = end + 1; i < lines.length; i++) {
    const line = lines[i]!;
    if (line.trim() === '') continue;
    const m = RINEX_EPOCH_LINE.exec(line);
    if (m) {
      const year = m[1]!.length === 4 ? Number(m[1]) : Number(m[1]) + (Number(m[1]) >= 80 ? 1900 : 2000);
      day = `${year}-${m[2]!.trim().padStart(2, '0')}-${m[3]!.trim().padStart(2, '0')}`;
    }
    rows.push({ line, fileLine: i + 1, day });
  }
  const firstDay = rows.find((r) => r.day !== undefined)?.day;
  if (firstDay === undefined) throw new InputFileError(`${fileName}: no epoch line after END OF HEADER`);
  return { header: lines.slice(0, end + 1), parts: partsOf(rows.map((r) => ({ ...r, day: r.day ?? firstDay }))) };
}

/** The text of one part: header lines then the day's lines, newline-terminated. */
export function partText(split: SplitText, part: DayPart): string {
  return [...split.header, ...part.lines].join('\n') + '\n';
}

/** The file line of the part text's 1-based line `lineInPart` (header lines are the file's first lines). */
export function fileLineOf(split: SplitText, part: DayPart, lineInPart: number): number {
  const headerLines = split.header.length;
  return lineInPart <= headerLines ? lineInPart : (part.fileLines[lineInPart - headerLines - 1] ?? lineInPart);
}
