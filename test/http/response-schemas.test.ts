/**
 * Responses are serialised with plain JSON.stringify (src/http/app.ts), so this file checks that
 * what each route answers conforms to the response schema it documents in the OpenAPI document.
 */

import type { z } from 'zod';
import { describe, expect, it } from 'vitest';
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
  ['mapping-factors', '/v1/mapping-factors', { site, epoch, elevations_deg: [5, 90], model: 'chao', gradient_model: 'tilting' }, mappingFactorsResponse],
  ['slant-delays (directions)', '/v1/slant-delays', { site, epoch, directions: [{ elevation_deg: 2, azimuth_deg: 5 }] }, slantDelaysResponse],
  ['slant-delays (satellites)', '/v1/slant-delays', { site, epoch, zenith: { zhd_m: 2.3, zwd_m: 0.2 }, satellites: [{ id: 'S1', x_m: -4.6e6, y_m: 2.56e6, z_m: -3.5e6 }].map((s) => ({ ...s, x_m: s.x_m * 4, y_m: s.y_m * 4, z_m: s.z_m * 4 })) }, slantDelaysResponse],
  ['precipitable-water', '/v1/precipitable-water', { site, records: [{ epoch, ztd_m: 2.5, pressure_hpa: 1008, temperature_c: 28 }] }, precipitableWaterResponse],
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
