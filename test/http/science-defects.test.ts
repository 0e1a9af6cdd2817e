/**
 * Issue 10, item 5 (science defects) through HTTP: each case here failed before the fix.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { column, evenHeightsM, toApiLevels } from '../../scripts/generators/us-standard-atmosphere-1976.js';
import { precipitableWaterResponse } from '../../src/http/schemas/precipitable-water.js';
import { useApp, problemFields } from '../helpers/app.js';
import { DEG, M, MM } from '../helpers/units.js';

const epoch = '2026-06-21T06:30:00Z';
// Invented station 500 m above sea level; its ellipsoidal height follows from the geoid undulation the service reports.
const place = { latitude_deg: 46.2, longitude_deg: 7.4 };
/** EGM96 undulation there [m], as the service reports it in geoid_undulation_m (checked below). */
const PLACE_UNDULATION_M = 51.39;

describe('VMF1 coefficients at the site get no height correction (Boehm et al. 2006; Niell 1996 eq. 6)', () => {
  const api = useApp();
  const coefficients = { ah: 0.00124, aw: 0.00061 };

  async function slant(heightReference: 'site' | 'sea-level' | undefined, elevationDeg: number) {
    const body = {
      site: { ...place, height_m: 500 + PLACE_UNDULATION_M },
      epoch,
      model: 'vmf1',
      coefficients: { ...coefficients, ...(heightReference ? { height_reference: heightReference } : {}) },
      zenith: { zhd_m: 2.18, zwd_m: 0.1 }, // ZHD of a 500 m station, about 955 hPa (common practice)
      directions: [{ elevation_deg: elevationDeg, azimuth_deg: 10 }],
    };
    return (await api().post('/v1/slant-delays').send(body).expect(200)).body;
  }

  it.each([
    // issue 10's figures: the double count was 24 mm of slant at 5° and 11 mm at 7° for a station at 500 m
    [5, 24],
    [7, 11],
  ])('at %i° the sea-level coefficients add %i mm (±1 mm) that site coefficients must not get', async (elevationDeg, mm) => {
    const site = await slant('site', elevationDeg);
    const sea = await slant('sea-level', elevationDeg);
    expect(Math.abs(sea.slants[0].hydrostatic_m - site.slants[0].hydrostatic_m - mm * MM)).toBeLessThan(1 * MM);
    // site coefficients: the bare VMF1 continued fraction (b = 0.0029, c from Boehm et al. 2006 eq. 7 for 46.2°N, day 172)
    const doy = 172 + 6.5 / 24;
    const c = 0.062 + ((Math.cos((2 * Math.PI * (doy - 28)) / 365.25) + 1) * 0.0025 + 0.001) * (1 - Math.cos(46.2 * DEG));
    const s = Math.sin(elevationDeg * DEG);
    const bare = (1 + 0.00124 / (1 + 0.0029 / (1 + c))) / (s + 0.00124 / (s + 0.0029 / (s + c)));
    expect(site.slants[0].mapping_hydrostatic).toBeCloseTo(bare, 10);
    expect(site.models.mapping_height_correction).toMatch(/^none/);
    expect(sea.models.mapping_height_correction).toMatch(/sea level/);
    expect(site.model_fingerprint).not.toBe(sea.model_fingerprint);
    expect(site.warnings.join(' ')).not.toMatch(/height_reference/);
    expect(Math.abs(site.geoid_undulation_m - PLACE_UNDULATION_M)).toBeLessThan(0.01 * M);
  });

  it('without height_reference the grid meaning ("sea-level") is assumed and the answer says so', async () => {
    const r = await slant(undefined, 5);
    const sea = await slant('sea-level', 5);
    expect(r.slants[0].hydrostatic_m).toBe(sea.slants[0].hydrostatic_m);
    expect(r.warnings.join(' ')).toMatch(/height_reference not given: "sea-level" assumed/);
  });

  it('refuses an unknown height_reference, naming the field and the choices', async () => {
    const r = await api()
      .post('/v1/mapping-factors')
      .send({
        site: { ...place, height_m: 500 },
        epoch,
        elevations_deg: [5],
        model: 'vmf1',
        coefficients: { ...coefficients, height_reference: 'ground' },
      })
      .expect(400);
    expect(problemFields(r.body)).toContain('coefficients.height_reference');
    expect(r.body.detail).toMatch(/site, sea-level/);
  });
});

