/**
 * Bounds of a time range in a query: an ISO 8601 date-time (UTC or with an offset) or a date alone
 * (YYYY-MM-DD, a UTC calendar day). A date alone as the start means 00:00:00.000Z of that day; as the
 * end, the last millisecond of that day (23:59:59.999Z), so `from=2026-07-10&to=2026-07-10` is that
 * whole day, with the inclusive bounds every series read uses.
 */

import { z } from 'zod';

const DATE_ONLY = /^\d{4}-\d{2}-\d{2}$/;
const DAY_MS = 86_400_000;
const MESSAGE = 'must be an ISO 8601 date-time (e.g. 2026-03-14T12:00:00Z) or a date (2026-03-14, a whole UTC day)';

const dateTime = z.iso.datetime({ offset: true });
const date = z.iso.date();

/** A range bound as text: date-time or date (validated; the text is kept for messages). */
export const rangeBoundSchema = z
  .string({ error: MESSAGE })
  .refine((s) => dateTime.safeParse(s).success || date.safeParse(s).success, { error: MESSAGE })
  .describe('ISO 8601 date-time (UTC, or with an offset converted to UTC) or a date alone (YYYY-MM-DD, a whole UTC day)');

/** Start of a range [ms]: a date alone is 00:00 UTC of that day. */
export function rangeStartMs(text: string): number {
  return Date.parse(DATE_ONLY.test(text) ? `${text}T00:00:00Z` : text);
}

/** Inclusive end of a range [ms]: a date alone is the last millisecond of that UTC day. */
export function rangeEndMs(text: string): number {
  return DATE_ONLY.test(text) ? Date.parse(`${text}T00:00:00Z`) + DAY_MS - 1 : Date.parse(text);
}
