import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';

const healthRoute: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/v1/health',
    {
      schema: {
        summary: 'Liveness: the process is up and serving',
        tags: ['operations'],
        response: { 200: z.object({ status: z.literal('ok') }) },
      },
    },
    async () => ({ status: 'ok' as const }),
  );
};

export default healthRoute;