describe('ZHD at any allowed temperature (Saastamoinen/Davis needs only pressure; IERS 2010 eq. 9.11)', () => {
  const api = useApp();
  const site = { latitude_deg: -78.5, longitude_deg: 106.9, height_m: 3500 }; // invented plateau station

  it.each([
    [-60, { relative_humidity_pct: 60 }],
    [-90, { relative_humidity_pct: 60 }],
    [-75, {}],
    [-50, { dewpoint_c: -82 }],
  ])('at %i °C: 200, ZHD by eq. 9.11, the humidity part extrapolated with a warning', async (t, humidity) => {
    const r = await api()
      .post('/v1/zenith-delays')
      .send({ site, epoch, met: { pressure_hpa: 640, temperature_c: t, ...humidity } })
      .expect(200);
    const zhd = (0.0022768 * 640) / (1 - 0.00266 * Math.cos(2 * -78.5 * DEG) - 0.28e-6 * 3500); // eq. 9.11 written out
    expect(Math.abs(r.body.zhd_m - zhd)).toBeLessThan(0.001 * MM);
    expect(r.body.zwd_m).toBeLessThan(2 * MM);
    expect(r.body.warnings.join(' ')).toMatch(/validity of the saturation formula/);
  });
});

describe('PWV σ budget (Bevis et al. 1992, 1994; IERS 2010): no term silently 0', () => {
  const api = useApp();
  const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };

  it("a record without the delay's σ gets pwv_sigma_mm null and a warning, not 0", async () => {
    const r = await api()
      .post('/v1/precipitable-water')
      .send({ site, records: [{ epoch, zwd_m: 0.12, temperature_c: 15 }] })
      .expect(200);
    expect(r.body.records[0].pwv_sigma_mm).toBeNull();
    expect(r.body.records[0].zwd_sigma_m).toBeNull();
    expect(r.body.warnings.join(' ')).toMatch(/neither ztd_sigma_m nor zwd_sigma_m/);
    precipitableWaterResponse.parse(r.body);
  });

  it('sigma_budget=true lists every term; pressure is 0.5 hPa by default, not 0; the total is their root sum of squares', async () => {
    const rec = { epoch, ztd_m: 2.35, ztd_sigma_m: 0.004, pressure_hpa: 962, temperature_c: 16 };
    const r = await api()
      .post('/v1/precipitable-water')
      .send({ site, sigma_budget: true, records: [rec] })
      .expect(200);
    precipitableWaterResponse.parse(r.body);
    const out = r.body.records[0];
    const b = out.sigma_budget;
    const tm = 70.2 + 0.72 * (16 + 273.15);
    const pi = 1e6 / (1000 * 461.5 * (3739 / tm + 0.221)); // Bevis et al. (1994) eq. 6, constants from memory
    const dZhdDp = 0.0022768 / (1 - 0.00266 * Math.cos(2 * 47.5 * DEG) - 0.28e-6 * 420); // eq. 9.11
    expect(b.delay_mm).toBeCloseTo(pi * 0.004 * 1000, 9);
    expect(b.pressure_mm).toBeCloseTo(pi * dZhdDp * 0.5 * 1000, 9);
    expect(b.zhd_model_mm).toBeGreaterThan(0.05); // 0.5 mm of ZHD ≈ 0.08 mm of PWV
    expect(b.temperature_mm).toBeGreaterThan(0);
    expect(b.tm_mm).toBeGreaterThan(0);
    expect(b.refractivity_mm / out.pwv_mm).toBeGreaterThan(0.003); // ≈ 0.35 % (Bevis 1994 σ of k2', k3, from memory)
    expect(b.defaulted).toEqual(['pressure_sigma_hpa', 'temperature_sigma_k']);
    const total = Math.hypot(b.delay_mm, b.pressure_mm, b.zhd_model_mm, b.temperature_mm, b.tm_mm, b.refractivity_mm);
    expect(out.pwv_sigma_mm).toBeCloseTo(total, 9);
    expect(r.body.models.pwv_sigma_budget).toMatch(/0\.5 hPa/);
  });

  it("a caller's pressure and temperature sigmas replace the defaults", async () => {
    const rec = {
      epoch,
      ztd_m: 2.35,
      ztd_sigma_m: 0.004,
      pressure_hpa: 962,
      pressure_sigma_hpa: 0.1,
      temperature_c: 16,
      temperature_sigma_k: 2,
    };
    const r = await api()
      .post('/v1/precipitable-water')
      .send({ site, sigma_budget: true, records: [rec] })
      .expect(200);
    const b = r.body.records[0].sigma_budget;
    expect(b.defaulted).toEqual([]);
    const d = await api()
      .post('/v1/precipitable-water')
      .send({ site, sigma_budget: true, records: [{ epoch, ztd_m: 2.35, ztd_sigma_m: 0.004, pressure_hpa: 962, temperature_c: 16 }] })
      .expect(200);
    expect(b.pressure_mm).toBeCloseTo(d.body.records[0].sigma_budget.pressure_mm / 5, 12);
    expect(b.temperature_mm).toBeCloseTo(d.body.records[0].sigma_budget.temperature_mm * 4, 12);
  });
});

