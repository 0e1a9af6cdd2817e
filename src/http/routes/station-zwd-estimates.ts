/**
 * POST /v1/stations/{station_id}/zwd-estimates: the ZWD estimation of /v1/zwd-estimates for a
 * station. The station's coordinates are the site; its stored met series (at the antenna height,
 * src/services/station-met.ts) serves as `met` unless the request carries its own; the result is
 * stored as the station's delay series under the result's fingerprint, and returned.
 *
 * Steps (the body stays bytes on the event loop):
 *   1. scan (worker): the observations' epoch range, from the `epoch` field or column wherever it
 *      is, and whether the body has met;
 *   2. stored met around that range (read only without met in the body), bounded like the read
 *      routes: a span longer than the maximum read range, or more than MAX_MET_RECORDS records,
 *      is a 400 that says to send `met` or split the observations;
 *   3. estimate (worker): the JSON answer and the delay columns to store;
 *   4. store the delay rows, append `station_id` and `stored` to the answer.
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { MAX_MET_GAP_S, MAX_MET_RECORDS, MAX_OBSERVATIONS, ZWD_BODY_LIMIT_BYTES } from '../../limits.js';
import { CallerError } from '../../services/caller-error.js';
import { storedMetAtAntenna, type MetColumns } from '../../services/station-met.js';
import type { DelayColumns } from '../../services/zwd-estimation.js';
import type { DelayRow, Repository, Station, WriteCounts } from '../../storage/repository.js';
import {
  asBuffer,
  bodyInWorkerValidator,
  readEstimationBodies,
  rawBodyOf,
  replyWithBytes,
  sentQueryKeys,
  transferOf,
} from '../raw-body.js';
import { answerShapeOf } from '../answer-shape.js';
import { taskMemoryBytes } from '../plugins/compute-pool.js';
import { preparedBuffers } from '../tasks/prepared-request.js';
import { problemSchema } from '../schemas/common.js';
import { tableAnswer } from '../table-answer.js';
import { DEFAULT_ESTIMATE_SOURCE, stationZwdEstimatesQuery, stationZwdEstimatesResponse } from '../schemas/station-zwd-estimates.js';
import { stationParams } from '../schemas/stations.js';
import { zwdEstimationBody, ZWD_ANSWER_FIELD_NAMES, ZWD_ANSWER_TABLES } from '../schemas/zwd-estimates.js';
import { requireStation, type StationRouteOptions } from './station-common.js';
import { DAY_MS } from './series-range.js';

/** Stored met is read this far around the observations: the largest met_max_gap_s allowed [ms]. */
const MET_WINDOW_MS = MAX_MET_GAP_S * 1000;

/**
 * Step 2: the station's stored met around the observations, at the antenna height; undefined when
 * the body has its own met or no epoch could be read (the estimation then says why).
 * @throws CallerError 400 when the read would exceed the read-range or met-record limits
 */
export async function storedMetFor(
  repository: Repository,
  station: Station,
  scan: { range: { firstMs: number; lastMs: number } | null; hasMet: boolean },
  maxReadRangeDays: number,
): Promise<MetColumns | undefined> {
  if (scan.hasMet || !scan.range) return undefined;
  const fromMs = scan.range.firstMs - MET_WINDOW_MS;
  const toMs = scan.range.lastMs + MET_WINDOW_MS;
  const spanDays = (toMs - fromMs) / DAY_MS;
  if (spanDays > maxReadRangeDays) {
    throw CallerError.field(
      400,
      'observations',
      `the observations span ${((scan.range.lastMs - scan.range.firstMs) / DAY_MS).toFixed(2)} days; with the stored met read 1 day around them that is ${spanDays.toFixed(2)} days, and one request reads at most ${maxReadRangeDays} days of stored met: send \`met\` in the request or split the observations`,
    );
  }
  const rows = await repository.readMet(station.stationId, { fromMs, toMs });
  const met = storedMetAtAntenna(station, rows);
  if (met.epochMs.length > MAX_MET_RECORDS) {
    throw CallerError.field(
      400,
      'observations',
      `the station has ${met.epochMs.length} stored met records around the observations; an estimation uses at most ${MAX_MET_RECORDS}: send \`met\` in the request or split the observations`,
    );
  }
  return met;
}

const orNull = (x: number) => (Number.isNaN(x) ? null : x);

/** Step 4: the delay columns of the worker as rows of the station's delay series. */
export function delayRows(c: DelayColumns, source: string, modelFingerprint: string): DelayRow[] {
  const rows = new Array<DelayRow>(c.epochMs.length);
  for (let k = 0; k < rows.length; k++) {
    rows[k] = {
      epochMs: c.epochMs[k]!,
      source,
      ztdM: c.ztdM[k]!,
      ztdSigmaM: c.sigmaM[k]!,
      zwdM: orNull(c.zwdM[k]!),
      zwdSigmaM: Number.isNaN(c.zwdM[k]!) ? null : c.sigmaM[k]!,
      northGradientM: orNull(c.northGradientM[k]!),
      eastGradientM: orNull(c.eastGradientM[k]!),
      northGradientSigmaM: orNull(c.northGradientSigmaM[k]!),
      eastGradientSigmaM: orNull(c.eastGradientSigmaM[k]!),
      modelFingerprint,
    };
  }
  return rows;
}

const stationZwdEstimatesRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app, options) => {
  readEstimationBodies(app, MAX_OBSERVATIONS);
  app.post(
    '/v1/stations/:station_id/zwd-estimates',
    {
      bodyLimit: ZWD_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Estimate ZWD and gradients for a station and store the result as its delay series',
        description: [
          'The request of POST /v1/zwd-estimates without `site`: the station gives latitude, longitude and height (JSON body, or text/csv with the options as query parameters).',
          "Without `met` in the request, the station's stored met series (records with pressure and temperature, reduced from met_height_m to the antenna height; at one epoch the first source in name order) from 1 day before the first to 1 day after the last observation serves as `met`.",
          `That read is bounded like the read routes: a span longer than the maximum read range (TROPO_MAX_READ_RANGE_DAYS) or more than ${MAX_MET_RECORDS} stored met records is a 400 naming \`observations\`.`,
          'The result is returned as by /v1/zwd-estimates and stored as the station\'s delay series under `?source=` (default "zwd-estimates") and the result\'s model_fingerprint: per epoch ztd_m, ztd_sigma_m = sigma_m (the a-priori ZHD is a fixed value), zwd_m, zwd_sigma_m, gradients and their sigmas.',
          `Up to ${MAX_OBSERVATIONS} observations. Body limit: ${ZWD_BODY_LIMIT_BYTES} bytes. Writes need \`Authorization: Bearer <key>\`.`,
        ].join(' '),
        tags: ['station archive', 'estimation'],
        security: [{ bearerKey: [] }],
        params: stationParams,
        querystring: stationZwdEstimatesQuery,
        body: zwdEstimationBody,
        response: {
          200: stationZwdEstimatesResponse,
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
      const stationId = request.params.station_id;
      const answer = answerShapeOf(request.query, request.headers.accept, ZWD_ANSWER_FIELD_NAMES);
      const station = await requireStation(app.repository, stationId);
      const source = request.query.source ?? DEFAULT_ESTIMATE_SOURCE;
      const sent = rawBodyOf(request);
      const query = request.query as Record<string, unknown>;
      const queryKeys = sentQueryKeys(request.raw.url);
      // The body's share of the pool's memory budget, for the estimation task too when the body goes on parsed.
      const memoryBytes = taskMemoryBytes(sent);
      const scanned = await app.compute.run('zwd-request-scan', { ...sent, query, queryKeys }, transferOf(sent));
      // A body that passed the checks comes back parsed (typed columns, moved on to the estimation); otherwise
      // JSON bytes were moved to the scan and back, and a text body is still the request's.
      const { prepared } = scanned;
      const raw = prepared ? { body: '', format: sent.format } : { body: scanned.body ?? sent.body, format: sent.format };
      const storedMet = await storedMetFor(app.repository, station, scanned, options.maxReadRangeDays);
      const site = { latitudeDeg: station.latitudeDeg, longitudeDeg: station.longitudeDeg, heightM: station.heightM };
      const output = await app.compute.run(
        'zwd-estimate-request',
        { ...raw, prepared, query, queryKeys, station: { site, storedMet }, answer, ...(prepared ? { memoryBytes } : {}) },
        prepared ? preparedBuffers(prepared) : transferOf(raw),
      );
      const stored = await storeDelays(app.repository, stationId, source, output);
      request.auditDetail = { source, records: stored.inserted + stored.updated + stored.unchanged, ...stored };
      // The worker's answer bytes are read into the answer made here, then given back (ComputePool.release).
      if (answer.format === 'arrow') {
        // The worker sent the rows answer; the Arrow table is made here, with what was stored in its metadata.
        const rows = JSON.parse(Buffer.from(output.json).toString('utf8')) as Record<string, unknown>;
        app.compute.release(output.json);
        const shaped = tableAnswer(rows, ZWD_ANSWER_TABLES, answer, { station_id: stationId, stored: { source, ...stored } });
        return reply.type(shaped.contentType).send(asBuffer(shaped.bytes) as never);
      }
      const tail = `,"station_id":${JSON.stringify(stationId)},"stored":${JSON.stringify({ source, ...stored })}}`;
      const bytes = Buffer.concat([asBuffer(output.json), Buffer.from(tail)]);
      app.compute.release(output.json);
      return replyWithBytes(reply, bytes, 'application/json', app.compute.release);
    },
  );
};

async function storeDelays(
  repository: Repository,
  stationId: string,
  source: string,
  output: {
    delays?: DelayColumns | undefined;
    modelFingerprint?: string | undefined;
    models?: Record<string, string | number | boolean | null> | undefined;
  },
): Promise<WriteCounts> {
  const rows = delayRows(output.delays!, source, output.modelFingerprint!);
  if (rows.length === 0) return { inserted: 0, updated: 0, unchanged: 0 };
  return repository.writeDelays(stationId, rows, { modelFingerprint: output.modelFingerprint!, models: output.models! });
}

export default stationZwdEstimatesRoute;
