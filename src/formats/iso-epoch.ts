/**
 * The writer of ISO 8601 UTC epochs for series answers (JSON and CSV): the text Date#toISOString
 * gives, with the date and the times of day cached, because a station-year formats 100 000 epochs of
 * a few hundred days.
 */

const DAY_MS = 86_400_000;
let cachedDay = Number.NaN;
let cachedDayPrefix = '';
const pad2 = (n: number) => (n < 10 ? `0${n}` : `${n}`);
/** "HH:mm:ss.sssZ" by millisecond of the day: a series repeats the same times of day every day. */
const timeOfDayTexts = new Map<number, string>();
const MAX_CACHED_TIMES = 100_000;

function timeOfDayText(msOfDay: number): string {
  let text = timeOfDayTexts.get(msOfDay);
  if (text === undefined) {
    const hours = Math.floor(msOfDay / 3_600_000);
    const minutes = Math.floor((msOfDay % 3_600_000) / 60_000);
    const seconds = Math.floor((msOfDay % 60_000) / 1000);
    const millis = msOfDay % 1000;
    text = `${pad2(hours)}:${pad2(minutes)}:${pad2(seconds)}.${millis < 10 ? `00${millis}` : millis < 100 ? `0${millis}` : millis}Z`;
    if (timeOfDayTexts.size >= MAX_CACHED_TIMES) timeOfDayTexts.clear();
    timeOfDayTexts.set(msOfDay, text);
  }
  return text;
}

/**
 * ISO 8601 UTC text of an epoch [ms], as Date#toISOString gives it (YYYY-MM-DDTHH:mm:ss.sssZ), with
 * the date part and the times of day cached: series reads format 100 000 epochs of a few hundred days.
 */
export function isoEpoch(ms: number): string {
  if (!(ms >= 0 && ms < 253_402_300_800_000)) return new Date(ms).toISOString(); // before 1970 or after 9999
  const day = Math.floor(ms / DAY_MS);
  if (day !== cachedDay) {
    cachedDay = day;
    cachedDayPrefix = new Date(day * DAY_MS).toISOString().slice(0, 11);
  }
  return cachedDayPrefix + timeOfDayText(ms - day * DAY_MS);
}
