/**
 * POST /v1/zwd-estimates: zenith wet delay estimation from residuals (issue 3).
 *
 * `zwdEstimationBody` is the request without the site, so that a route that knows the site
 * another way (a stored station) can take the same body; `zwdEstimatesRequest` adds the site.
 * Option objects are strict: a misspelt option is an error, not a silently used default.
 */

import { z } from 'zod';
import {
  azimuthDeg,
  bounded,
  elevationDeg,
  epochSchema,
  positive,
  pressureHpa,
  provenanceFields,
  relativeHumidityPct,
  siteSchema,
  temperatureC,
  zhdM,
  zwdM,
  sizedArray,
} from './common.js';

/** Body limit of the route [bytes]: 64 MiB, room for 7 days of 30 s data (~160 000 observations, ~21 MB of JSON). */
export const ZWD_BODY_LIMIT_BYTES = 64 * 1024 * 1024;
export const MAX_OBSERVATIONS = 500_000;
export const MAX_MET_RECORDS = 100_000;
/** Longest node interval [s]: 30 days. */
export const MAX_INTERVAL_S = 30 * 86_400;

/** Defaults of every option (README table). */
export const ZWD_DEFAULTS = {
  zwd_interval_s: 300,
  zwd_random_walk_m_per_sqrt_h: 0.01,
  zwd_apriori_sigma_m: 0.5,
  gradients: { interval_s: 21_600, random_walk_m_per_sqrt_h: 0.001, apriori_sigma_m: 0.01 },
  epoch_bias: true,
  weighting: 'elevation' as const,
  sigma0_m: 0.003,
  elevation_cutoff_deg: 7,
  outlier_threshold: 4,
  outlier_rejection: 'one-per-window' as const,
  max_rejections: 1000,
  scale_sigmas: true,
  met_max_gap_s: 10_800,
};

export const WEIGHTING_SCHEMES = ['elevation', 'uniform'] as const;
export const OUTLIER_REJECTION_MODES = ['one-per-window', 'one-per-solution'] as const;

export const zwdObservationSchema = z.strictObject({
  epoch: epochSchema,
  satellite: z
    .string({ error: 'must be a satellite identifier of 1..32 characters' })
    .min(1, { error: 'must be a satellite identifier of 1..32 characters' })
    .max(32, { error: 'must be a satellite identifier of 1..32 characters' })
    .describe('Satellite identifier; each (epoch, satellite) pair may appear once'),
  elevation_deg: elevationDeg(),
  azimuth_deg: azimuthDeg(),
  residual_m: bounded(-1e6, 1e6, 'm', 'Residual formed with the a-priori troposphere (observed − computed); may contain a receiver clock'),
  sigma_m: positive('m', 'Standard deviation of residual_m; absent = from options.weighting and sigma0_m', 10).optional(),
});

export const zwdMetRecordSchema = z.strictObject({
  epoch: epochSchema,
  pressure_hpa: pressureHpa('Measured surface pressure at the site height'),
  temperature_c: temperatureC('Measured surface temperature at the site height'),
  relative_humidity_pct: relativeHumidityPct().optional().describe('Relative humidity [%], 0..100; accepted, not needed for PWV'),
});

export const zwdAprioriSchema = z
  .strictObject({
    zhd_m: zhdM('ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site').optional(),
    zwd_m: zwdM('ZWD the residuals were formed with; default 0').optional(),
  })
  .describe('The a-priori zenith delays the residuals were formed with');

const nullableRandomWalk = (what: string, fallback: number) =>
  positive('m/√h', `Random-walk density q of ${what}: adjacent nodes x_{j+1} − x_j = 0 ± q √(Δ/1 h); null = no constraint`, 10)
    .nullable()
    .default(fallback);

const nullableApriori = (what: string, fallback: number, max: number) =>
  positive('m', `A-priori constraint on the first ${what} node, x_0 = 0 ± σ; null = none`, max).nullable().default(fallback);

