/**
 * POST /v1/network-estimates: ZWD of several stations estimated jointly from zero-difference
 * residuals, receiver and satellite clocks pre-eliminated epoch by epoch (issue 12); and
 * POST /v1/network/zwd-estimates, the same for archive stations, storing every station's series.
 * The body stays bytes on the event loop; parsing, validation, the estimation and the serialisation
 * run in the worker pool (src/http/tasks/network-request.ts).
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { Site } from '../../domain/site.js';
import { MAX_MET_RECORDS } from '../../limits.js';
import { CallerError } from '../../services/caller-error.js';
import type { MetColumns } from '../../services/station-met.js';
import type { DelayColumns } from '../../services/zwd-estimation.js';
import type { Repository, Station } from '../../storage/repository.js';
import type { MetUsed, NetworkScanOutput } from '../tasks/network-request.js';
import { preparedNetworkBuffers } from '../tasks/prepared-request.js';
import { taskMemoryBytes } from '../plugins/compute-pool.js';
import { asBuffer, bodyInWorkerValidator, keepJsonBodiesAsBytes, rawBodyOf, transferOf } from '../raw-body.js';

import { problemSchema } from '../schemas/common.js';
import {
  DEFAULT_NETWORK_SOURCE,
  MAX_NETWORK_STATION_OBSERVATIONS,
  MAX_NETWORK_STATIONS,
  MAX_OBSERVATIONS,
  networkCsvQuerySchema,
  networkEstimatesRequest,
  networkEstimatesResponse,
  networkStoredEstimatesRequest,
  networkStoredEstimatesResponse,
  networkStoredQuerySchema,
  ZWD_BODY_LIMIT_BYTES,
} from '../schemas/network-estimates.js';
import type { StationRouteOptions } from './station-common.js';
import { delayRows, storedMetFor } from './station-zwd-estimates.js';

const MODEL_TEXT =
  'Per observation r = m_w(e) δw_a(t) + m_g(e) [cos A G_N,a(t) + sin A G_E,a(t)] + ρ_a(t) + σ_k(t) + ε: ZWD and gradients per station with the random-walk model of POST /v1/zwd-estimates; with satellite_clocks "estimated" on piecewise-linear nodes (at most 300 s for ZWD and 1 800 s for gradients, dividing the output spacing; the requested spacing with parametrisation "nodes"), the variance of the random walk between and on the nodes in every σ, named in models.estimator; one receiver clock ρ per station and epoch and, with satellite_clocks "estimated", one clock σ per satellite and epoch, both pre-eliminated epoch by epoch (equivalent to double differences with their full covariance; one datum clock per connected group and epoch). With satellite_clocks "known" (point positioning) every station is solved alone, as by POST /v1/zwd-estimates.';

const LIMITS_TEXT = `Limits, checked before any work: up to ${MAX_NETWORK_STATIONS} stations and ${MAX_OBSERVATIONS} observations, and stations × observations at most ${MAX_NETWORK_STATION_OBSERVATIONS} (413 naming observations and saying how much fits; a 10-station day of 30-s data fits, as text/csv of about 31 MB or JSON of about 67 MB); the answer's output nodes over all stations within the estimation's answer cap (422). Body limit ${ZWD_BODY_LIMIT_BYTES} bytes. Networks too large for one body go through the archive: residual deposits per station-day (PUT /v1/stations/{station_id}/residuals/{day}) and POST /v1/network/days/{day}/zwd-estimates.`;

const BODY_TEXT =
  'Bodies: application/json (this schema; observations as an array of objects or as column arrays with a station column, met as records naming their station); application/vnd.apache.arrow.stream (the observations as an Arrow IPC table with a station column, the rest of the request as JSON in the schema metadata "request"); or text/csv: a table with the header row station,epoch,satellite,elevation_deg,azimuth_deg,residual_m[,sigma_m], the stations as query parameters station=ID,latitude_deg,longitude_deg,height_m[,apriori_zhd_m[,apriori_zwd_m]] (once per station) and the options as query parameters (those of POST /v1/zwd-estimates plus satellite_clocks, reference_station, common_mode_sigma_threshold_m); a text/csv request carries no met (as with POST /v1/zwd-estimates). All forms give the same answer.';

const networkEstimatesRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app, options) => {
  keepJsonBodiesAsBytes(app);
  app.post(
    '/v1/network-estimates',
    {
      bodyLimit: ZWD_BODY_LIMIT_BYTES,
      schema: {
        summary: 'ZWD and gradients of several stations estimated jointly, with the clocks pre-eliminated',
        description: [
          MODEL_TEXT,
          'Per station: the series of POST /v1/zwd-estimates (sigma_m: σ of the absolute ZWD) plus relative_sigma_m, σ relative to the reference station; with met records of the station (met[], each naming its station) also ZHD from the pressure, ZWD = ZTD − ZHD, Tm and PWV with its σ per epoch, as POST /v1/zwd-estimates does (pressure bridged across met gaps; zhd_source met | met-bridged | apriori). common_mode: σ of the network-mean ZWD with the clocks estimated and known, its correlation with the clocks, the extent in km and in nadir angle; a warning when the absolute level is not determined to options.common_mode_sigma_threshold_m. Satellites seen by one station at an epoch and epochs with one station carry no information with the clocks estimated: dropped and counted.',
          BODY_TEXT,
          LIMITS_TEXT,
        ].join(' '),
        tags: ['estimation'],
        querystring: networkCsvQuerySchema,
        body: networkEstimatesRequest,
        response: {
          200: networkEstimatesResponse,
          400: problemSchema,
          413: problemSchema,
          415: problemSchema,
          422: problemSchema,
          503: problemSchema,
        },
      },
      validatorCompiler: bodyInWorkerValidator,
    },
    async (request, reply) => {
      const raw = rawBodyOf(request);
      const output = await app.compute.run(
        'network-estimate-request',
        { ...raw, query: request.query as Record<string, unknown> },
        transferOf(raw),
      );
      return reply.type('application/json').send(asBuffer(output.json) as never);
    },
  );

  app.post(
    '/v1/network/zwd-estimates',
    {
      bodyLimit: ZWD_BODY_LIMIT_BYTES,
      schema: {
        summary: "Estimate ZWD jointly for archive stations and store every station's series",
        description: [
          'The estimation of POST /v1/network-estimates for stations of the archive: `stations` name archive stations (id, optional apriori; no site: the stored coordinates are the sites; a station not in the archive is a 404 naming stations.N.id). text/csv: station=ID[,apriori_zhd_m[,apriori_zwd_m]] once per station. JSON and Arrow bodies as for POST /v1/network-estimates.',
          `Every station's series is stored as its delay series under ?source= (default "${DEFAULT_NETWORK_SOURCE}") and the result's model_fingerprint, all stations in one transaction: all or nothing; per epoch the values POST /v1/stations/{id}/zwd-estimates stores for the same data and met (zwd_m = ZTD − ZHD of the station's met). A station's met: its records in the request's met[]; for a station without records there, its stored met series (records with pressure and temperature, reduced from met_height_m to the antenna height) from 1 day before the first to 1 day after the last observation of the request, read as that route reads it (a span beyond the maximum read range, or more than MAX_MET_RECORDS stored records for all such stations together, is a 400 naming observations); else the a-priori ZHD. stored[].met_used says which (request | archive | none); text/csv requests use the stored met. A station whose estimated ZTD falls outside the range a direct deposit accepts makes the whole request a 422 and nothing is stored.`,
          MODEL_TEXT,
          LIMITS_TEXT,
          'Writes need `Authorization: Bearer <key>`.',
        ].join(' '),
        tags: ['station archive', 'estimation'],
        security: [{ bearerKey: [] }],
        querystring: networkStoredQuerySchema,
        body: networkStoredEstimatesRequest,
        response: {
          200: networkStoredEstimatesResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          413: problemSchema,
          415: problemSchema,
          422: problemSchema,
          503: problemSchema,
        },
      },
      validatorCompiler: bodyInWorkerValidator,
    },
    async (request, reply) => {
      const source = request.query.source ?? DEFAULT_NETWORK_SOURCE;
      const query = request.query as Record<string, unknown>;
      const sent = rawBodyOf(request);
      // The body's share of the pool's memory budget, for the estimation task too when the body goes on parsed.
      const memoryBytes = taskMemoryBytes(sent);
      const scanned = await app.compute.run('network-request-scan', { ...sent, query }, transferOf(sent));
      // A body that passed the checks comes back parsed (typed columns, moved on to the estimation); otherwise
      // JSON and Arrow bytes were moved to the scan and back, and a text body is still the request's.
      const { prepared } = scanned;
      const raw = prepared ? { body: '', format: sent.format } : { body: scanned.body ?? sent.body, format: sent.format };
      // The request's stations only (one query), not the whole archive; a station not found is the task's 404.
      const archive = await app.repository.getStations(scanned.stations);
      const archiveSites = sitesOf(archive);
      const storedMet = await networkStoredMet(app.repository, archive, scanned, options.maxReadRangeDays);
      const output = await app.compute.run(
        'network-estimate-request',
        { ...raw, prepared, query, archiveSites, storedMet, ...(prepared ? { memoryBytes } : {}) },
        prepared ? preparedNetworkBuffers(prepared) : transferOf(raw),
      );
      const stored = await storeNetwork(app.repository, source, output.delays!, output.modelFingerprint!, output.models!, output.metUsed!);
      const tail = `,"stored":${JSON.stringify(stored)}}`;
      return reply.type('application/json').send(Buffer.concat([asBuffer(output.json), Buffer.from(tail)]) as never);
    },
  );
};

/** The archive stations' sites by id, as the network tasks take them (`archiveSites`). */
export function sitesOf(archive: ReadonlyMap<string, Station>): Record<string, Site> {
  const sites: Record<string, Site> = {};
  for (const s of archive.values()) sites[s.stationId] = { latitudeDeg: s.latitudeDeg, longitudeDeg: s.longitudeDeg, heightM: s.heightM };
  return sites;
}

