/**
 * The raw-body pipeline of the ZWD-estimation routes (one for both): in the route's scope JSON stays
 * bytes, the body part of the route schema is not validated on the event loop (the worker validates
 * it against the same schema, src/http/tasks/zwd-request.ts), and the content type picks the format.
 */

import type { FastifyInstance, FastifyRequest, FastifySchemaCompiler } from 'fastify';
import { validatorCompiler } from 'fastify-type-provider-zod';
import { ARROW_STREAM_TYPE } from './answer-shape.js';
import { HttpProblem } from './problem.js';

/** In this plugin scope, application/json (and Arrow IPC stream) bodies reach the handler as a Buffer. */
export function keepJsonBodiesAsBytes(app: FastifyInstance): void {
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', { parseAs: 'buffer' }, (_request, body, done) => done(null, body));
  app.addContentTypeParser(ARROW_STREAM_TYPE, { parseAs: 'buffer' }, (_request, body, done) => done(null, body));
}

/** Route validator: params and query as usual; the body passes through (validated in the worker). */
// fastify types a route's validatorCompiler with the whole route schema; each call gets one part's zod schema.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const bodyInWorkerValidator: FastifySchemaCompiler<any> = (route) =>
  route.httpPart === 'body'
    ? (data: unknown) => ({ value: data })
    : validatorCompiler(route as unknown as Parameters<typeof validatorCompiler>[0]);

/** The query parameter names as sent (before validation adds the defaults), e.g. ["source", "zwd_interval_s"]. */
export function sentQueryKeys(url: string | undefined): string[] {
  const at = url?.indexOf('?') ?? -1;
  return at < 0 ? [] : [...new Set(new URLSearchParams(url!.slice(at + 1)).keys())];
}

export interface RawBody {
  body: Uint8Array | string;
  format: 'json' | 'csv' | 'arrow';
}

/**
 * Bytes the worker pool can move (transfer) instead of copying: the array must own its whole
 * buffer (a small Buffer is a slice of Node's shared pool, which must not be detached; it is copied).
 */
export function movableBytes(bytes: Uint8Array): Uint8Array<ArrayBuffer> {
  return bytes.buffer instanceof ArrayBuffer && bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength
    ? (bytes as Uint8Array<ArrayBuffer>)
    : new Uint8Array(bytes);
}

/** The array buffers to move with a raw body (none for text). */
export const transferOf = (raw: RawBody): ArrayBuffer[] => (typeof raw.body === 'string' ? [] : [raw.body.buffer as ArrayBuffer]);

/** Bytes from a worker as a Buffer for the reply, without a copy. */
export const asBuffer = (bytes: Uint8Array): Buffer => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);

/** The body as bytes (JSON; movable to a worker) or text (CSV); any other content type is a 415. */
export function rawBodyOf(request: FastifyRequest): RawBody {
  const raw = request.body as Buffer | string;
  const type = (request.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
  const format = type === 'text/csv' ? 'csv' : type === 'application/json' ? 'json' : type === ARROW_STREAM_TYPE ? 'arrow' : undefined;
  if (!format)
    throw new HttpProblem(
      415,
      `content type ${type || '(none)'} is not accepted here; send application/json or text/csv (or an Arrow IPC stream, ${ARROW_STREAM_TYPE})`,
    );
  return { body: typeof raw === 'string' ? raw : movableBytes(new Uint8Array(raw.buffer, raw.byteOffset, raw.byteLength)), format };
}
