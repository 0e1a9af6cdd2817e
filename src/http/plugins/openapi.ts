/**
 * OpenAPI 3.1 document generated from the routes' zod schemas, served at GET /openapi.json, with
 * interactive documentation at /docs.
 */

import swagger from '@fastify/swagger';
import swaggerUi from '@fastify/swagger-ui';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { jsonSchemaTransform } from 'fastify-type-provider-zod';
import { SERVICE_VERSION } from '../../version.js';

async function openapi(app: FastifyInstance): Promise<void> {
  // Every route that takes a body states its limit in the OpenAPI description (requests over it get 413).
  app.addHook('onRoute', (route) => {
    const methods = Array.isArray(route.method) ? route.method : [route.method];
    if (!methods.some((m) => m === 'POST' || m === 'PUT' || m === 'PATCH') || !route.schema) return;
    const description = route.schema.description ?? '';
    if (/body limit/i.test(description)) return;
    const limit = route.bodyLimit ?? app.initialConfig.bodyLimit ?? 1_048_576;
    route.schema.description = `${description}${description ? ' ' : ''}Body limit: ${limit} bytes.`;
  });
  await app.register(swagger, {
    openapi: {
      openapi: '3.1.0',
      info: {
        title: 'tropodelay',
        version: SERVICE_VERSION,
        description:
          'Tropospheric delay modelling: a-priori zenith and slant delays, mapping functions, zenith wet delay estimation and precipitable water. Errors are RFC 9457 problem details (application/problem+json) that name the offending field and its allowed range. Not certified for safety-of-life use.',
      },
      components: {
        securitySchemes: {
          bearerKey: {
            type: 'http',
            scheme: 'bearer',
            description:
              'A named key with a role (read, write or admin): configured (TROPODELAY_API_KEYS, its file) or stored (POST /v1/admin/keys, the first admin key file)',
          },
        },
      },
      tags: [
        { name: 'a-priori delays', description: 'Zenith delays, mapping factors and slant delays from models' },
        { name: 'water vapour', description: 'Precipitable water vapour' },
        { name: 'estimation', description: 'Zenith wet delay and gradients estimated from observation residuals' },
        {
          name: 'atmospheric profiles',
          description: 'Delays, precipitable water and mapping factors integrated and ray-traced through a vertical profile',
        },
        {
          name: 'station archive',
          description:
            'Stations with their stored met and delay series, and precipitable water retrieved from them. Writes need `Authorization: Bearer <key>`',
        },
        { name: 'access', description: 'API keys, the audit trail of writes, deleted stations (role admin)' },
        { name: 'operations', description: 'Health and service documents' },
      ],
    },
    transform: jsonSchemaTransform,
  });
  await app.register(swaggerUi, { routePrefix: '/docs' });
  app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
}

export default fp(openapi, { name: 'openapi' });
