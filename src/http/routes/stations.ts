import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { StationDeletedError } from '../../storage/repository.js';
import { HttpProblem } from '../problem.js';
import { deleteStationQuery } from '../schemas/access.js';
import { problemSchema } from '../schemas/common.js';
import { stationBody, stationListResponse, stationParams, stationResponse } from '../schemas/stations.js';
import { requireStation, stationJson } from './station-common.js';

const stationsRoute: FastifyPluginAsyncZod = async (app) => {
  app.put(
    '/v1/stations/:station_id',
    {
      schema: {
        summary: 'Create or replace a station',
        description:
          'Creates the station (201) or replaces its description (200); its series stay. The id of a deleted station is reserved until it is purged or restored (409).',
        tags: ['station archive'],
        security: [{ bearerKey: [] }],
        params: stationParams,
        body: stationBody,
        response: {
          200: stationResponse,
          201: stationResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          409: problemSchema,
          413: problemSchema,
          415: problemSchema,
        },
      },
    },
    async (request, reply) => {
      const b = request.body;
      try {
        const { station, created } = await app.repository.putStation(request.params.station_id, {
          name: b.name,
          latitudeDeg: b.latitude_deg,
          longitudeDeg: b.longitude_deg,
          heightM: b.height_m,
          metHeightM: b.met_height_m ?? null,
          description: b.description ?? null,
        });
        return reply.code(created ? 201 : 200).send(stationJson(station));
      } catch (err) {
        if (!(err instanceof StationDeletedError)) throw err;
        throw new HttpProblem(
          409,
          `station "${err.stationId}" was deleted at ${err.deletedAt}; its id is reserved until an admin restores it (POST /v1/stations/${err.stationId}/restore) or purges it`,
          [{ field: 'params.station_id', message: 'id of a deleted station' }],
        );
      }
    },
  );

  app.get(
    '/v1/stations',
    {
      schema: {
        summary: 'List the stations',
        tags: ['station archive'],
        response: { 200: stationListResponse, 401: problemSchema, 403: problemSchema, 503: problemSchema },
      },
    },
    async () => ({ stations: (await app.repository.listStations()).map(stationJson) }),
  );

  app.get(
    '/v1/stations/:station_id',
    {
      schema: {
        summary: 'One station',
        tags: ['station archive'],
        params: stationParams,
        response: {
          200: stationResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          503: problemSchema,
        },
      },
    },
    async (request) => stationJson(await requireStation(app.repository, request.params.station_id)),
  );

  app.delete(
    '/v1/stations/:station_id',
    {
      config: { role: 'admin' },
      schema: {
        summary: 'Delete a station (restorable until purged)',
        description:
          'Marks the station deleted: it and its met and delay series are hidden from every read and refuse writes, and its id stays reserved. It can be restored (POST /v1/stations/{station_id}/restore) until the purge removes it with its series, TROPODELAY_DELETE_RETENTION_DAYS after the delete. `?purge=true` removes it for good at once (also a station already marked deleted).',
        tags: ['station archive'],
        params: stationParams,
        querystring: deleteStationQuery,
        response: { 204: z.null().describe('Deleted'), 400: problemSchema, 401: problemSchema, 403: problemSchema, 404: problemSchema },
      },
    },
    async (request, reply) => {
      const stationId = request.params.station_id;
      const done =
        request.query.purge === 'true'
          ? await app.repository.purgeStation(stationId)
          : await app.repository.deleteStation(stationId, new Date().toISOString());
      if (!done) await requireStation(app.repository, stationId);
      return reply.code(204).send(null);
    },
  );
};

export default stationsRoute;
