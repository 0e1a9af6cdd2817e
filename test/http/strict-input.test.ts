/**
 * Strict input (issue 10, item 4): a key that is not part of a request object or query string is a
 * 400 naming the key and the closest known one, never silently dropped for a default. Before, each of
 * these answered 200 with defaults in place of what the caller meant (issue 10, "Misspelt keys are
 * dropped"). The expected suggestions are the API's own field names (src/http/schemas).
 */

import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toCsv, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { closestKey } from '../../src/http/field-errors.js';
import { useApp } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const EPOCH = '2026-03-14T12:00:00Z';
const data = generateSyntheticResiduals({ durationS: 1800, latitudeDeg: SITE.latitude_deg, seed: 31 });
const { observations } = toRequestBody(data);

interface Problem {
  detail: string;
  errors: { field: string; message: string }[];
}

describe('closestKey (the suggestion)', () => {
  it('finds the key with the unit suffix, the word, or within a small edit distance; nothing when far', () => {
    expect(closestKey('pressure', ['pressure_hpa', 'temperature_c'])).toBe('pressure_hpa');
    expect(closestKey('humidity', ['relative_humidity_pct', 'dewpoint_c'])).toBe('relative_humidity_pct');
    expect(closestKey('wetmodel', ['wet_model', 'site'])).toBe('wet_model');
    expect(closestKey('zwd_intervall_s', ['zwd_interval_s', 'gradient_interval_s'])).toBe('zwd_interval_s');
    expect(closestKey('colour', ['pressure_hpa', 'temperature_c'])).toBeUndefined();
  });
});

describe('unknown keys in public requests', () => {
  const api = useApp();

  it.each([
    [{ pressure: 950 }, 'met.pressure', 'pressure_hpa'],
    [{ temperature: 12 }, 'met.temperature', 'temperature_c'],
    [{ humidity: 72 }, 'met.humidity', 'relative_humidity_pct'],
  ])('zenith delays, met %j: 400 naming %s, suggesting %s', async (met, field, known) => {
    const res = await api().post('/v1/zenith-delays').send({ site: SITE, epoch: EPOCH, met }).expect(400);
    const p = res.body as Problem;
    expect(p.errors).toContainEqual({ field, message: `unknown key; did you mean ${known}?` });
    expect(p.detail).toBe(`${field}: unknown key; did you mean ${known}?`);
  });

  it('zenith delays, top-level wetmodel: 400 suggesting wet_model', async () => {
    const res = await api().post('/v1/zenith-delays').send({ site: SITE, epoch: EPOCH, wetmodel: 'askne-nordius' }).expect(400);
    expect((res.body as Problem).errors).toContainEqual({ field: 'wetmodel', message: 'unknown key; did you mean wet_model?' });
  });

  it('slant delays, zenith.ztd_m: 400 naming the key (a ZTD is not a zenith input there)', async () => {
    const res = await api()
      .post('/v1/slant-delays')
      .send({ site: SITE, epoch: EPOCH, zenith: { ztd_m: 2.4 }, directions: [{ elevation_deg: 30, azimuth_deg: 90 }] })
      .expect(400);
    const err = (res.body as Problem).errors.find((e) => e.field === 'zenith.ztd_m');
    expect(err?.message).toMatch(/^unknown key; did you mean z[hw]d_m\?$/);
  });

  it('every unknown key of one object is named, each with its own field', async () => {
    const res = await api()
      .post('/v1/zenith-delays')
      .send({ site: SITE, epoch: EPOCH, met: { pressure: 950, temperature: 12 } })
      .expect(400);
    const fields = (res.body as Problem).errors.map((e) => e.field);
    expect(fields).toEqual(expect.arrayContaining(['met.pressure', 'met.temperature']));
  });

  it('ZWD estimation, text/csv query zwd_intervall_s: 400 naming query.zwd_intervall_s', async () => {
    const res = await api()
      .post('/v1/zwd-estimates')
      .query({ ...SITE, zwd_intervall_s: 300 })
      .set('content-type', 'text/csv')
      .send(toCsv(data))
      .expect(400);
    expect((res.body as Problem).errors).toContainEqual({
      field: 'query.zwd_intervall_s',
      message: 'unknown key; did you mean zwd_interval_s?',
    });
  });

  it('ZWD estimation, JSON body with a misspelt top-level key: 400', async () => {
    const res = await api().post('/v1/zwd-estimates').send({ site: SITE, observations, option: {} }).expect(400);
    expect((res.body as Problem).errors).toContainEqual({ field: 'option', message: 'unknown key; did you mean options?' });
  });

  it('the OpenAPI document says so: request objects have additionalProperties false', async () => {
    const res = await api().get('/openapi.json').expect(200);
    const text = JSON.stringify(res.body);
    expect(text).toContain('"additionalProperties":false');
  });
});

const backend = BACKENDS[0]!;
describe(`unknown keys on the station routes (${backend.name})`, () => {
  const { api, auth } = useArchiveApp(backend);

  it('station CSV estimation with site parameters: 400 (the stored site is used), nothing stored', async () => {
    await api()
      .put('/v1/stations/STRICT1')
      .set('authorization', auth)
      .send({ name: 'Strict input (invented)', ...SITE })
      .expect(201);
    const res = await api()
      .post('/v1/stations/STRICT1/zwd-estimates')
      .set('authorization', auth)
      .query({ latitude_deg: 10, longitude_deg: 20, height_m: 30 })
      .set('content-type', 'text/csv')
      .send(toCsv(data))
      .expect(400);
    const fields = (res.body as Problem).errors.map((e) => e.field);
    expect(fields).toEqual(expect.arrayContaining(['query.latitude_deg', 'query.longitude_deg', 'query.height_m']));
    const stored = await api().get('/v1/stations/STRICT1/delays').expect(200);
    expect(stored.body.records ?? []).toHaveLength(0);
  });

  it('series read with a misspelt query parameter: 400 suggesting the known one', async () => {
    const res = await api().get('/v1/stations/STRICT1/delays?fromm=2026-03-14').expect(400);
    expect((res.body as Problem).errors).toContainEqual({ field: 'query.fromm', message: 'unknown key; did you mean from?' });
  });
});
