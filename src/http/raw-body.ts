/**
 * The raw-body pipeline of the ZWD-estimation routes (one for both): in the route's scope JSON stays
 * bytes, the body part of the route schema is not validated on the event loop (the worker validates
 * it against the same schema, src/http/tasks/zwd-request.ts), and the content type picks the format.
 */

import type { FastifyInstance, FastifyReply, FastifyRequest, FastifySchemaCompiler } from 'fastify';
import { validatorCompiler } from 'fastify-type-provider-zod';
import { ARROW_STREAM_TYPE } from './answer-shape.js';
import { HttpProblem, type FieldError } from './problem.js';
import { arrowRowCounter, csvRowCounter, fewestJsonBytesPerRow, jsonRowCounter, type RowCounter } from './row-count.js';
import { zwdObservationSchema } from './schemas/zwd-estimates.js';

/**
 * The fewest bytes an observation of the estimation routes takes in a JSON body (column arrays: 33 bytes, of
 * which the epoch 23). A JSON body declared shorter than (maxRows + 1) × this is not counted while it arrives.
 */
export const FEWEST_JSON_OBSERVATION_BYTES = fewestJsonBytesPerRow(zwdObservationSchema.shape);

/** In this plugin scope, application/json (and Arrow IPC stream) bodies reach the handler as a Buffer. */
export function keepJsonBodiesAsBytes(app: FastifyInstance): void {
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', { parseAs: 'buffer' }, (_request, body, done) => done(null, body));
  app.addContentTypeParser(ARROW_STREAM_TYPE, { parseAs: 'buffer' }, (_request, body, done) => done(null, body));
}

/**
 * In this plugin scope (the estimation routes), JSON, Arrow and CSV bodies are read here rather than by
 * fastify's parsers: the route's body limit is enforced, and the observations are counted while the
 * bytes arrive (row-count.ts). Over `maxRows`, the answer is a 413 naming the limit as soon as the
 * count passes it: the rest of the body is dropped as it comes, never held.
 * JSON and Arrow reach the handler as the chunks they arrived in (an array of byte arrays), moved to the worker as they
 * are and joined there (compute-worker.ts): joined here, the copy cost the event loop ~2 ms per 2.3 MB
 * GPS-like day, and the chunks, garbage after it, counted toward the loop's external memory until a
 * collection, which marked the loop's whole old generation every few requests. CSV reaches the handler as a
 * string (copied into one buffer as it arrives, as before).
 *
 * A JSON body with a Content-Length below (maxRows + 1) × `jsonBytesPerRow` cannot hold more than maxRows
 * observations: it is not counted (the counter's byte scan cost ~3 ms of event-loop CPU per 2.3 MB GPS-like
 * day), and the worker's check after parsing answers anything off in it. Bodies without a Content-Length,
 * and longer ones, are counted as before.
 */
export function readEstimationBodies(app: FastifyInstance, maxRows: number, jsonBytesPerRow = FEWEST_JSON_OBSERVATION_BYTES): void {
  const formats: [string, () => RowCounter, boolean, number][] = [
    ['application/json', jsonRowCounter, false, (maxRows + 1) * jsonBytesPerRow],
    [ARROW_STREAM_TYPE, arrowRowCounter, false, 0],
    ['text/csv', csvRowCounter, true, 0],
  ];
  for (const [type, counterOf, asText, countFrom] of formats) {
    if (app.hasContentTypeParser(type)) app.removeContentTypeParser(type);
    app.addContentTypeParser(type, (request, payload, done) => {
      const limit = request.routeOptions.bodyLimit ?? app.initialConfig.bodyLimit ?? Infinity;
      const chunks: Uint8Array<ArrayBuffer>[] = [];
      let bytes = 0;
      // A text body with a Content-Length within the limit is copied into one buffer as it arrives, so that it
      // is never held twice (the chunks and their concatenation: 2 × 70 MB for 30 days).
      const declared = Number(request.headers['content-length']);
      const withinLimit = Number.isInteger(declared) && declared > 0 && declared <= limit;
      let whole = asText && withinLimit ? Buffer.allocUnsafeSlow(declared) : undefined;
      // Node's HTTP parser delivers no more than the declared length, so a short declared body needs no count.
      let counter: RowCounter | undefined = withinLimit && declared < countFrom ? undefined : counterOf();
      let finished = false;
      // The rest of the body is not held: it is read and dropped (the client gets the answer while it sends, and
      // a client that stops on it can keep its connection) up to the body limit, past which the socket is closed.
      const refuse = (detail: string, errors?: FieldError[]) => {
        finished = true;
        chunks.length = 0;
        whole = undefined;
        // Handed to the handler (rawBodyOf throws it): an error from a parser would make fastify close the
        // connection at once, and the client, still sending, could lose the answer to the reset.
        done(null, new RefusedBody(new HttpProblem(413, detail, errors)));
      };
      payload.on('data', (chunk: Buffer) => {
        bytes += chunk.length;
        if (finished) {
          if (bytes > limit) request.raw.socket.destroy();
          return;
        }
        if (bytes > limit) return refuse(`request body is larger than this route accepts (${limit} bytes)`);
        if (whole && bytes <= whole.length) chunk.copy(whole, bytes - chunk.length);
        else if (whole) {
          chunks.push(whole.subarray(0, bytes - chunk.length), movableBytes(chunk)); // more than declared (not seen from Node's parser)
          whole = undefined;
        } else chunks.push(movableBytes(chunk));
        try {
          counter?.push(chunk);
        } catch {
          counter = undefined; // not readable as this format: the full reader says why
        }
        if (counter && counter.rows > maxRows) {
          const message = `more than ${maxRows} observations (counted while reading, ${counter.rows} so far); split the request (at most ${maxRows} observations each)`;
          refuse(`observations: ${message}`, [{ field: 'observations', message }]);
        }
      });
      payload.on('end', () => {
        if (finished) return;
        finished = true;
        if (!asText) return done(null, chunks);
        const body = whole ? (bytes === whole.length ? whole : whole.subarray(0, bytes)) : Buffer.concat(chunks, bytes);
        done(null, body.toString('utf8'));
      });
      payload.on('error', (err) => {
        if (finished) return;
        finished = true;
        done(err, undefined);
      });
    });
  }
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
  /** Bytes (JSON, Arrow; from readEstimationBodies as the chunks they arrived in) or text (CSV). */
  body: Uint8Array | Uint8Array<ArrayBuffer>[] | string;
  format: 'json' | 'csv' | 'arrow';
}

