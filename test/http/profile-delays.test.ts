import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { column, evenHeightsM, toApiLevels } from '../../scripts/generators/us-standard-atmosphere-1976.js';
import { problemFields, useApp } from '../helpers/app.js';
import { MM } from '../helpers/units.js';

const EXAMPLE = JSON.parse(readFileSync(new URL('../../fixtures/profiles/ussa1976-45n.json', import.meta.url), 'utf8'));
const clone = () => structuredClone(EXAMPLE);
const URL_ = '/v1/profile-delays';

describe('POST /v1/profile-delays', () => {
  const api = useApp();

  it('answers the example request (fixtures/profiles/ussa1976-45n.json) with delays, PWV, Tm, extension, slants and provenance', async () => {
    const res = await api().post(URL_).send(EXAMPLE).expect(200);
    const b = res.body;
    expect(b.ztd_m).toBeCloseTo(b.zhd_m + b.zwd_m, 12);
    // Saastamoinen from the same surface pressure (IERS 2010 eq. 9.11): within 1 mm with the default Bevis constants
    expect(Math.abs(b.zhd_m - 0.0022768 * 1013.25)).toBeLessThan(1 * MM);
    expect(b.pwv_mm).toBeGreaterThan(10);
    expect(b.tm_k).toBeLessThan(288.15);
    expect(b.tm_k).toBeGreaterThan(288.15 - 30);
    expect(b.top_extension).toMatchObject({ method: 'dry-isothermal-hydrostatic', top_height_m: 30_000, zwd_m: 0 });
    expect(b.top_extension.zhd_fraction).toBeGreaterThan(0.01);
    expect(b.column).toMatchObject({ bottom_height_m: 0, levels_used: 40, levels_below_site: 0, extended_down_m: 0 });
    expect(b.slants).toHaveLength(EXAMPLE.elevations_deg.length);
    for (const s of b.slants) {
      expect(s.hydrostatic_m).toBeCloseTo(s.mapping_hydrostatic * b.zhd_m, 12);
      expect(s.wet_m).toBeCloseTo(s.mapping_wet * b.zwd_m, 12);
      expect(s.total_m).toBeCloseTo(s.hydrostatic_m + s.wet_m, 12);
      expect(s.apparent_elevation_deg - s.elevation_deg).toBeCloseTo(s.refraction_deg, 12);
    }
    expect(b.mapping_model).toBe('niell');
    expect(b.model_fingerprint).toMatch(/^[0-9a-f]{16}$/);
    expect(b.models.refractivity).toMatch(/^bevis-1994/);
    expect(b.models.compressibility).toMatch(/ignored/);
    // The example gives relative humidity up to 30 km: levels colder than −45 °C use the extrapolated WMO formula, and say so.
    expect(b.warnings).toHaveLength(1);
    expect(b.warnings[0]).toMatch(/colder than −45 °C .* extrapolated/);
  });

  it('sets the mapping function of the registry beside the traced factors: the same numbers /v1/mapping-factors gives', async () => {
    const body = clone();
    const profile = (await api().post(URL_).send(body).expect(200)).body;
    const model = (
      await api()
        .post('/v1/mapping-factors')
        .send({ site: body.site, epoch: body.epoch, elevations_deg: body.elevations_deg, model: 'niell' })
        .expect(200)
    ).body;
    expect(profile.slants.map((s: { model_mapping_hydrostatic: number }) => s.model_mapping_hydrostatic)).toEqual(model.hydrostatic);
    expect(profile.slants.map((s: { model_mapping_wet: number }) => s.model_mapping_wet)).toEqual(model.wet);
  });

  it('takes VMF1 with the caller’s coefficients, and refuses VMF1 without them', async () => {
    const coefficients = { ah: 0.00121, aw: 0.00058 };
    const body = { ...clone(), mapping_model: 'vmf1', coefficients };
    const profile = (await api().post(URL_).send(body).expect(200)).body;
    const model = (
      await api()
        .post('/v1/mapping-factors')
        .send({ site: body.site, epoch: body.epoch, elevations_deg: body.elevations_deg, model: 'vmf1', coefficients })
        .expect(200)
    ).body;
    expect(profile.slants.map((s: { model_mapping_hydrostatic: number }) => s.model_mapping_hydrostatic)).toEqual(model.hydrostatic);
    expect(profile.models.mapping_ah).toBe(0.00121);
    const missing = await api()
      .post(URL_)
      .send({ ...clone(), mapping_model: 'vmf1' })
      .expect(400);
    expect(problemFields(missing.body)).toContain('coefficients');
  });

  it('chooses the refractivity constants by key; the choice changes the wet delay and the fingerprint', async () => {
    const bevis = (await api().post(URL_).send(clone()).expect(200)).body;
    const thayer = (
      await api()
        .post(URL_)
        .send({ ...clone(), refractivity_constants: 'thayer-1974' })
        .expect(200)
    ).body;
    expect(thayer.zwd_m).not.toBe(bevis.zwd_m);
    expect(thayer.model_fingerprint).not.toBe(bevis.model_fingerprint);
    const bad = await api()
      .post(URL_)
      .send({ ...clone(), refractivity_constants: 'essen-froome' })
      .expect(400);
    expect(bad.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(bad.body.detail).toMatch(
      /refractivity_constants: must be one of: smith-weintraub-1953, thayer-1974, bevis-1994, rueger-2002-best-average/,
    );
  });

  it('omits slants when no elevations are asked for; a dry column has null Tm and null wet mapping factors', async () => {
    const noSlants = (
      await api()
        .post(URL_)
        .send({ ...clone(), elevations_deg: undefined })
        .expect(200)
    ).body;
    expect(noSlants).not.toHaveProperty('slants');
    const dry = { ...clone(), levels: toApiLevels(column(evenHeightsM(1000, 0, 20_000)), 'none') };
    const res = (await api().post(URL_).send(dry).expect(200)).body;
    expect(res.tm_k).toBeNull();
    expect(res.pwv_mm).toBe(0);
    expect(res.slants[0].mapping_wet).toBeNull();
    expect(res.warnings.join(' ')).toMatch(/dry/);
  });

  it('accepts geopotential heights (with the geoid undulation) and gives the same delays as geometric heights', async () => {
    const generated = column(evenHeightsM(1000, 0, 30_000), { surfaceRelativeHumidityPct: 60 });
    const site = { latitude_deg: 45.5, longitude_deg: 10, height_m: 0 };
    const geometric = (
      await api()
        .post(URL_)
        .send({ site, epoch: EXAMPLE.epoch, levels: toApiLevels(generated) })
        .expect(200)
    ).body;
    const geopotential = (
      await api()
        .post(URL_)
        .send({
          site: { ...site, height_m: 30 },
          epoch: EXAMPLE.epoch,
          levels: toApiLevels(generated, 'vapour_pressure_hpa', 'geopotential_height_m'),
          geoid_undulation_m: 30,
        })
        .expect(200)
    ).body;
    // The column now lies 30 m higher above the ellipsoid, where normal gravity is 9e-6 weaker: 0.02 mm of ZHD.
    expect(Math.abs(geopotential.zhd_m - geometric.zhd_m)).toBeLessThan(0.05 * MM);
    expect(Math.abs(geopotential.zwd_m - geometric.zwd_m)).toBeLessThan(0.01 * MM);
    expect(geopotential.column.bottom_height_m).toBe(30);
    expect(Math.abs(geopotential.column.top_height_m - 30_030)).toBeLessThan(0.1); // 30 km geometric + N (within 0.1 m, gravity.test.ts)
    expect(geopotential.warnings.join(' ')).toMatch(/geoid undulation 30 m/);
  });

  it('mixes humidity quantities level by level: dew point, specific humidity and vapour pressure describing the same air agree', async () => {
    const body = clone();
    const asVapour = (await api().post(URL_).send(body).expect(200)).body;
    // Level 0: 70 % at 15 °C → its dew point; level 1: its specific humidity. Values computed here with
    // WMO-No. 8 and q = ε e / (p − (1 − ε) e) (the same relations, inverted independently).
    const f = (p: number) => 1.0016 + 3.15e-6 * p - 0.074 / p;
    const ew = (t: number) => 6.112 * Math.exp((17.62 * t) / (243.12 + t));
    const e0 = 0.7 * f(1013.25) * ew(15);
    const x = Math.log(e0 / f(1013.25) / 6.112);
    const dewpoint = (243.12 * x) / (17.62 - x);
    const l1 = body.levels[1];
    const e1 = (l1.relative_humidity_pct / 100) * f(l1.pressure_hpa) * ew(l1.temperature_c);
    const eps = 287.0464 / 461.5;
    body.levels[0] = { ...body.levels[0], relative_humidity_pct: undefined, dewpoint_c: dewpoint };
    body.levels[1] = { ...l1, relative_humidity_pct: undefined, specific_humidity_kg_kg: (eps * e1) / (l1.pressure_hpa - (1 - eps) * e1) };
    const mixed = (await api().post(URL_).send(body).expect(200)).body;
    expect(Math.abs(mixed.zwd_m - asVapour.zwd_m)).toBeLessThan(1e-9);
  });

  describe('bad input: 400 problem+json naming the level and field', () => {
    const cases: [string, (b: ReturnType<typeof clone>) => void, string, RegExp][] = [
      [
        'pressure not decreasing',
        (b) => (b.levels[12].pressure_hpa = b.levels[11].pressure_hpa),
        'levels.12.pressure_hpa',
        /must decrease with height/,
      ],
      ['height not increasing', (b) => (b.levels[7].height_m = b.levels[6].height_m), 'levels.7.height_m', /must increase/],
      ['two humidity quantities', (b) => (b.levels[3].dewpoint_c = -5), 'levels.3.dewpoint_c', /exactly one of/],
      ['no humidity', (b) => delete b.levels[4].relative_humidity_pct, 'levels.4', /exactly one of/],
      ['top below 10 km', (b) => (b.levels = b.levels.slice(0, 20)), 'levels.19.height_m', /at least 10000 m/],
      ['too few levels', (b) => (b.levels = b.levels.slice(0, 4)), 'levels', /5\.\.10000 levels/],
      ['pressure out of range', (b) => (b.levels[0].pressure_hpa = 0), 'levels.0.pressure_hpa', /\(0, 1100\] hPa/],
      ['temperature out of range', (b) => (b.levels[2].temperature_c = 75), 'levels.2.temperature_c', /\[-130, 60\] °C/],
      ['elevation 0', (b) => (b.elevations_deg = [0]), 'elevations_deg.0', /\(0, 90\] deg/],
      [
        'profile far above the site',
        (b) => {
          b.site.height_m = -500;
          for (const l of b.levels as { height_m: number }[]) l.height_m += 1000;
        },
        'levels.0.height_m',
        /at most 1000 m/,
      ],
    ];
    it.each(cases)('%s', async (_name, mutate, field, message) => {
      const body = clone();
      mutate(body);
      const res = await api().post(URL_).send(body).expect(400);
      expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(problemFields(res.body)).toContain(field);
      expect(res.body.detail).toMatch(message);
    });
  });

  it('warns below 3° (the model mapping function is extrapolated there)', async () => {
    const res = (
      await api()
        .post(URL_)
        .send({ ...clone(), elevations_deg: [2, 10] })
        .expect(200)
    ).body;
    expect(res.warnings.join(' ')).toMatch(/below 3°/);
    expect(res.slants[0].refraction_deg).toBeGreaterThan(res.slants[1].refraction_deg);
  });

  it('is in the OpenAPI document', async () => {
    const doc = (await api().get('/openapi.json').expect(200)).body;
    expect(doc.paths['/v1/profile-delays'].post.description).toMatch(/Body limit: 4194304 bytes/);
  });
});
