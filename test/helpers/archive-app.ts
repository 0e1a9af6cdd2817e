import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import { buildApp, type AppOptions, type ArchiveOptions } from '../../src/http/app.js';
import type { BackendUnderTest } from './storage.js';

export const TEST_KEY = 'test-key-0123456789abcdef';
/** The name of TEST_KEY, an admin key, in useArchiveApp's apps (audit trail, request log). */
export const TEST_KEY_NAME = 'test-admin';

export interface ArchiveApp {
  /** supertest agent on the app */
  api(): request.Agent;
  /** the app itself (for app.repository) */
  app(): FastifyInstance;
  /** `Authorization` header value with the test key (role admin) */
  auth: string;
}

/**
 * Builds an app on a fresh storage of `backend` once per describe block (a temporary directory for
 * SQLite, a schema of its own on PostgreSQL), and removes it afterwards.
 */
export function useArchiveApp(
  backend: BackendUnderTest,
  archive: Partial<ArchiveOptions> = {},
  options: Omit<AppOptions, 'archive'> = {},
): ArchiveApp {
  let app: FastifyInstance;
  let cleanup: () => Promise<void>;
  beforeAll(async () => {
    const fresh = await backend.fresh();
    cleanup = fresh.cleanup;
    app = await buildApp({
      validateResponses: true,
      ...options,
      archive: {
        storage: fresh.config,
        apiKeys: [{ name: TEST_KEY_NAME, role: 'admin', secret: TEST_KEY }],
        keyDir: fresh.config.dataDir,
        readKeysRequired: false,
        maxReadRangeDays: 366,
        ...archive,
      },
    });
  });
  afterAll(async () => {
    await app?.close();
    await cleanup?.();
  });
  return { api: () => request.agent(app.server), app: () => app, auth: `Bearer ${TEST_KEY}` };
}
