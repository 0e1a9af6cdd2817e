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
  vmf1CoefficientsSchema,
  pressureHpa,
  provenanceFields,
  relativeHumidityPct,
  siteSchema,
  temperatureC,
  zhdM,
  zwdM,
  sizedArray,
  strictObject,
} from './common.js';
import { MAX_MET_RECORDS, MAX_OBSERVATIONS, MAX_QUERY_VALUE_CHARS } from '../../limits.js';
import { readNumber } from '../../formats/number-text.js';
import { GRADIENTS_GROUP, rangeText, ZWD_OPTIONS, type OptionSpec } from '../../services/zwd-options.js';

export { MAX_INTERVAL_S, MAX_MET_RECORDS, MAX_OBSERVATIONS, ZWD_BODY_LIMIT_BYTES } from '../../limits.js';

export const zwdObservationSchema = strictObject({
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

export const zwdMetRecordSchema = strictObject({
  epoch: epochSchema,
  pressure_hpa: pressureHpa('Measured surface pressure at the site height'),
  temperature_c: temperatureC('Measured surface temperature at the site height'),
  relative_humidity_pct: relativeHumidityPct().optional().describe('Relative humidity [%], 0..100; accepted, not needed for PWV'),
});

/** One row of VMF1 a coefficients (ranges as the a-priori routes' coefficients, common.ts). */
export const vmf1CoefficientRowSchema = strictObject({
  epoch: epochSchema,
  a_h: vmf1CoefficientsSchema.shape.ah,
  a_w: vmf1CoefficientsSchema.shape.aw,
});

export const zwdAprioriSchema = strictObject({
  zhd_m: zhdM('ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site').optional(),
  zwd_m: zwdM('ZWD the residuals were formed with; default 0').optional(),
}).describe('The a-priori zenith delays the residuals were formed with');

/** The zod schema of one option of the table (src/services/zwd-options.ts): range, message, default, description. */
export function optionSchema(spec: OptionSpec): z.ZodType {
  if (spec.type === 'boolean') {
    return z.boolean({ error: 'must be true or false' }).default(spec.default).describe(spec.description);
  }
  if (spec.type === 'enum') {
    const message = `must be one of: ${spec.values.join(', ')}`;
    return z
      .enum(spec.values, { error: message })
      .default(spec.default)
      .describe(`${spec.description}; one of ${spec.values.join(', ')}`);
  }
  const range = rangeText(spec);
  const message = `must be ${spec.type === 'integer' ? 'an integer' : 'a number'} in ${range}`;
  let n = z.number({ error: message });
  if (spec.type === 'integer') n = n.int({ error: message });
  n = spec.minExclusive ? n.gt(spec.min, { error: message }) : n.gte(spec.min, { error: message });
  n = spec.maxExclusive ? n.lt(spec.max, { error: message }) : n.lte(spec.max, { error: message });
  const description = `${spec.description} [${spec.unit}], ${range}${spec.nullMeans ? `; null = ${spec.nullMeans}` : ''}`;
  return (spec.nullMeans ? n.nullable().default(spec.default) : n.default(spec.default as number)).describe(description);
}

const specs = ZWD_OPTIONS as readonly OptionSpec[];
const fieldsOf = (group: 'gradients' | undefined) =>
  Object.fromEntries(specs.filter((s) => s.group === group).map((s) => [s.name, optionSchema(s)])) as Record<string, z.ZodType>;

/** Fields of options.gradients. */
export const zwdGradientOptionsSchema = strictObject(fieldsOf('gradients')).describe(GRADIENTS_GROUP.description);

/** options: strict (a misspelt option is an error, not a silently used default); every option has a default. */
export const zwdOptionsSchema = strictObject({ ...fieldsOf(undefined), gradients: zwdGradientOptionsSchema.nullable().prefault({}) })
  .prefault({})
  .describe('Estimation options; every one has a default (docs/zwd-estimation.md lists them)');

/** The observations as column arrays (documented form; checked by src/http/columns.ts, one loop per column). */
export const zwdObservationColumnsSchema = strictObject(
  Object.fromEntries(Object.entries(zwdObservationSchema.shape).map(([k, v]) => [k, z.array(v as z.ZodType)])),
).describe(
  `The observations as column arrays of equal length (1..${MAX_OBSERVATIONS}), one per field of an observation; sigma_m may be absent, or null on a row`,
);

export const observationObjects = sizedArray(
  z.array(zwdObservationSchema, { error: 'must be an array of observations' }),
  MAX_OBSERVATIONS,
  'observations',
);

export const zwdEstimationBody = strictObject({
  observations: z
    .union([observationObjects, zwdObservationColumnsSchema])
    .describe('Residuals of one station, in any order; grouped by epoch. An array of objects, or an object of column arrays'),
  apriori: zwdAprioriSchema.optional(),
  met: z
    .array(zwdMetRecordSchema, { error: 'must be an array of met records' })
    .max(MAX_MET_RECORDS, { error: `must hold at most ${MAX_MET_RECORDS} records` })
    .optional()
    .describe(
      'Surface met at the site, interpolated linearly to the epochs (not across gaps longer than options.met_max_gap_s); enables ZHD, ZWD and PWV per epoch',
    ),
  vmf1_coefficients: z
    .array(vmf1CoefficientRowSchema, { error: 'must be an array of {epoch, a_h, a_w}' })
    .min(1, { error: `must hold 1..${MAX_MET_RECORDS} rows` })
    .max(MAX_MET_RECORDS, { error: `must hold 1..${MAX_MET_RECORDS} rows` })
    .optional()
    .describe(
      'VMF1 a coefficients per epoch (Boehm et al. 2006; from the VMF1 grids or site files), for options.wet_mapping "vmf1" and only then: a_w maps the wet delay, interpolated linearly in time between the given epochs, which must span every observation epoch (no extrapolation: 400 otherwise). a_h is taken for completeness (the estimator maps the wet delay only)',
    ),
  options: zwdOptionsSchema,
});

export const zwdEstimatesRequest = zwdEstimationBody.extend({ site: siteSchema });

/**
 * The bodies as the worker checks them, by the form of their observations: objects (zod, field errors
 * such as observations.3.elevation_deg), or columns (checked by src/http/columns.ts; the rest here).
 */
export const zwdEstimationObjectRows = zwdEstimationBody.extend({ observations: observationObjects });
export const zwdEstimatesObjectRows = zwdEstimatesRequest.extend({ observations: observationObjects });
export const zwdEstimationColumnarRest = zwdEstimationBody.extend({ observations: z.unknown() });
export const zwdEstimatesColumnarRest = zwdEstimatesRequest.extend({ observations: z.unknown() });

export type ZwdEstimationBody = z.output<typeof zwdEstimationBody>;

// ---------------------------------------------------------------------------------------------
// text/csv requests: the observation table is the body, site and options are query parameters.

/**
 * Query-string value → JSON value: "null"/"off"/"none" → null, "true"/"false" → boolean, numerals →
 * number (readNumber); anything else stays text for the option's schema to refuse. Values longer
 * than MAX_QUERY_VALUE_CHARS are refused before anything looks at them.
 */
function fromQueryString(value: unknown, ctx: { addIssue: (issue: { code: 'custom'; message: string; input: unknown }) => void }): unknown {
  if (typeof value !== 'string') return value;
  if (value.length > MAX_QUERY_VALUE_CHARS) {
    ctx.addIssue({
      code: 'custom',
      message: `a value of ${value.length} characters; at most ${MAX_QUERY_VALUE_CHARS}`,
      input: value.slice(0, 20),
    });
    return z.NEVER;
  }
  const v = value.trim();
  if (v === 'null' || v === 'off' || v === 'none') return null;
  if (v === 'true' || v === 'false') return v === 'true';
  return readNumber(v) ?? value;
}

/** A query parameter read from text by fromQueryString, then checked by `schema`. */
export const queryParam = <T extends z.ZodType>(schema: T) => z.preprocess(fromQueryString, schema);

/** The option query parameters of a text/csv request, one per table entry (by flatName), and gradients=on|off. */
export const zwdOptionQueryFields = {
  ...Object.fromEntries(specs.map((s) => [s.flatName, queryParam(optionSchema(s))])),
  gradients: z.enum(['on', 'off'], { error: 'must be on or off' }).default('on').describe('Estimate gradients (on) or not (off)'),
} as Record<string, z.ZodType>;

/** Query parameters of a text/csv request (ignored for JSON bodies). Site parameters are required with CSV. */
export const zwdCsvQuerySchema = strictObject({
  latitude_deg: queryParam(siteSchema.shape.latitude_deg.optional()),
  longitude_deg: queryParam(siteSchema.shape.longitude_deg.optional()),
  height_m: queryParam(siteSchema.shape.height_m.optional()),
  apriori_zhd_m: queryParam(zwdAprioriSchema.shape.zhd_m),
  apriori_zwd_m: queryParam(zwdAprioriSchema.shape.zwd_m),
  ...zwdOptionQueryFields,
});

/** Query values (as validated) → the JSON `options` object they stand for. */
export function optionsFromQuery(q: Record<string, unknown>): Record<string, unknown> {
  const top: Record<string, unknown> = {};
  const gradients: Record<string, unknown> = {};
  for (const s of specs) (s.group === 'gradients' ? gradients : top)[s.name] = q[s.flatName];
  return { ...top, gradients: q.gradients === 'off' ? null : gradients };
}

export type ZwdEstimationOptionsBody = z.output<typeof zwdOptionsSchema>;

// ---------------------------------------------------------------------------------------------
// Response

const metQualitySchema = z.enum(['measured', 'interpolated', 'missing']);

export const zwdNodeResponse = z.object({
  epoch: z.string().describe('Node epoch jΔ on round UTC epochs'),
  correction_m: z.number().describe('Estimated correction δw to the a-priori ZWD [m]'),
  zwd_m: z.number().describe('A-priori ZWD + correction [m] (the nodes carry no met: series[].zwd_m is ztd_m − the ZHD of its zhd_source)'),
  sigma_m: z
    .number()
    .describe('Formal standard deviation [m] (with the Brownian-bridge variance between epochs and the correlated-noise factor)'),
  observations_nearby: z
    .number()
    .int()
    .describe('Used observations within one interval of the node; 0 = the value comes from the random walk alone (a node without data)'),
});

export const gradientNodeResponse = z.object({
  epoch: z.string(),
  north_m: z.number().describe('North gradient G_N [m]'),
  east_m: z.number().describe('East gradient G_E [m]'),
  north_sigma_m: z.number(),
  east_sigma_m: z.number(),
  observations_nearby: z.number().int().describe('Used observations within one interval of the node; 0 = a node without data'),
});

export const zwdSeriesEntryResponse = z.object({
  epoch: z.string(),
  correction_m: z.number().describe('δw interpolated between the adjacent nodes [m]'),
  zwd_m: z
    .number()
    .describe(
      'ZWD = ztd_m − ZHD, one meaning at every epoch [m]: with met in the request, ZHD is the Saastamoinen ZHD of the surface pressure (interpolated within met_max_gap_s; across longer gaps bridged linearly, held from the nearest record beyond the records: zhd_source "met-bridged"); without met, the a-priori ZHD (zhd_source "apriori"). Continuous wherever ztd_m is',
    ),
  zhd_source: z
    .enum(['met', 'met-bridged', 'apriori'])
    .describe(
      'Where the ZHD behind zwd_m comes from: met (measured or interpolated pressure), met-bridged (an epoch without met), apriori (a request without met)',
    ),
  sigma_m: z.number().describe('Formal standard deviation of δw (with the covariance of the adjacent nodes) [m]'),
  north_gradient_m: z.number().nullable().describe('G_N at the epoch [m]; null when gradients are off'),
  east_gradient_m: z.number().nullable().describe('G_E at the epoch [m]; null when gradients are off'),
  north_gradient_sigma_m: z.number().nullable(),
  east_gradient_sigma_m: z.number().nullable(),
  epoch_bias_m: z
    .number()
    .nullable()
    .describe('Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected'),
  observations: z.number().int().describe('Observations of the epoch used in the final solution'),
  ztd_m: z.number().describe('A-priori ZHD + a-priori ZWD + δw [m]'),
  met: metQualitySchema
    .optional()
    .describe('Met at this epoch: measured, interpolated or missing (only with met); "missing" epochs have no PWV and a bridged ZHD'),
  zhd_m: z
    .number()
    .optional()
    .describe('Saastamoinen ZHD of the surface pressure [m] (with met; at "missing" epochs the bridged pressure): zwd_m = ztd_m − zhd_m'),
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
  sigma_scale: z
    .number()
    .describe('1: the variance factor re-weights the observations (scale_sigmas), the formal errors are not multiplied'),
  solutions: z.number().int().describe('Least-squares solutions computed (re-weightings and screening)'),
  screening_complete: z.boolean().describe('false when max_rejections stopped the screening'),
  weighting_constant_m: z.number().describe('a of σ² = a² + b²/sin²e in the final solution (re-estimated with scale_sigmas) [m]'),
  weighting_elevation_m: z.number().describe('b of σ² = a² + b²/sin²e in the final solution [m]'),
  elevation_bands: z
    .array(
      z.object({
        lower_deg: z.number(),
        upper_deg: z.number(),
        observations_used: z.number().int(),
        observations_rejected: z.number().int(),
        rms_m: z.number().nullable().describe('RMS of the post-fit residuals of the band [m]'),
        normalised_rms: z.number().nullable().describe('RMS of v/σ_v (≈ 1 when the weights fit the band)'),
      }),
    )
    .describe('Residuals and rejections per elevation band'),
  noise_correlation: z
    .object({
      sampling_s: z.number(),
      autocorrelation: z
        .array(z.number())
        .describe('ρ(1), ρ(2), … of the normalised residuals per satellite arc, up to the first insignificant lag'),
      zwd_variance_inflation: z.number().describe('Mean factor on the ZWD variances'),
      gradient_variance_inflation: z.number().describe('Mean factor on the gradient variances'),
    })
    .nullable()
    .describe('Time correlation of the residuals and its effect on the formal errors; null when correlated_noise is off'),
  zwd_nodes_without_data: z.number().int(),
  gradient_nodes_without_data: z.number().int(),
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
  geoid_undulation_m: z
    .number()
    .describe(
      'EGM96 geoid undulation N at the site [m]: the standard atmosphere of the default a-priori ZHD and the mapping function get height_m − N',
    ),
  ...provenanceFields,
});

export type ZwdEstimatesResponse = z.input<typeof zwdEstimatesResponse>;
