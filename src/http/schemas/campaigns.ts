/**
 * Reprocessing campaigns: POST /v1/campaigns, the list, one campaign's progress, cancel, the report,
 * the residuals uploaded to a campaign and the close of its uploads (docs/campaigns.md).
 */

import { z } from 'zod';
import { MAX_CAMPAIGN_STATIONS } from '../../limits.js';
import { MAX_WINDOW_HOURS } from '../../services/campaigns/item-windows.js';
import { ITEM_STATES } from '../../storage/campaigns/campaign-store.js';
import { strictObject } from './common.js';
import { daySchema, residualPutResponse } from './residuals.js';
import { stationIdSchema } from './stations.js';
import { zwdOptionsSchema } from './zwd-estimates.js';

/** Where a campaign's residuals come from (API values; the store's input kinds). */
export const RESIDUAL_INPUTS = { deposited: 'deposits', uploaded: 'upload' } as const;

const hoursMessage = `must be a whole number of hours in [1, ${MAX_WINDOW_HOURS}]`;
const windowHours = (description: string) =>
  z
    .number({ error: hoursMessage })
    .int({ error: hoursMessage })
    .gte(1, { error: hoursMessage })
    .lte(MAX_WINDOW_HOURS, { error: hoursMessage })
    .describe(`${description} [h], [1, ${MAX_WINDOW_HOURS}]`);

export const campaignWindowSchema = strictObject({
  length_hours: windowHours('Length of a window: the observations one item estimates from'),
  step_hours: windowHours(
    'Step from one window to the next = the part of each window whose estimates are stored (its centre); ≤ length_hours',
  ),
})
  .refine((w) => w.step_hours <= w.length_hours, {
    error: 'must be ≤ length_hours (the stored centre parts of the windows tile the span)',
    path: ['step_hours'],
  })
  .describe(
    'Station-windows instead of station-days: one item per station and window; each stores the centre step_hours of its window (docs/campaigns.md, "Station-windows")',
  );

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
    'The single-station estimation options (those of POST /v1/zwd-estimates, docs/zwd-estimation.md), one set for every item',
  ),
  residuals: z
    .enum(['deposited', 'uploaded'], { error: 'must be "deposited" or "uploaded"' })
    .default('deposited')
    .describe(
      '"deposited": read from the station archive (PUT /v1/stations/{station_id}/residuals/{day}); "uploaded": sent to the campaign after submission (PUT /v1/campaigns/{campaign_id}/residuals/{station_id}/{day}); `stations` required',
    ),
  window: campaignWindowSchema.optional(),
});

/** The schema's window → whole hours (or null for station-days). */
export type CampaignWindowBody = z.infer<typeof campaignWindowSchema>;

const campaignIdSchema = z.string().min(1).max(64).describe('Campaign id (from POST /v1/campaigns)');
export const campaignParams = strictObject({ campaign_id: campaignIdSchema });
export const campaignUploadParams = strictObject({ campaign_id: campaignIdSchema, station_id: stationIdSchema, day: daySchema });

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
  residuals: z.enum(['deposited', 'uploaded']),
  window: z
    .object({ length_hours: z.number(), step_hours: z.number() })
    .nullable()
    .describe('Station-windows (hours); null = station-days'),
  uploads_closed_at: z.string().nullable().describe('When POST …/uploads-complete closed the uploads (uploaded residuals only)'),
  items_total: z.number().int(),
  items_awaiting_residuals: z.number().int().describe('Items whose uploaded residuals have not all arrived (they wait)'),
  items_no_residuals: z.number().int().describe('Items that got no residuals before the uploads were closed'),
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
    .describe(
      'The fingerprints stored now for the items the campaign did, with how many items (station-days, or station-windows) carry each',
    ),
  exceptions: z
    .array(
      z.object({
        station_id: z.string(),
        day: z.string().describe("The item's day (windows: the day its stored part starts)"),
        kept_from: z.string().optional().describe("Windows: start of the item's stored part (ISO 8601 UTC)"),
        kept_to: z.string().optional().describe("Windows: end of the item's stored part, exclusive"),
        reason: z.string(),
        fingerprint: z.string().optional(),
      }),
    )
    .describe(
      'Failed items, items without input (no residuals uploaded, or still awaited), and done items whose stored results differ from the campaign (another fingerprint, or gone)',
    ),
  items: z.object({
    total: z.number().int(),
    ...(Object.fromEntries(ITEM_STATES.map((state) => [state, z.number().int()])) as Record<(typeof ITEM_STATES)[number], z.ZodNumber>),
  }),
  throughput: z.object({
    station_days_per_s: z.number().nullable().describe('Items done per second of wall-clock time from the first claim to the end (or now)'),
    elapsed_s: z.number().nullable(),
    per_replica: z.array(
      replicaWork.extend({ station_days_per_cpu_s: z.number().nullable().describe("Items done per second of the replica's CPU time") }),
    ),
  }),
});

export const campaignUploadResponse = residualPutResponse.extend({
  campaign_id: z.string(),
  items_ready: z.number().int().describe('Items that became pending with this upload (all the days they read have arrived)'),
});

export const campaignUploadListResponse = z.object({
  campaign_id: z.string(),
  days: z.array(residualPutResponse.extend({ stored_at: z.string().describe('ISO 8601 UTC of the upload') })),
});
