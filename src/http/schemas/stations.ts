/**
 * Station resource: PUT/GET/DELETE /v1/stations/{station_id}, GET /v1/stations; and the query of
 * every station series read (from, to, format, source).
 */

import { z } from 'zod';
import { MAX_REDUCTION_HEIGHT_DIFFERENCE_M } from '../../domain/meteo/height-reduction.js';
import { bounded, strictObject } from './common.js';
import { rangeBoundSchema } from './range-bounds.js';

export const STATION_ID_PATTERN = /^[A-Za-z0-9_-]{1,32}$/;
const STATION_ID_MESSAGE = 'must be 1-32 characters of letters, digits, "-" and "_"';

export const stationIdSchema = z
  .string({ error: STATION_ID_MESSAGE })
  .regex(STATION_ID_PATTERN, { error: STATION_ID_MESSAGE })
  .describe('Station identifier: 1-32 characters of letters, digits, "-" and "_"');

export const stationParams = strictObject({ station_id: stationIdSchema });

export const SOURCE_PATTERN = /^[A-Za-z0-9._:@/-]{1,64}$/;
const SOURCE_MESSAGE = 'must be 1-64 characters of letters, digits and . _ : @ / -';
export const sourceSchema = z
  .string({ error: SOURCE_MESSAGE })
  .regex(SOURCE_PATTERN, { error: SOURCE_MESSAGE })
  .describe('Name of the producer of a series (a sensor, a processing run); part of the key (station, epoch, source)');

export const stationBody = strictObject({
  name: z
    .string()
    .trim()
    .min(1, { error: 'must be 1-200 characters' })
    .max(200, { error: 'must be 1-200 characters' })
    .describe('Display name'),
  latitude_deg: bounded(-90, 90, 'deg', 'Geodetic latitude (WGS84)'),
  longitude_deg: bounded(-180, 360, 'deg', 'Longitude, east positive'),
  height_m: bounded(-500, 9000, 'm', 'Antenna height above the WGS84 ellipsoid'),
  met_height_m: bounded(
    -500,
    9000,
    'm',
    `Height of the met sensor, same datum; absent = at the antenna height. Within ${MAX_REDUCTION_HEIGHT_DIFFERENCE_M} m of height_m`,
  )
    .nullable()
    .optional(),
  description: z
    .string()
    .max(2000, { error: 'must be at most 2000 characters' })
    .nullable()
    .optional()
    .describe('Free text, at most 2000 characters'),
}).superRefine((s, ctx) => {
  if (
    s.met_height_m !== undefined &&
    s.met_height_m !== null &&
    Math.abs(s.met_height_m - s.height_m) > MAX_REDUCTION_HEIGHT_DIFFERENCE_M
  ) {
    ctx.addIssue({
      code: 'custom',
      path: ['met_height_m'],
      message: `must be within ${MAX_REDUCTION_HEIGHT_DIFFERENCE_M} m of height_m (met values are reduced to the antenna height over at most that)`,
    });
  }
});

/** The place of a station in every station output (routes/station-common.ts stationPlaceFields). */
export function stationPlaceSchemaFields() {
  return {
    latitude_deg: z.number().describe('Geodetic latitude (WGS84) [deg]'),
    longitude_deg: z.number().describe('Longitude, east positive [deg]'),
    height_m: z.number().describe('Antenna height above the WGS84 ellipsoid [m]'),
    geoid_undulation_m: z
      .number()
      .describe('Geoid undulation N of EGM96 at the station (height of mean sea level above the ellipsoid) [m], to 1 cm'),
    altitude_m: z.number().describe('Antenna altitude above mean sea level (the EGM96 geoid): height_m − geoid_undulation_m [m], to 1 cm'),
  };
}

export const stationResponse = z.object({
  station_id: z.string(),
  name: z.string(),
  ...stationPlaceSchemaFields(),
  met_height_m: z.number().nullable().describe('[m]; null = at the antenna height'),
  description: z.string().nullable(),
  created_at: z.string(),
  updated_at: z.string(),
  links: z.object({ met: z.string(), delays: z.string(), precipitable_water: z.string() }).describe('Where the station series are read'),
});

export const stationListResponse = z.object({ stations: z.array(stationResponse) });

export const seriesFormatSchema = z
  .enum(['json', 'csv'], { error: 'must be one of: json, csv' })
  .default('json')
  .describe('json (default) or csv (one header row with the JSON field names)');

/** from/to of a series read; resolution of defaults and the maximum range: src/http/routes/series-range.ts. */
export const seriesQueryFields = {
  from: rangeBoundSchema
    .optional()
    .describe(
      'Start of the range, inclusive (ISO 8601 date-time, or a date for 00:00Z of that day). Default: `to` minus the maximum range',
    ),
  to: rangeBoundSchema
    .optional()
    .describe(
      'End of the range, inclusive (ISO 8601 date-time, or a date for the whole of that UTC day). Default: `from` plus the maximum range, or the latest stored epoch when neither is given',
    ),
  format: seriesFormatSchema,
  source: sourceSchema.optional().describe('Only the rows of this source'),
};

export const seriesRangeResponseFields = {
  station_id: z.string(),
  from: z.string().describe('Start of the range read (inclusive)'),
  to: z.string().describe('End of the range read (inclusive)'),
};
