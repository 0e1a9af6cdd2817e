/**
 * Spans of GPS-like data as the estimation API's columns (issue 14: "30 days of data can be sent in one
 * request"): one constellation of 30 satellites at 30 s, 7–11 in view (the sky of test/helpers/realistic-sky.ts,
 * seed 11, as `npm run bench -- columns` uses for its day), 25 gross errors a day; as columns JSON or as an
 * Arrow IPC stream with the rest of the request in the schema metadata `request`.
 */

import { tableFromArrays, tableToIPC, type Table } from 'apache-arrow';
import { DEG } from '../../src/domain/constants.js';
import { simulateSky, type Sky, type SkyOptions } from './realistic-sky.js';

export interface GpsLikeRequest {
  rest: { site: { latitude_deg: number; longitude_deg: number; height_m: number }; apriori: { zhd_m: number } } & Record<string, unknown>;
  columns: { epoch: string[]; satellite: string[]; elevation_deg: number[]; azimuth_deg: number[]; residual_m: number[] };
  /** Observations. */
  count: number;
}

/**
 * A simulated sky as the estimation API's request: the observation columns (epochs as ISO texts, one text per
 * distinct epoch; angles in degrees) and the rest of the body (the sky's site, a-priori ZHD 2.2 m, `extra`).
 * The one definition of the benchmark and byte-for-byte days (bench/columns.bench.ts and the tests beside it).
 */
export function skyRequest(sky: Sky, extra: Record<string, unknown> = {}): GpsLikeRequest {
  const iso = new Map<number, string>();
  const epoch = sky.epochMs.map((ms) => iso.get(ms) ?? (iso.set(ms, new Date(ms).toISOString()), iso.get(ms)!));
  return {
    rest: {
      site: { latitude_deg: sky.options.latitudeDeg, longitude_deg: 7.4, height_m: sky.options.heightM },
      apriori: { zhd_m: 2.2 },
      ...extra,
    },
    columns: {
      epoch,
      satellite: sky.satellite,
      elevation_deg: sky.elevationRad.map((e) => e / DEG),
      azimuth_deg: sky.azimuthRad.map((a) => a / DEG),
      residual_m: sky.residualM,
    },
    count: epoch.length,
  };
}

/** The benchmarks' day of the sky simulation (seed 11, one day at 30 s, GPS-like, 25 gross errors), with `sky` overrides. */
export function dayRequest(sky: Partial<SkyOptions> = {}, extra: Record<string, unknown> = {}): GpsLikeRequest {
  return skyRequest(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 25, constellations: ['gps'], ...sky }), extra);
}

export function gpsLikeColumns(days: number): GpsLikeRequest {
  return dayRequest({ durationS: days * 86_400, grossErrors: 25 * days });
}

/** The request as columns JSON (UTF-8 bytes); `extra` goes beside site and apriori (e.g. options). */
export function columnsJson(req: GpsLikeRequest, extra: Record<string, unknown> = {}): Uint8Array<ArrayBuffer> {
  return new Uint8Array(Buffer.from(JSON.stringify({ ...req.rest, ...extra, observations: req.columns })));
}

/** The request as an Arrow IPC stream: the observations as the table, the rest as JSON in the metadata `request`. */
export function columnsArrow(req: GpsLikeRequest, extra: Record<string, unknown> = {}): Uint8Array<ArrayBuffer> {
  const c = req.columns;
  const table = tableFromArrays({
    epoch: c.epoch,
    satellite: c.satellite,
    elevation_deg: Float64Array.from(c.elevation_deg),
    azimuth_deg: Float64Array.from(c.azimuth_deg),
    residual_m: Float64Array.from(c.residual_m),
  }) as Table;
  table.schema.metadata.set('request', JSON.stringify({ ...req.rest, ...extra }));
  return tableToIPC(table, 'stream') as Uint8Array<ArrayBuffer>;
}
