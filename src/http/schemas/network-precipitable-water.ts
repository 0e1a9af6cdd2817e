/**
 * GET /v1/network/precipitable-water: PWV and ZTD of many stations (all, a list or a bounding box)
 * at one epoch, over a range, since an epoch or at each station's latest epoch, as records or as
 * regular-interval means (src/services/network-pwv.ts, src/services/interval-means.ts).
 */

import { z } from 'zod';
import { PWV_QUALITY_FLAGS } from '../../services/station-pwv.js';
import { provenanceFields, strictObject } from './common.js';
import { modelSetSummary } from './delays.js';
import { rangeBoundSchema } from './range-bounds.js';
import { stationPwvQuery } from './station-precipitable-water.js';
import { SOURCE_PATTERN, STATION_ID_PATTERN, stationPlaceSchemaFields } from './stations.js';

/** Most stations named in `stations`. */
export const NETWORK_MAX_STATIONS = 2000;
/** Interval limits [s]: from one minute to one day, a divisor of one day. */
export const INTERVAL_MIN_S = 60;
export const INTERVAL_MAX_S = 86_400;

export const NETWORK_FORMATS = ['json', 'csv', 'netcdf'] as const;
const networkFormat = z
  .enum(NETWORK_FORMATS, { error: `must be one of: ${NETWORK_FORMATS.join(', ')}` })
  .default('json')
  .describe(
    'json (default); csv (an attachment, one header row, station coordinates on every row); netcdf (an attachment: netCDF-3 64-bit offset, ' +
      'CF-1.8 timeSeries, stations × a common time axis, missing values as _FillValue; not with source=all)',
  );

const STATIONS_MESSAGE = `must be a comma-separated list of 1..${NETWORK_MAX_STATIONS} station ids (letters, digits, "-", "_")`;
const BBOX_MESSAGE =
  'must be west,south,east,north in degrees: longitudes in [-180, 180], latitudes in [-90, 90], south <= north (west > east crosses 180°)';
const INTERVAL_MESSAGE = `must be an ISO 8601 duration of hours, minutes or seconds (PT1H, PT30M, PT600S) or P1D, from ${INTERVAL_MIN_S} s to 1 day and dividing one day`;
const SOURCE_MESSAGE = 'must be "all" or a source name (1-64 characters of letters, digits and . _ : @ / -)';

export const stationList = z
  .string({ error: STATIONS_MESSAGE })
  .transform((s, ctx) => {
    const ids = s.split(',').map((x) => x.trim());
    if (ids.length > NETWORK_MAX_STATIONS || ids.some((id) => !STATION_ID_PATTERN.test(id))) {
      ctx.addIssue({ code: 'custom', message: STATIONS_MESSAGE });
      return z.NEVER;
    }
    return [...new Set(ids)];
  })
  .describe(`Station ids, comma-separated (at most ${NETWORK_MAX_STATIONS}); default: every station (or those in bbox)`);

export interface BoundingBox {
  westDeg: number;
  southDeg: number;
  eastDeg: number;
  northDeg: number;
}

export const bbox = z
  .string({ error: BBOX_MESSAGE })
  .transform((s, ctx): BoundingBox => {
    const v = s.split(',').map((x) => (x.trim() === '' ? Number.NaN : Number(x)));
    const [w, so, e, n] = v as [number, number, number, number];
    const ok =
      v.length === 4 &&
      v.every(Number.isFinite) &&
      Math.abs(w) <= 180 &&
      Math.abs(e) <= 180 &&
      Math.abs(so) <= 90 &&
      Math.abs(n) <= 90 &&
      so <= n;
    if (!ok) {
      ctx.addIssue({ code: 'custom', message: BBOX_MESSAGE });
      return z.NEVER;
    }
    return { westDeg: w, southDeg: so, eastDeg: e, northDeg: n };
  })
  .describe('Only stations inside this box: west,south,east,north [deg] (WGS84; west > east crosses the 180° meridian)');

/** ISO 8601 duration → seconds, for the subset PTnH, PTnM, PTnS (and combinations) and PnD. */
export function durationSeconds(text: string): number | null {
  const m = /^P(?:(\d+)D)?(?:T(?:(\d+)H)?(?:(\d+)M)?(?:(\d+)S)?)?$/.exec(text);
  if (!m || text === 'P' || text.endsWith('T')) return null;
  const [, d, h, mi, s] = m;
  return Number(d ?? 0) * 86_400 + Number(h ?? 0) * 3600 + Number(mi ?? 0) * 60 + Number(s ?? 0);
}

