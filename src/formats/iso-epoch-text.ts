/**
 * An epoch [ms since 1970-01-01T00:00:00Z] as the text of Date.prototype.toISOString
 * ("YYYY-MM-DDTHH:MM:SS.sssZ"), for the epochs of the answers' row tables (a GPS-like day's series has
 * 2 880): toISOString cost ~0.5 µs an epoch, 1.4 ms of a GPS-like day's answer (issue 14). Here the date
 * part "YYYY-MM-DDT" comes from toISOString once per day (kept while the day does not change: the epochs
 * of a table are mostly in one day) and the time of day from integer arithmetic and tables of two- and
 * three-digit texts, joined by string concatenation (no Date object per epoch).
 *
 * Only whole milliseconds of the years 1970–9999 take this path; anything else (before 1970, from year
 * 10000 on, fractional ms, non-finite) is toISOString's own text (or its RangeError), as before.
 *
 * Pure apart from the one-day cache. Tested against toISOString (test/formats/iso-epoch-text.test.ts).
 */

const MS_PER_DAY = 86_400_000;
/** 10000-01-01T00:00:00Z [ms]: toISOString writes six-digit years from here on. */
const YEAR_10000_MS = 253_402_300_800_000;

const TWO_DIGITS = Array.from({ length: 100 }, (_, i) => String(i).padStart(2, '0'));
const THREE_DIGITS = Array.from({ length: 1000 }, (_, i) => String(i).padStart(3, '0'));

let cachedDay = NaN;
/** "YYYY-MM-DDT" of cachedDay. */
let cachedDate = '';

/** toISOString's text of `ms` [ms since 1970-01-01T00:00:00Z]. */
export function isoEpochText(ms: number): string {
  if (!(ms >= 0 && ms < YEAR_10000_MS) || Math.floor(ms) !== ms) return new Date(ms).toISOString();
  const day = Math.floor(ms / MS_PER_DAY);
  if (day !== cachedDay) {
    cachedDate = new Date(day * MS_PER_DAY).toISOString().slice(0, 11);
    cachedDay = day;
  }
  let rest = ms - day * MS_PER_DAY; // [0, 86 399 999]
  const hours = Math.floor(rest / 3_600_000);
  rest -= hours * 3_600_000;
  const minutes = Math.floor(rest / 60_000);
  rest -= minutes * 60_000;
  const seconds = Math.floor(rest / 1000);
  return `${cachedDate}${TWO_DIGITS[hours]!}:${TWO_DIGITS[minutes]!}:${TWO_DIGITS[seconds]!}.${THREE_DIGITS[rest - seconds * 1000]!}Z`;
}

/** Bytes of the longest text of isoEpochText: a signed six-digit year ("+275760-09-13T00:00:00.000Z"). */
export const ISO_EPOCH_MAX_BYTES = 27;

/** "YYYY-MM-DDT" of cachedAsciiDay, as ASCII bytes. */
const cachedAsciiDate = new Uint8Array(11);
let cachedAsciiDay = NaN;

/** The ASCII text into out[at…], returning where it ends. */
function writeAscii(text: string, out: Uint8Array, at: number): number {
  for (let i = 0; i < text.length; i++) out[at + i] = text.charCodeAt(i);
  return at + text.length;
}

/** value (an integer, < 10^width) as `width` decimal digits into out[at…]; int32 arithmetic (a double's % is fmod). */
function writeDigits(out: Uint8Array, at: number, value: number, width: number): void {
  for (let i = width - 1, v = value | 0; i >= 0; i--, v = (v / 10) | 0) out[at + i] = 0x30 + (v % 10);
}

/**
 * The text of isoEpochText(ms) as ASCII bytes into out[at…] (room for ISO_EPOCH_MAX_BYTES), returning where it
 * ends (or toISOString's RangeError): the text without a string made per epoch, for the Arrow answer's dictionary
 * of epochs (issue 14; at load ~11 a string per epoch, then its pieces joined, cost ~0.2 µs an epoch, the bytes ~0.06 µs).
 */
export function writeIsoEpochAscii(ms: number, out: Uint8Array, at: number): number {
  if (!(ms >= 0 && ms < YEAR_10000_MS) || Math.floor(ms) !== ms) return writeAscii(new Date(ms).toISOString(), out, at);
  const day = Math.floor(ms / MS_PER_DAY);
  if (day !== cachedAsciiDay) {
    writeAscii(new Date(day * MS_PER_DAY).toISOString().slice(0, 11), cachedAsciiDate, 0);
    cachedAsciiDay = day;
  }
  for (let i = 0; i < 11; i++) out[at + i] = cachedAsciiDate[i]!; // (a loop: TypedArray set costs more for 11 bytes)
  const time = (ms - day * MS_PER_DAY) | 0; // [0, 86 399 999]
  writeDigits(out, at + 11, (time / 3_600_000) | 0, 2);
  out[at + 13] = 0x3a; // :
  writeDigits(out, at + 14, ((time / 60_000) | 0) % 60, 2);
  out[at + 16] = 0x3a; // :
  writeDigits(out, at + 17, ((time / 1000) | 0) % 60, 2);
  out[at + 19] = 0x2e; // .
  writeDigits(out, at + 20, time % 1000, 3);
  out[at + 23] = 0x5a; // Z
  return at + 24;
}
