import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toCsv, toRequestBody } from '../../scripts/synthetic-residuals.js';
import type { ZwdEstimationInput } from '../../src/estimation/types.js';
import { problemFields, useApp } from '../helpers/app.js';
import { denseZwdEstimate } from '../helpers/dense-estimation.js';
import { TEST_OPTIONS } from '../helpers/synthetic-input.js';
import { M, MM } from '../helpers/units.js';
import { MAX_OBSERVATIONS, ZWD_BODY_LIMIT_BYTES } from '../../src/limits.js';

const ROUTE = '/v1/zwd-estimates';
const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const H = 3600;
const DEG = Math.PI / 180;

// Two hours of 120 s synthetic residuals with three gross errors (scripts/synthetic-residuals.ts);
// 120 s keeps the dense reference (a state per epoch since issue 10) small.
const data = generateSyntheticResiduals({ durationS: 2 * H, samplingS: 120, grossErrors: 3, latitudeDeg: SITE.latitude_deg, seed: 4 });
const requestBody = toRequestBody(data);
type Observation = (typeof requestBody.observations)[number];
const body = (extra: Record<string, unknown> = {}) => ({ ...structuredClone(requestBody), ...extra });

/** The estimator input for the same (rounded) numbers the request carries: degrees → radians here, not by the service. */
function inputFor(observations: Observation[], options: Partial<ZwdEstimationInput['options']> = {}): ZwdEstimationInput {
  return {
    latitudeRad: SITE.latitude_deg * DEG,
    observations: {
      epochMs: observations.map((o) => Date.parse(o.epoch)),
      satellite: observations.map((o) => o.satellite),
      elevationRad: observations.map((o) => o.elevation_deg * DEG),
      azimuthRad: observations.map((o) => o.azimuth_deg * DEG),
      residualM: observations.map((o) => o.residual_m),
    },
    options: structuredClone({ ...TEST_OPTIONS, ...options }),
  };
}

/** Saastamoinen ZHD, IERS Conventions (2010) eq. 9.11 (from memory), written out here independently. */
const saastamoinenZhdM = (pressureHpa: number) =>
  (0.0022768 * pressureHpa) / (1 - 0.00266 * Math.cos(2 * SITE.latitude_deg * DEG) - 0.28e-6 * SITE.height_m);
/** Bevis et al. (1994) Π with k2' = 0.221 K/Pa, k3 = 3739 K²/Pa, ρw Rv = 1000 · 461.5 (docs/constants.md, from memory). */
const bevisPi = (tmK: number) => 1e6 / (1000 * 461.5 * (3739 / tmK + 0.221));

