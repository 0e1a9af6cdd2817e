import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { BATCH_BODY_LIMIT_BYTES, OFFLOAD_BODY_BYTES } from '../../limits.js';
import { answerBatchRequest, readBatchBodies } from '../batch-body.js';
import { bodyInWorkerValidator } from '../raw-body.js';
import { problemSchema } from '../schemas/common.js';
import { mappingFactorsResponse } from '../schemas/mapping-factors.js';
import { mappingFactorsBody, handleMappingFactorsRequest } from '../tasks/apriori-batch.js';

const mappingFactorsRoute: FastifyPluginAsyncZod = async (app) => {
  readBatchBodies(app);
  app.post(
    '/v1/mapping-factors',
    {
      bodyLimit: BATCH_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Hydrostatic, wet and gradient mapping factors at given elevations',
        description: `Mapping functions in the normalised continued-fraction form (Marini 1972): niell (Niell 1996, default), vmf1 (Boehm et al. 2006 with caller a coefficients), chao (Chao 1972), cosecant. Gradient mapping: chen-herring (default) or tilting. Body limit: ${BATCH_BODY_LIMIT_BYTES} bytes (32 MiB); a body above ${OFFLOAD_BODY_BYTES} bytes is computed in the worker pool (503 with Retry-After when its queue is full).`,
        tags: ['a-priori delays'],
        body: mappingFactorsBody,
        response: { 200: mappingFactorsResponse, 400: problemSchema, 413: problemSchema, 415: problemSchema, 503: problemSchema },
      },
      validatorCompiler: bodyInWorkerValidator,
    },
    async (request, reply) => answerBatchRequest(app, request, reply, 'mapping-factors-request', handleMappingFactorsRequest),
  );
};

export default mappingFactorsRoute;
