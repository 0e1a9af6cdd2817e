/**
 * Downloads a station's stored series to a file: delays (`GET /v1/stations/{station_id}/delays`), PWV
 * (`…/precipitable-water`) or met (`…/met`), as JSON or CSV. netCDF exists for PWV only, through the
 * network read `GET /v1/network/precipitable-water?stations=<id>&format=netcdf` (a CF-1.8 timeSeries
 * file); the station routes have no netCDF form, so asking for delays or met in netCDF is refused here
 * before any request.
 */

import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { segment, type QueryValue, type Service } from './service.js';

export const SERIES_KINDS = ['delays', 'pwv', 'met'] as const;
export type SeriesKind = (typeof SERIES_KINDS)[number];
export const SERIES_FORMATS = ['json', 'csv', 'netcdf'] as const;
export type SeriesFormat = (typeof SERIES_FORMATS)[number];

export interface SeriesDownloadOptions {
  stationId: string;
  kind: SeriesKind;
  format: SeriesFormat;
  /** ISO 8601 date-time or date (inclusive); the service's defaults apply when absent. */
  from?: string;
  to?: string;
  /** Only this source (producer) of the series. */
  source?: string;
  /** Where to write; the bytes are written as the service sent them. */
  out: string;
}

export interface SeriesDownloadResult {
  stationId: string;
  kind: SeriesKind;
  format: SeriesFormat;
  out: string;
  bytes: number;
  /** The range the service read and its homogeneity, where the answer says them (JSON body or CSV headers). */
  homogeneous?: boolean;
  modelFingerprints?: string[];
}

const STATION_ROUTE: Record<SeriesKind, string> = { delays: 'delays', pwv: 'precipitable-water', met: 'met' };

/** Refuses the combinations the service has no route for, in the words of the option names. */
export function checkSeriesRequest(kind: SeriesKind, format: SeriesFormat): void {
  if (format === 'netcdf' && kind !== 'pwv')
    throw new RangeError(`netcdf is available for pwv only (the network read); download ${kind} as json or csv`);
}

export async function downloadSeries(service: Service, options: SeriesDownloadOptions): Promise<SeriesDownloadResult> {
  checkSeriesRequest(options.kind, options.format);
  const range: Record<string, QueryValue> = { from: options.from, to: options.to, source: options.source };
  const response =
    options.format === 'netcdf'
      ? await service.request('GET', '/v1/network/precipitable-water', {
          query: { ...range, stations: options.stationId, format: 'netcdf' },
        })
      : await service.request('GET', `/v1/stations/${segment(options.stationId)}/${STATION_ROUTE[options.kind]}`, {
          query: { ...range, format: options.format === 'csv' ? 'csv' : undefined },
        });
  const bytes = new Uint8Array(await response.arrayBuffer());
  const path = resolve(options.out);
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, bytes);
  return {
    stationId: options.stationId,
    kind: options.kind,
    format: options.format,
    out: options.out,
    bytes: bytes.length,
    ...provenance(response, bytes, options),
  };
}

/** Homogeneity and fingerprints from the CSV headers or the JSON body of a delay or PWV read. */
function provenance(
  response: Response,
  bytes: Uint8Array,
  options: SeriesDownloadOptions,
): Pick<SeriesDownloadResult, 'homogeneous' | 'modelFingerprints'> {
  if (options.kind === 'met' || options.format === 'netcdf') return {};
  if (options.format === 'csv') {
    const homogeneous = response.headers.get('x-homogeneous');
    const fingerprints = response.headers.get('x-model-fingerprints');
    return {
      ...(homogeneous !== null ? { homogeneous: homogeneous === 'true' } : {}),
      ...(fingerprints !== null ? { modelFingerprints: fingerprints.split(',').filter(Boolean) } : {}),
    };
  }
  const body = JSON.parse(Buffer.from(bytes).toString('utf8')) as {
    homogeneous?: boolean;
    model_sets?: Array<{ model_fingerprint: string }>;
  };
  return {
    ...(typeof body.homogeneous === 'boolean' ? { homogeneous: body.homogeneous } : {}),
    ...(Array.isArray(body.model_sets) ? { modelFingerprints: body.model_sets.map((s) => s.model_fingerprint) } : {}),
  };
}
