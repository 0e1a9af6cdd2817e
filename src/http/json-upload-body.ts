/**
 * The JSON bodies of the series uploads (met records, delay deposits): up to OFFLOAD_BODY_BYTES
 * parsed by fastify's own JSON parser on the event loop, as on every other route; a larger one kept
 * as bytes (OffloadedJsonBody) and parsed, checked and turned into rows in the worker pool
 * (src/http/tasks/json-upload.ts), so that a 100 000-record upload never holds the loop. The route's
 * envelope validator lets an OffloadedJsonBody through (the task checks the same envelope).
 */

import type { FastifyInstance } from 'fastify';
import { OFFLOAD_BODY_BYTES } from '../limits.js';
import { movableBytes } from './raw-body.js';

/** A JSON body above OFFLOAD_BODY_BYTES, as bytes the pool can move to a worker. */
export class OffloadedJsonBody {
  constructor(readonly bytes: Uint8Array<ArrayBuffer>) {}
}

/** Methods whose JSON content type may come without a body (as plugins/json-body.ts allows). */
const BODYLESS_METHODS = new Set(['DELETE', 'GET', 'HEAD', 'OPTIONS']);

/** In this plugin scope: small JSON bodies parsed as everywhere else, large ones kept as OffloadedJsonBody. */
export function offloadLargeJsonBodies(app: FastifyInstance): void {
  const parseJson = app.getDefaultJsonParser('error', 'error');
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', { parseAs: 'buffer' }, (request, body, done) => {
    const bytes = body as Buffer;
    if (bytes.byteLength > OFFLOAD_BODY_BYTES) {
      return done(null, new OffloadedJsonBody(movableBytes(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength))));
    }
    if (bytes.byteLength === 0 && BODYLESS_METHODS.has(request.method)) return done(null, undefined);
    return parseJson(request, bytes.toString('utf8'), done);
  });
}