describe('heights above sea level from the EGM96 geoid (NGA check values, from memory)', () => {
  const api = useApp();

  it('reports the undulation used: −31.6 m at an NGA check point (38.628155 N, 269.779155 E; ±0.1 m)', async () => {
    const r = await api()
      .post('/v1/zenith-delays')
      .send({ site: { latitude_deg: 38.628155, longitude_deg: 269.779155, height_m: 200 }, epoch })
      .expect(200);
    expect(Math.abs(r.body.geoid_undulation_m - -31.629)).toBeLessThan(0.1 * M);
    expect(r.body.models.geoid).toMatch(/egm96/);
  });

  it('two sites on one latitude, both 300 m above sea level but with undulations −31.6 m and +50 m, get the same Niell factors', async () => {
    const lat = 38.628155;
    const heights = [];
    for (const lon of [269.779155, 359.9995]) {
      const n = (
        await api()
          .post('/v1/zenith-delays')
          .send({ site: { latitude_deg: lat, longitude_deg: lon, height_m: 0 }, epoch })
          .expect(200)
      ).body.geoid_undulation_m;
      const r = await api()
        .post('/v1/mapping-factors')
        .send({ site: { latitude_deg: lat, longitude_deg: lon, height_m: 300 + n }, epoch, elevations_deg: [5] })
        .expect(200);
      expect(r.body.geoid_undulation_m).toBe(n);
      heights.push({ n, hydrostatic: r.body.hydrostatic[0] as number });
    }
    expect(heights[1]!.n - heights[0]!.n).toBeGreaterThan(80);
    expect(heights[0]!.hydrostatic).toBeCloseTo(heights[1]!.hydrostatic, 12);
  });

  it("a 50 m undulation is 2.5 mm of slant at 5° (issue 10's figure; ±0.2 mm)", async () => {
    const site = { latitude_deg: 38.625473, longitude_deg: 359.9995 }; // N ≈ +50 m
    const send = (height_m: number) =>
      api()
        .post('/v1/slant-delays')
        .send({
          site: { ...site, height_m },
          epoch,
          zenith: { zhd_m: 2.3, zwd_m: 0.1 },
          directions: [{ elevation_deg: 5, azimuth_deg: 0 }],
        })
        .expect(200);
    const n = (await send(300)).body.geoid_undulation_m;
    const fixed = (await send(300 + n)).body; // 300 m above sea level
    // Before the fix the service took h = 300 + N for the height above sea level; the fixed service
    // computes that height for h = 300 + 2N.
    const ellipsoidTakenForSeaLevel = (await send(300 + 2 * n)).body;
    expect(Math.abs(ellipsoidTakenForSeaLevel.slants[0].hydrostatic_m - fixed.slants[0].hydrostatic_m - 2.5 * MM * (n / 50))).toBeLessThan(
      0.2 * MM,
    );
  });
});

describe('profile levels in geopotential heights are placed with the EGM96 undulation when none is given', () => {
  const api = useApp();

  it('a site on the geoid (height_m = N) gets the column bottom at N and the same delays as with geoid_undulation_m = N', async () => {
    // U.S. Standard Atmosphere (1976) generator
    const generated = column(evenHeightsM(1000, 0, 30_000), { surfaceRelativeHumidityPct: 60 });
    const site = { latitude_deg: 38.625473, longitude_deg: 359.9995 }; // N ≈ +50.0 m (NGA check point, from memory)
    const epoch = '2026-04-29T12:00:00Z';
    const levels = toApiLevels(generated, 'vapour_pressure_hpa', 'geopotential_height_m');
    const n = 50.036; // EGM96 15′ grid at this point (test/domain/geoid.test.ts: within 0.1 m of NGA's 50.065 m)
    const implicit = (
      await api()
        .post('/v1/profile-delays')
        .send({ site: { ...site, height_m: n }, epoch, levels })
        .expect(200)
    ).body;
    const explicit = (
      await api()
        .post('/v1/profile-delays')
        .send({ site: { ...site, height_m: n }, epoch, levels, geoid_undulation_m: n })
        .expect(200)
    ).body;
    expect(Math.abs(implicit.column.bottom_height_m - n)).toBeLessThan(0.01);
    expect(Math.abs(implicit.zhd_m - explicit.zhd_m)).toBeLessThan(0.001 * MM);
    expect(implicit.warnings.join(' ')).toMatch(/EGM96 geoid undulation 50\.0\d m/);
  });
});

