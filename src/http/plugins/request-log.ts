/**
 * One JSON log line per answered request: request id, method, route pattern, status and duration.
 * No bodies, no headers (so no keys), by default.
 */

import type { FastifyBaseLogger, FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';

/** pino's loggers can say whether a level is on; building the record is skipped when it is not. */
function isInfoEnabled(log: FastifyBaseLogger): boolean {
  const pinoLike = log as FastifyBaseLogger & { isLevelEnabled?: (level: string) => boolean };
  return pinoLike.isLevelEnabled ? pinoLike.isLevelEnabled('info') : true;
}

async function requestLog(app: FastifyInstance): Promise<void> {
  app.addHook('onResponse', (request, reply, done) => {
    if (isInfoEnabled(request.log)) {
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
    }
    done();
  });
}

export default fp(requestLog, { name: 'request-log' });
