import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import { buildApp } from '../../src/http/app.js';

/**
 * Builds the app once per test file and returns a supertest agent factory bound to it.
 * Usage: `const api = useApp(); ... await api().post('/v1/...').send(body)`.
 */
export function useApp(): () => request.Agent {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp({ validateResponses: true });
  });
  afterAll(async () => {
    await app.close();
  });
  return () => request.agent(app.server);
}

/** Expect an RFC 9457 problem naming `field`. */
export function problemFields(body: { errors?: { field: string }[] }): string[] {
  return (body.errors ?? []).map((e) => e.field);
}
