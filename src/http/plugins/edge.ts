/**
 * What sits at the edge of the service, all off by default inside an agency network and switched on
 * by configuration: security headers (@fastify/helmet), CORS (@fastify/cors) and rate limiting per
 * API key or client address (@fastify/rate-limit).
 */

import cors from '@fastify/cors';
import helmet from '@fastify/helmet';
import rateLimit from '@fastify/rate-limit';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import type { Config, TrustProxy } from '../../config.js';
import { HttpProblem } from '../problem.js';

/**
 * Fastify's `trustProxy` from the TRUST_PROXY setting. Addresses/CIDRs go to fastify as they are
 * (proxy-addr checks each hop's address). A hop count n becomes "trust the n nearest hops": the TCP
 * peer is hop 0, the last X-Forwarded-For entry hop 1, and so on; the client address is the first
 * untrusted one, so anything a client writes further left in the header is ignored. (Fastify itself
 * takes a bare number as "trust nothing", because a hop count cannot check that the peer really is
 * the proxy: use it only where clients cannot reach the service except through the proxy.)
 */
export function trustProxyOption(setting: TrustProxy): false | string[] | ((address: string, hop: number) => boolean) {
  if (typeof setting === 'number') return (_address: string, hop: number) => hop < setting;
  return setting;
}

export interface EdgeOptions {
  config: Pick<Config, 'SECURITY_HEADERS' | 'CORS_ORIGINS' | 'RATE_LIMIT_PER_MINUTE'>;
}

async function edge(app: FastifyInstance, { config }: EdgeOptions): Promise<void> {
  if (config.SECURITY_HEADERS) {
    // The interactive docs at /docs load their own scripts and styles, which a strict CSP would block.
    await app.register(helmet, { contentSecurityPolicy: false });
  }
  const origins = config.CORS_ORIGINS.split(',')
    .map((s) => s.trim())
    .filter(Boolean);
  if (origins.length > 0) {
    await app.register(cors, {
      origin: origins.includes('*') ? true : origins,
      // The archive routes use PUT and DELETE; the plugin's default list stops at GET,HEAD,POST.
      methods: ['GET', 'HEAD', 'POST', 'PUT', 'DELETE'],
      exposedHeaders: ['x-request-id', 'retry-after', 'x-homogeneous', 'x-model-fingerprints', 'x-model-fingerprint-count'],
    });
  }
  if (config.RATE_LIMIT_PER_MINUTE > 0) {
    await app.register(rateLimit, {
      max: config.RATE_LIMIT_PER_MINUTE,
      timeWindow: 60_000,
      // One budget per accepted API key (by a hash: keys are never kept in clear); anything else, an
      // invalid key included, shares the budget of its client address (behind a proxy set TRUST_PROXY to
      // the proxy's addresses or hop count: X-Forwarded-For entries left of the trusted hops are ignored).
      keyGenerator: (request) => {
        const keyId = app.hasDecorator('acceptedKeyId') ? app.acceptedKeyId(request.headers.authorization) : null;
        return keyId ? `key:${keyId}` : `ip:${request.ip}`;
      },
      allowList: (request) => ['/v1/health', '/v1/ready', '/metrics'].includes(request.url.split('?')[0]!),
      // The plugin throws what this returns; the error handler turns it into a problem response.
      errorResponseBuilder: (_request, context) =>
        new HttpProblem(429, `more than ${context.max} requests per minute; retry after ${Math.ceil(context.ttl / 1000)} s`),
    });
  }
}

export default fp(edge, { name: 'edge' });