const interval = z
  .string({ error: INTERVAL_MESSAGE })
  .transform((s, ctx) => {
    const seconds = durationSeconds(s);
    if (seconds === null || seconds < INTERVAL_MIN_S || seconds > INTERVAL_MAX_S || INTERVAL_MAX_S % seconds !== 0) {
      ctx.addIssue({ code: 'custom', message: INTERVAL_MESSAGE });
      return z.NEVER;
    }
    return seconds;
  })
  .describe(
    'Regular-interval means instead of records: an ISO 8601 duration (PT1H, PT30M, P1D; 60 s to 1 day, dividing a day). ' +
      'Intervals are [start, start + interval) aligned on 00:00 UTC. Per interval: the mean PWV of the records flagged ok, met-interpolated or ' +
      'delay-sigma-unknown (count), σ of the mean as the mean of their σ (errors taken as fully correlated within the interval: the independent ' +
      'formula would shrink σ by √count), the sample SD of the values, the same for ZTD, and the records per quality flag. With source=all, one mean per source.',
  );

const latest = z
  .enum(['true', 'false'], { error: 'must be true or false' })
  .transform((s) => s === 'true')
  .describe("true: each station's latest stored delay epoch (with interval: the interval that holds it)");

const sourceQuery = z
  .string({ error: SOURCE_MESSAGE })
  .refine((s) => s === 'all' || SOURCE_PATTERN.test(s), { error: SOURCE_MESSAGE })
  .optional()
  .describe(
    "Default: one value per station and epoch, from the station's preferred source: its sources ranked by their number of delay rows over the whole UTC day(s) of the range " +
      '(most first, ties by name), the best-ranked source present at each epoch (reported per station as `sources`). "all": every row of every source. ' +
      'A source name: only that source.',
  );

export const networkPwvQuery = strictObject({
  stations: stationList.optional(),
  bbox: bbox.optional(),
  epoch: rangeBoundSchema.optional().describe('One epoch (with interval: the interval that holds it). Not with from/to, since or latest'),
  from: rangeBoundSchema.optional().describe('Start of the range, inclusive (date-time, or a date for 00:00Z of that day)'),
  to: rangeBoundSchema
    .optional()
    .describe('End of the range, inclusive (date-time, or a date for the whole UTC day); default: from plus the maximum range'),
  since: rangeBoundSchema.optional().describe('Records after this epoch (exclusive), for regular delivery: pass the last epoch received'),
  latest: latest.optional(),
  interval: interval.optional(),
  source: sourceQuery,
  met_max_gap_s: stationPwvQuery.shape.met_max_gap_s,
  max_ztd_sigma_m: stationPwvQuery.shape.max_ztd_sigma_m,
  format: networkFormat,
}).describe('Exactly one of epoch, from (with optional to), since, latest=true');

const networkStation = z.object({
  station_id: z.string(),
  name: z.string(),
  ...stationPlaceSchemaFields(),
  from: z
    .string()
    .nullable()
    .describe(
      'Start of the range read for this station (inclusive); null when nothing was read (latest or since: no delays stored, or none after since)',
    ),
  to: z.string().nullable().describe('End of the range read for this station (inclusive)'),
  sources: z
    .array(z.string())
    .describe('Sources of the delay rows read, in preference order (most rows over the UTC day(s) of the range first, ties by name)'),
  record_count: z.number().int().describe('Records (or intervals) of this station in the answer'),
});

const qualityEnum = z
  .enum(PWV_QUALITY_FLAGS)
  .describe(
    `Most severe first: met-missing (no PWV: no pressure or temperature within met_max_gap_s), delay-sigma-large (ztd_sigma_m > max_ztd_sigma_m), ` +
      `delay-sigma-unknown (no ztd_sigma_m: no pwv_sigma_mm), met-interpolated (met interpolated in time), ok`,
  );

