/**
 * POST /v1/network-estimates and POST /v1/network/zwd-estimates: ZWD of several stations estimated
 * jointly from zero-difference residuals (issue 12).
 *
 * The observations are the single-station route's (zwdObservationSchema) plus `station`; the
 * options are the single-station options, derived from the one table (src/services/zwd-options.ts)
 * like zwdOptionsSchema, plus the network's own (satellite_clocks, reference_station,
 * common_mode_sigma_threshold_m). Each station's answer has the single-station answer's parts
 * (zwd_nodes, gradient_nodes, series, rejected, apriori) with σ relative to the reference station added.
 */

import { z } from 'zod';
import { MAX_MET_RECORDS, MAX_NETWORK_STATIONS, MAX_OBSERVATIONS } from '../../limits.js';
import { DEFAULT_COMMON_MODE_SIGMA_THRESHOLD_M, SATELLITE_CLOCK_HANDLING } from '../../services/network-estimation.js';
import { ZWD_OPTIONS, type OptionSpec } from '../../services/zwd-options.js';
import { bounded, provenanceFields, siteSchema, sizedArray, strictObject } from './common.js';
import { sourceSchema, stationIdSchema } from './stations.js';
import {
  gradientNodeResponse,
  optionSchema,
  queryParam,
  rejectedObservationResponse,
  zwdAprioriSchema,
  zwdEstimatesResponse,
  zwdGradientOptionsSchema,
  zwdNodeResponse,
  zwdMetRecordSchema,
  zwdObservationSchema,
  zwdOptionQueryFields,
  zwdSeriesEntryResponse,
} from './zwd-estimates.js';

export { MAX_NETWORK_STATIONS, MAX_NETWORK_STATION_OBSERVATIONS, MAX_OBSERVATIONS, ZWD_BODY_LIMIT_BYTES } from '../../limits.js';

export const DEFAULT_NETWORK_SOURCE = 'network-estimates';

export const networkObservationSchema = zwdObservationSchema.extend({
  station: stationIdSchema.describe('Station of the observation: one of stations[].id'),
});

/** A met record of a network request: the single-station record plus `station`, like the observations. */
export const networkMetRecordSchema = zwdMetRecordSchema.extend({
  station: stationIdSchema.describe('Station of the record: one of stations[].id'),
});

const metField = z
  .array(networkMetRecordSchema, { error: 'must be an array of met records' })
  .max(MAX_MET_RECORDS, { error: `must hold at most ${MAX_MET_RECORDS} records (all stations together)` })
  .optional()
  .describe(
    `Surface met at the stations' site heights, each record naming its station, in any order (at most ${MAX_MET_RECORDS} records over all stations): per station as \`met\` of POST /v1/zwd-estimates (interpolated linearly within options.met_max_gap_s, the pressure bridged across longer gaps), giving that station's series ZHD, ZWD = ZTD − ZHD, Tm and PWV per epoch. A station without records gets zhd_source "apriori"`,
  );

/** A station of POST /v1/network-estimates: its id, site and a-priori delays. */
export const networkStationSchema = strictObject({
  id: stationIdSchema.describe('Station id: 1-32 characters of letters, digits, "-" and "_"; observations[].station refers to it'),
  site: siteSchema,
  apriori: zwdAprioriSchema.optional(),
});

/** A station of the storing route: an archive station (its coordinates are the site). */
export const networkStoredStationSchema = networkStationSchema.omit({ site: true });

/** The network's own options, besides the single-station ones. */
const networkOwnOptions = {
  satellite_clocks: z
    .enum(SATELLITE_CLOCK_HANDLING, { error: `must be one of: ${SATELLITE_CLOCK_HANDLING.join(', ')}` })
    .default('estimated')
    .describe(
      'estimated: a clock per satellite and epoch, pre-eliminated (the network solution; only ZWD differences are well determined in a small network); known: the residuals were formed with satellite clocks of a global solution (point positioning: independent single-station solutions)',
    ),
  reference_station: stationIdSchema
    .nullable()
    .default(null)
    .describe('Station the relative ZWD (relative_sigma_m) refers to; null = the station nearest the network centroid'),
  common_mode_sigma_threshold_m: bounded(0, 1, 'm', 'A warning is given when σ of the network-mean ZWD exceeds this', {
    exclusiveMin: true,
  })
    .default(DEFAULT_COMMON_MODE_SIGMA_THRESHOLD_M)
    .describe(
      `A warning (absolute-level-poorly-determined) is given when σ of the network-mean ZWD (median over epochs) exceeds this [m], (0, 1]; default ${DEFAULT_COMMON_MODE_SIGMA_THRESHOLD_M}`,
    ),
};

const specs = ZWD_OPTIONS as readonly OptionSpec[];

