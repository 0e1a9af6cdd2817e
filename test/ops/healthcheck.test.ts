/**
 * docker/healthcheck.mjs, the image's HEALTHCHECK command, run as the container runtime runs it (a
 * separate node process; exit status 0 = healthy, 1 = unhealthy: Dockerfile reference, "HEALTHCHECK")
 * against the real app listening on loopback, and against a port where nothing or something unhealthy
 * answers.
 */

import { execFile } from 'node:child_process';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { fileURLToPath } from 'node:url';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/http/app.js';

const SCRIPT = fileURLToPath(new URL('../../docker/healthcheck.mjs', import.meta.url));
const HEALTHY = 0; // Dockerfile reference, HEALTHCHECK exit status: 0 success
const UNHEALTHY = 1; // 1 unhealthy

function runCheck(env: Record<string, string>): Promise<{ code: number; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [SCRIPT], { env: { PATH: process.env.PATH ?? '', ...env }, timeout: 10_000 }, (err, _stdout, stderr) => {
      resolve({ code: err ? Number((err as { code?: number }).code ?? -1) : 0, stderr });
    });
  });
}

const portOf = (server: { address(): AddressInfo | string | null }) => String((server.address() as AddressInfo).port);

describe('HEALTHCHECK command against the service', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp();
    await app.listen({ port: 0, host: '127.0.0.1' });
  });
  afterAll(async () => {
    await app.close();
  });

  it('is healthy when GET /v1/ready answers 200 ready (TROPODELAY_HOST=0.0.0.0 as in the image is checked on loopback)', async () => {
    const result = await runCheck({ TROPODELAY_PORT: portOf(app.server), TROPODELAY_HOST: '0.0.0.0' });
    expect(result.stderr).toBe('');
    expect(result.code).toBe(HEALTHY);
  });

  it('uses an explicit host when it is not a wildcard, and still reads the deprecated PORT / HOST', async () => {
    const result = await runCheck({ PORT: portOf(app.server), HOST: '127.0.0.1' });
    expect(result.code).toBe(HEALTHY);
  });
});

describe('HEALTHCHECK command follows readiness, not liveness (issue 15 item 7)', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp();
    // A database that does not answer: the readiness check fails while the process serves.
    app.addReadinessCheck('database', async () => {
      throw new Error('connect ECONNREFUSED 10.0.0.9:5432');
    });
    await app.listen({ port: 0, host: '127.0.0.1' });
  });
  afterAll(async () => {
    await app.close();
  });

  it('is unhealthy when the database check of GET /v1/ready fails', async () => {
    const result = await runCheck({ TROPODELAY_PORT: portOf(app.server) });
    expect(result.code).toBe(UNHEALTHY);
    expect(result.stderr).toMatch(/unhealthy: .*\/v1\/ready answered 503 .*not-ready/);
  });

  it('--live checks GET /v1/health, which still answers', async () => {
    const result = await new Promise<{ code: number }>((resolve) => {
      execFile(
        process.execPath,
        [SCRIPT, '--live'],
        { env: { PATH: process.env.PATH ?? '', TROPODELAY_PORT: portOf(app.server) } },
        (err) => resolve({ code: err ? Number((err as { code?: number }).code ?? -1) : 0 }),
      );
    });
    expect(result.code).toBe(HEALTHY);
  });
});

describe('HEALTHCHECK command when the service is not healthy', () => {
  let other: Server;
  beforeAll(async () => {
    other = createServer((_req, res) => {
      res.writeHead(503, { 'content-type': 'application/json' }).end('{"status":"starting"}');
    });
    await new Promise<void>((resolve) => other.listen(0, '127.0.0.1', resolve));
  });
  afterAll(async () => {
    await new Promise((resolve) => other.close(resolve));
  });

  it('is unhealthy, saying why, when the route answers 503', async () => {
    const result = await runCheck({ PORT: portOf(other), HOST: '0.0.0.0' });
    expect(result.code).toBe(UNHEALTHY);
    expect(result.stderr).toMatch(/unhealthy: .*\/v1\/ready answered 503/);
  });

  it('is unhealthy when nothing listens on the port', async () => {
    const closed = createServer();
    await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', resolve));
    const port = portOf(closed);
    await new Promise((resolve) => closed.close(resolve));
    const result = await runCheck({ PORT: port, HOST: '0.0.0.0' });
    expect(result.code).toBe(UNHEALTHY);
    expect(result.stderr).toMatch(/unhealthy: .*ECONNREFUSED|fetch failed/);
  });
});