describe('POST /v1/zwd-estimates with a JSON body', () => {
  const api = useApp();

  it('answers with nodes, series, rejections and statistics; the numbers are the dense least-squares solution', async () => {
    const res = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { scale_sigmas: false } }))
      .expect(200);
    const dense = denseZwdEstimate(inputFor(requestBody.observations, { scaleSigmas: false }));
    expect(res.body.zwd_nodes.length).toBe(25); // 2 h / 300 s + 1 (issue: default 300 s)
    expect(res.body.gradient_nodes.length).toBe(2); // 6 h default: T0 and T0 + 6 h
    res.body.zwd_nodes.forEach((n: { correction_m: number; sigma_m: number }, j: number) => {
      expect(Math.abs(n.correction_m - dense.zwdNodesM[j]!)).toBeLessThan(1e-6 * M);
      expect(Math.abs(n.sigma_m - dense.zwdNodeSigmaM[j]!)).toBeLessThan(1e-6 * M);
    });
    expect(res.body.series.length).toBe(dense.epochMs.length);
    expect(new Set(res.body.rejected.map((r: { index: number }) => r.index))).toEqual(new Set(dense.rejected));
    for (const i of data.grossErrorIndices) expect(res.body.rejected.map((r: { index: number }) => r.index)).toContain(i);
    const rejected = res.body.rejected[0];
    expect(rejected.residual_m).toBe(requestBody.observations[rejected.index]!.residual_m);
    expect(rejected.satellite).toBe(requestBody.observations[rejected.index]!.satellite);
    expect(res.body.statistics).toMatchObject({
      observations_total: requestBody.observations.length,
      observations_rejected: dense.rejected.length,
      unknowns: dense.unknowns,
      degrees_of_freedom: dense.degreesOfFreedom,
    });
  }, 120_000); // the dense reference solve is heavy on a loaded 2-core machine (31 s measured at load 30)

  it('a-priori ZHD defaults to Saastamoinen of the standard atmosphere (Berg 1948, P0 = 1013.25 hPa), with a warning; ztd_m = ZHD + ZWD + δw', async () => {
    const res = await api()
      .post(ROUTE)
      .send(body({ site: SITE }))
      .expect(200);
    // The standard atmosphere is defined above sea level: H = h − N, N = 51.39 m here (EGM96, as the
    // a-priori routes report it for this place, test/http/science-defects.test.ts).
    expect(Math.abs(res.body.geoid_undulation_m - 51.39)).toBeLessThan(0.01 * M);
    const seaLevelHeightM = SITE.height_m - res.body.geoid_undulation_m;
    const pressureHpa = 1013.25 * Math.pow(1 - 2.26e-5 * seaLevelHeightM, 5.225); // Berg (1948), textbook form
    expect(res.body.apriori).toEqual({ zhd_m: expect.any(Number), zwd_m: 0, zhd_source: 'standard-atmosphere' });
    expect(Math.abs(res.body.apriori.zhd_m - saastamoinenZhdM(pressureHpa))).toBeLessThan(1e-9 * M);
    expect(res.body.warnings.join(' ')).toMatch(/apriori\.zhd_m not given/);
    for (const e of res.body.series.slice(0, 5)) {
      expect(e.ztd_m).toBeCloseTo(res.body.apriori.zhd_m + e.correction_m, 12);
      expect(e.zwd_m).toBeCloseTo(e.correction_m, 12);
      expect(e.zhd_source).toBe('apriori');
      expect(e.pwv_mm).toBeUndefined();
    }
    const given = await api()
      .post(ROUTE)
      .send(body({ site: SITE, apriori: { zhd_m: 2.25, zwd_m: 0.1 } }))
      .expect(200);
    expect(given.body.apriori).toEqual({ zhd_m: 2.25, zwd_m: 0.1, zhd_source: 'caller' });
    const e0 = given.body.series[0];
    expect(e0.zwd_m).toBeCloseTo(0.1 + e0.correction_m, 12);
    expect(e0.ztd_m).toBeCloseTo(2.35 + e0.correction_m, 12);
  });

  it('lists every model and setting in models; the fingerprint changes with a setting and only then', async () => {
    const a = await api()
      .post(ROUTE)
      .send(body({ site: SITE }))
      .expect(200);
    const b = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { zwd_interval_s: 300 } }))
      .expect(200);
    const c = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { zwd_interval_s: 600 } }))
      .expect(200);
    expect(a.body.model_fingerprint).toMatch(/^[0-9a-f]{16}$/);
    expect(b.body.model_fingerprint).toBe(a.body.model_fingerprint);
    expect(c.body.model_fingerprint).not.toBe(a.body.model_fingerprint);
    expect(a.body.models).toMatchObject({
      mapping: expect.stringMatching(/Niell \(1996\)/),
      gradient_mapping: expect.stringMatching(/Chen & Herring \(1997\)/),
      zwd_interval_s: 300,
      zwd_random_walk_m_per_sqrt_h: 0.01,
      zwd_apriori_sigma_m: 0.5,
      gradient_interval_s: 21600,
      gradient_random_walk_m_per_sqrt_h: 0.001,
      epoch_bias: true,
      weighting: 'elevation',
      sigma0_m: 0.003,
      elevation_cutoff_deg: 7,
      outlier_threshold: 4,
    });
  });

  it('gradients null: no gradient nodes, null gradients in the series', async () => {
    const res = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { gradients: null } }))
      .expect(200);
    expect(res.body.gradient_nodes).toEqual([]);
    expect(res.body.series[0].north_gradient_m).toBeNull();
    expect(res.body.models.gradient_mapping).toBe('none');
  });

  describe('with surface met: ZHD from the measured pressure, ZWD = ZTD − ZHD, Tm (Bevis 1992) and PWV (Bevis 1994)', () => {
    const t0 = Date.parse(requestBody.observations[0]!.epoch);
    const met = [
      { epoch: new Date(t0).toISOString(), pressure_hpa: 955.0, temperature_c: 8.0 },
      { epoch: new Date(t0 + 3600_000).toISOString(), pressure_hpa: 953.0, temperature_c: 10.0, relative_humidity_pct: 70 },
    ];

    it('at a met epoch, between two records, and outside the records', async () => {
      const res = await api()
        .post(ROUTE)
        .send(body({ site: SITE, met, apriori: { zhd_m: 2.17 } }))
        .expect(200);
      const series = res.body.series;
      const first = series[0];
      expect(first.met).toBe('measured');
      const zhd = saastamoinenZhdM(955.0);
      const tm = 70.2 + 0.72 * (8.0 + 273.15); // Bevis et al. (1992), from memory
      expect(Math.abs(first.zhd_m - zhd)).toBeLessThan(1e-9 * M);
      expect(first.zwd_m).toBeCloseTo(first.ztd_m - zhd, 12);
      expect(first.tm_k).toBeCloseTo(tm, 9);
      expect(Math.abs(first.pwv_mm - bevisPi(tm) * first.zwd_m * 1000)).toBeLessThan(1e-6 * MM);
      expect(first.pwv_sigma_mm).toBeCloseTo(bevisPi(tm) * first.sigma_m * 1000, 9);
      expect(first.pwv_total_sigma_mm).toBeGreaterThan(first.pwv_sigma_mm);

      const half = series.find((e: { epoch: string }) => Date.parse(e.epoch) === t0 + 1800_000);
      expect(half.met).toBe('interpolated');
      expect(Math.abs(half.zhd_m - saastamoinenZhdM(954.0))).toBeLessThan(1e-9 * M); // linear: 954 hPa at half time
      expect(half.tm_k).toBeCloseTo(70.2 + 0.72 * (9.0 + 273.15), 9);

      const after = series.find((e: { epoch: string }) => Date.parse(e.epoch) > t0 + 3600_000);
      expect(after.met).toBe('missing');
      expect(after.pwv_mm).toBeUndefined();
      expect(res.body.warnings.join(' ')).toMatch(/epochs have no met/);
    });

    it('does not interpolate across a gap longer than met_max_gap_s', async () => {
      const res = await api()
        .post(ROUTE)
        .send(body({ site: SITE, met, options: { met_max_gap_s: 1800 } }))
        .expect(200);
      const half = res.body.series.find((e: { epoch: string }) => Date.parse(e.epoch) === t0 + 1800_000);
      expect(half.met).toBe('missing');
    });

    it('a duplicate met epoch is a 400 naming the record', async () => {
      const res = await api()
        .post(ROUTE)
        .send(body({ site: SITE, met: [met[0], met[1], { ...met[0] }] }))
        .expect(400);
      expect(problemFields(res.body)).toEqual(['met.2']);
    });
  });
});

