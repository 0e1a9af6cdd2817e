/**
 * GET /v1/ready: 200 when every registered readiness check passes (e.g. the database answers and
 * its migrations are applied, the data directory takes writes), 503 otherwise or while the service
 * shuts down. Plugins that own a dependency register a check with `app.addReadinessCheck(name, fn)`.
 *
 * The checks run in parallel, each with a deadline (READY_CHECK_TIMEOUT_MS): a blackholed database
 * makes the probe answer 503 in time instead of hanging the load balancer's probe. The answer is
 * public, so a failed check says only what kind of failure it was; the driver's text is logged with
 * the request id. A check that is only not ready yet (the compute pool's warm-up at start) throws
 * NotReadyYet: its text is shown as it is and nothing is logged (a load balancer probes every few seconds).
 *
 * It also owns the "closing" state of a shutdown: from the first moment of app.close() every answer
 * carries `Connection: close`, so a keep-alive client whose request was in flight does not hold the
 * server open after its answer (server.ts).
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { z } from 'zod';
import { storageUnavailable } from '../../storage/errors.js';
import { SchemaMismatchError } from '../../storage/migrations.js';
import { problemSchema } from '../schemas/common.js';

type Check = () => Promise<void>;

/** Thrown by a check whose dependency is still starting: the message is public, the probe logs nothing. */
export class NotReadyYet extends Error {}

declare module 'fastify' {
  interface FastifyInstance {
    addReadinessCheck(name: string, check: Check): void;
  }
}

const readyResponse = z.object({
  status: z.enum(['ready', 'not-ready']),
  checks: z.record(z.string(), z.string()).describe('Each check: "ok" or why it failed'),
});

export interface ReadinessOptions {
  /** Deadline of each check [ms] (READY_CHECK_TIMEOUT_MS). */
  timeoutMs?: number;
}

/** A check's outcome as the public answer shows it. */
async function runCheck(
  check: Check,
  timeoutMs: number,
): Promise<{ ok: true } | { ok: false; text: string; err?: unknown; starting?: boolean }> {
  let timer: NodeJS.Timeout | undefined;
  const deadline = new Promise<'timeout'>((resolve) => {
    timer = setTimeout(() => resolve('timeout'), timeoutMs);
  });
  try {
    const outcome = await Promise.race([check().then(() => 'ok' as const), deadline]);
    return outcome === 'ok' ? { ok: true } : { ok: false, text: `no answer within ${timeoutMs} ms` };
  } catch (err) {
    if (err instanceof NotReadyYet) return { ok: false, text: err.message, starting: true };
    // A schema mismatch names migration versions only, so its reason is shown (docs/operations.md, rolling update).
    const text = err instanceof SchemaMismatchError ? err.message : storageUnavailable(err)?.message;
    return { ok: false, text: text ?? 'failed (the reason is in the service log)', err };
  } finally {
    clearTimeout(timer);
  }
}

async function readiness(app: FastifyInstance, options: ReadinessOptions): Promise<void> {
  const checks = new Map<string, Check>();
  const timeoutMs = options.timeoutMs ?? 2_000;
  let closing = false;
  app.decorate('addReadinessCheck', (name: string, check: Check) => void checks.set(name, check));
  app.addHook('preClose', async () => {
    closing = true;
  });
  app.addHook('onSend', async (request, reply) => {
    if (closing && request.raw.httpVersionMajor < 2) reply.header('connection', 'close');
  });

  app.get(
    '/v1/ready',
    {
      schema: {
        summary:
          'Readiness: dependencies reachable (database, migrations), estimation workers warmed up at start; 503 otherwise or while shutting down',
        tags: ['operations'],
        response: { 200: readyResponse, 400: problemSchema, 503: readyResponse },
      },
    },
    async (request, reply) => {
      const results: Record<string, string> = {};
      let ok = !closing;
      if (closing) results['shutdown'] = 'the service is shutting down';
      const outcomes = await Promise.all([...checks].map(async ([name, check]) => [name, await runCheck(check, timeoutMs)] as const));
      for (const [name, outcome] of outcomes) {
        if (outcome.ok) {
          results[name] = 'ok';
        } else {
          ok = false;
          results[name] = outcome.text;
          if (!outcome.starting) request.log.warn({ check: name, err: outcome.err, reason: outcome.text }, 'readiness check failed');
        }
      }
      return reply.code(ok ? 200 : 503).send({ status: ok ? 'ready' : 'not-ready', checks: results });
    },
  );
}

export default fp(readiness, { name: 'readiness' });
