import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { problemSchema } from '../schemas/common.js';

const healthRoute: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/v1/health',
    {
      schema: {
        summary: 'Liveness: the process is up and serving',
        tags: ['operations'],
        response: { 200: z.object({ status: z.literal('ok') }), 400: problemSchema },
      },
    },
    async () => ({ status: 'ok' as const }),
  );
};

export default healthRoute;
