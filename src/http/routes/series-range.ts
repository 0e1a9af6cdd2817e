/**
 * The time range of a series read: from/to as given, with defaults, checked against the maximum
 * range per request (TROPO_MAX_READ_RANGE_DAYS, default 366 days).
 *
 * - both given: from ≤ to, and to − from ≤ the maximum range;
 * - only from: to = from + maximum; only to: from = to − maximum;
 * - neither: the maximum range ending at the station's latest stored epoch of that series (or now).
 */

import type { Repository, TimeRange } from '../../storage/repository.js';
import { HttpProblem } from '../problem.js';
import { rangeEndMs, rangeStartMs } from '../schemas/range-bounds.js';

export const DAY_MS = 86_400_000;

export async function resolveSeriesRange(
  repository: Repository,
  stationId: string,
  series: 'met' | 'delays',
  query: { from?: string | undefined; to?: string | undefined },
  maxRangeDays: number,
): Promise<TimeRange> {
  const maxMs = Math.round(maxRangeDays * DAY_MS);
  const fromMs = query.from === undefined ? undefined : rangeStartMs(query.from);
  const toMs = query.to === undefined ? undefined : rangeEndMs(query.to);
  if (fromMs !== undefined && toMs !== undefined) {
    if (fromMs > toMs) {
      throw new HttpProblem(400, `query.from (${query.from}) must not be after query.to (${query.to})`, [
        { field: 'query.from', message: 'must be at or before query.to' },
      ]);
    }
    if (toMs - fromMs > maxMs) {
      throw new HttpProblem(
        400,
        `the range from..to spans ${((toMs - fromMs) / DAY_MS).toFixed(2)} days; one request reads at most ${maxRangeDays} days`,
        [{ field: 'query.to', message: `must be at most ${maxRangeDays} days after query.from` }],
      );
    }
    return { fromMs, toMs };
  }
  if (fromMs !== undefined) return { fromMs, toMs: fromMs + maxMs };
  if (toMs !== undefined) return { fromMs: toMs - maxMs, toMs };
  const latest = (await repository.latestEpochMs(stationId, series)) ?? Date.now();
  return { fromMs: latest - maxMs, toMs: latest };
}
