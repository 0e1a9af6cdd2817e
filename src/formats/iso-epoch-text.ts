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
