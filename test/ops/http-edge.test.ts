/**
 * The HTTP edge under hostile or careless clients (issue 11, items 12 and 13):
 * - proxy trust: a client-chosen X-Forwarded-For cannot change the rate-limit identity;
 * - router-level errors (bad percent-encoding, over-long path segments) are problem+json;
 * - CORS preflight allows the archive's PUT and DELETE;
 * - DELETE with a JSON content type and no body is not a 400;
 * - x-model-fingerprints stays far below the 16 kB header limit of common clients.
 * X-Forwarded-For semantics: each proxy appends the address it received the request from (the
 * header's de-facto definition; RFC 7239 §5.2 for its standard successor `Forwarded: for=`).
 */

import { createHash } from 'node:crypto';
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { configWarnings, loadConfig } from '../../src/config.js';
import { MAX_FINGERPRINT_HEADER_BYTES, modelFingerprintHeaders } from '../../src/http/fingerprint-headers.js';
import { buildApp } from '../../src/http/app.js';
import { TEST_KEY } from '../helpers/archive-app.js';

let app: FastifyInstance | undefined;
afterEach(async () => {
  await app?.close();
  app = undefined;
});

const zenithBody = { site: { latitude_deg: 10, longitude_deg: 20, height_m: 30 }, epoch: '2026-02-01T00:00:00Z' };
const archive = {
  storage: { dataDir: ':memory:' },
  apiKeys: [{ name: 'edge-admin', role: 'admin' as const, secret: TEST_KEY }],
  readKeysRequired: false,
  maxReadRangeDays: 366,
};
const auth = `Bearer ${TEST_KEY}`;

/** A forged first entry per request, then the address the load balancer saw (documentation ranges, RFC 5737). */
const forged = (i: number, seenByProxy: string) => `198.51.100.${i % 250}, ${seenByProxy}`;

describe('TRUST_PROXY: the rate limit keys on the address the trusted proxy saw', () => {
  it.each([
    ['true (taken as 1 hop)', 'true'],
    ['a hop count', '1'],
    ['the proxy address as a CIDR', '127.0.0.0/8'],
  ])('%s: forged X-Forwarded-For entries do not buy a fresh budget; another real client has its own', async (_label, setting) => {
    const config = loadConfig({ TRUST_PROXY: setting, RATE_LIMIT_PER_MINUTE: '5' });
    app = await buildApp({ config, archive });
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) {
      const r = await request(app.server).post('/v1/zenith-delays').set('x-forwarded-for', forged(i, '203.0.113.7')).send(zenithBody);
      statuses.push(r.status);
    }
    expect(statuses.filter((s) => s === 200)).toHaveLength(5);
    expect(statuses.filter((s) => s === 429)).toHaveLength(7);
    // The proxy still tells clients apart: a second client behind it has a budget of its own.
    await request(app.server).post('/v1/zenith-delays').set('x-forwarded-for', forged(99, '203.0.113.8')).send(zenithBody).expect(200);
  });

  it('the default trusts no proxy: X-Forwarded-For is ignored and the TCP peer is the client', async () => {
    app = await buildApp({ config: loadConfig({ RATE_LIMIT_PER_MINUTE: '3' }), archive });
    for (let i = 0; i < 3; i++)
      await request(app.server).post('/v1/zenith-delays').set('x-forwarded-for', `203.0.113.${i}`).send(zenithBody).expect(200);
    await request(app.server).post('/v1/zenith-delays').set('x-forwarded-for', '203.0.113.200').send(zenithBody).expect(429);
  });

  it('TRUST_PROXY=true still starts but is warned about; a bad value names the variable', () => {
    expect(loadConfig({ TRUST_PROXY: 'true' }).TRUST_PROXY).toBe(1);
    expect(configWarnings({ TRUST_PROXY: 'true' }).join()).toMatch(/TRUST_PROXY=true is taken as 1 trusted hop/);
    expect(configWarnings({ TROPODELAY_TRUST_PROXY: '10.0.0.0/8' })).toEqual([]);
    expect(loadConfig({ TRUST_PROXY: '10.0.0.0/8, 10.1.2.3' }).TRUST_PROXY).toEqual(['10.0.0.0/8', '10.1.2.3']);
    expect(() => loadConfig({ TRUST_PROXY: 'everyone' })).toThrow(/TRUST_PROXY="everyone": must be false, a hop count/);
    expect(() => loadConfig({ TRUST_PROXY: '0x10' })).toThrow(/TRUST_PROXY/);
  });
});

