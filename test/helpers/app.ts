import type { AddressInfo } from 'node:net';
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

/**
 * Builds the app once per test file and listens on a free loopback port, for tests that write raw bytes to a
 * socket (bodies in pieces, chunked, shorter than declared). Returns the port, once beforeAll has run.
 */
export function useListeningApp(): () => number {
  let app: FastifyInstance;
  let port = 0;
  beforeAll(async () => {
    app = await buildApp({ validateResponses: true });
    await app.listen({ port: 0, host: '127.0.0.1' });
    port = (app.server.address() as AddressInfo).port;
  });
  afterAll(async () => {
    await app.close();
  });
  return () => port;
}

/** Expect an RFC 9457 problem naming `field`. */
export function problemFields(body: { errors?: { field: string }[] }): string[] {
  return (body.errors ?? []).map((e) => e.field);
}
