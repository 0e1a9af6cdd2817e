/**
 * Responses are serialised with plain JSON.stringify (src/http/app.ts). Every HTTP test builds the
 * app with `validateResponses` (test/helpers), so each JSON answer any test receives is checked
 * against its route's response schema for that status (src/http/response-check.ts); this file
 * checks that the check itself catches drift, that every route of the OpenAPI document has a
 * response schema, and a few answers explicitly.
 */

import type { z } from 'zod';
import { readFileSync } from 'node:fs';
import Fastify from 'fastify';
import { validatorCompiler, type ZodTypeProvider } from 'fastify-type-provider-zod';
import { z as zod } from 'zod';
import { describe, expect, it } from 'vitest';
import { checkResponsesAgainstSchemas } from '../../src/http/response-check.js';
import { mappingFactorsResponse } from '../../src/http/schemas/mapping-factors.js';
import { precipitableWaterResponse } from '../../src/http/schemas/precipitable-water.js';
import { slantDelaysResponse } from '../../src/http/schemas/slant-delays.js';
import { zenithDelaysResponse } from '../../src/http/schemas/zenith-delays.js';
import { problemSchema } from '../../src/http/schemas/common.js';
import { useApp } from '../helpers/app.js';

const site = { latitude_deg: -33.9, longitude_deg: 151.2, height_m: 60 };
const epoch = '2026-01-15T00:00:00+10:00';

const cases: [string, string, object, z.ZodType][] = [
  ['zenith-delays', '/v1/zenith-delays', { site, epoch, met: { pressure_hpa: 1008 } }, zenithDelaysResponse],
  [
    'mapping-factors',
    '/v1/mapping-factors',
    { site, epoch, elevations_deg: [5, 90], model: 'chao', gradient_model: 'tilting' },
    mappingFactorsResponse,
  ],
  [
    'slant-delays (directions)',
    '/v1/slant-delays',
    { site, epoch, directions: [{ elevation_deg: 2, azimuth_deg: 5 }] },
    slantDelaysResponse,
  ],
  [
    'slant-delays (satellites)',
    '/v1/slant-delays',
    {
      site,
      epoch,
      zenith: { zhd_m: 2.3, zwd_m: 0.2 },
      satellites: [{ id: 'S1', x_m: -4.6e6, y_m: 2.56e6, z_m: -3.5e6 }].map((s) => ({
        ...s,
        x_m: s.x_m * 4,
        y_m: s.y_m * 4,
        z_m: s.z_m * 4,
      })),
    },
    slantDelaysResponse,
  ],
  [
    'precipitable-water',
    '/v1/precipitable-water',
    { site, records: [{ epoch, ztd_m: 2.5, pressure_hpa: 1008, temperature_c: 28 }] },
    precipitableWaterResponse,
  ],
];

describe('responses conform to their documented schemas', () => {
  const api = useApp();
  it.each(cases)('%s', async (_name, url, body, schema) => {
    const r = await api().post(url).send(body);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const parsed = schema.safeParse(r.body);
    expect(parsed.error?.issues ?? []).toEqual([]);
  });

  it('errors conform to the problem schema', async () => {
    const r = await api().post('/v1/zenith-delays').send({}).expect(400);
    expect(problemSchema.safeParse(r.body).success).toBe(true);
  });
});

describe('every route documents its answers (OpenAPI document)', () => {
  const doc = JSON.parse(readFileSync(new URL('../../openapi/openapi.json', import.meta.url), 'utf8')) as {
    paths: Record<string, Record<string, { responses: Record<string, { content?: Record<string, { schema?: unknown }> }> }>>;
  };
  const operations = Object.entries(doc.paths).flatMap(([path, ops]) =>
    Object.entries(ops).map(([method, op]) => [`${method.toUpperCase()} ${path}`, op] as const),
  );
  it('has the routes of the service (47 operations: 19 + 5 of soundings + 3 of the network estimation (one from deposits) + 7 of keys, audit and deleted stations + 4 of residual deposits + 8 of campaigns (3 of their uploads) + network coverage)', () => {
    expect(operations.length).toBe(47);
  });
  it.each(operations)('%s has a success response with a schema, and problem schemas for its errors', (_name, op) => {
    const success = Object.entries(op.responses).filter(([status]) => status.startsWith('2'));
    expect(success.length).toBeGreaterThan(0);
    for (const [status, r] of success) if (status !== '204') expect(r.content?.['application/json']?.schema).toBeDefined();
    for (const [, r] of Object.entries(op.responses).filter(([status]) => /^[45]/.test(status))) {
      expect(r.content?.['application/json']?.schema).toBeDefined();
    }
  });
});

describe('the response check catches drift (src/http/response-check.ts)', () => {
  async function tinyApp() {
    const app = Fastify().withTypeProvider<ZodTypeProvider>();
    app.setValidatorCompiler(validatorCompiler);
    app.setSerializerCompiler(() => (data) => JSON.stringify(data));
    checkResponsesAgainstSchemas(app);
    // as src/http/plugins/error-handler.ts: 500
    app.setErrorHandler((error: Error, _request, reply) => reply.code(500).send({ message: error.message }));
    const schema = { response: { 200: zod.object({ zwd_m: zod.number() }) } };
    app.get('/right', { schema }, async () => ({ zwd_m: 0.1 }));
    app.get('/renamed-field', { schema }, async () => ({ zwd_mm: 100 }) as never);
    app.get('/undocumented-status', { schema }, async (_request, reply) => reply.code(404 as 200).send({ zwd_m: 1 }));
    await app.ready();
    return app;
  }
  it('passes a matching answer and turns a mismatch or an undocumented status into a 500 naming it', async () => {
    const app = await tinyApp();
    expect((await app.inject('/right')).statusCode).toBe(200);
    const renamed = await app.inject('/renamed-field');
    expect(renamed.statusCode).toBe(500);
    expect(renamed.json().message).toMatch(/GET \/renamed-field answered 200 not matching its response schema: zwd_m/);
    const undocumented = await app.inject('/undocumented-status');
    expect(undocumented.statusCode).toBe(500);
    expect(undocumented.json().message).toMatch(/answered 404, which its response schemas do not document/);
    await app.close();
  });
});
