/**
 * Soundings of a station: PUT/GET/DELETE /v1/stations/{station_id}/soundings/{epoch},
 * GET /v1/stations/{station_id}/soundings and GET /v1/stations/{station_id}/sounding-comparison.
 * The body of a sounding is the profile of POST /v1/profile-delays without site and epoch (the station and
 * the path give them).
 */

import { z } from 'zod';
import { DEFAULT_PAIRING_WINDOW_MS, MAX_PAIRING_WINDOW_MS } from '../../services/sounding-comparison.js';
import { COMPARISON_EXCLUDED_QUALITIES } from '../../services/soundings.js';
import { epochSchema, modelsSchema, provenanceFields, strictObject } from './common.js';
import { humidityExtensionSchema, profileDelaysRequest } from './profile-delays.js';
import { seriesQueryFields, seriesRangeResponseFields, sourceSchema, stationIdSchema } from './stations.js';

export const soundingParams = strictObject({
  station_id: stationIdSchema,
  epoch: epochSchema.describe('Nominal (launch) epoch of the sounding, ISO 8601 date-time; one sounding per station and epoch'),
});

const profile = profileDelaysRequest.shape;
export const soundingBody = strictObject({
  levels: profile.levels,
  refractivity_constants: profile.refractivity_constants,
  compressibility: profile.compressibility,
  geoid_undulation_m: profile.geoid_undulation_m,
});
export type SoundingBody = z.output<typeof soundingBody>;

export const soundingRecord = z.object({
  epoch: z.string().describe('Nominal epoch of the sounding'),
  zhd_m: z.number().describe('Zenith hydrostatic delay of the column above the station [m]'),
  zwd_m: z.number().describe('Zenith wet delay [m]'),
  ztd_m: z.number().describe('Zenith total delay [m]'),
  pwv_mm: z.number().describe('Precipitable water vapour [mm]'),
  tm_k: z.number().nullable().describe('Weighted mean temperature [K]; null for a dry column'),
  last_humidity_pressure_hpa: z
    .number()
    .nullable()
    .describe(
      'Pressure where measured humidity stopped [hPa] (above it humidity was continued climatologically); null when every level carries humidity',
    ),
  levels: z.number().int().describe('Levels of the stored profile'),
  model_fingerprint: z.string().describe('Fingerprint of the models that computed the values'),
  warnings: z.array(z.string()).describe('Warnings of the computation, as when it was stored'),
  stored_at: z.string().describe('When the sounding was last written (ISO 8601 UTC)'),
});

export const soundingPutResponse = z.object({
  station_id: z.string(),
  created: z.boolean().describe('true for a new sounding, false when one of the same epoch was replaced'),
  sounding: soundingRecord,
  humidity_extension: humidityExtensionSchema,
  ...provenanceFields,
});

export const soundingGetResponse = z.object({
  station_id: z.string(),
  sounding: soundingRecord,
  models: modelsSchema,
  profile: z.record(z.string(), z.unknown()).describe('The profile as stored (the PUT body, with defaults applied)'),
});

export const soundingListQuery = strictObject({ from: seriesQueryFields.from, to: seriesQueryFields.to });

export const soundingListResponse = z.object({
  ...seriesRangeResponseFields,
  soundings: z.array(soundingRecord).describe('Soundings in the range, by epoch, without their profiles'),
});

const windowMessage = `must be a number in [0, ${MAX_PAIRING_WINDOW_MS / 1000}] s`;
export const soundingComparisonQuery = strictObject({
  from: seriesQueryFields.from,
  to: seriesQueryFields.to,
  source: sourceSchema
    .optional()
    .describe('Only the delay rows of this source; default: one row per epoch by the source preference of /v1/network/precipitable-water'),
  window_s: z.coerce
    .number({ error: windowMessage })
    .min(0, { error: windowMessage })
    .max(MAX_PAIRING_WINDOW_MS / 1000, { error: windowMessage })
    .default(DEFAULT_PAIRING_WINDOW_MS / 1000)
    .describe(
      `Half-width of the pairing window around each sounding epoch [s], [0, ${MAX_PAIRING_WINDOW_MS / 1000}]; default ${DEFAULT_PAIRING_WINDOW_MS / 1000}`,
    ),
});

export const PAIRING_RULE = `GNSS PWV records with a PWV and a quality other than ${COMPARISON_EXCLUDED_QUALITIES.join(' and ')} count. When GNSS epochs on both sides of the sounding epoch (or at it) lie within window_s, the GNSS PWV is interpolated linearly in time between them (pairing "interpolated", σ the larger of the two); otherwise the GNSS epoch nearest to the sounding within window_s is taken ("nearest"); otherwise the sounding stays unpaired. Differences are GNSS minus sounding; bias is their mean, sd their sample standard deviation (n − 1), rms their root mean square.`;

export const soundingComparisonResponse = z.object({
  ...seriesRangeResponseFields,
  window_s: z.number().describe('Half-width of the pairing window [s]'),
  pairing: z.string().describe('The pairing rule and the statistics, in words'),
  gnss_sources: z.array(z.string()).describe('Delay sources read, in preference order'),
  statistics: z
    .object({
      count: z.number().int().describe('Pairs'),
      bias_mm: z.number().nullable().describe('Mean of GNSS − sounding PWV [mm]; null without pairs'),
      sd_mm: z.number().nullable().describe('Sample standard deviation of the differences [mm]; null below 2 pairs'),
      rms_mm: z.number().nullable().describe('Root mean square of the differences [mm]; null without pairs'),
    })
    .describe('GNSS minus sounding PWV over the pairs'),
  pairs: z.array(
    z.object({
      epoch: z.string().describe('Sounding epoch'),
      sounding_pwv_mm: z.number(),
      gnss_pwv_mm: z.number().describe('GNSS PWV at the sounding epoch, by the pairing rule [mm]'),
      gnss_pwv_sigma_mm: z.number().nullable().describe('Its σ [mm]; null when a ZTD σ is unknown'),
      difference_mm: z.number().describe('GNSS − sounding [mm]'),
      pairing: z.enum(['interpolated', 'nearest']),
      gnss_epochs: z.array(z.string()).describe('The GNSS epochs used'),
    }),
  ),
  unpaired: z.array(z.string()).describe('Epochs of soundings without GNSS PWV within the window'),
  excluded_gnss_records: z.number().int().describe('GNSS records near the soundings left out by their quality'),
  warnings: z.array(z.string()),
});
