/**
 * POST /v1/network/days/{day}/zwd-estimates: the network estimation of POST /v1/network/zwd-estimates
 * for a day whose observations are already in the archive, as the stations' residual deposits
 * (PUT /v1/stations/{id}/residuals/{day}). This is the path for networks too large for one request
 * body (a 50-station day is ~2.6 M observations): the body names the stations, optional met and the
 * options; the route reads the deposits and the stored met, the worker pool decodes and estimates
 * (src/http/tasks/network-request.ts), and every station's series is stored in one transaction.
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { NETWORK_DAY_MEMORY_PER_STATION_OBSERVATION } from '../../limits.js';
import { CallerError } from '../../services/caller-error.js';
import { ResidualStore } from '../../storage/campaigns/residual-store.js';
import { problemSchema } from '../schemas/common.js';
import {
  DEFAULT_NETWORK_SOURCE,
  networkDayEstimatesRequest,
  networkStoredEstimatesResponse,
  networkStoredQuerySchema,
  ZWD_BODY_LIMIT_BYTES,
} from '../schemas/network-estimates.js';
import { daySchema } from '../schemas/residuals.js';
import { strictObject } from '../schemas/common.js';
import type { StationRouteOptions } from './station-common.js';
import { networkStoredMet, sitesOf, storeNetwork } from './network-estimates.js';
import { asBuffer } from '../raw-body.js';

export interface NetworkDaysRouteOptions extends StationRouteOptions {
  /** Largest stations × observations of one day (TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS). */
  maxStationObservations: number;
}

const DAY_MS = 86_400_000;

const networkDaysRoute: FastifyPluginAsyncZod<NetworkDaysRouteOptions> = async (app, options) => {
  const residuals = () => new ResidualStore(app.repository.sqlExecutor());
  app.post(
    '/v1/network/days/:day/zwd-estimates',
    {
      bodyLimit: ZWD_BODY_LIMIT_BYTES,
      schema: {
        summary: "Estimate ZWD jointly from the stations' deposited residuals of one day and store every station's series",
        description: [
          'The estimation and storing of POST /v1/network/zwd-estimates, with the observations taken from the archive: each station in `stations` must have its residuals of the UTC day deposited (PUT /v1/stations/{station_id}/residuals/{day}); a station without a deposit is a 404 naming stations.N.id. The body holds no observations: `stations` (archive ids, optional apriori), optional `met` (records naming their station; a station without records uses its stored met) and `options` (those of POST /v1/network-estimates).',
          `Sized for networks beyond one request body: stations × observations up to ${options.maxStationObservations} (TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS; a 50-station day of 30-s data with about 18 satellites in view is 130 M and takes about a minute of one core and 1.9 GB of memory), checked before any work: 413 naming stations. The answer and what is stored are those of POST /v1/network/zwd-estimates for the same observations.`,
          'Writes need `Authorization: Bearer <key>`.',
        ].join(' '),
        tags: ['station archive', 'estimation'],
        security: [{ bearerKey: [] }],
        params: strictObject({ day: daySchema }),
        querystring: networkStoredQuerySchema.pick({ source: true }),
        body: networkDayEstimatesRequest,
        response: {
          200: networkStoredEstimatesResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          413: problemSchema,
          422: problemSchema,
          503: problemSchema,
        },
      },
    },
    async (request, reply) => {
      const { day } = request.params;
      const body = request.body;
      const source = request.query.source ?? DEFAULT_NETWORK_SOURCE;
      // The named stations only (one query), not the whole archive.
      const archive = await app.repository.getStations(body.stations.map((s) => s.id));
      const archiveSites = sitesOf(archive);
      const store = residuals();
      const days = [];
      for (const [i, s] of body.stations.entries()) {
        if (!archive.has(s.id)) continue; // the worker answers the 404 naming it, as the storing route does
        const deposit = await store.get(s.id, day);
        if (!deposit)
          throw CallerError.field(
            404,
            `stations.${i}.id`,
            `no residuals of station "${s.id}" on ${day}; deposit them with PUT /v1/stations/${s.id}/residuals/${day}`,
          );
        days.push(deposit);
      }
      const observations = days.reduce((sum, d) => sum + d.observationCount, 0);
      if (body.stations.length * observations > options.maxStationObservations)
        throw CallerError.field(
          413,
          'stations',
          `${body.stations.length} stations × ${observations} deposited observations = ${body.stations.length * observations}; one network day takes at most ${options.maxStationObservations} (stations × observations, TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS): estimate fewer stations together (a subnetwork with a few distant stations keeps the absolute level) or raise the setting where the replica has the memory`,
        );
      const startMs = Date.parse(`${day}T00:00:00Z`);
      const metStations = (body.met ?? []).map((r) => r.station);
      const storedMet = await networkStoredMet(
        app.repository,
        archive,
        {
          range: { firstMs: startMs, lastMs: startMs + DAY_MS - 1 },
          stations: body.stations.map((s) => s.id),
          metStations,
        },
        options.maxReadRangeDays,
      );
      const output = await app.compute.run('network-day-estimate', {
        day,
        body,
        residuals: days.map((d) => d.data),
        archiveSites,
        storedMet,
        maxStationObservations: options.maxStationObservations,
        memoryBytes: body.stations.length * observations * NETWORK_DAY_MEMORY_PER_STATION_OBSERVATION,
      });
      const stored = await storeNetwork(app.repository, source, output.delays!, output.modelFingerprint!, output.models!, output.metUsed!);
      request.auditDetail = {
        source,
        records: stored.reduce((n, x) => n + x.inserted + x.updated + x.unchanged, 0),
        inserted: stored.reduce((n, x) => n + x.inserted, 0),
        updated: stored.reduce((n, x) => n + x.updated, 0),
        unchanged: stored.reduce((n, x) => n + x.unchanged, 0),
      };
      const tail = `,"stored":${JSON.stringify(stored)}}`;
      return reply.type('application/json').send(Buffer.concat([asBuffer(output.json), Buffer.from(tail)]) as never);
    },
  );
};

export default networkDaysRoute;
