/**
 * GET /v1/stations/{station_id}/precipitable-water: PWV for every stored delay epoch of a range,
 * from the stored ZTD and the stored met series (src/services/station-pwv.ts).
 */

import { z } from 'zod';
import { DEFAULT_MAX_MET_GAP_MS } from '../../domain/meteo/met-interpolation.js';
import { DEFAULT_MAX_ZTD_SIGMA_M, PWV_QUALITY_FLAGS } from '../../services/station-pwv.js';
import { MAX_MET_GAP_S } from '../../limits.js';
import { provenanceFields, strictObject } from './common.js';
import { homogeneityFields } from './delays.js';
import { seriesQueryFields, seriesRangeResponseFields, sourceSchema } from './stations.js';

const metGapSchema = () =>
  z.coerce
    .number({ error: `must be a number in [0, ${MAX_MET_GAP_S}] s` })
    .min(0, { error: `must be a number in [0, ${MAX_MET_GAP_S}] s` })
    .max(MAX_MET_GAP_S, { error: `must be a number in [0, ${MAX_MET_GAP_S}] s` })
    .optional();

export const stationPwvQuery = strictObject({
  ...seriesQueryFields,
  source: sourceSchema.optional().describe('Only the delay rows of this source'),
  met_source: sourceSchema
    .optional()
    .describe('Only the met rows of this source (default: all; at one epoch the first source in name order)'),
  met_max_gap_s: metGapSchema().describe(
    `Longest gap between two met records interpolated across [s], [0, ${MAX_MET_GAP_S}]; default ${DEFAULT_MAX_MET_GAP_MS / 1000} (3 h). The same name as the estimation option`,
  ),
  max_met_gap_s: metGapSchema().describe('Deprecated alias of met_max_gap_s (still works; the answer then carries a warning)'),
  max_ztd_sigma_m: z.coerce
    .number({ error: 'must be a number in (0, 1] m' })
    .gt(0, { error: 'must be a number in (0, 1] m' })
    .max(1, { error: 'must be a number in (0, 1] m' })
    .default(DEFAULT_MAX_ZTD_SIGMA_M)
    .describe(`ztd_sigma_m above this flags the record "delay-sigma-large" [m]; default ${DEFAULT_MAX_ZTD_SIGMA_M}`),
});

export const stationPwvRecord = z.object({
  epoch: z.string(),
  source: z.string().describe('Source of the delay row'),
  model_fingerprint: z.string().describe('Fingerprint of the delay row'),
  ztd_m: z.number().describe('Stored zenith total delay [m]'),
  ztd_sigma_m: z.number().nullable().describe('[m]'),
  pressure_hpa: z
    .number()
    .nullable()
    .describe('Pressure at the antenna height used for ZHD [hPa] (interpolated, reduced from met_height_m)'),
  temperature_c: z.number().nullable().describe('Temperature at the antenna height used for Tm [°C]'),
  zhd_m: z.number().nullable().describe('Zenith hydrostatic delay from pressure_hpa [m]; null without pressure'),
  zwd_m: z.number().nullable().describe('ZTD − ZHD [m]'),
  zwd_sigma_m: z.number().nullable().describe('[m]; null when ztd_sigma_m is unknown'),
  tm_k: z.number().nullable().describe('Weighted mean temperature, Bevis et al. (1992) [K]'),
  tm_sigma_k: z.number().nullable().describe('[K]'),
  conversion_factor: z.number().nullable().describe('Π = PWV/ZWD, Bevis et al. (1994) [-]'),
  pwv_mm: z.number().nullable().describe('Precipitable water vapour [mm]; null when met is missing'),
  pwv_sigma_mm: z.number().nullable().describe('[mm]; null when PWV or ztd_sigma_m is missing'),
  quality: z.enum(PWV_QUALITY_FLAGS).describe(`One of ${PWV_QUALITY_FLAGS.join(', ')} (most severe first; see the README)`),
  pressure_quality: z.enum(['measured', 'interpolated', 'missing']),
  temperature_quality: z.enum(['measured', 'interpolated', 'missing']),
});

/** The record fields, then `warnings`: the record's warning codes joined by ";" (PWV_RECORD_WARNING_CODES), CSV only. */
export const STATION_PWV_CSV_COLUMNS = [
  ...(Object.keys(stationPwvRecord.shape) as (keyof typeof stationPwvRecord.shape)[]),
  'warnings',
] as const;

export const stationPwvResponse = z.object({
  ...seriesRangeResponseFields,
  records: z.array(stationPwvRecord),
  ...homogeneityFields,
  retrieval: z
    .object({
      models: provenanceFields.models,
      model_fingerprint: provenanceFields.model_fingerprint,
      met_max_gap_s: z.number().describe('The met gap limit used [s]'),
      max_met_gap_s: z.number().describe('Deprecated: the same as met_max_gap_s'),
      max_ztd_sigma_m: z.number(),
    })
    .describe('Models and settings of the PWV retrieval itself (ZHD, Tm, Π, met interpolation)'),
});
