/**
 * POST /v1/zwd-estimates: the body stays bytes on the event loop; parsing, validation, the
 * estimation and the serialisation run in the worker pool (src/http/tasks/zwd-request.ts).
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { bodyInWorkerValidator, readEstimationBodies, rawBodyOf, replyWithBytes, sentQueryKeys, transferOf } from '../raw-body.js';
import { answerShapeOf, ARROW_STREAM_TYPE } from '../answer-shape.js';
import { problemSchema } from '../schemas/common.js';
import {
  MAX_OBSERVATIONS,
  ZWD_BODY_LIMIT_BYTES,
  zwdCsvQuerySchema,
  zwdEstimatesRequest,
  zwdEstimatesResponse,
  ZWD_ANSWER_FIELD_NAMES,
} from '../schemas/zwd-estimates.js';

const zwdEstimatesRoute: FastifyPluginAsyncZod = async (app) => {
  readEstimationBodies(app, MAX_OBSERVATIONS);
  app.post(
    '/v1/zwd-estimates',
    {
      bodyLimit: ZWD_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Zenith wet delay and gradients estimated from residuals, with random-walk constraints',
        description: [
          'Least-squares estimate of r_i = m_w(e_i) δw(t_k) + m_g(e_i) [cos a_i G_N(t_k) + sin a_i G_E(t_k)] + b_k + ε_i with Niell (1996) wet mapping at the site latitude, Chen & Herring (1997) gradient mapping (C = 0.0032), δw, G_N, G_E piecewise linear between nodes T0 + jΔ under random-walk constraints, and one free bias b_k per epoch (pre-eliminated).',
          'Formal errors of the nodes and of δw at every epoch (with the covariance of the adjacent nodes); outlier screening by the normalised residual τ = v/(σ̂0 σ_v) (Pope 1976).',
          'With met records, each epoch also gets ZHD from the measured pressure, ZWD = ZTD − ZHD, Tm (Bevis et al. 1992) and PWV (Bevis et al. 1994).',
          `Bodies: application/json (this schema) or text/csv: a table with the header row epoch,satellite,elevation_deg,azimuth_deg,residual_m[,sigma_m], with the site and options as query parameters (latitude_deg, longitude_deg, height_m required; zwd_interval_s, gradients=on|off, gradient_interval_s, ..., "null" or "off" for null). Up to ${MAX_OBSERVATIONS} observations. Body limit: ${ZWD_BODY_LIMIT_BYTES} bytes (${ZWD_BODY_LIMIT_BYTES / 1024 / 1024} MiB; 30 days of 30-s data from one 30-satellite constellation, about 826 000 observations, is about 73 MB as column arrays, 31 MB as Arrow).`,
          `Answer shapes: \`shape=rows\` (default), \`shape=columns\` (every table as one array per field, rounded to the documented precision), \`fields\` to select (fields of series, or table.field of zwd_nodes, gradient_nodes, rejected); \`Accept: ${ARROW_STREAM_TYPE}\` answers an Apache Arrow IPC stream with series as the table and the rest of the answer (the other tables as columns) as JSON in the schema metadata "answer".`,
        ].join(' '),
        tags: ['estimation'],
        querystring: zwdCsvQuerySchema,
        body: zwdEstimatesRequest,
        response: {
          200: zwdEstimatesResponse,
          400: problemSchema,
          413: problemSchema,
          415: problemSchema,
          422: problemSchema,
          503: problemSchema,
        },
      },
      validatorCompiler: bodyInWorkerValidator,
    },
    async (request, reply) => {
      const raw = rawBodyOf(request);
      const output = await app.compute.run(
        'zwd-estimate-request',
        {
          ...raw,
          query: request.query as Record<string, unknown>,
          queryKeys: sentQueryKeys(request.raw.url),
          answer: answerShapeOf(request.query, request.headers.accept, ZWD_ANSWER_FIELD_NAMES),
        },
        transferOf(raw),
      );
      // Already serialised in the worker; the bytes are sent as they are, and given back once sent.
      return replyWithBytes(reply, output.json, output.contentType ?? 'application/json', app.compute.release);
    },
  );
};

export default zwdEstimatesRoute;
