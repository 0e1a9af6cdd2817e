/**
 * The JSON body parser: fastify's own (prototype-poisoning checks, its 400 for malformed JSON), except
 * that a request without a body content — DELETE, GET, HEAD, OPTIONS — may still carry a JSON
 * content type. Generic clients send `Content-Type: application/json` on every request, and a DELETE
 * refused with "body cannot be empty" would be a 400 for no mistake of the caller.
 *
 * The bytes are read as fastify's `parseAs: 'string'` reads them (the route's body limit, a 413 for a
 * body over it, a 400 for one shorter than its Content-Length or a broken stream), with one shortcut:
 * when the whole declared body is already in the request's buffer as the parser runs — a small body
 * arrives with its headers, and Node's HTTP parser has pushed it before fastify's onRequest hooks
 * finish — it is taken from there at once, instead of through the stream's 'data' event and an 'end'
 * event a tick later. That dance cost about 3 µs of a single-point POST /v1/zenith-delays's ~40 µs of
 * service CPU (DEVELOPERS.md, "The per-request cost of the single-point routes").
 */

import type { IncomingMessage } from 'node:http';
import { errorCodes, type FastifyInstance, type FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { readBodyChunks } from '../body-chunks.js';

const BODYLESS_METHODS = new Set(['DELETE', 'GET', 'HEAD', 'OPTIONS']);

type TextDone = (err: Error | null, text?: string) => void;

/**
 * The body as UTF-8 text, with the errors fastify's raw-body reader gives. Node's HTTP parser never
 * delivers more than Content-Length bytes to a request, so `readableLength === declared` means all of it.
 */
export function readBodyText(request: FastifyRequest, payload: IncomingMessage, done: TextDone): void {
  const limit = request.routeOptions.bodyLimit ?? Infinity;
  const declared = Number(request.headers['content-length']);
  if (declared > limit) return done(new errorCodes.FST_ERR_CTP_BODY_TOO_LARGE());
  if (payload === request.raw && payload.readableLength === declared) {
    const whole = declared === 0 ? null : (payload.read() as Buffer | null);
    if (declared === 0 || whole?.length === declared) return done(null, whole === null ? '' : whole.toString('utf8'));
    if (whole) payload.unshift(whole); // not expected: back where it was, and read below
  }
  const chunks: Buffer[] = [];
  readBodyChunks(
    request,
    payload,
    (chunk) => chunks.push(chunk),
    (err, received) => {
      if (err) return done(err);
      done(null, (chunks.length === 1 ? chunks[0]! : Buffer.concat(chunks, received)).toString('utf8'));
    },
  );
}

async function jsonBody(app: FastifyInstance): Promise<void> {
  const parseJson = app.getDefaultJsonParser('error', 'error');
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', (request, payload, done) => {
    readBodyText(request, payload, (err, text) => {
      if (err) done(err);
      else if (text === '' && BODYLESS_METHODS.has(request.method)) done(null, undefined);
      else void parseJson(request, text!, done);
    });
  });
}

export default fp(jsonBody, { name: 'json-body' });
