/** Soft-deleted stations: the list, restore, and the purge of those past the retention period. */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { HttpProblem } from '../problem.js';
import { problemSchema } from '../schemas/common.js';
import { deletedStationsResponse, purgeResponse } from '../schemas/access.js';
import { stationParams, stationResponse } from '../schemas/stations.js';
import { requireStation, stationJson } from './station-common.js';

const DAY_MS = 86_400_000;

const adminStationsRoute: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/v1/admin/deleted-stations',
    {
      config: { role: 'admin' },
      schema: {
        summary: 'List the deleted stations',
        description: 'Stations marked deleted and still restorable, oldest first, with the time after which the purge removes them.',
        tags: ['access'],
        response: { 200: deletedStationsResponse, 401: problemSchema, 403: problemSchema },
      },
    },
    async () => ({
      retention_days: app.deleteRetentionDays,
      stations: (await app.repository.listDeletedStations()).map((s) => ({
        station_id: s.stationId,
        name: s.name,
        deleted_at: s.deletedAt,
        purge_after: new Date(Date.parse(s.deletedAt) + app.deleteRetentionDays * DAY_MS).toISOString(),
      })),
    }),
  );

  app.post(
    '/v1/stations/:station_id/restore',
    {
      config: { role: 'admin' },
      schema: {
        summary: 'Restore a deleted station',
        description: 'Clears the deletion mark of a station not yet purged: it and its series are visible again, unchanged.',
        tags: ['station archive', 'access'],
        params: stationParams,
        response: {
          200: stationResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          415: problemSchema,
        },
      },
    },
    async (request) => {
      const stationId = request.params.station_id;
      if (!(await app.repository.restoreStation(stationId))) {
        throw new HttpProblem(404, `no deleted station "${stationId}" (never deleted, or already purged)`, [
          { field: 'params.station_id', message: 'no such deleted station' },
        ]);
      }
      return stationJson(await requireStation(app.repository, stationId));
    },
  );

  app.post(
    '/v1/admin/purge',
    {
      config: { role: 'admin' },
      schema: {
        summary: 'Purge the stations deleted longer ago than the retention period, and trim the audit trail',
        description:
          'Runs now what runs hourly: removes for good every station marked deleted at or before now minus TROPODELAY_DELETE_RETENTION_DAYS, with its series, then deletes the audit events stored before now minus TROPODELAY_AUDIT_RETENTION_DAYS (none when it is 0), in batches. Running it again, or on several replicas at once, deletes nothing twice. To remove one station at once, DELETE /v1/stations/{station_id}?purge=true.',
        tags: ['access'],
        response: { 200: purgeResponse, 401: problemSchema, 403: problemSchema, 415: problemSchema },
      },
    },
    async () => {
      const { purged, cutoff, audit } = await app.purgeExpired();
      return {
        purged,
        cutoff,
        audit_events_trimmed: audit.trimmed,
        audit_events_cutoff: audit.cutoff,
        audit_retention_days: app.auditRetentionDays,
      };
    },
  );
};

export default adminStationsRoute;
