import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';

/** Where `GET /` sends a person who opens the service's address in a browser: the interactive API documentation. */
export const ROOT_REDIRECT_TARGET = '/docs';

const rootRoute: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/',
    {
      schema: {
        summary: `Start page: redirects (302) to the interactive API documentation at ${ROOT_REDIRECT_TARGET}`,
        tags: ['operations'],
        response: { 302: z.null().describe(`no body; the Location header is ${ROOT_REDIRECT_TARGET}`) },
      },
    },
    async (_request, reply) => reply.redirect(ROOT_REDIRECT_TARGET, 302),
  );
};

export default rootRoute;
