import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { BATCH_BODY_LIMIT_BYTES, OFFLOAD_BODY_BYTES } from '../../limits.js';
import { answerBatchRequest } from '../batch-body.js';
import { bodyInWorkerValidator, keepJsonBodiesAsBytes } from '../raw-body.js';
import { problemSchema } from '../schemas/common.js';
import { precipitableWaterResponse } from '../schemas/precipitable-water.js';
import { precipitableWaterBody, handlePrecipitableWaterRequest } from '../tasks/apriori-batch.js';

const precipitableWaterRoute: FastifyPluginAsyncZod = async (app) => {
  keepJsonBodiesAsBytes(app);
  app.post(
    '/v1/precipitable-water',
    {
      bodyLimit: BATCH_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Precipitable water vapour from zenith delays and surface met',
        description: `PWV = Π(Tm) · ZWD with Π from Bevis et al. (1994) and Tm from Bevis et al. (1992) or the caller. ZWD = ZTD − ZHD(P) when a total delay is given, which then needs the measured pressure (never defaulted). σ_PWV is the root sum of squares of its budget: the delay's sigma (no default: without it σ is null), pressure (default 0.5 hPa), the ZHD model, the surface temperature (default 0.5 K), Tm (4.74 K for the Bevis regression, default 2 K for a caller's tm_k) and the refractivity constants; sigma_budget=true lists the terms per record. Body limit: ${BATCH_BODY_LIMIT_BYTES} bytes (32 MiB); a body above ${OFFLOAD_BODY_BYTES} bytes is computed in the worker pool (503 with Retry-After when its queue is full).`,
        tags: ['water vapour'],
        body: precipitableWaterBody,
        response: { 200: precipitableWaterResponse, 400: problemSchema, 413: problemSchema, 415: problemSchema, 503: problemSchema },
      },
      validatorCompiler: bodyInWorkerValidator,
    },
    async (request, reply) => answerBatchRequest(app, request, reply, 'precipitable-water-request', handlePrecipitableWaterRequest),
  );
};

export default precipitableWaterRoute;