/** Fields of options.gradients (also the gradient_* query parameters of a CSV request). */
export const zwdGradientOptionFields = {
  interval_s: positive('s', 'Spacing of the gradient nodes', MAX_INTERVAL_S).default(ZWD_DEFAULTS.gradients.interval_s),
  random_walk_m_per_sqrt_h: nullableRandomWalk('each gradient component', ZWD_DEFAULTS.gradients.random_walk_m_per_sqrt_h),
  apriori_sigma_m: nullableApriori('gradient', ZWD_DEFAULTS.gradients.apriori_sigma_m, 1),
};

export const zwdGradientOptionsSchema = z
  .strictObject(zwdGradientOptionFields)
  .describe('Horizontal gradients G_N, G_E (Chen & Herring 1997 mapping), piecewise linear; null = not estimated');

const CUTOFF_MESSAGE = 'must be a number in [0, 90) deg';

/** Fields of options (also the query parameters of a CSV request). */
export const zwdOptionFields = {
  zwd_interval_s: positive('s', 'Spacing Δ of the ZWD nodes T0 + jΔ (T0 the first epoch used)', MAX_INTERVAL_S).default(ZWD_DEFAULTS.zwd_interval_s),
  zwd_random_walk_m_per_sqrt_h: nullableRandomWalk('the ZWD', ZWD_DEFAULTS.zwd_random_walk_m_per_sqrt_h),
  zwd_apriori_sigma_m: nullableApriori('ZWD', ZWD_DEFAULTS.zwd_apriori_sigma_m, 10),
  gradients: zwdGradientOptionsSchema.nullable().prefault({}),
  epoch_bias: z
    .boolean({ error: 'must be true or false' })
    .default(ZWD_DEFAULTS.epoch_bias)
    .describe('Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated'),
  weighting: z
    .enum(WEIGHTING_SCHEMES, { error: `must be one of: ${WEIGHTING_SCHEMES.join(', ')}` })
    .default(ZWD_DEFAULTS.weighting)
    .describe('σ_i of observations without sigma_m: sigma0_m / sin(e) ("elevation") or sigma0_m ("uniform")'),
  sigma0_m: positive('m', 'σ0 of the weighting scheme (zenith standard deviation of a residual)', 1).default(ZWD_DEFAULTS.sigma0_m),
  elevation_cutoff_deg: z
    .number({ error: CUTOFF_MESSAGE })
    .gte(0, { error: CUTOFF_MESSAGE })
    .lt(90, { error: CUTOFF_MESSAGE })
    .default(ZWD_DEFAULTS.elevation_cutoff_deg)
    .describe('Observations below this elevation are dropped (and counted) [deg], [0, 90)'),
  outlier_threshold: bounded(2, 1000, '', 'Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k; null = no screening')
    .nullable()
    .default(ZWD_DEFAULTS.outlier_threshold),
  outlier_rejection: z
    .enum(OUTLIER_REJECTION_MODES, { error: `must be one of: ${OUTLIER_REJECTION_MODES.join(', ')}` })
    .default(ZWD_DEFAULTS.outlier_rejection)
    .describe(
      'one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than max(3 ZWD intervals, 30 min) away from the others (same result at a cost linear in the span)',
    ),
  max_rejections: z
    .number({ error: 'must be an integer in [0, 100000]' })
    .int({ error: 'must be an integer in [0, 100000]' })
    .min(0, { error: 'must be an integer in [0, 100000]' })
    .max(100_000, { error: 'must be an integer in [0, 100000]' })
    .default(ZWD_DEFAULTS.max_rejections)
    .describe('Screening stops after this many rejections, with a warning'),
  scale_sigmas: z
    .boolean({ error: 'must be true or false' })
    .default(ZWD_DEFAULTS.scale_sigmas)
    .describe('Multiply formal errors by √variance_factor (a-posteriori); false = a-priori formal errors'),
  met_max_gap_s: positive('s', 'Longest gap between met records that is interpolated across', 86_400).default(ZWD_DEFAULTS.met_max_gap_s),
};

export const zwdOptionsSchema = z
  .strictObject(zwdOptionFields)
  .prefault({})
  .describe('Estimation options; every one has a default');