/** options: the single-station options (from the one table) plus the network's; strict, every one has a default. */
export const networkOptionsSchema = strictObject({
  ...(Object.fromEntries(specs.filter((s) => s.group === undefined).map((s) => [s.name, optionSchema(s)])) as Record<string, z.ZodType>),
  gradients: zwdGradientOptionsSchema.nullable().prefault({}),
  ...networkOwnOptions,
})
  .prefault({})
  .describe(
    'Estimation options: those of POST /v1/zwd-estimates (docs/zwd-estimation.md) plus satellite_clocks, reference_station and common_mode_sigma_threshold_m',
  );

const observationObjects = sizedArray(
  z.array(networkObservationSchema, { error: 'must be an array of observations' }),
  MAX_OBSERVATIONS,
  'observations',
);

/** The observations as column arrays (documented form; checked by src/http/columns.ts, one loop per column). */
export const networkObservationColumnsSchema = strictObject(
  Object.fromEntries(Object.entries(networkObservationSchema.shape).map(([k, v]) => [k, z.array(v as z.ZodType)])),
).describe(
  `The observations as column arrays of equal length (1..${MAX_OBSERVATIONS}), one per field of an observation, station included; sigma_m may be absent, or null on a row`,
);

const observationsField = z
  .union([observationObjects, networkObservationColumnsSchema])
  .describe(
    'Zero-difference residuals of all stations, in any order: an array of objects, or an object of column arrays (as POST /v1/zwd-estimates, plus a station column)',
  );

const stationsField = <T extends z.ZodType>(station: T) =>
  sizedArray(z.array(station, { error: 'must be an array of stations' }), MAX_NETWORK_STATIONS, 'stations');

export const networkEstimatesRequest = strictObject({
  stations: stationsField(networkStationSchema).describe('The stations: id, site and optional a-priori delays'),
  observations: observationsField,
  met: metField,
  options: networkOptionsSchema,
});

export const networkStoredEstimatesRequest = strictObject({
  stations: stationsField(networkStoredStationSchema).describe(
    'Archive stations (their stored coordinates are the sites) and optional a-priori delays',
  ),
  observations: observationsField,
  met: metField,
  options: networkOptionsSchema,
});

/**
 * POST /v1/network/days/{day}/zwd-estimates: the storing request without observations; they are the
 * stations' residual deposits of the day (PUT /v1/stations/{id}/residuals/{day}).
 */
export const networkDayEstimatesRequest = strictObject({
  stations: stationsField(networkStoredStationSchema).describe(
    'Archive stations whose residuals of the day are deposited (their stored coordinates are the sites), and optional a-priori delays',
  ),
  met: metField,
  options: networkOptionsSchema,
});

export type NetworkDayEstimatesRequest = z.output<typeof networkDayEstimatesRequest>;

/**
 * The bodies as the worker checks them, by the form of their observations: objects (zod, field errors
 * such as observations.3.station), or columns (checked by src/http/columns.ts; the rest here).
 */
export const networkObjectRows = networkEstimatesRequest.extend({ observations: observationObjects });
export const networkColumnarRest = networkEstimatesRequest.extend({ observations: z.unknown() });
export const networkStoredObjectRows = networkStoredEstimatesRequest.extend({ observations: observationObjects });
export const networkStoredColumnarRest = networkStoredEstimatesRequest.extend({ observations: z.unknown() });

export type NetworkEstimatesRequest = z.output<typeof networkObjectRows>;
export type NetworkStoredEstimatesRequest = z.output<typeof networkStoredObjectRows>;
export type NetworkOptionsBody = z.output<typeof networkOptionsSchema>;

// ---------------------------------------------------------------------------------------------
// text/csv requests: the observation table (with a station column) is the body; stations and
// options are query parameters.

const STATION_PARAM_TEXT =
  'A station of a text/csv request, repeated once per station: "ID,latitude_deg,longitude_deg,height_m[,apriori_zhd_m[,apriori_zwd_m]]" (POST /v1/network-estimates) or "ID[,apriori_zhd_m[,apriori_zwd_m]]" (the storing route, whose sites come from the archive); an empty a-priori field = not given';

const stationParam = z
  .union([z.string().max(256, { error: 'at most 256 characters' }), z.array(z.string().max(256, { error: 'at most 256 characters' }))])
  .optional()
  .describe(STATION_PARAM_TEXT);

const networkOwnQueryFields = {
  satellite_clocks: queryParam(networkOwnOptions.satellite_clocks),
  reference_station: queryParam(networkOwnOptions.reference_station),
  common_mode_sigma_threshold_m: queryParam(networkOwnOptions.common_mode_sigma_threshold_m),
};

/** Query parameters of POST /v1/network-estimates (the options and `station` are read for text/csv bodies only). */
export const networkCsvQuerySchema = strictObject({
  station: stationParam,
  ...zwdOptionQueryFields,
  ...networkOwnQueryFields,
});

