import { describe, expect, it } from 'vitest';
import { DEG } from '../../src/domain/constants.js';
import { useApp, problemFields } from '../helpers/app.js';
import { MM } from '../helpers/units.js';

const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };
const epoch = '2026-06-21T06:30:00Z';

describe('GET /v1/health', () => {
  const api = useApp();
  it('answers 200 {"status":"ok"}', async () => {
    const r = await api().get('/v1/health').expect(200);
    expect(r.body).toEqual({ status: 'ok' });
    expect(r.headers['x-request-id']).toBeTruthy();
  });
});

describe('POST /v1/zenith-delays', () => {
  const api = useApp();

  it('computes ZHD (IERS 2010 eq. 9.11), ZWD (Saastamoinen 1972) and ZTD from measured met', async () => {
    const r = await api()
      .post('/v1/zenith-delays')
      .send({ site, epoch, met: { pressure_hpa: 965.3, temperature_c: 18.2, vapour_pressure_hpa: 14.1 } })
      .expect(200);
    const zhd = (0.0022768 * 965.3) / (1 - 0.00266 * Math.cos(2 * 47.5 * DEG) - 0.28e-6 * 420); // eq. 9.11 written out
    const zwd = 0.002277 * (1255 / (18.2 + 273.15) + 0.05) * 14.1; // Saastamoinen (1972), from memory
    expect(Math.abs(r.body.zhd_m - zhd)).toBeLessThan(0.001 * MM);
    expect(Math.abs(r.body.zwd_m - zwd)).toBeLessThan(0.001 * MM);
    expect(r.body.ztd_m).toBeCloseTo(r.body.zhd_m + r.body.zwd_m, 12);
    expect(r.body.met_used.source).toEqual({ pressure: 'measured', temperature: 'measured', humidity: 'measured' });
    expect(r.body.models.zwd).toMatch(/saastamoinen/);
    expect(r.body.model_fingerprint).toMatch(/^[0-9a-f]{16}$/);
    expect(r.body.warnings).toEqual([]);
  });

  it('uses the standard atmosphere for missing met and says so; ZTD about 2.3–2.5 m near sea level (common practice)', async () => {
    // height_m is above the ellipsoid; the standard atmosphere's 1013.25 hPa is at sea level, N above it
    const n = (await api().post('/v1/zenith-delays').send({ site, epoch }).expect(200)).body.geoid_undulation_m;
    const r = await api()
      .post('/v1/zenith-delays')
      .send({ site: { ...site, height_m: n }, epoch })
      .expect(200);
    expect(r.body.met_used.source).toEqual({
      pressure: 'standard-atmosphere',
      temperature: 'standard-atmosphere',
      humidity: 'standard-atmosphere',
    });
    expect(r.body.met_used.pressure_hpa).toBeCloseTo(1013.25, 9);
    expect(r.body.warnings.length).toBe(3);
    expect(r.body.ztd_m).toBeGreaterThan(2.3);
    expect(r.body.ztd_m).toBeLessThan(2.5);
  });

  it('reduces met measured at another height and marks it reduced', async () => {
    const r = await api()
      .post('/v1/zenith-delays')
      .send({ site, epoch, met: { pressure_hpa: 966, temperature_c: 18, relative_humidity_pct: 55, height_m: 410 } })
      .expect(200);
    expect(r.body.met_used.source.pressure).toBe('reduced');
    expect(966 - r.body.met_used.pressure_hpa).toBeGreaterThan(1.0); // about 1.15 hPa per 10 m (common practice)
    expect(966 - r.body.met_used.pressure_hpa).toBeLessThan(1.3);
  });

  it('accepts dew point instead of relative humidity, and selects Askne & Nordius', async () => {
    const a = await api()
      .post('/v1/zenith-delays')
      .send({ site, epoch, met: { pressure_hpa: 960, temperature_c: 20, dewpoint_c: 12 }, wet_model: 'askne-nordius' })
      .expect(200);
    expect(a.body.models.zwd).toMatch(/askne-nordius/);
    const s = await api()
      .post('/v1/zenith-delays')
      .send({ site, epoch, met: { pressure_hpa: 960, temperature_c: 20, dewpoint_c: 12 } })
      .expect(200);
    expect(a.body.model_fingerprint).not.toBe(s.body.model_fingerprint);
    expect(Math.abs(a.body.zwd_m - s.body.zwd_m) / s.body.zwd_m).toBeLessThan(0.05);
  });

  it.each([
    ['site.latitude_deg', { site: { ...site, latitude_deg: 90.5 }, epoch }, /\[-90, 90\] deg/],
    ['site.longitude_deg', { site: { ...site, longitude_deg: 361 }, epoch }, /\[-180, 360\] deg/],
    ['site.height_m', { site: { ...site, height_m: 9001 }, epoch }, /\[-500, 9000\] m/],
    ['met.pressure_hpa', { site, epoch, met: { pressure_hpa: 200 } }, /\[300, 1100\] hPa/],
    ['met.temperature_c', { site, epoch, met: { temperature_c: 61 } }, /\[-90, 60\] °C/],
    ['met.relative_humidity_pct', { site, epoch, met: { relative_humidity_pct: 101 } }, /\[0, 100\] %/],
    ['met.dewpoint_c', { site, epoch, met: { relative_humidity_pct: 50, dewpoint_c: 5 } }, /at most one/],
    ['epoch', { site, epoch: '21 June 2026' }, /ISO 8601/],
    ['wet_model', { site, epoch, wet_model: 'hopeful' }, /saastamoinen, askne-nordius/],
    ['site', { epoch }, /./],
  ])('rejects a bad %s with a 400 problem naming it and its range', async (field, body, message) => {
    const r = await api().post('/v1/zenith-delays').send(body).expect(400);
    expect(r.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(problemFields(r.body)).toContain(field);
    expect(r.body.detail).toMatch(message);
    expect(r.body.status).toBe(400);
    expect(JSON.stringify(r.body)).not.toMatch(/at .*\.ts:\d+/); // no stack trace
  });

  it('answers 400 to unparseable JSON and 415 to a content type it does not take', async () => {
    const bad = await api().post('/v1/zenith-delays').set('content-type', 'application/json').send('{"site":').expect(400);
    expect(bad.headers['content-type']).toMatch(/problem\+json/);
    const wrong = await api().post('/v1/zenith-delays').set('content-type', 'application/xml').send('<site/>').expect(415);
    expect(wrong.body.detail).toMatch(/application\/json/);
  });

  it('answers 413 to a body over the 1 MiB limit', async () => {
    const r = await api()
      .post('/v1/zenith-delays')
      .set('content-type', 'application/json')
      .send(JSON.stringify({ site, epoch, padding: 'x'.repeat(1_100_000) }))
      .expect(413);
    expect(r.body.detail).toMatch(/1048576 bytes/);
  });

  it('answers a 404 problem for an unknown route', async () => {
    const r = await api().get('/v1/nowhere').expect(404);
    expect(r.body.title).toBe('Not found');
  });
});

describe('POST /v1/mapping-factors', () => {
  const api = useApp();

  it('returns hydrostatic, wet and gradient factors in the order of the elevations (Niell default)', async () => {
    const r = await api()
      .post('/v1/mapping-factors')
      .send({ site, epoch, elevations_deg: [90, 30, 5] })
      .expect(200);
    expect(r.body.model).toBe('niell');
    expect(r.body.hydrostatic[0]).toBeCloseTo(1, 9); // normalised at zenith
    expect(r.body.hydrostatic[2]).toBeGreaterThan(9.8); // about 10 at 5° (common practice)
    expect(r.body.hydrostatic[2]).toBeLessThan(10.4);
    expect(r.body.wet[1]).toBeGreaterThan(1.99);
    expect(r.body.wet[1]).toBeLessThan(2.0); // just under the cosecant 2 at 30°
    expect(r.body.gradient[1]).toBeCloseTo(1 / (0.5 * Math.tan(30 * DEG) + 0.0032), 9); // Chen & Herring (1997)
  });

  it('warns below 3° elevation', async () => {
    const r = await api()
      .post('/v1/mapping-factors')
      .send({ site, epoch, elevations_deg: [2, 10] })
      .expect(200);
    expect(r.body.warnings.join(' ')).toMatch(/below 3°/);
  });

  it('takes VMF1 coefficients, and refuses vmf1 without them or other models with them', async () => {
    const ok = await api()
      .post('/v1/mapping-factors')
      .send({ site, epoch, elevations_deg: [5], model: 'vmf1', coefficients: { ah: 0.00122, aw: 0.00055 } })
      .expect(200);
    expect(ok.body.models.mapping).toMatch(/^vmf1/);
    const missing = await api()
      .post('/v1/mapping-factors')
      .send({ site, epoch, elevations_deg: [5], model: 'vmf1' })
      .expect(400);
    expect(problemFields(missing.body)).toContain('coefficients');
    const extra = await api()
      .post('/v1/mapping-factors')
      .send({ site, epoch, elevations_deg: [5], coefficients: { ah: 0.00122, aw: 0.00055 } })
      .expect(400);
    expect(problemFields(extra.body)).toContain('coefficients');
  });

  it.each([
    ['elevations_deg.1', [10, 0], /\(0, 90\] deg/],
    ['elevations_deg.0', [90.5], /\(0, 90\] deg/],
    ['elevations_deg', [], /1\.\.100000/],
  ])('rejects %s', async (field, elevations_deg, message) => {
    const r = await api().post('/v1/mapping-factors').send({ site, epoch, elevations_deg }).expect(400);
    expect(problemFields(r.body)).toContain(field);
    expect(r.body.detail).toMatch(message);
  });

  it('lists the valid model names for an unknown one', async () => {
    const r = await api()
      .post('/v1/mapping-factors')
      .send({ site, epoch, elevations_deg: [5], model: 'mine' })
      .expect(400);
    expect(r.body.detail).toMatch(/niell, vmf1, chao, cosecant/);
  });
});

describe('POST /v1/slant-delays', () => {
  const api = useApp();

  it('maps caller zenith values: slant = m_h ZHD + m_w ZWD + m_g (G_N cos a + G_E sin a)', async () => {
    const zenith = { zhd_m: 2.2, zwd_m: 0.15, north_gradient_m: 0.0008, east_gradient_m: -0.0004 };
    const directions = [
      { elevation_deg: 10, azimuth_deg: 30 },
      { elevation_deg: 45, azimuth_deg: 200 },
    ];
    const r = await api().post('/v1/slant-delays').send({ site, epoch, zenith, directions }).expect(200);
    const mf = await api()
      .post('/v1/mapping-factors')
      .send({ site, epoch, elevations_deg: [10, 45] })
      .expect(200);
    r.body.slants.forEach((s: Record<string, number>, i: number) => {
      const a = directions[i]!.azimuth_deg * DEG;
      const expected =
        mf.body.hydrostatic[i] * 2.2 + mf.body.wet[i] * 0.15 + mf.body.gradient[i] * (0.0008 * Math.cos(a) - 0.0004 * Math.sin(a));
      expect(s.total_m).toBeCloseTo(expected, 12);
      expect(s.azimuth_deg).toBe(directions[i]!.azimuth_deg);
    });
    expect(r.body.zenith.source).toEqual({ zhd: 'caller', zwd: 'caller', gradients: 'caller' });
    expect(r.body.met_used).toBeUndefined();
    // about ten times the zenith delay at low elevation (common practice): 10° gives about 5.6
    expect(r.body.slants[0].total_m / 2.35).toBeGreaterThan(5.4);
  });

  it('computes elevation and azimuth from satellite ECEF positions, with the nadir angle', async () => {
    // A satellite straight above the site at GNSS orbit radius: elevation 90°, nadir 0°.
    const lat = site.latitude_deg * DEG;
    const lon = site.longitude_deg * DEG;
    const r = 26_560e3;
    const sat = { id: 'X01', x_m: r * Math.cos(lat) * Math.cos(lon), y_m: r * Math.cos(lat) * Math.sin(lon), z_m: r * Math.sin(lat) };
    const res = await api()
      .post('/v1/slant-delays')
      .send({ site, epoch, satellites: [sat] })
      .expect(200);
    expect(res.body.slants[0].satellite).toBe('X01');
    expect(res.body.slants[0].elevation_deg).toBeGreaterThan(89.8); // geocentric vs geodetic vertical differ by ≤ 0.2°
    // the site is off the geocentric radial by the 0.19° geodetic–geocentric latitude difference
    expect(res.body.slants[0].nadir_deg).toBeLessThan(0.1);
  });

  it('refuses a satellite below the horizon, naming it', async () => {
    const res = await api()
      .post('/v1/slant-delays')
      .send({ site, epoch, satellites: [{ id: 'X02', x_m: -26_560e3, y_m: 0, z_m: 0 }] })
      .expect(400);
    expect(problemFields(res.body)).toContain('satellites.0');
    expect(res.body.detail).toMatch(/\(0, 90\] deg/);
  });

  it('needs exactly one of directions and satellites', async () => {
    const r = await api().post('/v1/slant-delays').send({ site, epoch }).expect(400);
    expect(problemFields(r.body)).toContain('directions');
  });

  it.each([
    ['zenith.zwd_m', { zenith: { zwd_m: 1.5 } }, /\[0, 1\] m/],
    ['zenith.zhd_m', { zenith: { zhd_m: 0.5 } }, /\[1, 3\] m/],
    ['directions.0.azimuth_deg', { directions: [{ elevation_deg: 10, azimuth_deg: 361 }] }, /\[0, 360\] deg/],
  ])('rejects %s', async (field, extra, message) => {
    const r = await api()
      .post('/v1/slant-delays')
      .send({ site, epoch, directions: [{ elevation_deg: 10, azimuth_deg: 0 }], ...extra })
      .expect(400);
    expect(problemFields(r.body)).toContain(field);
    expect(r.body.detail).toMatch(message);
  });

  it('handles a 100 000-direction request', async () => {
    const directions = Array.from({ length: 100_000 }, (_, i) => ({ elevation_deg: 3 + (i % 870) / 10, azimuth_deg: (i * 7) % 360 }));
    const r = await api().post('/v1/slant-delays').send({ site, epoch, directions }).expect(200);
    expect(r.body.slants).toHaveLength(100_000);
    expect(r.body.slants[99_999].elevation_deg).toBe(directions[99_999]!.elevation_deg);
  });
});

describe('POST /v1/precipitable-water', () => {
  const api = useApp();

  it('derives PWV from ZTD and measured pressure and temperature (Bevis 1992/1994)', async () => {
    const r = await api()
      .post('/v1/precipitable-water')
      .send({ site, records: [{ epoch, ztd_m: 2.35, ztd_sigma_m: 0.005, pressure_hpa: 962, temperature_c: 16 }] })
      .expect(200);
    const rec = r.body.records[0];
    const zhd = (0.0022768 * 962) / (1 - 0.00266 * Math.cos(2 * 47.5 * DEG) - 0.28e-6 * 420);
    const tm = 70.2 + 0.72 * (16 + 273.15);
    const pi = 1e6 / (1000 * 461.5 * (3739 / tm + 0.221)); // Bevis et al. (1994) eq. 6, constants from memory
    expect(rec.pwv_mm).toBeCloseTo((2.35 - zhd) * pi * 1000, 6);
    expect(rec.tm_k).toBeCloseTo(tm, 9);
    expect(rec.pwv_sigma_mm).toBeGreaterThan(0.005 * pi * 1000); // at least the ZTD part
    expect(rec.epoch).toBe('2026-06-21T06:30:00.000Z');
  });

  it('takes a ZWD and a caller Tm without needing pressure', async () => {
    const r = await api()
      .post('/v1/precipitable-water')
      .send({ site, records: [{ epoch, zwd_m: 0.13, tm_k: 275 }] })
      .expect(200);
    expect(r.body.records[0].zhd_m).toBeNull();
    expect(r.body.records[0].pwv_mm).toBeCloseTo(0.13 * 1000 * (1e6 / (1000 * 461.5 * (3739 / 275 + 0.221))), 6);
    expect(r.body.models.tm).toBe('caller');
  });

  it('refuses a ZTD without pressure (pressure is never silently defaulted), naming the record', async () => {
    const r = await api()
      .post('/v1/precipitable-water')
      .send({
        site,
        records: [
          { epoch, zwd_m: 0.1, tm_k: 270 },
          { epoch, ztd_m: 2.4, temperature_c: 10 },
        ],
      })
      .expect(400);
    expect(problemFields(r.body)).toContain('records.1.pressure_hpa');
  });

  it.each([
    ['records.0.ztd_m', { ztd_m: 3.5, pressure_hpa: 1000, temperature_c: 10 }, /\[1, 3\] m/],
    ['records.0.zwd_m', { zwd_m: -0.1, temperature_c: 10 }, /\[0, 1\] m/],
    ['records.0.pressure_hpa', { ztd_m: 2.4, pressure_hpa: 1200, temperature_c: 10 }, /\[300, 1100\] hPa/],
  ])('rejects %s out of range', async (field, rec, message) => {
    const r = await api()
      .post('/v1/precipitable-water')
      .send({ site, records: [{ epoch, ...rec }] })
      .expect(400);
    expect(problemFields(r.body)).toContain(field);
    expect(r.body.detail).toMatch(message);
  });
});
