/**
 * The service log (issue 15 item 8): level names and ISO 8601 times by default (TROPODELAY_LOG_FORMAT=iso),
 * pino's numeric shape on request (epoch), and one line per request with the client address, the key
 * name and the problem type of a 4xx/5xx answer.
 *
 * References: ISO 8601 / RFC 3339 "date-time" in UTC ("2026-12-02T15:04:05.123Z"; RFC 3339 section 5.6);
 * pino's level numbers (info = 30, warn = 40: pino documentation, "Logger Level" — from memory).
 */

import type { FastifyInstance, FastifyRequest } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultConfig } from '../../src/config.js';
import { buildApp } from '../../src/http/app.js';
import { loggerOptions } from '../../src/http/logger-options.js';
import { callerKeyName } from '../../src/http/plugins/request-log.js';
import { collector, type LogLine } from '../helpers/log-lines.js';

/** RFC 3339 section 5.6 date-time, UTC with milliseconds as pino's isoTime writes it. */
const RFC3339_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/;
const PINO_INFO = 30;

async function appWithLog(format: 'iso' | 'epoch'): Promise<{ app: FastifyInstance; lines: LogLine[] }> {
  const { stream, lines } = collector();
  const config = defaultConfig({ LOG_LEVEL: 'info', TROPODELAY_LOG_FORMAT: format });
  const app = await buildApp({ config, logger: loggerOptions(config, stream) });
  return { app, lines };
}

const requestLines = (lines: LogLine[]) => lines.filter((l) => l['msg'] === 'request completed');

describe('TROPODELAY_LOG_FORMAT=iso (default): level names and RFC 3339 UTC times', () => {
  let app: FastifyInstance;
  let lines: LogLine[];
  beforeAll(async () => {
    ({ app, lines } = await appWithLog(defaultConfig().TROPODELAY_LOG_FORMAT));
  });
  afterAll(async () => {
    await app.close();
  });

  it('writes "level":"info" and an ISO 8601 time within a minute of now', async () => {
    await request(app.server).get('/v1/health').expect(200);
    const line = requestLines(lines).at(-1)!;
    expect(line['level']).toBe('info');
    expect(line['time']).toMatch(RFC3339_UTC);
    expect(Math.abs(Date.parse(line['time'] as string) - Date.now())).toBeLessThan(60_000);
  });

  it('a 2xx line has the route, status, client address and key (null without one), and no problem field', async () => {
    await request(app.server).get('/v1/health?x=1').expect(200);
    const line = requestLines(lines).at(-1)!;
    expect(line).toMatchObject({ method: 'GET', route: '/v1/health', url: '/v1/health', status: 200, client: '127.0.0.1', key: null });
    expect(line).not.toHaveProperty('problem');
  });

  it('a 404 line says which problem type was answered', async () => {
    const res = await request(app.server).get('/v1/no-such-route').expect(404);
    const line = requestLines(lines).at(-1)!;
    expect(line['status']).toBe(404);
    expect(line['problem']).toBe(res.body.type);
    expect(line['problem']).toMatch(/^\/problems\//);
  });

  it('a 400 line carries the invalid-request problem type', async () => {
    await request(app.server)
      .post('/v1/zenith-delays')
      .send({ site: { latitude_deg: 123 } })
      .expect(400);
    expect(requestLines(lines).at(-1)!['problem']).toBe('/problems/invalid-request');
  });
});

describe('TROPODELAY_LOG_FORMAT=epoch: pino numeric levels and epoch milliseconds', () => {
  let app: FastifyInstance;
  let lines: LogLine[];
  beforeAll(async () => {
    ({ app, lines } = await appWithLog('epoch'));
  });
  afterAll(async () => {
    await app.close();
  });

  it('writes level 30 and a millisecond time', async () => {
    await request(app.server).get('/v1/health').expect(200);
    const line = requestLines(lines).at(-1)!;
    expect(line['level']).toBe(PINO_INFO);
    expect(typeof line['time']).toBe('number');
    expect(Math.abs((line['time'] as number) - Date.now())).toBeLessThan(60_000);
  });
});

describe('key name in the request line', () => {
  it('reads the name of the key the auth plugin attached, and null without one', () => {
    expect(callerKeyName({ callerKey: { name: 'harbour-office', role: 'write' } } as unknown as FastifyRequest)).toBe('harbour-office');
    expect(callerKeyName({ callerKey: null } as unknown as FastifyRequest)).toBeNull();
    expect(callerKeyName({} as FastifyRequest)).toBeNull();
  });
});