describe('cosmetic defects', () => {
  const api = useApp();
  const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };

  it('a satellite at exactly 3° (computed 2.9999999999999964°) is not flagged "below 3°"', async () => {
    // Site + 2.2e7 m along (cos 3° · north + sin 3° · up): the elevation computed back is 3° to the last bits.
    const lat = 47.5 * DEG;
    const lon = 8.25 * DEG;
    const a = 6378137;
    const e2 = 0.0066943799901413165; // WGS84 (NIMA TR8350.2 Table 3.1)
    const nRad = a / Math.sqrt(1 - e2 * Math.sin(lat) ** 2);
    const s = [
      (nRad + 420) * Math.cos(lat) * Math.cos(lon),
      (nRad + 420) * Math.cos(lat) * Math.sin(lon),
      (nRad * (1 - e2) + 420) * Math.sin(lat),
    ];
    const north = [-Math.sin(lat) * Math.cos(lon), -Math.sin(lat) * Math.sin(lon), Math.cos(lat)];
    const up = [Math.cos(lat) * Math.cos(lon), Math.cos(lat) * Math.sin(lon), Math.sin(lat)];
    const r = 2.2e7;
    const p = [0, 1, 2].map((k) => s[k]! + r * (Math.cos(3 * DEG) * north[k]! + Math.sin(3 * DEG) * up[k]!));
    const res = await api()
      .post('/v1/slant-delays')
      .send({ site, epoch, satellites: [{ id: 'G07', x_m: p[0], y_m: p[1], z_m: p[2] }] })
      .expect(200);
    expect(Math.abs(res.body.slants[0].elevation_deg - 3)).toBeLessThan(1e-9);
    expect(res.body.warnings.join(' ')).not.toMatch(/below 3°/);
  });

  it('azimuth 360 never appears: a direction sent as 360° and a satellite due north come back as 0', async () => {
    const d = await api()
      .post('/v1/slant-delays')
      .send({ site, epoch, directions: [{ elevation_deg: 30, azimuth_deg: 360 }] })
      .expect(200);
    expect(d.body.slants[0].azimuth_deg).toBe(0);
    // due north of the site at 60° elevation; the east component rounds to −2.3e-10 m, which made 360
    const s = await api()
      .post('/v1/slant-delays')
      .send({ site, epoch, satellites: [{ id: 'E11', x_m: 8984870.44114443, y_m: 1302744.2137923073, z_m: 26158319.559106473 }] })
      .expect(200);
    expect(s.body.slants[0].azimuth_deg).toBeGreaterThanOrEqual(0);
    expect(s.body.slants[0].azimuth_deg).toBeLessThan(360);
  });

  it('the gradient factor at 90° is exactly 0 (was 6e-17), for both gradient models', async () => {
    for (const gradient_model of ['chen-herring', 'tilting']) {
      const r = await api()
        .post('/v1/mapping-factors')
        .send({ site, epoch, elevations_deg: [90], gradient_model })
        .expect(200);
      expect(r.body.gradient[0]).toBe(0);
    }
  });

  it.each([[1e-310], [0.001]])(
    'a profile traced at %f° keeps every traced number and gives no mapping-function factor there (was null or −487)',
    async (e) => {
      const example = JSON.parse(readFileSync(new URL('../../fixtures/profiles/ussa1976-45n.json', import.meta.url), 'utf8'));
      const r = await api()
        .post('/v1/profile-delays')
        .send({ ...example, elevations_deg: [e, 5] })
        .expect(200);
      const [low, five] = r.body.slants;
      for (const k of [
        'apparent_elevation_deg',
        'refraction_deg',
        'hydrostatic_m',
        'wet_m',
        'total_m',
        'bending_m',
        'mapping_hydrostatic',
        'mapping_wet',
      ]) {
        expect(Number.isFinite(low[k]), k).toBe(true);
      }
      // refraction at the horizon ≈ 0.5–0.6° (common practice)
      expect(low.refraction_deg).toBeGreaterThan(0.45);
      expect(low.refraction_deg).toBeLessThan(0.7);
      expect(low.model_mapping_hydrostatic).toBeNull();
      expect(low.model_mapping_wet).toBeNull();
      expect(five.model_mapping_hydrostatic).toBeGreaterThan(10);
      expect(r.body.warnings.join(' ')).toMatch(/1 elevation\(s\) below 1°: the mapping function is not evaluated/);
    },
  );

  it.each([[1e-310], [1e-300], [0.5]])(
    'an elevation of %f° is refused with a 400 naming it (was 200 with null or absurd factors)',
    async (e) => {
      const r = await api()
        .post('/v1/mapping-factors')
        .send({ site, epoch, elevations_deg: [10, e] })
        .expect(400);
      expect(problemFields(r.body)).toContain('elevations_deg.1');
      expect(r.body.detail).toMatch(/below 1°/);
      const s = await api()
        .post('/v1/slant-delays')
        .send({ site, epoch, directions: [{ elevation_deg: e, azimuth_deg: 0 }] })
        .expect(400);
      expect(problemFields(s.body)).toContain('directions.0.elevation_deg');
    },
  );
});