export const zwdEstimationBody = z.strictObject({
  observations: sizedArray(z
    .array(zwdObservationSchema, { error: 'must be an array of observations' }), MAX_OBSERVATIONS, 'observations')
    .describe('Residuals of one station, in any order; grouped by epoch'),
  apriori: zwdAprioriSchema.optional(),
  met: z
    .array(zwdMetRecordSchema, { error: 'must be an array of met records' })
    .max(MAX_MET_RECORDS, { error: `must hold at most ${MAX_MET_RECORDS} records` })
    .optional()
    .describe('Surface met at the site, interpolated linearly to the epochs (not across gaps longer than options.met_max_gap_s); enables ZHD, ZWD and PWV per epoch'),
  options: zwdOptionsSchema,
});

export const zwdEstimatesRequest = zwdEstimationBody.extend({ site: siteSchema });

export type ZwdEstimationBody = z.output<typeof zwdEstimationBody>;

// ---------------------------------------------------------------------------------------------
// text/csv requests: the observation table is the body, site and options are query parameters.

/** Query-string value → JSON value: "null"/"off"/"none" → null, "true"/"false" → boolean, numerals → number. */
function fromQueryString(value: unknown): unknown {
  if (typeof value !== 'string') return value;
  const v = value.trim();
  if (v === 'null' || v === 'off' || v === 'none') return null;
  if (v === 'true' || v === 'false') return v === 'true';
  return /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(v) ? Number(v) : value;
}

const param = <T extends z.ZodType>(schema: T) => z.preprocess(fromQueryString, schema);

/** Query parameters of a text/csv request (ignored for JSON bodies). Site parameters are required with CSV. */
export const zwdCsvQuerySchema = z.object({
  latitude_deg: param(siteSchema.shape.latitude_deg.optional()),
  longitude_deg: param(siteSchema.shape.longitude_deg.optional()),
  height_m: param(siteSchema.shape.height_m.optional()),
  apriori_zhd_m: param(zwdAprioriSchema.shape.zhd_m),
  apriori_zwd_m: param(zwdAprioriSchema.shape.zwd_m),
  zwd_interval_s: param(zwdOptionFields.zwd_interval_s),
  zwd_random_walk_m_per_sqrt_h: param(zwdOptionFields.zwd_random_walk_m_per_sqrt_h),
  zwd_apriori_sigma_m: param(zwdOptionFields.zwd_apriori_sigma_m),
  gradients: z
    .enum(['on', 'off'], { error: 'must be on or off' })
    .default('on')
    .describe('Estimate gradients (on) or not (off)'),
  gradient_interval_s: param(zwdGradientOptionFields.interval_s),
  gradient_random_walk_m_per_sqrt_h: param(zwdGradientOptionFields.random_walk_m_per_sqrt_h),
  gradient_apriori_sigma_m: param(zwdGradientOptionFields.apriori_sigma_m),
  epoch_bias: param(zwdOptionFields.epoch_bias),
  weighting: zwdOptionFields.weighting,
  sigma0_m: param(zwdOptionFields.sigma0_m),
  elevation_cutoff_deg: param(zwdOptionFields.elevation_cutoff_deg),
  outlier_threshold: param(zwdOptionFields.outlier_threshold),
  outlier_rejection: zwdOptionFields.outlier_rejection,
  max_rejections: param(zwdOptionFields.max_rejections),
  scale_sigmas: param(zwdOptionFields.scale_sigmas),
});

export type ZwdCsvQuery = z.output<typeof zwdCsvQuerySchema>;
export type ZwdEstimationOptionsBody = z.output<typeof zwdOptionsSchema>;

// ---------------------------------------------------------------------------------------------
// Response

const metQualitySchema = z.enum(['measured', 'interpolated', 'missing']);

export const zwdNodeResponse = z.object({
  epoch: z.string().describe('Node epoch T0 + jΔ (UTC)'),
  correction_m: z.number().describe('Estimated correction δw to the a-priori ZWD [m]'),
  zwd_m: z.number().describe('A-priori ZWD + correction [m]'),
  sigma_m: z.number().describe('Formal standard deviation [m]'),
});

export const gradientNodeResponse = z.object({
  epoch: z.string(),
  north_m: z.number().describe('North gradient G_N [m]'),
  east_m: z.number().describe('East gradient G_E [m]'),
  north_sigma_m: z.number(),
  east_sigma_m: z.number(),
});

