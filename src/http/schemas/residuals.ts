/**
 * Residual deposits: one station-day of residuals (the observations of the estimation routes) per
 * PUT /v1/stations/{station_id}/residuals/{day}, kept in a compact stored form for campaigns
 * (src/formats/residual-day-form.ts; docs/campaigns.md).
 */

import { z } from 'zod';
import { dayStartMs } from '../../formats/residual-day-form.js';
import { strictObject } from './common.js';
import { stationIdSchema } from './stations.js';
import { observationObjects, zwdObservationColumnsSchema } from './zwd-estimates.js';

const DAY_MESSAGE = 'must be a UTC calendar day YYYY-MM-DD (e.g. 2026-03-14)';

/** A UTC calendar day `YYYY-MM-DD` that exists. */
export const daySchema = z
  .string({ error: DAY_MESSAGE })
  .refine((d) => !Number.isNaN(dayStartMs(d)), { error: DAY_MESSAGE })
  .describe('UTC calendar day, YYYY-MM-DD');

export const residualDayParams = strictObject({ station_id: stationIdSchema, day: daySchema });

export const residualListQuery = strictObject({
  start: daySchema.optional().describe('First day listed (inclusive), YYYY-MM-DD'),
  end: daySchema.optional().describe('Last day listed (inclusive), YYYY-MM-DD'),
});

/** The JSON body with observations as objects (the worker's check of that form). */
export const residualDepositObjects = strictObject({ observations: observationObjects });

/** The documented body: observations as objects or as column arrays (as the estimation routes take them). */
export const residualDepositBody = strictObject({
  observations: z
    .union([observationObjects, zwdObservationColumnsSchema])
    .describe(
      'The residuals of one station and one UTC day: every epoch within the day. An array of objects, or an object of column arrays',
    ),
});

const residualDayFields = {
  day: z.string().describe('UTC day, YYYY-MM-DD'),
  observation_count: z.number().int(),
  sha256: z.string().describe('SHA-256 (hex) of the canonical stored form: the same observations sent again give the same digest'),
  stored_bytes: z.number().int().describe('Size of the stored form [bytes]'),
};

export const residualPutResponse = z.object({ station_id: z.string(), ...residualDayFields });

export const residualListResponse = z.object({
  station_id: z.string(),
  days: z.array(z.object({ ...residualDayFields, stored_at: z.string().describe('ISO 8601 UTC of the last deposit') })),
});

export const residualGetResponse = z.object({
  station_id: z.string(),
  day: z.string(),
  observations: z
    .object({
      epoch: z.array(z.string()),
      satellite: z.array(z.string()),
      elevation_deg: z.array(z.number()),
      azimuth_deg: z.array(z.number()),
      residual_m: z.array(z.number()),
      sigma_m: z.array(z.number().nullable()).optional().describe('Present when the deposit had sigmas; null on a row without one'),
    })
    .describe('The deposited observations as column arrays, sorted by epoch then satellite'),
});
