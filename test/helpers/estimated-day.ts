/**
 * A simulated day (test/helpers/gps-like-days.ts `dayRequest`) through the estimation service as the route runs
 * it (the body's schema with its defaults, the observation columns converted by the route's adapter), and met
 * records over part of it: the domain results the answer writers' tests shape both ways.
 */

import { observationsFromColumns, toZwdRequest } from '../../src/http/adapters/zwd-estimation.js';
import { zwdEstimatesRequest } from '../../src/http/schemas/zwd-estimates.js';
import { runZwdEstimation, type ZwdEstimationResult } from '../../src/services/zwd-estimation.js';
import { dayRequest } from './gps-like-days.js';
import type { SkyOptions } from './realistic-sky.js';

/** A day of the sky simulation through the estimation service, as the route runs it (body schema, adapters). */
export function estimatedDay(sky: Partial<SkyOptions>, extra: Record<string, unknown> = {}): ZwdEstimationResult {
  const { columns, rest } = dayRequest(sky, extra);
  // The rest of the body through its schema (defaults applied), the observation columns converted as the route does.
  const first = { epoch: columns.epoch[0], satellite: columns.satellite[0], elevation_deg: 45, azimuth_deg: 0, residual_m: 0 };
  const parsed = zwdEstimatesRequest.parse({ ...rest, observations: [first] });
  const site = { latitudeDeg: parsed.site.latitude_deg, longitudeDeg: parsed.site.longitude_deg, heightM: parsed.site.height_m };
  return runZwdEstimation(toZwdRequest(site, parsed, observationsFromColumns(columns)));
}

/** Met records every 10 min over the first 14 h of the day (then none: the rest of the series has met "missing"). */
export function metRecords(dayStartMs: number) {
  return Array.from({ length: 85 }, (_, i) => ({
    epoch: new Date(dayStartMs + i * 600_000).toISOString(),
    pressure_hpa: 955 + 3 * Math.sin(i / 20),
    temperature_c: 12 + 6 * Math.sin(i / 30),
    ...(i % 2 === 0 ? { relative_humidity_pct: 60 } : {}),
  }));
}
