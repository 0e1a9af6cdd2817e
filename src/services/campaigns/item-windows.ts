/**
 * What one campaign item covers: a station-day, or a station-window (docs/campaigns.md, "Station-windows").
 *
 * A campaign with a window of length L and step S (L ≥ S, both whole hours) cuts its span
 * [start_date 00:00 UTC, end_date + 1 day) into kept parts of S hours, k = 0, 1, …:
 *
 *   kept part  [T0 + k·S, min(T0 + (k+1)·S, T1))          T0, T1 = start and end of the span
 *   window     [T0 + k·S − m, T0 + k·S − m + L)            m = (L − S) / 2, the margin on each side
 *
 * Each item estimates from the observations of its whole window and stores only the epochs of its
 * kept part. The kept parts tile the span, so every epoch is stored by exactly one item. Why the
 * centre: a random-walk estimate is constrained from both sides in the middle of its data but from one
 * side only at its ends, where it is least certain; the margins give every stored epoch data before
 * and after it (m hours each), and the overlap never stores an epoch twice. L = S gives windows side by
 * side (no overlap, nothing discarded), shorter than a day when S < 24 h.
 *
 * A station-day item is the special case L = S = 24 h whose key is the day `YYYY-MM-DD`; a window
 * item's key is the start of its kept part, `YYYY-MM-DDTHH:MM:SSZ`.
 */

import { dayStartMs } from '../../formats/residual-day-form.js';

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

/** Longest window a campaign takes [h] (10 days; the estimation's observation cap applies to its data too). */
export const MAX_WINDOW_HOURS = 240;

export interface WindowSpec {
  /** Length L of a window [ms]. */
  lengthMs: number;
  /** Step S between windows = length of the kept part [ms]; S ≤ L. */
  stepMs: number;
}

export interface ItemSpan {
  /** The item's key: the day (station-days) or the start of the kept part (windows). */
  key: string;
  /** The epochs this item stores: [keepFromMs, keepToMs). */
  keepFromMs: number;
  keepToMs: number;
  /** The observations it estimates from: [fromMs, toMs). */
  fromMs: number;
  toMs: number;
}

/** The span [T0, T1) of a campaign [ms]. */
export function spanMs(startDate: string, endDate: string): { fromMs: number; toMs: number } {
  return { fromMs: dayStartMs(startDate), toMs: dayStartMs(endDate) + DAY_MS };
}

const isoSecond = (ms: number) => new Date(ms).toISOString().replace(/\.\d{3}Z$/, 'Z');

/** Every item span of a campaign, in time order. */
export function itemSpans(startDate: string, endDate: string, window: WindowSpec | null): ItemSpan[] {
  const span = spanMs(startDate, endDate);
  const step = window?.stepMs ?? DAY_MS;
  const out: ItemSpan[] = [];
  for (let from = span.fromMs; from < span.toMs; from += step) out.push(spanAt(from, span.toMs, window));
  return out;
}

function spanAt(keepFromMs: number, spanToMs: number, window: WindowSpec | null): ItemSpan {
  if (!window) {
    return {
      key: new Date(keepFromMs).toISOString().slice(0, 10),
      keepFromMs,
      keepToMs: keepFromMs + DAY_MS,
      fromMs: keepFromMs,
      toMs: keepFromMs + DAY_MS,
    };
  }
  const marginMs = (window.lengthMs - window.stepMs) / 2;
  return {
    key: isoSecond(keepFromMs),
    keepFromMs,
    keepToMs: Math.min(keepFromMs + window.stepMs, spanToMs),
    fromMs: keepFromMs - marginMs,
    toMs: keepFromMs - marginMs + window.lengthMs,
  };
}

/** The span of the item with this key (as itemSpans gives it). */
export function spanOfKey(key: string, startDate: string, endDate: string, window: WindowSpec | null): ItemSpan {
  const from = window ? Date.parse(key) : dayStartMs(key);
  return spanAt(from, spanMs(startDate, endDate).toMs, window);
}

/** The key of the item whose kept part holds `epochMs`; null outside the span. */
export function keyAtEpoch(epochMs: number, startDate: string, endDate: string, window: WindowSpec | null): string | null {
  const span = spanMs(startDate, endDate);
  if (epochMs < span.fromMs || epochMs >= span.toMs) return null;
  const step = window?.stepMs ?? DAY_MS;
  return spanAt(span.fromMs + Math.floor((epochMs - span.fromMs) / step) * step, span.toMs, window).key;
}

/** The UTC days `YYYY-MM-DD` that share some time with [fromMs, toMs). */
export function daysOverlapping(fromMs: number, toMs: number): string[] {
  const out: string[] = [];
  for (let d = Math.floor(fromMs / DAY_MS) * DAY_MS; d < toMs; d += DAY_MS) out.push(new Date(d).toISOString().slice(0, 10));
  return out;
}

/** A window spec from whole hours (the API's `window.length_hours`, `window.step_hours`). */
export function windowFromHours(lengthHours: number, stepHours: number): WindowSpec {
  return { lengthMs: lengthHours * HOUR_MS, stepMs: stepHours * HOUR_MS };
}
