/**
 * API keys stored in the database, shared by every replica: create (the secret is in the answer once),
 * list (never a secret) and revoke. Configured keys are listed too but change only with the configuration.
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { HttpProblem } from '../problem.js';
import { problemSchema } from '../schemas/common.js';
import { keyCreateBody, keyCreatedResponse, keyListResponse, keyParams } from '../schemas/access.js';

const adminKeysRoute: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/admin/keys',
    {
      config: { role: 'admin' },
      schema: {
        summary: 'Create an API key',
        description:
          'Stores a new key with a name and a role in the database (every replica on it accepts the key within 10 s). The answer holds the secret: it is shown this once and stored only as its SHA-256 digest. A name in use, also by a revoked or a configured key, is a 409.',
        tags: ['access'],
        body: keyCreateBody,
        response: {
          201: keyCreatedResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          409: problemSchema,
          415: problemSchema,
        },
      },
    },
    async (request, reply) => {
      const created = await app.keyStore.create(request.body.name, request.body.role, request.callerKey?.name ?? null);
      if (!created) {
        throw new HttpProblem(409, `a key named "${request.body.name}" exists (or existed: names of revoked keys are not reused)`, [
          { field: 'body.name', message: 'name in use' },
        ]);
      }
      const k = created.key;
      return reply.code(201).send({
        name: k.name,
        role: k.role,
        origin: 'database' as const,
        created_at: k.createdAt,
        created_by: k.createdBy,
        revoked_at: null,
        secret: created.secret,
      });
    },
  );

  app.get(
    '/v1/admin/keys',
    {
      config: { role: 'admin' },
      schema: {
        summary: 'List the API keys',
        description: 'Configured keys and keys stored in the database, revoked ones included, by name. Never a secret.',
        tags: ['access'],
        response: { 200: keyListResponse, 401: problemSchema, 403: problemSchema },
      },
    },
    async () => ({
      keys: (await app.keyStore.list()).map((k) => ({
        name: k.name,
        role: k.role,
        origin: k.origin,
        created_at: k.createdAt,
        created_by: k.createdBy,
        revoked_at: k.revokedAt,
      })),
    }),
  );

  app.delete(
    '/v1/admin/keys/:key_name',
    {
      config: { role: 'admin' },
      schema: {
        summary: 'Revoke an API key',
        description:
          'Marks a stored key revoked: refused at once by this replica, by the others within 10 s. Its name stays in the list and the audit trail. A configured key is a 409 (remove it from the configuration).',
        tags: ['access'],
        params: keyParams,
        response: {
          204: z.null().describe('Revoked'),
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          409: problemSchema,
        },
      },
    },
    async (request, reply) => {
      const name = request.params.key_name;
      if (app.keyStore.configuredNames.includes(name)) {
        throw new HttpProblem(409, `key "${name}" is configured (TROPODELAY_API_KEYS or its file): remove it there and restart`, [
          { field: 'params.key_name', message: 'configured key' },
        ]);
      }
      if (!(await app.keyStore.revoke(name))) {
        throw new HttpProblem(404, `no valid stored key named "${name}"`, [{ field: 'params.key_name', message: 'no such valid key' }]);
      }
      return reply.code(204).send(null);
    },
  );
};

export default adminKeysRoute;