/**
 * Bytes the worker pool can move (transfer) instead of copying: the array must own its whole
 * buffer (a small Buffer is a slice of Node's shared pool, which must not be detached; it is copied).
 */
export function movableBytes(bytes: Uint8Array): Uint8Array<ArrayBuffer> {
  return ownsBuffer(bytes) ? bytes : new Uint8Array(bytes);
}

/** Whether the array is its buffer, whole (as a worker's moved output is): only such a buffer may be moved or given back. */
export const ownsBuffer = (bytes: Uint8Array): bytes is Uint8Array<ArrayBuffer> =>
  bytes.buffer instanceof ArrayBuffer && bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength;

/** The array buffers to move with a raw body (none for text). */
export const transferOf = (raw: RawBody): ArrayBuffer[] =>
  typeof raw.body === 'string' ? [] : Array.isArray(raw.body) ? raw.body.map((chunk) => chunk.buffer) : [raw.body.buffer as ArrayBuffer];

/** Bytes from a worker as a Buffer for the reply, without a copy. */
export const asBuffer = (bytes: Uint8Array): Buffer => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);

/**
 * Replies with an answer's bytes as they are (asBuffer, no copy), and once the socket has taken them all
 * ('finish') gives them back (`release`: app.compute.release), so that their buffer stops counting toward the
 * event loop's external memory at once instead of at the loop's next collection. The bytes must be this
 * answer's alone. An answer whose client went away before the end is left to the collector (the socket may
 * still hold it).
 */
export function replyWithBytes(reply: FastifyReply, bytes: Uint8Array, contentType: string, release: (bytes: Uint8Array) => void) {
  reply.raw.once('finish', () => release(bytes));
  return reply.type(contentType).send(asBuffer(bytes) as never);
}

/** A body refused while it was read (readEstimationBodies): the problem to answer. */
class RefusedBody {
  constructor(readonly problem: HttpProblem) {}
}

/**
 * The body as bytes (JSON, Arrow; movable to a worker: the chunks of readEstimationBodies as they are, a Buffer
 * as one array that owns its buffer) or text (CSV); any other content type is a 415.
 */
export function rawBodyOf(request: FastifyRequest): RawBody {
  if (request.body instanceof RefusedBody) throw request.body.problem;
  const raw = request.body as Buffer | Uint8Array<ArrayBuffer>[] | string;
  const type = (request.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
  const format = type === 'text/csv' ? 'csv' : type === 'application/json' ? 'json' : type === ARROW_STREAM_TYPE ? 'arrow' : undefined;
  if (!format)
    throw new HttpProblem(
      415,
      `content type ${type || '(none)'} is not accepted here; send application/json or text/csv (or an Arrow IPC stream, ${ARROW_STREAM_TYPE})`,
    );
  if (typeof raw === 'string' || Array.isArray(raw)) return { body: raw, format };
  return { body: movableBytes(new Uint8Array(raw.buffer, raw.byteOffset, raw.byteLength)), format };
}
