/**
 * One place maps every error to a problem response: schema violations and model-domain errors to
 * 4xx naming the field, fastify's own 4xx (bad JSON, wrong content type, body too large) to the
 * same shape, a storage failure (database unreachable or too slow, disk full or read-only, a lock
 * conflict that outlived its retries) to a 503 with Retry-After and a text without driver detail,
 * anything else to a 500 with a generic text and the context in the log.
 */

import type { FastifyError, FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { hasZodFastifySchemaValidationErrors } from 'fastify-type-provider-zod';
import { ModelDomainError } from '../../domain/errors.js';
import { FormatError } from '../../formats/format-error.js';
import { CallerError } from '../../services/caller-error.js';
import { detailOf, expandUnknownKeys, fieldName } from '../field-errors.js';
import { UnknownStationError } from '../../storage/repository.js';
import { storageUnavailable } from '../../storage/errors.js';
import { HttpProblem, makeProblem, sendProblem, type FieldError } from '../problem.js';

const locationOf = (context: string | undefined) =>
  context === undefined || context === 'body' ? 'body' : context === 'querystring' ? 'query' : (context as 'params' | 'headers');

function fieldFromPath(instancePath: string, context: string | undefined): string {
  const path = instancePath.replace(/^\//, '').split('/').filter(Boolean);
  return fieldName(path, locationOf(context));
}

/**
 * Fastify's `frameworkErrors` option (app.ts): errors the router raises before any route or error
 * handler runs (a path that is not valid percent-encoding, a path parameter longer than the router's
 * maxParamLength), answered in the same problem shape as everything else.
 */
export function routerErrorHandler(error: FastifyError, request: FastifyRequest, reply: FastifyReply): void {
  const path = request.url.split('?')[0] ?? '';
  const detail =
    error.code === 'FST_ERR_BAD_URL'
      ? 'the request path is not valid percent-encoding (RFC 3986): encode reserved and non-ASCII characters as %XX of their UTF-8 bytes'
      : error.code === 'FST_ERR_MAX_PARAM_LENGTH'
        ? 'a path segment is longer than the router accepts (100 characters); no identifier of this service is that long'
        : 'the request could not be routed';
  const status = error.code === 'FST_ERR_MAX_PARAM_LENGTH' ? 414 : (error.statusCode ?? 400);
  void sendProblem(reply, makeProblem(status >= 400 && status < 500 ? status : 400, detail, undefined, path.slice(0, 200)));
}

async function errorHandler(app: FastifyInstance): Promise<void> {
  app.setErrorHandler((error: FastifyError, request, reply) => {
    if (hasZodFastifySchemaValidationErrors(error)) {
      const errors: FieldError[] = error.validation.flatMap((v) => {
        const keys = (v.params as { keys?: unknown } | undefined)?.keys;
        if (v.keyword === 'unrecognized_keys' && Array.isArray(keys)) {
          const path = v.instancePath.replace(/^\//, '').split('/').filter(Boolean);
          return expandUnknownKeys(path, keys.map(String), v.message ?? 'unknown key', locationOf(error.validationContext));
        }
        return [{ field: fieldFromPath(v.instancePath, error.validationContext), message: v.message ?? 'invalid value' }];
      });
      return sendProblem(reply, makeProblem(400, detailOf(errors), errors, request.url));
    }
    if (error instanceof ModelDomainError) {
      return sendProblem(
        reply,
        makeProblem(error.status, `${error.field}: ${error.message}`, [{ field: error.field, message: error.message }], request.url),
      );
    }
    // Errors of the inner layers in domain terms (src/services, src/formats).
    if (error instanceof CallerError) {
      return sendProblem(reply, makeProblem(error.status, error.message, error.errors, request.url));
    }
    if (error instanceof FormatError) {
      return sendProblem(reply, makeProblem(400, error.message, [{ field: error.field, message: error.reason }], request.url));
    }
    if (error instanceof UnknownStationError) {
      return sendProblem(
        reply,
        makeProblem(404, `no station "${error.stationId}"`, [{ field: 'params.station_id', message: 'no such station' }], request.url),
      );
    }
    if (error instanceof HttpProblem) {
      for (const [k, v] of Object.entries(error.headers ?? {})) reply.header(k, v);
      return sendProblem(reply, makeProblem(error.status, error.message, error.errors, request.url));
    }
    const status = error.statusCode ?? 500;
    if (status >= 400 && status < 500) {
      const detail =
        error.code === 'FST_ERR_CTP_BODY_TOO_LARGE'
          ? `request body is larger than this route accepts (${request.routeOptions.bodyLimit ?? app.initialConfig.bodyLimit} bytes)`
          : error.code === 'FST_ERR_CTP_INVALID_MEDIA_TYPE'
            ? `content type ${request.headers['content-type'] ?? '(none)'} is not accepted here; send application/json`
            : error.message;
      return sendProblem(reply, makeProblem(status, detail, undefined, request.url));
    }
    // After the 4xx branch: a client that aborts its upload raises socket codes too, with a 4xx status.
    const unavailable = storageUnavailable(error);
    if (unavailable) {
      // The driver's text (host, file path, SQL) stays in the log, found by the request id.
      request.log.error({ err: error, route: request.routeOptions.url, failure: unavailable.failure }, 'storage unavailable');
      reply.header('retry-after', String(unavailable.retryAfterS));
      return sendProblem(
        reply,
        makeProblem(
          503,
          `${unavailable.message}; retry after ${unavailable.retryAfterS} s (request id in the x-request-id header)`,
          undefined,
          request.url,
        ),
      );
    }
    request.log.error({ err: error, route: request.routeOptions.url }, 'request failed');
    return sendProblem(reply, makeProblem(500, 'internal error; the request id is in the x-request-id header', undefined, request.url));
  });

  app.setNotFoundHandler((request, reply) =>
    sendProblem(reply, makeProblem(404, `no route ${request.method} ${request.url.split('?')[0]}`, undefined, request.url)),
  );
}

export default fp(errorHandler, { name: 'error-handler' });