describe('router-level errors are problem+json (RFC 9457)', () => {
  it.each([
    ['bad percent-encoding', '/v1/stations/%E0%A4%A', 400, /not valid percent-encoding/],
    ['an over-long path segment', `/v1/stations/${'a'.repeat(300)}/met`, 414, /path segment is longer/],
  ])('%s', async (_label, path, status, detail) => {
    app = await buildApp({ archive });
    const r = await request(app.server).get(path).expect(status);
    expect(r.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(r.body).toMatchObject({ status, detail: expect.stringMatching(detail) });
  });
});

describe('CORS preflight for the archive routes', () => {
  it.each(['PUT', 'DELETE'])('allows %s', async (method) => {
    app = await buildApp({ config: { CORS_ORIGINS: 'http://portal.example.test' }, archive });
    const r = await request(app.server)
      .options('/v1/stations/CORS1')
      .set('origin', 'http://portal.example.test')
      .set('access-control-request-method', method)
      .set('access-control-request-headers', 'authorization, content-type');
    expect(r.status).toBe(204);
    expect(String(r.headers['access-control-allow-methods']).split(/,\s*/)).toContain(method);
  });
});

describe('DELETE with a JSON content type and no body', () => {
  it('deletes (204) or says the station is missing (404), never a 400 about the empty body', async () => {
    app = await buildApp({ archive });
    await request(app.server)
      .put('/v1/stations/DEL1')
      .set('authorization', auth)
      .send({ name: 'Delwick (invented)', latitude_deg: 1, longitude_deg: 2, height_m: 3 })
      .expect(201);
    await request(app.server).delete('/v1/stations/DEL1').set('authorization', auth).set('content-type', 'application/json').expect(204);
    await request(app.server).delete('/v1/stations/DEL1').set('authorization', auth).set('content-type', 'application/json').expect(404);
    // A POST with an empty JSON body is still the caller's mistake.
    const r = await request(app.server).post('/v1/zenith-delays').set('content-type', 'application/json').send('');
    expect(r.status).toBe(400);
  });
});

describe('x-model-fingerprints header size', () => {
  // Fingerprints as the service makes them: 16 hex digits (src/domain/provenance.ts).
  const fingerprint = (i: number) => createHash('sha256').update(String(i)).digest('hex').slice(0, 16);

  it('lists what fits in 1 kB, counts all, and says when the list was cut', () => {
    const few = [fingerprint(1), fingerprint(2)];
    expect(modelFingerprintHeaders(few)).toEqual({ 'x-model-fingerprints': few.join(','), 'x-model-fingerprint-count': '2' });
    const many = Array.from({ length: 2000 }, (_, i) => fingerprint(i)); // 34 kB joined: over Node's 16 kB header limit
    const h = modelFingerprintHeaders(many);
    expect(h['x-model-fingerprints']!.length).toBeLessThanOrEqual(MAX_FINGERPRINT_HEADER_BYTES);
    expect(h['x-model-fingerprints']!.split(',')).toEqual(many.slice(0, 60)); // 60 × 17 − 1 = 1019 bytes
    expect(h['x-model-fingerprint-count']).toBe('2000');
    expect(h['x-model-fingerprints-complete']).toBe('false');
  });

  it('a CSV read of a range with 80 model sets sends a capped header with the count', async () => {
    app = await buildApp({ archive });
    await request(app.server)
      .put('/v1/stations/MANYFP')
      .set('authorization', auth)
      .send({ name: 'Manifold (invented)', latitude_deg: 1, longitude_deg: 2, height_m: 3 })
      .expect(201);
    const t0 = Date.UTC(2026, 6, 1);
    for (let i = 0; i < 80; i++) {
      await request(app.server)
        .post('/v1/stations/MANYFP/delays')
        .set('authorization', auth)
        .send({
          source: `run-${i}`,
          models: { mapping: 'niell', run: i },
          records: [{ epoch: new Date(t0 + i * 60_000).toISOString(), ztd_m: 2.4 }],
        })
        .expect(200);
    }
    const r = await request(app.server)
      .get('/v1/stations/MANYFP/delays')
      .query({ from: new Date(t0).toISOString(), to: new Date(t0 + 80 * 60_000).toISOString(), format: 'csv' })
      .expect(200);
    expect(String(r.headers['x-model-fingerprints']).length).toBeLessThanOrEqual(MAX_FINGERPRINT_HEADER_BYTES);
    expect(r.headers['x-model-fingerprint-count']).toBe('80');
    expect(r.headers['x-model-fingerprints-complete']).toBe('false');
  });
});
