/**
 * The a-priori batch routes (slant delays, mapping factors, precipitable water): in the route's scope
 * JSON stays bytes, and the body is parsed, validated, computed and serialised by one function of
 * src/http/tasks/apriori-batch.ts: on the event loop while its estimated work is that of a JSON body
 * up to OFFLOAD_BODY_BYTES (cheaper than the hand-over; column arrays and Arrow cost less per byte,
 * OFFLOAD_COST_PER_BYTE), in the worker pool above it, so that a 100 000-item batch never holds the loop.
 */

import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import { OFFLOAD_BODY_BYTES, OFFLOAD_COST_PER_BYTE } from '../limits.js';
import type { TaskOutcome } from '../workers/task-outcome.js';
import { ARROW_STREAM_TYPE, releaseAnswerBytes } from './answer-shape.js';
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
 * Answers a batch request: `inLoop` is the task function itself, called here for a small body.
 * Anything but application/json (kept as a Buffer by keepJsonBodiesAsBytes) is a 415.
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
    if (!outcome.ok) throw new HttpProblem(outcome.error.status, outcome.error.detail, outcome.error.errors);
    output = outcome.output;
  } else {
    const body = movableBytes(new Uint8Array(raw.buffer, raw.byteOffset, raw.byteLength));
    output = await app.compute.run(task, { body, bodyFormat, ...options }, [body.buffer]);
  }
  // Already serialised; the bytes are sent as they are. An Arrow answer's buffer goes back to its pool once
  // Node has handed the last byte to the operating system (answer-shape.ts releaseAnswerBytes).
  if (output.contentType === ARROW_STREAM_TYPE) reply.raw.once('finish', () => releaseAnswerBytes(output.json));
  return reply.type(output.contentType ?? 'application/json').send(asBuffer(output.json) as never);
}
