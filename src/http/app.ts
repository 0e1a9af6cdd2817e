/**
 * Builds the HTTP application as a plugin tree; never listens (server.ts does). Tests build the
 * same app and talk to it in-process.
 */

import { randomUUID } from 'node:crypto';
import Fastify, { type FastifyInstance, type FastifyServerOptions } from 'fastify';
import { serializerCompiler, validatorCompiler, type ZodTypeProvider } from 'fastify-type-provider-zod';
import errorHandler from './plugins/error-handler.js';
import openapi from './plugins/openapi.js';
import healthRoute from './routes/health.js';
import mappingFactorsRoute from './routes/mapping-factors.js';
import precipitableWaterRoute from './routes/precipitable-water.js';
import profileDelaysRoute from './routes/profile-delays.js';
import slantDelaysRoute from './routes/slant-delays.js';
import zenithDelaysRoute from './routes/zenith-delays.js';

export interface AppOptions {
  logger?: FastifyServerOptions['logger'];
}

export async function buildApp(options: AppOptions = {}): Promise<FastifyInstance> {
  const app = Fastify({
    logger: options.logger ?? false,
    bodyLimit: 1024 * 1024,
    requestIdHeader: 'x-request-id',
    genReqId: () => randomUUID(),
    ajv: undefined,
  }).withTypeProvider<ZodTypeProvider>();

  // Tables (CSV) and RINEX meteorological files arrive as text; routes that take them parse them.
  app.addContentTypeParser(['text/csv', 'text/plain'], { parseAs: 'string' }, (_request, body, done) => done(null, body));
  app.setValidatorCompiler(validatorCompiler);
  app.setSerializerCompiler(serializerCompiler);
  app.addHook('onSend', async (request, reply) => {
    reply.header('x-request-id', request.id);
  });

  await app.register(errorHandler);
  await app.register(openapi);
  await app.register(healthRoute);
  await app.register(zenithDelaysRoute);
  await app.register(mappingFactorsRoute);
  await app.register(slantDelaysRoute);
  await app.register(precipitableWaterRoute);
  await app.register(profileDelaysRoute);
  await app.ready();
  return app;
}
