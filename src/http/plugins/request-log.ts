/**
 * One JSON log line per answered request: request id, method, route pattern, status and duration.
 * No bodies, no headers (so no keys), by default.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';

async function requestLog(app: FastifyInstance): Promise<void> {
  app.addHook('onResponse', async (request, reply) => {
    request.log.info(
      {
        method: request.method,
        route: request.routeOptions.url ?? 'unmatched',
        url: request.url.split('?')[0],
        status: reply.statusCode,
        durationMs: Math.round(reply.elapsedTime * 10) / 10,
      },
      'request completed',
    );
  });
}

export default fp(requestLog, { name: 'request-log' });