describe('POST /v1/zwd-estimates with a text/csv body (site and options as query parameters)', () => {
  const api = useApp();
  const csv = toCsv({ ...data, observations: { ...data.observations } });
  const query = { latitude_deg: SITE.latitude_deg, longitude_deg: SITE.longitude_deg, height_m: SITE.height_m };

  it('gives the same answer as the same table sent as JSON', async () => {
    const csvRes = await api().post(ROUTE).query(query).set('content-type', 'text/csv').send(csv).expect(200);
    const observations = csv
      .trim()
      .split('\n')
      .slice(1)
      .map((line) => {
        const [epoch, satellite, e, a, r] = line.split(',');
        return { epoch: epoch!, satellite: satellite!, elevation_deg: Number(e), azimuth_deg: Number(a), residual_m: Number(r) };
      });
    const jsonRes = await api().post(ROUTE).send({ site: SITE, observations }).expect(200);
    expect(csvRes.body.zwd_nodes).toEqual(jsonRes.body.zwd_nodes);
    expect(csvRes.body.rejected).toEqual(jsonRes.body.rejected);
    expect(csvRes.body.model_fingerprint).toBe(jsonRes.body.model_fingerprint);
  });

  it('takes options from the query: gradients=off, zwd_interval_s, outlier_threshold=off, sigma_m column', async () => {
    const withSigma = csv
      .trim()
      .split('\n')
      .map((line, i) => `${line},${i === 0 ? 'sigma_m' : '0.004'}`)
      .join('\n');
    const res = await api()
      .post(ROUTE)
      .query({ ...query, gradients: 'off', zwd_interval_s: 600, outlier_threshold: 'off', weighting: 'uniform' })
      .set('content-type', 'text/csv; charset=utf-8')
      .send(withSigma)
      .expect(200);
    expect(res.body.gradient_nodes).toEqual([]);
    expect(res.body.zwd_nodes.length).toBe(13);
    expect(res.body.rejected).toEqual([]);
    expect(res.body.models).toMatchObject({
      gradient_interval_s: null,
      zwd_interval_s: 600,
      outlier_threshold: null,
      weighting: 'uniform',
    });
  });

  it.each([
    [
      'a missing column',
      'epoch,satellite,elevation_deg,azimuth_deg\n2026-03-14T00:00:00Z,S01,30,40\n',
      'body',
      /missing column\(s\) residual_m/,
    ],
    [
      'an unknown column',
      'epoch,satellite,elevation_deg,azimuth_deg,residual_m,snr\n2026-03-14T00:00:00Z,S01,30,40,0.1,45\n',
      'body',
      /unknown column\(s\) snr/,
    ],
    [
      'a cell that is not a number',
      'epoch,satellite,elevation_deg,azimuth_deg,residual_m\n2026-03-14T00:00:00Z,S01,thirty,40,0.1\n',
      'observations.0.elevation_deg',
      /\(0, 90\] deg/,
    ],
    ['a bad epoch', 'epoch,satellite,elevation_deg,azimuth_deg,residual_m\n14/03/2026,S01,30,40,0.1\n', 'observations.0.epoch', /ISO 8601/],
    [
      'an unclosed quote',
      'epoch,satellite,elevation_deg,azimuth_deg,residual_m\n"2026-03-14T00:00:00Z,S01,30,40,0.1\n',
      'body',
      /not a valid CSV table/,
    ],
    [
      'only a header',
      'epoch,satellite,elevation_deg,azimuth_deg,residual_m\n',
      'observations',
      new RegExp(`1\\.\\.${MAX_OBSERVATIONS} observations`),
    ],
    ['an empty body', '', 'body', /empty/],
  ])('%s is a 400 naming the field', async (_what, text, field, message) => {
    const res = await api().post(ROUTE).query(query).set('content-type', 'text/csv').send(text).expect(400);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(problemFields(res.body)).toContain(field);
    expect(res.body.detail).toMatch(message);
  });

  it('missing site query parameters and bad option values are 400s naming the query parameter', async () => {
    const noSite = await api().post(ROUTE).set('content-type', 'text/csv').send(csv).expect(400);
    expect(problemFields(noSite.body)).toEqual(['query.latitude_deg', 'query.longitude_deg', 'query.height_m']);
    const badInterval = await api()
      .post(ROUTE)
      .query({ ...query, zwd_interval_s: -5 })
      .set('content-type', 'text/csv')
      .send(csv)
      .expect(400);
    expect(problemFields(badInterval.body)).toEqual(['query.zwd_interval_s']);
    expect(badInterval.body.detail).toMatch(/must be a number in \(0, 2592000\] s/);
    const badSwitch = await api()
      .post(ROUTE)
      .query({ ...query, gradients: 'maybe' })
      .set('content-type', 'text/csv')
      .send(csv)
      .expect(400);
    expect(problemFields(badSwitch.body)).toEqual(['query.gradients']);
  });

  it('text/plain is not accepted here (415)', async () => {
    const res = await api().post(ROUTE).query(query).set('content-type', 'text/plain').send(csv).expect(415);
    expect(res.body.detail).toMatch(/application\/json or text\/csv/);
  });
});

