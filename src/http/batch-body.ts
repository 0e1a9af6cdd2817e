/**
 * The a-priori batch routes (slant delays, mapping factors, precipitable water): in the route's scope
 * JSON stays bytes, and the body is parsed, validated, computed and serialised by one function of
 * src/http/tasks/apriori-batch.ts: on the event loop while its estimated work is that of a JSON body
 * up to OFFLOAD_BODY_BYTES (cheaper than the hand-over; column arrays and Arrow cost less per byte,
 * OFFLOAD_COST_PER_BYTE), in the worker pool above it, so that a 100 000-item batch never holds the loop.
 */

import type { IncomingMessage } from 'node:http';
import { errorCodes, type FastifyInstance, type FastifyReply, type FastifyRequest } from 'fastify';
import { OFFLOAD_BODY_BYTES, OFFLOAD_COST_PER_BYTE } from '../limits.js';
import type { TaskOutcome } from '../workers/task-outcome.js';
import { ARROW_STREAM_TYPE, pooledBytes, releasePooledBytes } from './answer-shape.js';
import { readBodyChunks } from './body-chunks.js';
import { HttpProblem } from './problem.js';
import { asBuffer, movableBytes } from './raw-body.js';
import type { BatchTaskInput, BatchTaskOutput } from './tasks/apriori-batch.js';

export type BatchTaskName = 'slant-delays-request' | 'mapping-factors-request' | 'precipitable-water-request';

const COLUMN_ROWS = /"(?:directions|satellites)"\s*:\s*\{/;

/**
 * The body's work on the event loop in bytes of JSON objects (OFFLOAD_COST_PER_BYTE). Rows sent as column
 * arrays are recognised by `"directions": {` or `"satellites": {` in the first bytes after the site and
 * options (a guess that only moves the work between loop and pool: both give the same answer).
 */
export function loopCostBytes(raw: Buffer, format: 'json' | 'arrow'): number {
  if (format === 'arrow') return raw.byteLength * OFFLOAD_COST_PER_BYTE.arrow;
  const head = raw.toString('latin1', 0, Math.min(raw.byteLength, 4096));
  return raw.byteLength * (COLUMN_ROWS.test(head) ? OFFLOAD_COST_PER_BYTE.jsonColumns : OFFLOAD_COST_PER_BYTE.jsonRows);
}

/**
 * In this plugin scope, application/json and Arrow IPC stream bodies reach the handler as a Buffer, read as
 * fastify's `parseAs: 'buffer'` reads them (the route's body limit, the same errors for a body over it or
 * shorter than its Content-Length), except that a body with a Content-Length is copied as it arrives into one
 * buffer from the pool of answer-shape.ts (pooledBytes) instead of collected and concatenated into a new one:
 * answerBatchRequest hands it back once the task on the event loop has read it. Node's HTTP parser still gives
 * each piece of the body (≤ 64 kB) a buffer of its own; the concatenation was a second buffer of the body's
 * size per request, counted by V8 against the old generation's limit (answer-shape.ts, pooledBytes).
 */
export function readBatchBodies(app: FastifyInstance): void {
  for (const type of ['application/json', ARROW_STREAM_TYPE]) {
    if (app.hasContentTypeParser(type)) app.removeContentTypeParser(type);
    app.addContentTypeParser(type, (request, payload, done) => readBody(request, payload, done));
  }
}

function readBody(request: FastifyRequest, payload: IncomingMessage, done: (err: Error | null, body?: Buffer) => void): void {
  const limit = request.routeOptions.bodyLimit ?? Infinity;
  const declared = Number(request.headers['content-length']);
  if (declared > limit) return done(new errorCodes.FST_ERR_CTP_BODY_TOO_LARGE());
  // Node's HTTP parser delivers no more than the declared length: the bytes fit the buffer.
  const whole = Number.isInteger(declared) && declared > 0 ? pooledBytes(declared) : undefined;
  const chunks: Buffer[] = [];
  readBodyChunks(
    request,
    payload,
    (chunk, at) => {
      if (whole && at + chunk.length <= whole.length) whole.set(chunk, at);
      else chunks.push(chunk);
    },
    (err, received) => {
      if (err) {
        if (whole) releasePooledBytes(whole);
        return done(err);
      }
      done(null, whole ? Buffer.from(whole.buffer, 0, declared) : Buffer.concat(chunks, received));
    },
  );
}

/**
 * Answers a batch request: `inLoop` is the task function itself, called here for a small body.
 * Anything but application/json (kept as a Buffer by keepJsonBodiesAsBytes or readBatchBodies) is a 415.
 * Bytes from the pool of answer-shape.ts go back to it once read (the body) or sent (the answer).
 */
export async function answerBatchRequest(
  app: FastifyInstance,
  request: FastifyRequest,
  reply: FastifyReply,
  task: BatchTaskName,
  inLoop: (input: BatchTaskInput) => Promise<TaskOutcome<BatchTaskOutput>>,
  options: Omit<BatchTaskInput, 'body' | 'bodyFormat'> = {},
): Promise<FastifyReply> {
  const raw = request.body;
  if (!Buffer.isBuffer(raw)) {
    throw new HttpProblem(415, `content type ${request.headers['content-type'] ?? '(none)'} is not accepted here; send application/json`);
  }
  const type = (request.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
  const bodyFormat = type === ARROW_STREAM_TYPE ? 'arrow' : 'json';
  let output: BatchTaskOutput;
  if (loopCostBytes(raw, bodyFormat) <= OFFLOAD_BODY_BYTES) {
    const outcome = await inLoop({ body: raw, bodyFormat, ...options });
    releasePooledBytes(raw); // read: the task keeps no view of the body past its answer
    if (!outcome.ok) throw new HttpProblem(outcome.error.status, outcome.error.detail, outcome.error.errors);
    output = outcome.output;
  } else {
    const body = movableBytes(new Uint8Array(raw.buffer, raw.byteOffset, raw.byteLength));
    output = await app.compute.run(task, { body, bodyFormat, ...options }, [body.buffer]);
    releasePooledBytes(raw); // a pooled body copied for the worker (one moved is detached: ignored)
  }
  // Already serialised; the bytes are sent as they are. A pooled answer's buffer goes back to its pool once
  // Node has handed the last byte to the operating system (answer-shape.ts releasePooledBytes).
  reply.raw.once('finish', () => releasePooledBytes(output.json));
  return reply.type(output.contentType ?? 'application/json').send(asBuffer(output.json) as never);
}