export const networkPwvRecord = z.object({
  station_id: z.string(),
  epoch: z.string(),
  source: z.string().describe('Source of the delay row'),
  model_fingerprint: z.string().describe('Fingerprint of the models of the delay row'),
  ztd_m: z.number().describe('Stored zenith total delay [m]'),
  ztd_sigma_m: z.number().nullable().describe('[m]'),
  pressure_hpa: z.number().nullable().describe('Pressure at the antenna height [hPa]'),
  temperature_c: z.number().nullable().describe('Temperature at the antenna height [°C]'),
  pwv_mm: z.number().nullable().describe('Precipitable water vapour [mm]; null when met is missing'),
  pwv_sigma_mm: z.number().nullable().describe('[mm]; null when PWV or ztd_sigma_m is missing'),
  quality: qualityEnum,
});

export const networkIntervalMean = z.object({
  station_id: z.string(),
  epoch: z.string().describe('Start of the interval (inclusive)'),
  interval_end: z.string().describe('End of the interval (exclusive)'),
  sources: z.array(z.string()).describe('Sources of the records in the interval'),
  count: z.number().int().describe('Records whose PWV enters the mean (quality ok, met-interpolated, delay-sigma-unknown)'),
  excluded_count: z.number().int().describe('Records left out of the PWV mean (met-missing, delay-sigma-large)'),
  pwv_mm: z.number().nullable().describe('Mean PWV [mm]; null when count = 0'),
  pwv_sigma_mm: z
    .number()
    .nullable()
    .describe("σ of the mean PWV: mean of the records' σ (errors fully correlated within the interval) [mm]; null when any σ is unknown"),
  pwv_sd_mm: z.number().nullable().describe('Sample standard deviation of the PWV values in the interval [mm]; null when count < 2'),
  ztd_count: z.number().int().describe('Records whose ZTD enters the mean (all but delay-sigma-large)'),
  ztd_m: z.number().nullable().describe('Mean ZTD [m]'),
  ztd_sigma_m: z.number().nullable().describe('σ of the mean ZTD, as for PWV [m]'),
  ztd_sd_m: z.number().nullable().describe('Sample standard deviation of ZTD [m]'),
  quality_counts: z.record(z.string(), z.number().int()).describe('Records per quality flag'),
});

export const networkPwvResponse = z.object({
  from: z.string().describe("Earliest start of the stations' ranges"),
  to: z.string().describe("Latest end of the stations' ranges"),
  interval_s: z.number().nullable().describe('Length of the intervals [s]; null for records'),
  source: z.string().describe('"preferred" (the default), "all" or the one source read'),
  stations: z.array(networkStation),
  records: z
    .array(networkPwvRecord)
    .describe('Without interval: one per station and epoch (per source with source=all), ordered by station then epoch'),
  intervals: z
    .array(networkIntervalMean)
    .describe('With interval: one per station and interval holding records (per source with source=all)'),
  homogeneous: z.boolean().describe('True when every delay row used comes from one model set'),
  model_sets: z.array(modelSetSummary),
  warnings: z.array(z.string()),
  retrieval: z
    .object({
      models: provenanceFields.models,
      model_fingerprint: provenanceFields.model_fingerprint,
      met_max_gap_s: z.number(),
      max_ztd_sigma_m: z.number(),
    })
    .describe('Models and settings of the PWV retrieval itself (ZHD, Tm, Π, met interpolation)'),
});

/** The station's place on every CSV row (routes/station-common.ts stationPlaceFields). */
export const STATION_PLACE_CSV_COLUMNS = ['latitude_deg', 'longitude_deg', 'height_m', 'geoid_undulation_m', 'altitude_m'] as const;

/**
 * CSV columns: the station, its place, the record (or interval) fields, and last `warnings`: the
 * warning codes that concern the row joined by ";" (PWV_RECORD_WARNING_CODES; for an interval, the
 * codes of any of its records), empty when none. Plain cells, so pd.read_csv(url) reads it as is.
 */
export const NETWORK_PWV_CSV_COLUMNS = [
  'station_id',
  ...STATION_PLACE_CSV_COLUMNS,
  ...Object.keys(networkPwvRecord.shape).slice(1),
  'warnings',
] as const;
export const NETWORK_INTERVAL_CSV_COLUMNS = [
  'station_id',
  ...STATION_PLACE_CSV_COLUMNS,
  ...Object.keys(networkIntervalMean.shape).filter((k) => k !== 'station_id' && k !== 'quality_counts' && k !== 'sources'),
  'sources',
  ...PWV_QUALITY_FLAGS.map((q) => `count_${q.replaceAll('-', '_')}`),
  'warnings',
] as const;
