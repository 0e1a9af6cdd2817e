/**
 * Responses are serialised with plain JSON.stringify (app.ts: validating every answer with zod
 * costs a third of the throughput of a single-point request), so nothing at run time keeps them in
 * step with the response schemas the OpenAPI document publishes. With `validateResponses` (every
 * HTTP test builds the app so) this onSend hook checks each JSON answer against its route's
 * response schema for that status, and turns a mismatch, or a status the route does not document,
 * into a 500 naming the route, the status and the first differences: a test that receives it fails.
 */

import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import type { z } from 'zod';

export class ResponseSchemaMismatch extends Error {
  override readonly name = 'ResponseSchemaMismatch';
}

const isJson = (type: unknown) => typeof type === 'string' && /^application\/(problem\+)?json/.test(type);

function check(request: FastifyRequest, reply: FastifyReply, payload: unknown): void {
  if (request.headers['x-response-check'] === 'off') return;
  const responses = request.routeOptions.schema?.response as Record<string, z.ZodType> | undefined;
  if (!responses || !isJson(reply.getHeader('content-type'))) return;
  if (typeof payload !== 'string' && !Buffer.isBuffer(payload)) return;
  const status = reply.statusCode;
  const route = `${request.method} ${request.routeOptions.url}`;
  // Answers the edge gives before or around every route (rate limit, server errors) are documented once, not per route.
  if (status === 429 || status >= 500) return;
  const schema = responses[String(status)] ?? responses[`${String(status)[0]}xx`] ?? responses.default;
  if (!schema) throw new ResponseSchemaMismatch(`${route} answered ${status}, which its response schemas do not document`);
  const parsed = schema.safeParse(JSON.parse(payload.toString()));
  if (!parsed.success) {
    const issues = parsed.error.issues.slice(0, 5).map((i) => `${i.path.join('.') || '(root)'}: ${i.message}`);
    throw new ResponseSchemaMismatch(`${route} answered ${status} not matching its response schema: ${issues.join('; ')}`);
  }
}

export function checkResponsesAgainstSchemas(app: FastifyInstance): void {
  app.addHook('onSend', async (request, reply, payload) => {
    check(request, reply, payload);
    return payload;
  });
}
