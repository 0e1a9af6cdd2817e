/** The audit trail of writes (plugins/audit.ts), newest first, for admins. */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { problemSchema } from '../schemas/common.js';
import { auditQuery, auditResponse } from '../schemas/access.js';
import { rangeEndMs, rangeStartMs } from '../schemas/range-bounds.js';

const adminAuditRoute: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/v1/audit',
    {
      config: { role: 'admin' },
      schema: {
        summary: 'Read the audit trail of writes',
        description:
          'One event per write request made with an accepted key (PUT/DELETE of stations, uploads, stored estimations, restores, purges, key changes), refused ones included: key name, client address, route, station, source, record counts, status, time. Newest first. Events older than TROPODELAY_AUDIT_RETENTION_DAYS are deleted by the hourly retention run (0 = kept forever).',
        tags: ['access'],
        querystring: auditQuery,
        response: { 200: auditResponse, 400: problemSchema, 401: problemSchema, 403: problemSchema },
      },
    },
    async (request) => {
      const q = request.query;
      const events = await app.repository.listAuditEvents({
        fromMs: q.from === undefined ? undefined : rangeStartMs(q.from),
        toMs: q.to === undefined ? undefined : rangeEndMs(q.to),
        stationId: q.station,
        keyName: q.key_name,
        limit: q.limit,
      });
      return {
        events: events.map((e) => ({
          event_id: e.eventId,
          at: new Date(e.atMs).toISOString(),
          key_name: e.keyName,
          client_address: e.clientAddress,
          method: e.method,
          route: e.route,
          path: e.path,
          station_id: e.stationId,
          source: e.source,
          records: e.records,
          inserted: e.inserted,
          updated: e.updated,
          unchanged: e.unchanged,
          status: e.status,
          request_id: e.requestId,
        })),
      };
    },
  );
};

export default adminAuditRoute;
