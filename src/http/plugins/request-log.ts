/**
 * One JSON log line per answered request: request id, method, route pattern, status, duration, the
 * client address (as seen through the trusted proxies, TRUST_PROXY), the name of the caller's key
 * (`key`, null without one) and, for a 4xx/5xx problem answer, its problem `type` — so "who got which
 * refusal, and why" is in the log. No bodies, no headers (so no keys themselves).
 */

import type { FastifyBaseLogger, FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';

/** pino's loggers can say whether a level is on; building the record is skipped when it is not. */
function isInfoEnabled(log: FastifyBaseLogger): boolean {
  const pinoLike = log as FastifyBaseLogger & { isLevelEnabled?: (level: string) => boolean };
  return pinoLike.isLevelEnabled ? pinoLike.isLevelEnabled('info') : true;
}

/**
 * The name of the key the request was authorised with. The auth plugin decorates requests with
 * `callerKey` (`{ name, role } | null`); read through this accessor so the log works with or without it.
 */
export function callerKeyName(request: FastifyRequest): string | null {
  const key = (request as FastifyRequest & { callerKey?: { name?: unknown } | null }).callerKey;
  return typeof key?.name === 'string' ? key.name : null;
}

/** Problem `type` of each answered error, read from the problem+json body as it is sent. */
const problemTypes = new WeakMap<FastifyRequest, string>();

function problemTypeOf(payload: unknown): string | undefined {
  const text = typeof payload === 'string' ? payload : Buffer.isBuffer(payload) ? payload.toString('utf8') : undefined;
  if (text === undefined || text.length > 64 * 1024) return undefined;
  try {
    const body = JSON.parse(text) as { type?: unknown };
    return typeof body.type === 'string' ? body.type : undefined;
  } catch {
    return undefined;
  }
}

async function requestLog(app: FastifyInstance): Promise<void> {
  app.addHook('onSend', (request, reply, payload, done) => {
    if (reply.statusCode >= 400 && String(reply.getHeader('content-type') ?? '').includes('problem+json')) {
      const type = problemTypeOf(payload);
      if (type !== undefined) problemTypes.set(request, type);
    }
    done(null, payload);
  });
  app.addHook('onResponse', (request, reply, done) => {
    if (isInfoEnabled(request.log)) {
      request.log.info(
        {
          method: request.method,
          route: request.routeOptions.url ?? 'unmatched',
          url: request.url.split('?')[0],
          status: reply.statusCode,
          durationMs: Math.round(reply.elapsedTime * 10) / 10,
          client: request.ip,
          key: callerKeyName(request),
          ...(reply.statusCode >= 400 ? { problem: problemTypes.get(request) ?? null } : {}),
        },
        'request completed',
      );
    }
    done();
  });
}

export default fp(requestLog, { name: 'request-log' });
