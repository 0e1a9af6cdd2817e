/**
 * GET /v1/ready: 200 when every registered readiness check passes (e.g. the database answers and
 * its migrations are applied), 503 otherwise or while the service shuts down. Plugins that own a
 * dependency register a check with `app.addReadinessCheck(name, fn)`.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { z } from 'zod';
import { problemSchema } from '../schemas/common.js';

type Check = () => Promise<void>;

declare module 'fastify' {
  interface FastifyInstance {
    addReadinessCheck(name: string, check: Check): void;
  }
}

const readyResponse = z.object({
  status: z.enum(['ready', 'not-ready']),
  checks: z.record(z.string(), z.string()).describe('Each check: "ok" or why it failed'),
});

async function readiness(app: FastifyInstance): Promise<void> {
  const checks = new Map<string, Check>();
  let closing = false;
  app.decorate('addReadinessCheck', (name: string, check: Check) => void checks.set(name, check));
  app.addHook('preClose', async () => {
    closing = true;
  });

  app.get(
    '/v1/ready',
    {
      schema: {
        summary: 'Readiness: dependencies reachable (database, migrations); 503 otherwise or while shutting down',
        tags: ['operations'],
        response: { 200: readyResponse, 400: problemSchema, 503: readyResponse },
      },
    },
    async (_request, reply) => {
      const results: Record<string, string> = {};
      let ok = !closing;
      if (closing) results['shutdown'] = 'the service is shutting down';
      for (const [name, check] of checks) {
        try {
          await check();
          results[name] = 'ok';
        } catch (err) {
          ok = false;
          results[name] = err instanceof Error ? err.message : String(err);
        }
      }
      return reply.code(ok ? 200 : 503).send({ status: ok ? 'ready' : 'not-ready', checks: results });
    },
  );
}

export default fp(readiness, { name: 'readiness' });