export const zwdSeriesEntryResponse = z.object({
  epoch: z.string(),
  correction_m: z.number().describe('δw interpolated between the adjacent nodes [m]'),
  zwd_m: z.number().describe('ZTD − ZHD(measured pressure) with met at this epoch, else a-priori ZWD + δw [m]'),
  sigma_m: z.number().describe('Formal standard deviation of δw (with the covariance of the adjacent nodes) [m]'),
  north_gradient_m: z.number().nullable().describe('G_N at the epoch [m]; null when gradients are off'),
  east_gradient_m: z.number().nullable().describe('G_E at the epoch [m]; null when gradients are off'),
  north_gradient_sigma_m: z.number().nullable(),
  east_gradient_sigma_m: z.number().nullable(),
  epoch_bias_m: z.number().nullable().describe('Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected'),
  observations: z.number().int().describe('Observations of the epoch used in the final solution'),
  ztd_m: z.number().describe('A-priori ZHD + a-priori ZWD + δw [m]'),
  met: metQualitySchema.optional().describe('Met at this epoch: measured, interpolated or missing (only with met)'),
  zhd_m: z.number().optional().describe('Saastamoinen ZHD from the measured pressure [m] (with met)'),
  tm_k: z.number().optional().describe('Weighted mean temperature, Bevis et al. (1992) [K] (with met)'),
  pwv_mm: z.number().optional().describe('Precipitable water vapour [mm] (with met)'),
  pwv_sigma_mm: z.number().optional().describe('Standard deviation of pwv_mm from the formal error of δw [mm]'),
  pwv_total_sigma_mm: z.number().optional().describe('Standard deviation of pwv_mm including the Tm regression uncertainty (4.74 K) [mm]'),
});

export const rejectedObservationResponse = z.object({
  index: z.number().int().describe('Index of the observation in the request (data row for CSV, 0-based)'),
  epoch: z.string(),
  satellite: z.string(),
  residual_m: z.number().describe('The residual as sent [m]'),
  fitted_residual_m: z.number().describe('Post-fit residual when it was rejected [m]'),
  normalized_residual: z.number().describe('Pope τ = v/(σ̂0 σ_v) when it was rejected (signed)'),
});

export const zwdStatisticsResponse = z.object({
  observations_total: z.number().int(),
  observations_below_cutoff: z.number().int().describe('Dropped for elevation below elevation_cutoff_deg (not errors)'),
  observations_used: z.number().int(),
  observations_rejected: z.number().int(),
  epochs: z.number().int(),
  zwd_nodes: z.number().int(),
  gradient_nodes: z.number().int(),
  unknowns: z.number().int().describe('Node values plus one bias per epoch (epoch_bias)'),
  constraints: z.number().int().describe('Random-walk and a-priori pseudo-observations'),
  degrees_of_freedom: z.number().int().describe('observations_used + constraints − unknowns'),
  rms_m: z.number().describe('RMS of the post-fit residuals [m]'),
  variance_factor: z.number().nullable().describe('(vᵀPv + constraint terms) / degrees_of_freedom; null when that is 0'),
  sigma_scale: z.number().describe('Factor applied to the formal errors (√variance_factor or 1)'),
  solutions: z.number().int().describe('Least-squares solutions computed during screening'),
  screening_complete: z.boolean().describe('false when max_rejections stopped the screening'),
});

export const zwdEstimatesResponse = z.object({
  zwd_nodes: z.array(zwdNodeResponse),
  gradient_nodes: z.array(gradientNodeResponse).describe('Empty when gradients are off'),
  series: z.array(zwdSeriesEntryResponse).describe('One entry per epoch with observations above the cutoff'),
  rejected: z.array(rejectedObservationResponse),
  statistics: zwdStatisticsResponse,
  apriori: z.object({
    zhd_m: z.number().describe('A-priori ZHD used for ztd_m [m]'),
    zwd_m: z.number().describe('A-priori ZWD used [m]'),
    zhd_source: z.enum(['caller', 'standard-atmosphere']),
  }),
  ...provenanceFields,
});

export type ZwdEstimatesResponse = z.input<typeof zwdEstimatesResponse>;