describe('bad input (issue 3): clear 4xx problems naming the field', () => {
  const api = useApp();
  const one = requestBody.observations[10]!;

  it('no observations: 400', async () => {
    const res = await api().post(ROUTE).send({ site: SITE, observations: [] }).expect(400);
    expect(problemFields(res.body)).toEqual(['observations']);
    expect(res.body.detail).toContain(`1..${MAX_OBSERVATIONS} observations`);
  });

  it('none at or above the cutoff: 422 (observations between 0° and the cutoff are dropped, not errors)', async () => {
    const low = requestBody.observations.filter((o) => o.elevation_deg < 7);
    expect(low.length).toBeGreaterThan(0);
    const res = await api().post(ROUTE).send({ site: SITE, observations: low }).expect(422);
    expect(problemFields(res.body)).toEqual(['observations']);
    expect(res.body.detail).toMatch(/cutoff \(7\.00°\)/);
    const mixed = await api()
      .post(ROUTE)
      .send(body({ site: SITE }))
      .expect(200);
    expect(mixed.body.statistics.observations_below_cutoff).toBe(low.length);
  });

  it('a duplicate (epoch, satellite) pair: 400 naming both', async () => {
    const b = body({ site: SITE });
    b.observations.push({ ...one, residual_m: one.residual_m + 1 });
    const res = await api().post(ROUTE).send(b).expect(400);
    expect(problemFields(res.body)).toEqual([`observations.${b.observations.length - 1}`]);
    expect(res.body.detail).toMatch(/also observations\.10/);
  });

  it('the same instant written with an offset is the same epoch (duplicate)', async () => {
    const shifted = new Date(Date.parse(one.epoch)).toISOString().replace('Z', '+00:00');
    const res = await api()
      .post(ROUTE)
      .send({ site: SITE, observations: [one, { ...one, epoch: shifted }] })
      .expect(400);
    expect(problemFields(res.body)).toEqual(['observations.1']);
  });

  it.each([
    [{ zwd_interval_s: 0 }, 'options.zwd_interval_s', /\(0, 2592000\] s/],
    [{ zwd_interval_s: -300 }, 'options.zwd_interval_s', /\(0, 2592000\] s/],
    [{ gradients: { interval_s: 0 } }, 'options.gradients.interval_s', /\(0, 2592000\] s/],
    [{ sigma0_m: 0 }, 'options.sigma0_m', /\(0, 1\] m/],
    [{ zwd_random_walk_m_per_sqrt_h: 0 }, 'options.zwd_random_walk_m_per_sqrt_h', /\(0, 10\] m\/√h/],
    [{ zwd_apriori_sigma_m: -1 }, 'options.zwd_apriori_sigma_m', /\(0, 10\] m/],
    [{ gradients: { apriori_sigma_m: 0 } }, 'options.gradients.apriori_sigma_m', /\(0, 1\] m/],
    [{ elevation_cutoff_deg: 90 }, 'options.elevation_cutoff_deg', /\[0, 90\) deg/],
    [{ outlier_threshold: 1 }, 'options.outlier_threshold', /\[2, 1000\]/],
    [{ weighting: 'snr' }, 'options.weighting', /elevation, uniform/],
    [{ zwd_intervall_s: 300 }, 'options.zwd_intervall_s', /unknown key; did you mean zwd_interval_s\?/],
  ])('options %j: 400 naming %s', async (options, field, message) => {
    const res = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options }))
      .expect(400);
    expect(problemFields(res.body)).toContain(field);
    expect(res.body.detail).toMatch(message);
  });

  it.each([
    [{ sigma_m: 0 }, 'observations.0.sigma_m', /\(0, 10\] m/],
    [{ sigma_m: -0.003 }, 'observations.0.sigma_m', /\(0, 10\] m/],
    [{ elevation_deg: 0 }, 'observations.0.elevation_deg', /\(0, 90\] deg/],
    [{ azimuth_deg: 400 }, 'observations.0.azimuth_deg', /\[0, 360\] deg/],
    [{ epoch: 'yesterday' }, 'observations.0.epoch', /ISO 8601/],
  ])('observation %j: 400 naming %s', async (change, field, message) => {
    const res = await api()
      .post(ROUTE)
      .send({ site: SITE, observations: [{ ...one, ...change }] })
      .expect(400);
    expect(problemFields(res.body)).toContain(field);
    expect(res.body.detail).toMatch(message);
  });

  it('a system singular even with the constraints: 422 naming the node that lacks observations', async () => {
    const t0 = Date.parse(requestBody.observations[0]!.epoch);
    const gappy = requestBody.observations.filter((o) => {
      const t = Date.parse(o.epoch) - t0;
      return t < 1800_000 || t >= 3600_000;
    });
    const res = await api()
      .post(ROUTE)
      .send({
        site: SITE,
        observations: gappy,
        options: { zwd_random_walk_m_per_sqrt_h: null, zwd_apriori_sigma_m: null, gradients: null },
      })
      .expect(422);
    expect(problemFields(res.body)).toEqual(['observations']);
    expect(res.body.detail).toMatch(/singular: the zenith wet delay node 7 at \S+ is not determined: no observation touches it/);
    // With the default random walk the same data are fine: the constraint bridges the gap.
    await api().post(ROUTE).send({ site: SITE, observations: gappy }).expect(200);
  });

  it('a body over the body limit (ZWD_BODY_LIMIT_BYTES): 413', async () => {
    const big = `{"site":${JSON.stringify(SITE)},"observations":[${' '.repeat(ZWD_BODY_LIMIT_BYTES)}]}`;
    const res = await api().post(ROUTE).set('content-type', 'application/json').send(big);
    expect(res.status).toBe(413);
    expect(res.body.detail).toContain(`${ZWD_BODY_LIMIT_BYTES} bytes`);
  });

  it('the OpenAPI document describes the route and states its body limit', async () => {
    const doc = await api().get('/openapi.json').expect(200);
    const op = doc.body.paths[ROUTE].post;
    expect(op.description).toContain(`Body limit: ${ZWD_BODY_LIMIT_BYTES} bytes`);
    expect(op.description).toMatch(/text\/csv/);
    expect(Object.keys(op.requestBody.content['application/json'].schema.properties)).toEqual(
      expect.arrayContaining(['site', 'observations', 'apriori', 'met', 'options']),
    );
  });
});

