/**
 * GPS time and UTC. GPS time runs without leap seconds from 1980-01-06T00:00:00 UTC, when it equalled
 * UTC; since then UTC has taken leap seconds, so GPS − UTC grows by one second at each.
 *
 * Table: the leap seconds announced in IERS Bulletin C since 1980 (from memory; equals TAI − UTC − 19 s).
 * GPS − UTC = 18 s from 2017-01-01 on. Epochs before 1980-01-06 are outside GPS time (an error).
 * The table must be extended when IERS announces a new leap second (none announced as of writing).
 */

import { ModelDomainError } from './errors.js';

/** UTC instants [ms] from which GPS − UTC took the value [s]. */
const LEAP_STEPS: readonly (readonly [number, number])[] = [
  [Date.UTC(1981, 6, 1), 1],
  [Date.UTC(1982, 6, 1), 2],
  [Date.UTC(1983, 6, 1), 3],
  [Date.UTC(1985, 6, 1), 4],
  [Date.UTC(1988, 0, 1), 5],
  [Date.UTC(1990, 0, 1), 6],
  [Date.UTC(1991, 0, 1), 7],
  [Date.UTC(1992, 6, 1), 8],
  [Date.UTC(1993, 6, 1), 9],
  [Date.UTC(1994, 6, 1), 10],
  [Date.UTC(1996, 0, 1), 11],
  [Date.UTC(1997, 6, 1), 12],
  [Date.UTC(1999, 0, 1), 13],
  [Date.UTC(2006, 0, 1), 14],
  [Date.UTC(2009, 0, 1), 15],
  [Date.UTC(2012, 6, 1), 16],
  [Date.UTC(2015, 6, 1), 17],
  [Date.UTC(2017, 0, 1), 18],
];

/** Start of GPS time, 1980-01-06T00:00:00 UTC [ms]. */
export const GPS_EPOCH_UTC_MS = Date.UTC(1980, 0, 6);

/**
 * @param utcMs instant in UTC [ms since 1970]
 * @returns GPS − UTC at that instant [s]
 */
export function gpsMinusUtcSeconds(utcMs: number): number {
  let offset = 0;
  for (const [fromMs, seconds] of LEAP_STEPS) if (utcMs >= fromMs) offset = seconds;
  return offset;
}

/**
 * A calendar reading in GPS time to the UTC instant.
 * @param gpsMs the GPS calendar reading, encoded as if it were UTC [ms]
 * @returns UTC [ms]
 * @throws ModelDomainError before the start of GPS time
 */
export function gpsToUtcMs(gpsMs: number, field = 'epoch'): number {
  if (gpsMs < GPS_EPOCH_UTC_MS) throw new ModelDomainError(field, 'GPS time starts on 1980-01-06; this epoch is earlier', 400);
  // The offset is looked up at the GPS reading minus the offset itself (exact except within the
  // 18 s after a leap second, where the earlier offset applies).
  const first = gpsMinusUtcSeconds(gpsMs);
  return gpsMs - 1000 * gpsMinusUtcSeconds(gpsMs - 1000 * first);
}

/** UTC [ms] to the GPS calendar reading, encoded as if it were UTC [ms]. */
export function utcToGpsMs(utcMs: number): number {
  return utcMs + 1000 * gpsMinusUtcSeconds(utcMs);
}
