/**
 * Met series of a station: POST (JSON, CSV or RINEX met) and GET /v1/stations/{station_id}/met.
 */

import { z } from 'zod';
import {
  dewpointC,
  epochSchema,
  pressureHpa,
  relativeHumidityPct,
  temperatureC,
  vapourPressureHpa,
  sizedArray,
  strictObject,
} from './common.js';
import { MAX_BATCH } from './mapping-factors.js';
import { seriesQueryFields, seriesRangeResponseFields, sourceSchema } from './stations.js';

export const DEFAULT_MET_SOURCE = 'default';
export const HUMIDITY_FIELDS = ['relative_humidity_pct', 'dewpoint_c', 'vapour_pressure_hpa'] as const;

/** One met record; null and absent both mean "not measured". */
export const metRecordSchema = strictObject({
  epoch: epochSchema,
  pressure_hpa: pressureHpa('Surface pressure measured at the met sensor').nullish(),
  temperature_c: temperatureC('Air temperature at the met sensor').nullish(),
  relative_humidity_pct: relativeHumidityPct().nullish(),
  dewpoint_c: dewpointC().nullish(),
  vapour_pressure_hpa: vapourPressureHpa().nullish(),
}).superRefine((r, ctx) => {
  if ((r.pressure_hpa ?? null) === null && (r.temperature_c ?? null) === null) {
    ctx.addIssue({
      code: 'custom',
      path: ['pressure_hpa'],
      message: 'a record needs pressure_hpa (300..1100 hPa) or temperature_c (-90..60 °C)',
    });
  }
  const given = HUMIDITY_FIELDS.filter((k) => (r[k] ?? null) !== null);
  if (given.length > 1) {
    ctx.addIssue({
      code: 'custom',
      path: [given[1]!],
      message: `give at most one of ${HUMIDITY_FIELDS.join(', ')} (got ${given.join(' and ')})`,
    });
  }
});

export const metIngestJsonBody = strictObject({
  records: sizedArray(z.array(metRecordSchema), MAX_BATCH, 'records').describe(
    `1..${MAX_BATCH} met records; each is checked on its own: bad ones are reported in \`rejected\`, the good ones stored`,
  ),
  source: sourceSchema.optional().describe(`Producer of the records (default "${DEFAULT_MET_SOURCE}")`),
});

/** The envelope actually enforced before per-record checks (records are checked one by one). */
export const metIngestEnvelope = strictObject({
  records: sizedArray(z.array(z.unknown()), MAX_BATCH, 'records'),
  source: sourceSchema.optional(),
});

export const ingestQuery = strictObject({
  source: sourceSchema
    .optional()
    .describe(
      `Producer of the records of a CSV or RINEX body (default "${DEFAULT_MET_SOURCE}"); a JSON body names it in \`source\`; a CSV row with a \`source\` cell is stored under that source`,
    ),
});

export const rejectedSchema = z.object({
  index: z.number().int().optional().describe('Index of the record in `records` (JSON)'),
  line: z.number().int().optional().describe('1-based line of the record (CSV, RINEX)'),
  reason: z.string(),
});

export const MAX_REJECTED_LISTED = 1000;

export const ingestResponseFields = {
  station_id: z.string(),
  source: z.string(),
  inserted: z.number().int().describe('Records whose (epoch, source) was new'),
  updated: z.number().int().describe('Records that replaced different stored values'),
  unchanged: z.number().int().describe('Records equal to what was stored (a re-send)'),
  rejected: z.array(rejectedSchema).describe(`Bad records, one by one (the first ${MAX_REJECTED_LISTED}); none of them is stored`),
  rejected_count: z.number().int().describe('Number of bad records'),
  warnings: z.array(z.string()),
};

export const metIngestResponse = z.object({
  ...ingestResponseFields,
  format: z.enum(['json', 'csv', 'rinex-met']).describe('How the body was read'),
  sources: z.array(z.string()).describe('Sources the stored records went to: `source` alone, or those a CSV named in its `source` column'),
  rinex: z
    .object({
      version: z.string(),
      marker_name: z.string().nullable(),
      observation_types: z.array(z.string()),
      ignored_values: z
        .record(z.string(), z.number().int())
        .describe('Values of types other than PR, TD, HR, counted per type (not stored)'),
    })
    .optional()
    .describe('What the RINEX meteorological file held'),
});

export const metReadQuery = strictObject(seriesQueryFields);

export const metRecordResponse = z.object({
  epoch: z.string(),
  source: z.string(),
  pressure_hpa: z.number().nullable().describe('[hPa] at the met sensor'),
  temperature_c: z.number().nullable().describe('[°C] at the met sensor'),
  relative_humidity_pct: z.number().nullable().describe('[%]'),
  dewpoint_c: z.number().nullable().describe('[°C]'),
  vapour_pressure_hpa: z.number().nullable().describe('[hPa]'),
});

export const MET_CSV_OUTPUT_COLUMNS = [
  'epoch',
  'source',
  'pressure_hpa',
  'temperature_c',
  'relative_humidity_pct',
  'dewpoint_c',
  'vapour_pressure_hpa',
] as const;

export const metReadResponse = z.object({
  ...seriesRangeResponseFields,
  records: z.array(metRecordResponse),
});
