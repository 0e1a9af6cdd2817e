/**
 * A request body's bytes as they arrive, with the limit and errors of fastify's own raw-body reader: a chunk
 * past the route's body limit ends the read with a 413 (FST_ERR_CTP_BODY_TOO_LARGE), a body shorter or longer
 * than its Content-Length with a 400 (FST_ERR_CTP_INVALID_CONTENT_LENGTH), a broken stream with its error as a
 * 4xx. One reader for the content-type parsers that keep bytes their own way (batch-body.ts into pooled bytes,
 * plugins/json-body.ts into text); each checks a declared length over the limit itself before it reads.
 */

import type { IncomingMessage } from 'node:http';
import { errorCodes, type FastifyRequest } from 'fastify';

/**
 * Calls `take(chunk, at)` for each chunk (`at`: the bytes before it), then `done(null, received)` at the end of
 * the body, or `done(err, received)` once, after which no chunk is taken. Content-Length counts the bytes on the
 * wire, so it is checked only for the request's own stream (a payload a preParsing hook replaced, none today,
 * may differ, as fastify's reader allows).
 */
export function readBodyChunks(
  request: FastifyRequest,
  payload: IncomingMessage,
  take: (chunk: Buffer, at: number) => void,
  done: (err: Error | null, received: number) => void,
): void {
  const limit = request.routeOptions.bodyLimit ?? Infinity;
  const declared = Number(request.headers['content-length']);
  let received = 0;
  const finish = (err: Error | null) => {
    payload.removeListener('data', onData);
    payload.removeListener('end', onEnd);
    payload.removeListener('error', onError);
    done(err, received);
  };
  const onData = (chunk: Buffer | string) => {
    const bytes = typeof chunk === 'string' ? Buffer.from(chunk) : chunk;
    if (received + bytes.length > limit) return finish(new errorCodes.FST_ERR_CTP_BODY_TOO_LARGE());
    take(bytes, received);
    received += bytes.length;
  };
  const onEnd = () => {
    if (payload === request.raw && Number.isInteger(declared) && received !== declared)
      return finish(new errorCodes.FST_ERR_CTP_INVALID_CONTENT_LENGTH());
    finish(null);
  };
  const onError = (err: Error & { statusCode?: number }) => {
    if (!(typeof err.statusCode === 'number' && err.statusCode >= 400)) err.statusCode = 400;
    finish(err);
  };
  payload.on('data', onData);
  payload.on('end', onEnd);
  payload.on('error', onError);
  payload.resume();
}
