import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { BATCH_BODY_LIMIT_BYTES, OFFLOAD_BODY_BYTES } from '../../limits.js';
import { answerShapeOf, answerShapeQuery, ARROW_STREAM_TYPE } from '../answer-shape.js';
import { answerBatchRequest, readBatchBodies } from '../batch-body.js';
import { bodyInWorkerValidator } from '../raw-body.js';
import { problemSchema } from '../schemas/common.js';
import { slantDelaysResponse } from '../schemas/slant-delays.js';
import { slantDelaysBody, handleSlantDelaysRequest, SLANT_FIELD_NAMES } from '../tasks/apriori-batch.js';

const slantDelaysRoute: FastifyPluginAsyncZod = async (app) => {
  readBatchBodies(app);
  app.post(
    '/v1/slant-delays',
    {
      bodyLimit: BATCH_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Slant delays along directions or towards satellites',
        description: `slant = m_h ZHD + m_w ZWD + m_g (G_N cos a + G_E sin a). Zenith values not supplied come from met or the standard atmosphere; gradients default to 0. Directions may be given as elevation/azimuth or as satellite ECEF positions (WGS84). Up to 100 000 directions, as objects or as column arrays. Answer shapes: \`shape=rows\` (default), \`shape=columns\` (one array per field, rounded to the documented precision), \`fields\` to select; \`Accept: ${ARROW_STREAM_TYPE}\` answers an Apache Arrow IPC stream (the per-direction table at full precision, the rest of the answer as JSON in the schema metadata "answer"), and a body of that type is read as the rows table with the rest of the request as JSON in the schema metadata "request". Body limit: ${BATCH_BODY_LIMIT_BYTES} bytes (32 MiB); a body above ${OFFLOAD_BODY_BYTES} bytes is computed in the worker pool (503 with Retry-After when its queue is full).`,
        tags: ['a-priori delays'],
        querystring: answerShapeQuery,
        body: slantDelaysBody,
        response: { 200: slantDelaysResponse, 400: problemSchema, 413: problemSchema, 415: problemSchema, 503: problemSchema },
      },
      validatorCompiler: bodyInWorkerValidator,
    },
    async (request, reply) =>
      answerBatchRequest(app, request, reply, 'slant-delays-request', handleSlantDelaysRequest, {
        answer: answerShapeOf(request.query, request.headers.accept, SLANT_FIELD_NAMES),
      }),
  );
};

export default slantDelaysRoute;