// Issue 10: the estimator options of the honest formal errors, through HTTP (JSON and text/csv).
describe('issue 10 options: parametrisation, weighting components, correlated noise, wet mapping', () => {
  const api = useApp();

  it('defaults: states at every epoch, correlated-noise statistics, band statistics, node flags, named in models', async () => {
    const res = await api()
      .post(ROUTE)
      .send(body({ site: SITE }))
      .expect(200);
    const s = res.body.statistics;
    expect(res.body.models).toMatchObject({
      parametrisation: 'every-epoch',
      correlated_noise: true,
      wet_mapping: 'niell',
      sigma_constant_m: null,
    });
    expect(res.body.models.estimator).toMatch(/random-walk states at every epoch/);
    expect(s.sigma_scale).toBe(1);
    expect(s.weighting_constant_m).toBe(0);
    // The generator's σ0 is 3 mm: the re-estimated b is close to it (common practice: a few % from ~1000 residuals).
    expect(s.weighting_elevation_m).toBeGreaterThan(0.0025);
    expect(s.weighting_elevation_m).toBeLessThan(0.0035);
    expect(s.elevation_bands.reduce((n: number, b: { observations_used: number }) => n + b.observations_used, 0)).toBe(s.observations_used);
    expect(s.elevation_bands[0].lower_deg).toBeCloseTo(7, 9);
    expect(s.noise_correlation).toMatchObject({ sampling_s: 120 });
    expect(res.body.zwd_nodes.every((n: { observations_nearby: number }) => n.observations_nearby > 0)).toBe(true);
    expect(s.zwd_nodes_without_data).toBe(0);
  });

  it('each option changes the answer and the fingerprint; the older model is parametrisation "nodes"', async () => {
    const base = await api()
      .post(ROUTE)
      .send(body({ site: SITE }))
      .expect(200);
    for (const options of [
      { parametrisation: 'nodes' },
      { correlated_noise: false },
      { weighting: 'elevation-components', sigma_constant_m: 0.001 },
      { wet_mapping: 'chao' },
    ]) {
      const res = await api()
        .post(ROUTE)
        .send(body({ site: SITE, options }))
        .expect(200);
      expect(res.body.model_fingerprint, JSON.stringify(options)).not.toBe(base.body.model_fingerprint);
      for (const [k, v] of Object.entries(options)) expect(res.body.models[k]).toBe(v);
    }
    const off = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { correlated_noise: false } }))
      .expect(200);
    expect(off.body.statistics.noise_correlation).toBeNull();
    const nodes = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { parametrisation: 'nodes' } }))
      .expect(200);
    expect(nodes.body.models.estimator).toMatch(/piecewise-linear nodes/);
  });

  it('text/csv query parameters for the same options; bad values are 400s naming the field and the choices', async () => {
    const csv = toCsv({ ...data, observations: { ...data.observations } });
    const query = { latitude_deg: SITE.latitude_deg, longitude_deg: SITE.longitude_deg, height_m: SITE.height_m };
    const res = await api()
      .post(ROUTE)
      .query({ ...query, parametrisation: 'nodes', weighting: 'elevation-components', correlated_noise: 'false', wet_mapping: 'niell' })
      .set('content-type', 'text/csv')
      .send(csv)
      .expect(200);
    expect(res.body.models).toMatchObject({ parametrisation: 'nodes', weighting: 'elevation-components', correlated_noise: false });
    const bad = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { parametrisation: 'epochs' } }))
      .expect(400);
    expect(problemFields(bad.body)).toContain('options.parametrisation');
    const vmf = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { wet_mapping: 'vmf1' } }))
      .expect(400);
    expect(problemFields(vmf.body)).toContain('vmf1_coefficients'); // vmf1 needs its per-epoch coefficients
    const negative = await api()
      .post(ROUTE)
      .send(body({ site: SITE, options: { sigma_constant_m: -0.001 } }))
      .expect(400);
    expect(problemFields(negative.body)).toContain('options.sigma_constant_m');
  });
});