/**
 * The stored met of the request's archive stations that have no met records in the request, read as the
 * single-station storing route reads it (storedMetFor: 1 day around the observations, at the antenna
 * height, bounded by the read range).
 * @throws CallerError 400 naming `observations` when the stations' stored met together exceeds MAX_MET_RECORDS
 */
export async function networkStoredMet(
  repository: Repository,
  archive: ReadonlyMap<string, Station>,
  scan: Pick<NetworkScanOutput, 'range' | 'stations' | 'metStations'>,
  maxReadRangeDays: number,
): Promise<Record<string, MetColumns>> {
  const out: Record<string, MetColumns> = {};
  const withMet = new Set(scan.metStations);
  let records = 0;
  for (const id of new Set(scan.stations)) {
    const station = archive.get(id);
    if (!station || withMet.has(id)) continue;
    const met = await storedMetFor(repository, station, { range: scan.range, hasMet: false }, maxReadRangeDays);
    if (!met || met.epochMs.length === 0) continue;
    records += met.epochMs.length;
    if (records > MAX_MET_RECORDS) {
      throw CallerError.field(
        400,
        'observations',
        `the stations without met in the request have more than ${MAX_MET_RECORDS} stored met records around the observations together (MAX_MET_RECORDS, all stations of one estimation): send \`met\` in the request or split the observations or the stations`,
      );
    }
    out[id] = met;
  }
  return out;
}

/** Every station's rows in one transaction (Repository.writeDelaysMany): all stored or none. */
export async function storeNetwork(
  repository: Repository,
  source: string,
  delays: { station: string; columns: DelayColumns }[],
  modelFingerprint: string,
  models: Record<string, string | number | boolean | null>,
  metUsed: MetUsed[],
) {
  const writes = delays.map((d) => ({ stationId: d.station, rows: delayRows(d.columns, source, modelFingerprint) }));
  const counts = await repository.writeDelaysMany(writes, { modelFingerprint, models });
  return delays.map((d, i) => ({ station: d.station, source, met_used: metUsed[i]!, ...counts[i]! }));
}

export default networkEstimatesRoute;
