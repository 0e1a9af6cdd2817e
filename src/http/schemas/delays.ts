/**
 * Delay series of a station: POST (deposit a series computed elsewhere) and GET
 * /v1/stations/{station_id}/delays; the model-set fields every series read carries.
 */

import { z } from 'zod';
import { epochSchema, gradientM, modelsSchema, positive, ztdM, zwdM, sizedArray, strictObject } from './common.js';
import { MAX_BATCH } from './mapping-factors.js';
import { ingestResponseFields } from './met.js';
import { seriesQueryFields, seriesRangeResponseFields, sourceSchema } from './stations.js';

export const delayRecordSchema = strictObject({
  epoch: epochSchema,
  ztd_m: ztdM(),
  ztd_sigma_m: positive('m', 'Standard deviation of ztd_m', 1).nullish(),
  zwd_m: zwdM('Zenith wet delay, if the producer separated it').nullish(),
  zwd_sigma_m: positive('m', 'Standard deviation of zwd_m', 1).nullish(),
  north_gradient_m: gradientM('North gradient of the delay').nullish(),
  east_gradient_m: gradientM('East gradient of the delay').nullish(),
  north_gradient_sigma_m: positive('m', 'Standard deviation of north_gradient_m', 1).nullish(),
  east_gradient_sigma_m: positive('m', 'Standard deviation of east_gradient_m', 1).nullish(),
});

const MAX_MODEL_ENTRIES = 64;
export const depositModelsSchema = modelsSchema
  .refine((m) => Object.keys(m).length <= MAX_MODEL_ENTRIES, { error: `must have at most ${MAX_MODEL_ENTRIES} entries` })
  .refine((m) => Object.entries(m).every(([k, v]) => k.length <= 64 && (typeof v !== 'string' || v.length <= 500)), {
    error: 'keys must have at most 64 characters and string values at most 500',
  })
  .describe(
    'The models and settings that produced the series (e.g. mapping function, cutoff, random-walk settings); with `source` they make the fingerprint',
  );

export const delayDepositJsonBody = strictObject({
  records: sizedArray(z.array(delayRecordSchema), MAX_BATCH, 'records').describe(
    `1..${MAX_BATCH} delay records; each is checked on its own: bad ones are reported in \`rejected\`, the good ones stored`,
  ),
  source: sourceSchema.describe('Producer of the series (required): part of the key and of the fingerprint'),
  models: depositModelsSchema.optional(),
});

export const delayDepositEnvelope = strictObject({
  records: sizedArray(z.array(z.unknown()), MAX_BATCH, 'records'),
  source: sourceSchema,
  models: depositModelsSchema.optional(),
});

export const delayDepositResponse = z.object({
  ...ingestResponseFields,
  models: modelsSchema,
  model_fingerprint: z.string().describe('Fingerprint stored with every record of this deposit'),
});

export const modelSetSummary = z.object({
  model_fingerprint: z.string(),
  models: modelsSchema,
  sources: z.array(z.string()),
  first_epoch: z.string(),
  last_epoch: z.string(),
  count: z.number().int(),
});

export const homogeneityFields = {
  homogeneous: z.boolean().describe('True when every record of the range was produced by the same model set (one fingerprint)'),
  model_sets: z.array(modelSetSummary).describe('The model sets met in the range, with the epochs they cover'),
  warnings: z.array(z.string()),
};

export const delayReadQuery = strictObject(seriesQueryFields);

export const delayRecordResponse = z.object({
  epoch: z.string(),
  ztd_m: z.number().describe('[m]'),
  ztd_sigma_m: z.number().nullable().describe('[m]; null when the producer gave none'),
  zwd_m: z.number().nullable().describe('[m]'),
  zwd_sigma_m: z.number().nullable().describe('[m]'),
  north_gradient_m: z.number().nullable().describe('[m]'),
  east_gradient_m: z.number().nullable().describe('[m]'),
  north_gradient_sigma_m: z.number().nullable().describe('[m]'),
  east_gradient_sigma_m: z.number().nullable().describe('[m]'),
  source: z.string(),
  model_fingerprint: z.string(),
});

export const DELAY_CSV_COLUMNS = [
  'epoch',
  'ztd_m',
  'ztd_sigma_m',
  'zwd_m',
  'zwd_sigma_m',
  'north_gradient_m',
  'east_gradient_m',
  'north_gradient_sigma_m',
  'east_gradient_sigma_m',
  'source',
  'model_fingerprint',
] as const;

export const delayReadResponse = z.object({
  ...seriesRangeResponseFields,
  records: z.array(delayRecordResponse),
  ...homogeneityFields,
});