/** Query parameters of the storing route: those of POST /v1/network-estimates plus `source`. */
export const networkStoredQuerySchema = networkCsvQuerySchema.extend({
  source: sourceSchema.optional().describe(`Source under which every station's series is stored (default "${DEFAULT_NETWORK_SOURCE}")`),
});

// ---------------------------------------------------------------------------------------------
// Response

const relativeSigma = z
  .number()
  .nullable()
  .describe("σ of the value minus the reference station's [m]; 0 for the reference; null when the reference has no value then");

export const networkStationResponse = z.object({
  station: z.string(),
  zwd_nodes: z.array(zwdNodeResponse.extend({ relative_sigma_m: relativeSigma })),
  gradient_nodes: z.array(gradientNodeResponse).describe('Empty when gradients are off'),
  series: z
    .array(zwdSeriesEntryResponse.extend({ relative_sigma_m: relativeSigma }))
    .describe('One entry per epoch of the station (the single-station series; sigma_m is σ of the absolute ZWD)'),
  rejected: z.array(rejectedObservationResponse).describe('index: the observation in the request (data row for CSV, 0-based)'),
  statistics: z.object({
    observations_total: z.number().int(),
    observations_below_cutoff: z.number().int(),
    observations_single_station_satellite: z
      .number()
      .int()
      .describe('Observations of a satellite no other station saw at that epoch: no information on its clock, not used'),
    observations_used: z.number().int(),
    observations_rejected: z.number().int(),
    epochs: z.number().int(),
  }),
  sigma_m: z.number().nullable().describe('Median over the epochs of σ of the absolute ZWD [m]'),
  relative_sigma_m: z.number().nullable().describe('Median over the epochs of σ of the ZWD relative to the reference station [m]'),
  apriori: zwdEstimatesResponse.shape.apriori,
});

export const networkEstimatesResponse = z.object({
  reference_station: z.string().describe('Station the relative sigmas refer to'),
  satellite_clocks: z.enum(SATELLITE_CLOCK_HANDLING).describe('How the satellite clocks were treated (a one-station network: known)'),
  stations: z.array(networkStationResponse).describe('One per station, in the order of the request'),
  common_mode: z
    .object({
      mean_zwd_sigma_clocks_estimated_m: z
        .number()
        .nullable()
        .describe('σ of the network-mean ZWD with the satellite clocks estimated (median over epochs) [m]; null when they were known'),
      mean_zwd_sigma_clocks_known_m: z.number().nullable().describe('The same with the satellite clocks known (independent stations) [m]'),
      correlation_with_clocks: z
        .number()
        .nullable()
        .describe(
          'Correlation of the network-mean ZWD with the mean clock term of the epoch (median); near ±1 when the clocks absorb the common mode',
        ),
      extent_km: z.number().describe('Largest distance between two stations (chord) [km]'),
      extent_nadir_deg: z
        .number()
        .describe('Largest angle between two stations seen from a GNSS satellite 20 200 km above the centroid [deg]'),
    })
    .describe('What the network can see of the common mode (the network-mean ZWD)'),
  statistics: z.object({
    stations: z.number().int(),
    epochs: z.number().int(),
    observations_total: z.number().int(),
    observations_used: z.number().int(),
    observations_rejected: z.number().int(),
    observations_single_station_satellite: z.number().int().describe('Dropped: their satellite was seen by one station only at that epoch'),
    single_station_satellites: z.number().int().describe('(epoch, satellite) pairs dropped for that reason'),
    single_station_epochs: z
      .number()
      .int()
      .describe('Epochs with observations of one station only (no information with satellite clocks estimated)'),
    unknowns: z.number().int(),
    clock_unknowns: z.number().int(),
    constraints: z.number().int(),
    degrees_of_freedom: z.number().int(),
    rms_m: z.number().nullable(),
    variance_factor: z.number().nullable(),
    sigma_scale: z
      .number()
      .nullable()
      .describe('Factor on the formal errors (√variance factor with scale_sigmas); null when it differs per station'),
    solutions: z.number().int(),
    screening_complete: z.boolean(),
  }),
  ...provenanceFields,
});

export const networkStoredEstimatesResponse = networkEstimatesResponse.extend({
  stored: z
    .array(
      z.object({
        station: z.string(),
        source: z.string(),
        met_used: z
          .enum(['request', 'archive', 'none'])
          .describe(
            "Where the station's met came from: its records in the request's met[], its stored met series, or neither (ZHD a-priori, no PWV)",
          ),
        inserted: z.number().int(),
        updated: z.number().int(),
        unchanged: z.number().int(),
      }),
    )
    .describe("Per station: its series as stored in the station's delay series under this source and the result's model_fingerprint"),
});

export type NetworkEstimatesResponse = z.input<typeof networkEstimatesResponse>;
