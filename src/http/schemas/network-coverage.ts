/**
 * GET /v1/network/coverage: what the archive holds per station and source — first and last epoch,
 * record count and the gaps longer than gap_min_s — for all stations, a list or a bounding box
 * (src/storage/coverage-query.ts computes it in the database).
 */

import { z } from 'zod';
import { COVERAGE_DEFAULT_GAP_MIN_S, COVERAGE_DEFAULT_MAX_GAPS, COVERAGE_GAP_MIN_RANGE_S, COVERAGE_MAX_GAPS_LIMIT } from '../../limits.js';
import { strictObject } from './common.js';
import { bbox, stationList } from './network-precipitable-water.js';
import { rangeBoundSchema } from './range-bounds.js';
import { stationPlaceSchemaFields } from './stations.js';

const [GAP_MIN_S, GAP_MAX_S] = COVERAGE_GAP_MIN_RANGE_S;
const GAP_MESSAGE = `must be a number of seconds in [${GAP_MIN_S}, ${GAP_MAX_S}]`;
const MAX_GAPS_MESSAGE = `must be an integer in [0, ${COVERAGE_MAX_GAPS_LIMIT}]`;

export const networkCoverageQuery = strictObject({
  stations: stationList.optional(),
  bbox: bbox.optional(),
  from: rangeBoundSchema.optional().describe('Only records at or after this epoch (a date: 00:00Z of that day); default: the first stored'),
  to: rangeBoundSchema.optional().describe('Only records at or before this epoch (a date: the whole UTC day); default: the last stored'),
  gap_min_s: z.coerce
    .number({ error: GAP_MESSAGE })
    .min(GAP_MIN_S, { error: GAP_MESSAGE })
    .max(GAP_MAX_S, { error: GAP_MESSAGE })
    .default(COVERAGE_DEFAULT_GAP_MIN_S)
    .describe(
      `A gap is a spacing between two consecutive records of one station and source longer than this [s]; default ${COVERAGE_DEFAULT_GAP_MIN_S} (1 h), range [${GAP_MIN_S}, ${GAP_MAX_S}]`,
    ),
  max_gaps: z.coerce
    .number({ error: MAX_GAPS_MESSAGE })
    .int({ error: MAX_GAPS_MESSAGE })
    .min(0, { error: MAX_GAPS_MESSAGE })
    .max(COVERAGE_MAX_GAPS_LIMIT, { error: MAX_GAPS_MESSAGE })
    .default(COVERAGE_DEFAULT_MAX_GAPS)
    .describe(
      `Most gaps listed per station and source: the longest, in time order (all are counted in gap_count); default ${COVERAGE_DEFAULT_MAX_GAPS}`,
    ),
});

const gap = z.object({
  from: z.string().describe('Epoch of the last record before the gap'),
  to: z.string().describe('Epoch of the first record after the gap'),
  length_s: z.number().describe('to − from [s]'),
});

const seriesCoverage = z.object({
  source: z.string(),
  first_epoch: z.string(),
  last_epoch: z.string(),
  record_count: z.number().int(),
  gap_count: z.number().int().describe('Gaps longer than gap_min_s between first_epoch and last_epoch'),
  gap_total_s: z.number().describe('Sum of their lengths [s]'),
  gaps: z.array(gap).describe('The longest max_gaps of them, in time order'),
});

export const networkCoverageResponse = z.object({
  from: z.string().nullable().describe('Start of the range looked at; null: from the first stored record'),
  to: z.string().nullable().describe('End of the range looked at; null: to the last stored record'),
  gap_min_s: z.number(),
  max_gaps: z.number().int(),
  series: z.literal('delays').describe('The series looked at: the stored delays (ZTD), from which PWV is computed'),
  stations: z.array(
    z.object({
      station_id: z.string(),
      name: z.string(),
      ...stationPlaceSchemaFields(),
      sources: z.array(seriesCoverage).describe('One entry per source with records in the range, by source name; empty: none'),
    }),
  ),
  summary: z.object({
    station_count: z.number().int(),
    stations_with_records: z.number().int(),
    source_series: z.number().int().describe('Station–source pairs with records'),
    record_count: z.number().int(),
    gap_count: z.number().int(),
    first_epoch: z.string().nullable(),
    last_epoch: z.string().nullable(),
  }),
});
