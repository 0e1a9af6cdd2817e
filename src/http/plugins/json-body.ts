/**
 * The JSON body parser: fastify's own (prototype-poisoning checks, its 400 for malformed JSON), except
 * that a request without a body content — DELETE, GET, HEAD, OPTIONS — may still carry a JSON
 * content type. Generic clients send `Content-Type: application/json` on every request, and a DELETE
 * refused with "body cannot be empty" would be a 400 for no mistake of the caller.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';

const BODYLESS_METHODS = new Set(['DELETE', 'GET', 'HEAD', 'OPTIONS']);

async function jsonBody(app: FastifyInstance): Promise<void> {
  const parseJson = app.getDefaultJsonParser('error', 'error');
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', { parseAs: 'string' }, (request, body, done) => {
    if (body === '' && BODYLESS_METHODS.has(request.method)) return done(null, undefined);
    return parseJson(request, String(body), done);
  });
}

export default fp(jsonBody, { name: 'json-body' });
