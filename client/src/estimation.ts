/**
 * Runs a ZWD estimation on a file: `POST /v1/zwd-estimates` (the site in the body, or in the query for a
 * CSV table) or, with a station, `POST /v1/stations/{station_id}/zwd-estimates` (the station is the site,
 * its stored met is used and the result is stored as its delay series). The body is sent as the file
 * holds it; its form follows the file name: `.csv` a table, `.arrow`/`.arrows` an Apache Arrow IPC
 * stream, anything else JSON.
 */

import { readFileSync } from 'node:fs';
import type { Answer } from './api.js';
import { segment, type QueryValue, type Service } from './service.js';

export type EstimationAnswer = Answer<'/v1/zwd-estimates', 'post'>;
export type StationEstimationAnswer = Answer<'/v1/stations/{station_id}/zwd-estimates', 'post'>;

export interface EstimationOptions {
  /** Request body file (JSON, CSV or Arrow). */
  file: string;
  /** Estimate for this archive station and store the result. */
  stationId?: string;
  /** Query parameters: the site and options of a CSV body (`latitude_deg`, `zwd_interval_s`, …), `source` of the stored series. */
  query?: Record<string, QueryValue>;
}

/** The content type the service reads a body file as, from its name. */
export function contentTypeOf(file: string): string {
  if (/\.csv$/i.test(file)) return 'text/csv';
  if (/\.arrows?$/i.test(file)) return 'application/vnd.apache.arrow.stream';
  return 'application/json';
}

/** The estimation's answer, as the service sent it (JSON). */
export async function runEstimation(service: Service, options: EstimationOptions): Promise<EstimationAnswer | StationEstimationAnswer> {
  const path = options.stationId ? `/v1/stations/${segment(options.stationId)}/zwd-estimates` : '/v1/zwd-estimates';
  return service.json('POST', path, {
    body: readFileSync(options.file),
    contentType: contentTypeOf(options.file),
    query: options.query,
  });
}
