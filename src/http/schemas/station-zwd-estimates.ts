/**
 * POST /v1/stations/{station_id}/zwd-estimates: the estimation request of /v1/zwd-estimates
 * without `site` (the station gives it); `source` of the stored series as a query parameter.
 */

import { z } from 'zod';
import { zwdCsvQuerySchema, zwdEstimatesResponse } from './zwd-estimates.js';
import { sourceSchema } from './stations.js';

export const DEFAULT_ESTIMATE_SOURCE = 'zwd-estimates';

export const stationZwdEstimatesQuery = zwdCsvQuerySchema.omit({ latitude_deg: true, longitude_deg: true, height_m: true }).extend({
  source: sourceSchema.optional().describe(`Source under which the estimated series is stored (default "${DEFAULT_ESTIMATE_SOURCE}")`),
});

export const stationZwdEstimatesResponse = zwdEstimatesResponse.extend({
  station_id: z.string(),
  met_used: z
    .enum(['request', 'archive', 'none'])
    .describe("Where the met came from: the request's `met`, the station's stored met series, or none (no ZHD/PWV per epoch)"),
  stored: z
    .object({
      source: z.string(),
      inserted: z.number().int(),
      updated: z.number().int(),
      unchanged: z.number().int(),
    })
    .describe(
      "The series as stored in the station's delay series (ZTD, ZWD, gradients, sigmas), under this source and the result's model_fingerprint",
    ),
});
