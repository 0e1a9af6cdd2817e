import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { problemSchema } from '../schemas/common.js';
import { stationBody, stationListResponse, stationParams, stationResponse } from '../schemas/stations.js';
import { requireStation, stationJson } from './station-common.js';

const AUTH = 'Writes need `Authorization: Bearer <key>` (401 without, 403 with a wrong key).';

const stationsRoute: FastifyPluginAsyncZod = async (app) => {
  app.put(
    '/v1/stations/:station_id',
    {
      schema: {
        summary: 'Create or replace a station',
        description: `Creates the station (201) or replaces its description (200); its series stay. ${AUTH}`,
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
          413: problemSchema,
          415: problemSchema,
        },
      },
    },
    async (request, reply) => {
      const b = request.body;
      const { station, created } = await app.repository.putStation(request.params.station_id, {
        name: b.name,
        latitudeDeg: b.latitude_deg,
        longitudeDeg: b.longitude_deg,
        heightM: b.height_m,
        metHeightM: b.met_height_m ?? null,
        description: b.description ?? null,
      });
      return reply.code(created ? 201 : 200).send(stationJson(station));
    },
  );

  app.get(
    '/v1/stations',
    {
      schema: {
        summary: 'List the stations',
        tags: ['station archive'],
        response: { 200: stationListResponse, 401: problemSchema, 403: problemSchema },
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
        response: { 200: stationResponse, 400: problemSchema, 401: problemSchema, 403: problemSchema, 404: problemSchema },
      },
    },
    async (request) => stationJson(await requireStation(app.repository, request.params.station_id)),
  );

  app.delete(
    '/v1/stations/:station_id',
    {
      schema: {
        summary: 'Delete a station and all its series',
        security: [{ bearerKey: [] }],
        description: `Deletes the station with its met and delay series, in one transaction. ${AUTH}`,
        tags: ['station archive'],
        params: stationParams,
        response: { 204: z.null().describe('Deleted'), 400: problemSchema, 401: problemSchema, 403: problemSchema, 404: problemSchema },
      },
    },
    async (request, reply) => {
      if (!(await app.repository.deleteStation(request.params.station_id))) await requireStation(app.repository, request.params.station_id);
      return reply.code(204).send(null);
    },
  );
};

export default stationsRoute;
