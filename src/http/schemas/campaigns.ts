/**
 * Reprocessing campaigns: POST /v1/campaigns, the list, one campaign's progress, cancel, the report
 * (docs/campaigns.md).
 */

import { z } from 'zod';
import { MAX_CAMPAIGN_STATIONS } from '../../limits.js';
import { strictObject } from './common.js';
import { daySchema } from './residuals.js';
import { stationIdSchema } from './stations.js';
import { zwdOptionsSchema } from './zwd-estimates.js';

export const campaignBody = strictObject({
  name: z
    .string({ error: 'must be a text of 1-200 characters' })
    .min(1, { error: 'must be a text of 1-200 characters' })
    .max(200, { error: 'must be a text of 1-200 characters' })
    .optional()
    .describe('A name for people'),
  stations: z
    .array(stationIdSchema, { error: 'must be an array of station ids' })
    .min(1, { error: `must hold 1..${MAX_CAMPAIGN_STATIONS} station ids` })
    .max(MAX_CAMPAIGN_STATIONS, { error: `must hold 1..${MAX_CAMPAIGN_STATIONS} station ids` })
    .optional()
    .describe('The stations; omitted = every station with residuals deposited in the span'),
  start_date: daySchema.describe('First UTC day of the span, YYYY-MM-DD (inclusive)'),
  end_date: daySchema.describe('Last UTC day of the span, YYYY-MM-DD (inclusive)'),
  options: zwdOptionsSchema.describe(
    'The single-station estimation options (those of POST /v1/zwd-estimates, docs/zwd-estimation.md), one set for every station-day',
  ),
});

export const campaignParams = strictObject({ campaign_id: z.string().min(1).max(64).describe('Campaign id (from POST /v1/campaigns)') });

const replicaWork = z.object({
  replica: z.string().describe('Replica name (TROPODELAY_REPLICA_NAME, else host:pid)'),
  items_done: z.number().int(),
  cpu_s: z.number().describe('Process CPU time of the replica while it worked on the items it finished [s]'),
});

export const campaignResponse = z.object({
  campaign_id: z.string(),
  name: z.string().nullable(),
  state: z.enum(['queued', 'running', 'finished', 'cancelled']).describe('finished also when some items failed: the counts say'),
  start_date: z.string(),
  end_date: z.string(),
  items_total: z.number().int(),
  items_done: z.number().int(),
  items_failed: z.number().int(),
  items_pending: z.number().int(),
  items_running: z.number().int(),
  items_cancelled: z.number().int(),
  model_fingerprint: z.string().describe("The fingerprint of the campaign's model set: every result should carry it"),
  created_at: z.string(),
  started_at: z.string().nullable(),
  finished_at: z.string().nullable(),
  replicas: z.array(replicaWork),
});

export const campaignListResponse = z.object({ campaigns: z.array(campaignResponse) });

export const campaignReportResponse = z.object({
  campaign_id: z.string(),
  state: campaignResponse.shape.state,
  homogeneous: z.boolean().describe('Every station-day the campaign did holds results of its fingerprint only'),
  model_fingerprint: z.string(),
  fingerprints: z
    .array(z.object({ fingerprint: z.string(), station_days: z.number().int() }))
    .describe('The fingerprints stored now for the station-days the campaign did, with how many station-days carry each'),
  exceptions: z
    .array(z.object({ station_id: z.string(), day: z.string(), reason: z.string(), fingerprint: z.string().optional() }))
    .describe('Failed items, and done station-days whose stored results differ from the campaign (another fingerprint, or gone)'),
  items: z.object({
    total: z.number().int(),
    done: z.number().int(),
    failed: z.number().int(),
    cancelled: z.number().int(),
    pending: z.number().int(),
    running: z.number().int(),
  }),
  throughput: z.object({
    station_days_per_s: z.number().nullable().describe('Items done per second of wall-clock time from the first claim to the end (or now)'),
    elapsed_s: z.number().nullable(),
    per_replica: z.array(
      replicaWork.extend({ station_days_per_cpu_s: z.number().nullable().describe("Items done per second of the replica's CPU time") }),
    ),
  }),
});
