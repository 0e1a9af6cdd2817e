/**
 * Issue 10, the remaining items, through HTTP: unit guards (humidity as a fraction, angles in
 * radians), one meaning for the estimation series' zwd_m across met gaps, the standard atmosphere
 * at the height above sea level in the estimation, the PWV σ budget named in `models`, and VMF1
 * per-epoch coefficients for the estimator's wet mapping.
 */
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { estimateZwd } from '../../src/estimation/estimate.js';
import { DEFAULT_ZWD_OPTIONS } from '../../src/services/zwd-options.js';
import { toEstimatorOptions } from '../../src/services/zwd-estimation.js';
import { problemFields, useApp } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { sqliteBackend } from '../helpers/storage.js';
import { DEG, M, MM } from '../helpers/units.js';

const H = 3600;
const epoch = '2026-06-21T06:30:00Z';
// Invented station near the Alps; N = 51.39 m there (EGM96, test/http/science-defects.test.ts).
const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };

/** Saastamoinen ZHD, IERS Conventions (2010) eq. 9.11 (from memory), written out independently. */
const saastamoinenZhdM = (pressureHpa: number, latitudeDeg: number, heightM: number) =>
  (0.0022768 * pressureHpa) / (1 - 0.00266 * Math.cos(2 * latitudeDeg * DEG) - 0.28e-6 * heightM);
/** Berg (1948) standard-atmosphere pressure at a height above sea level [hPa] (textbook form). */
const bergPressureHpa = (heightAboveSeaLevelM: number) => 1013.25 * Math.pow(1 - 2.26e-5 * heightAboveSeaLevelM, 5.225);

const warningsOf = (body: { warnings: string[] }) => body.warnings.join(' ');

describe('unit guards on the a-priori routes (docs/zwd-estimation.md, "Unit guards")', () => {
  const api = useApp();

  it('relative humidity as a fraction on /v1/zenith-delays and /v1/slant-delays: a warning naming the field, "percent expected"', async () => {
    const site = SITE;
    const fraction = await api()
      .post('/v1/zenith-delays')
      .send({ site, epoch, met: { pressure_hpa: 955, temperature_c: 15, relative_humidity_pct: 0.72 } })
      .expect(200);
    expect(warningsOf(fraction.body)).toMatch(/met\.relative_humidity_pct is 0\.72: percent expected/);
    const percent = await api()
      .post('/v1/zenith-delays')
      .send({ site, epoch, met: { pressure_hpa: 955, temperature_c: 15, relative_humidity_pct: 72 } })
      .expect(200);
    expect(warningsOf(percent.body)).not.toMatch(/percent expected/);
    // The value is used as sent: 0.72 % gives a ZWD about 100 times smaller than 72 % (common practice: e ∝ RH).
    expect(fraction.body.zwd_m).toBeLessThan(percent.body.zwd_m / 50);

    const slant = await api()
      .post('/v1/slant-delays')
      .send({
        site,
        epoch,
        met: { pressure_hpa: 955, temperature_c: 15, relative_humidity_pct: 0.5 },
        directions: [{ elevation_deg: 30, azimuth_deg: 100 }],
      })
      .expect(200);
    expect(warningsOf(slant.body)).toMatch(/met\.relative_humidity_pct is 0\.5: percent expected/);
  });

  it('elevations in radians on /v1/slant-delays: refused when the answer is meaningless, warned otherwise', async () => {
    const radians = [0.21, 0.62, 1.1, 1.52]; // 12°, 35.5°, 63°, 87° in radians
    const refused = await api()
      .post('/v1/slant-delays')
      .send({ site: SITE, epoch, directions: radians.map((e, i) => ({ elevation_deg: e, azimuth_deg: 1 + i * 1.5 })) })
      .expect(400);
    expect(problemFields(refused.body)).toEqual(['directions']);
    expect(refused.body.detail).toMatch(/look like radians/);

    // All at or above the 1° floor of the mapping functions: a low-elevation table in degrees may be meant.
    const ambiguous = await api()
      .post('/v1/slant-delays')
      .send({ site: SITE, epoch, directions: [1.1, 1.3, 1.5].map((e) => ({ elevation_deg: e, azimuth_deg: 200 })) })
      .expect(200);
    expect(warningsOf(ambiguous.body)).toMatch(
      /directions: all 3 elevations are ≤ π\/2 = 1\.5708 \(largest 1\.5\): they look like radians/,
    );

    const degrees = await api()
      .post('/v1/slant-delays')
      .send({ site: SITE, epoch, directions: [12, 35.5, 63].map((e, i) => ({ elevation_deg: e, azimuth_deg: 40 + 100 * i })) })
      .expect(200);
    expect(warningsOf(degrees.body)).not.toMatch(/radians/);
  });

  it('azimuths in radians on /v1/slant-delays: a warning (zenith delays do not depend on azimuth)', async () => {
    const r = await api()
      .post('/v1/slant-delays')
      .send({ site: SITE, epoch, directions: [0.4, 1.9, 3.3, 5.8].map((a) => ({ elevation_deg: 40, azimuth_deg: a })) })
      .expect(200);
    expect(warningsOf(r.body)).toMatch(/directions: all 4 azimuths are within \[0, 2π\]/);
    // three directions within 6° of north spread by less than 1: no warning (a deliberate northern scan)
    const north = await api()
      .post('/v1/slant-delays')
      .send({ site: SITE, epoch, directions: [0.2, 0.5, 0.9].map((a) => ({ elevation_deg: 40, azimuth_deg: a })) })
      .expect(200);
    expect(warningsOf(north.body)).not.toMatch(/azimuths/);
  });

  it('elevations in radians on /v1/mapping-factors: 400 naming elevations_deg when one is below 1°', async () => {
    const refused = await api()
      .post('/v1/mapping-factors')
      .send({ site: SITE, epoch, elevations_deg: [0.1, 0.5, 1.0, 1.5] })
      .expect(400);
    expect(problemFields(refused.body)).toEqual(['elevations_deg']);
    expect(refused.body.detail).toMatch(/look like radians/);
    const ambiguous = await api()
      .post('/v1/mapping-factors')
      .send({ site: SITE, epoch, elevations_deg: [1.0, 1.25, 1.5] })
      .expect(200);
    expect(warningsOf(ambiguous.body)).toMatch(/elevations_deg: all 3 elevations are ≤ π\/2/);
    const fine = await api()
      .post('/v1/mapping-factors')
      .send({ site: SITE, epoch, elevations_deg: [1.5, 5, 30] })
      .expect(200);
    expect(warningsOf(fine.body)).not.toMatch(/radians/);
  });
});

// Two hours of 120 s synthetic residuals (scripts/synthetic-residuals.ts, a known truth).
const data = generateSyntheticResiduals({ durationS: 2 * H, samplingS: 120, latitudeDeg: SITE.latitude_deg, seed: 7 });
const requestBody = toRequestBody(data);
const body = (extra: Record<string, unknown> = {}) => ({ ...structuredClone(requestBody), ...extra });
const T0 = Date.parse(requestBody.observations[0]!.epoch);
const T_END = Date.parse(requestBody.observations[requestBody.observations.length - 1]!.epoch);
const iso = (ms: number) => new Date(ms).toISOString();

describe('unit guards on the estimation (POST /v1/zwd-estimates)', () => {
  const api = useApp();

  it('elevations in radians: 400 naming observations (every observation would be within 1.6° of the horizon)', async () => {
    const b = body({ site: SITE });
    for (const o of b.observations) o.elevation_deg = Number((o.elevation_deg * DEG).toFixed(6));
    const r = await api().post('/v1/zwd-estimates').send(b).expect(400);
    expect(problemFields(r.body)).toEqual(['observations']);
    expect(r.body.detail).toMatch(/look like radians/);
  });

  it('azimuths in radians: a warning naming observations', async () => {
    const b = body({ site: SITE });
    for (const o of b.observations) o.azimuth_deg = Number((o.azimuth_deg * DEG).toFixed(6));
    const r = await api().post('/v1/zwd-estimates').send(b).expect(200);
    expect(warningsOf(r.body)).toMatch(/observations: all \d+ azimuths are within \[0, 2π\]/);
    const plain = await api()
      .post('/v1/zwd-estimates')
      .send(body({ site: SITE }))
      .expect(200);
    expect(warningsOf(plain.body)).not.toMatch(/radians/);
  });

  it('relative humidity of the met records as fractions: a warning naming met.relative_humidity_pct', async () => {
    const met = [
      { epoch: iso(T0), pressure_hpa: 955, temperature_c: 8, relative_humidity_pct: 0.71 },
      { epoch: iso(T_END), pressure_hpa: 953, temperature_c: 10, relative_humidity_pct: 0.64 },
    ];
    const r = await api()
      .post('/v1/zwd-estimates')
      .send(body({ site: SITE, met }))
      .expect(200);
    expect(warningsOf(r.body)).toMatch(/all 2 values of met\.relative_humidity_pct are ≤ 1\.5 \(largest 0\.71\): percent expected/);
    const percent = met.map((m) => ({ ...m, relative_humidity_pct: m.relative_humidity_pct * 100 }));
    const ok = await api()
      .post('/v1/zwd-estimates')
      .send(body({ site: SITE, met: percent }))
      .expect(200);
    expect(warningsOf(ok.body)).not.toMatch(/percent expected/);
  });
});

describe('unit guards on station met uploads (JSON and CSV)', () => {
  const { api, auth } = useArchiveApp(sqliteBackend);

  it('relative humidity as fractions: the upload is stored, with a warning naming relative_humidity_pct', async () => {
    await api()
      .put('/v1/stations/HUMI')
      .set('authorization', auth)
      .send({ name: 'Hummock Flats (invented)', ...SITE })
      .expect(201);
    const json = await api()
      .post('/v1/stations/HUMI/met')
      .set('authorization', auth)
      .send({
        records: [
          { epoch: '2026-06-21T00:00:00Z', pressure_hpa: 955, temperature_c: 12, relative_humidity_pct: 0.8 },
          { epoch: '2026-06-21T01:00:00Z', pressure_hpa: 954, temperature_c: 11, relative_humidity_pct: 0.85 },
        ],
      })
      .expect(200);
    expect(warningsOf(json.body)).toMatch(/all 2 values of relative_humidity_pct are ≤ 1\.5 \(largest 0\.85\): percent expected/);
    const csv = await api()
      .post('/v1/stations/HUMI/met')
      .set('authorization', auth)
      .set('content-type', 'text/csv')
      .send('epoch,pressure_hpa,temperature_c,relative_humidity_pct\n2026-06-21T02:00:00Z,953,10,0.9\n2026-06-21T03:00:00Z,953,9,0.92\n')
      .expect(200);
    expect(warningsOf(csv.body)).toMatch(/relative_humidity_pct are ≤ 1\.5 \(largest 0\.92\): percent expected/);
    const percent = await api()
      .post('/v1/stations/HUMI/met')
      .set('authorization', auth)
      .set('content-type', 'text/csv')
      .send('epoch,pressure_hpa,temperature_c,relative_humidity_pct\n2026-06-21T04:00:00Z,953,10,90\n')
      .expect(200);
    expect(warningsOf(percent.body)).not.toMatch(/percent expected/);
  });
});

describe('one meaning for the series zwd_m: ZTD − ZHD of the surface pressure, bridged across met gaps', () => {
  const api = useApp();
  // Met every 10 min for the first 30 min and the last 30 min; a gap of an hour between (met_max_gap_s 1800).
  const MET_STEP_MS = 600_000;
  const pressureAt = (ms: number) => 955 - (2 * (ms - T0)) / (2 * H * 1000); // a steady 1 hPa/h fall
  const metEpochs = [0, 1, 2, 3, 9, 10, 11, 12].map((k) => T0 + k * MET_STEP_MS);
  const met = metEpochs.map((ms) => ({ epoch: iso(ms), pressure_hpa: pressureAt(ms), temperature_c: 10 }));
  // An a-priori ZHD 23 mm above the measured one: before the fix zwd_m jumped by that at the gap edges.
  const apriori = { zhd_m: 2.2, zwd_m: 0.08 };

  it('is continuous where ZTD is, flags the gap epochs and counts them in a warning', async () => {
    const r = await api()
      .post('/v1/zwd-estimates')
      .send(body({ site: SITE, met, apriori, options: { met_max_gap_s: 1800 } }))
      .expect(200);
    const series = r.body.series as { epoch: string; zwd_m: number; ztd_m: number; met: string; zhd_source: string; zhd_m: number }[];
    const gap = series.filter((e) => Date.parse(e.epoch) > metEpochs[3]! && Date.parse(e.epoch) < metEpochs[4]!);
    expect(gap.length).toBeGreaterThan(20);
    for (const e of gap) {
      expect(e.met).toBe('missing');
      expect(e.zhd_source).toBe('met-bridged');
      // bridged: linear between the last record before the gap and the first after (written out here)
      const t = Date.parse(e.epoch);
      const w = (t - metEpochs[3]!) / (metEpochs[4]! - metEpochs[3]!);
      const p = pressureAt(metEpochs[3]!) + w * (pressureAt(metEpochs[4]!) - pressureAt(metEpochs[3]!));
      expect(Math.abs(e.zwd_m - (e.ztd_m - saastamoinenZhdM(p, SITE.latitude_deg, SITE.height_m)))).toBeLessThan(1e-9 * M);
    }
    const withMet = series.filter((e) => e.met !== 'missing');
    expect(withMet.every((e) => e.zhd_source === 'met')).toBe(true);
    // Continuity: step by step the ZWD moves with the ZTD, less the ZHD change of 2 min at 1 hPa/h (0.1 mm).
    let largest = 0;
    for (let k = 1; k < series.length; k++) {
      const dZwd = series[k]!.zwd_m - series[k - 1]!.zwd_m;
      const dZtd = series[k]!.ztd_m - series[k - 1]!.ztd_m;
      largest = Math.max(largest, Math.abs(dZwd - dZtd));
    }
    expect(largest).toBeLessThan(0.2 * MM); // was 23 mm at the gap edges (ZTD − ZHD(P) vs a-priori ZWD + δw)
    expect(warningsOf(r.body)).toMatch(new RegExp(`${gap.length} of ${series.length} epochs have no met`));
    expect(warningsOf(r.body)).toMatch(/zhd_source "met-bridged"/);
    expect(r.body.models.zwd_definition).toMatch(/bridged/);
  });

  it('beyond the met records the nearest pressure is held (flagged), and without met zwd_m = ztd_m − a-priori ZHD', async () => {
    const early = met.slice(0, 4); // records for the first 30 min only
    const r = await api()
      .post('/v1/zwd-estimates')
      .send(body({ site: SITE, met: early, apriori }))
      .expect(200);
    const last = r.body.series[r.body.series.length - 1];
    expect(last).toMatchObject({ met: 'missing', zhd_source: 'met-bridged' });
    expect(last.zwd_m).toBeCloseTo(last.ztd_m - saastamoinenZhdM(pressureAt(metEpochs[3]!), SITE.latitude_deg, SITE.height_m), 9);

    const none = await api()
      .post('/v1/zwd-estimates')
      .send(body({ site: SITE, apriori }))
      .expect(200);
    for (const e of none.body.series) {
      expect(e.zhd_source).toBe('apriori');
      expect(e.zwd_m).toBeCloseTo(e.ztd_m - apriori.zhd_m, 12);
    }
  });
});

describe('standard atmosphere at the height above sea level in the estimation (EGM96 geoid)', () => {
  const api = useApp();
  // Invented station on the Mongolian plateau at NGA's EGM96 check point, N = −43.572 m there (NGA test
  // values distributed with its interpolation program, from memory; test/domain/geoid.test.ts).
  const STEPPE = { latitude_deg: 46.874319, longitude_deg: 102.448729, height_m: 1500 };
  const NGA_UNDULATION_M = -43.572;
  const steppe = generateSyntheticResiduals({
    durationS: H,
    samplingS: 120,
    latitudeDeg: STEPPE.latitude_deg,
    longitudeDeg: STEPPE.longitude_deg,
    heightM: STEPPE.height_m,
    seed: 11,
  });
  const steppeBody = toRequestBody(steppe, {
    latitudeDeg: STEPPE.latitude_deg,
    longitudeDeg: STEPPE.longitude_deg,
    heightM: STEPPE.height_m,
  });

  it('the default a-priori ZHD is the Saastamoinen ZHD of Berg (1948) at h − N; geoid_undulation_m and models.geoid report it', async () => {
    const r = await api().post('/v1/zwd-estimates').send(steppeBody).expect(200);
    expect(Math.abs(r.body.geoid_undulation_m - NGA_UNDULATION_M)).toBeLessThan(0.06 * M); // grid + bilinear: ≤ 6 cm
    expect(r.body.models.geoid).toMatch(/egm96/);
    const seaLevelHeightM = STEPPE.height_m - NGA_UNDULATION_M; // 1543.6 m
    const expected = saastamoinenZhdM(bergPressureHpa(seaLevelHeightM), STEPPE.latitude_deg, STEPPE.height_m);
    // 6 cm of N is 0.015 mm of ZHD; the ellipsoidal height instead would be 11 mm higher.
    expect(Math.abs(r.body.apriori.zhd_m - expected)).toBeLessThan(0.05 * MM);
    const ellipsoidal = saastamoinenZhdM(bergPressureHpa(STEPPE.height_m), STEPPE.latitude_deg, STEPPE.height_m);
    expect(ellipsoidal - r.body.apriori.zhd_m).toBeGreaterThan(8 * MM);
    expect(warningsOf(r.body)).toMatch(/1543\.\d m above sea level, EGM96 N = -43\.\d\d m/);
  });
});

describe('the PWV σ budget is named in models on every PWV-producing route', () => {
  const api = useApp();
  /** Fingerprint scheme of docs (README, "Provenance"): SHA-256 of the scheme tag and the sorted models, 16 hex digits. */
  const fingerprintOf = (models: Record<string, unknown>) =>
    createHash('sha256')
      .update('tropodelay-models/1' + JSON.stringify(Object.fromEntries(Object.entries(models).sort(([a], [b]) => (a < b ? -1 : 1)))))
      .digest('hex')
      .slice(0, 16);

  it('POST /v1/precipitable-water and POST /v1/zwd-estimates with met', async () => {
    const pwv = await api()
      .post('/v1/precipitable-water')
      .send({
        site: SITE,
        records: [{ epoch, ztd_m: 2.35, ztd_sigma_m: 0.004, pressure_hpa: 955, temperature_c: 15 }],
      })
      .expect(200);
    expect(pwv.body.models.pwv_sigma_budget).toMatch(/^tropodelay-pwv-sigma-budget\/2: /);
    expect(pwv.body.model_fingerprint).toBe(fingerprintOf(pwv.body.models));
    const { pwv_sigma_budget: _budget, ...without } = pwv.body.models as Record<string, unknown>;
    expect(fingerprintOf(without)).not.toBe(pwv.body.model_fingerprint);

    const est = await api()
      .post('/v1/zwd-estimates')
      .send(
        body({
          site: SITE,
          met: [
            { epoch: iso(T0), pressure_hpa: 955, temperature_c: 8 },
            { epoch: iso(T_END), pressure_hpa: 954, temperature_c: 9 },
          ],
        }),
      )
      .expect(200);
    expect(est.body.models.pwv_sigma_budget).toBe(pwv.body.models.pwv_sigma_budget);
    expect(est.body.model_fingerprint).toBe(fingerprintOf(est.body.models));
  });

  describe('station and network PWV', () => {
    const archive = useArchiveApp(sqliteBackend);
    it('GET /v1/stations/{id}/precipitable-water and GET /v1/network/precipitable-water', async () => {
      const { api: a, auth } = archive;
      await a()
        .put('/v1/stations/BUDG')
        .set('authorization', auth)
        .send({ name: 'Budget Knoll (invented)', ...SITE })
        .expect(201);
      await a()
        .post('/v1/stations/BUDG/met')
        .set('authorization', auth)
        .send({ records: [{ epoch: '2026-06-21T00:00:00Z', pressure_hpa: 955, temperature_c: 12 }] })
        .expect(200);
      await a()
        .post('/v1/stations/BUDG/delays')
        .set('authorization', auth)
        .send({ source: 'ref', records: [{ epoch: '2026-06-21T00:00:00Z', ztd_m: 2.35, ztd_sigma_m: 0.004 }] })
        .expect(200);
      const range = { from: '2026-06-20T23:00:00Z', to: '2026-06-21T01:00:00Z' };
      const station = await a().get('/v1/stations/BUDG/precipitable-water').query(range).expect(200);
      expect(station.body.retrieval.models.pwv_sigma_budget).toMatch(/^tropodelay-pwv-sigma-budget\/2: /);
      const network = await a().get('/v1/network/precipitable-water').query(range).expect(200);
      expect(network.body.retrieval.models.pwv_sigma_budget).toMatch(/^tropodelay-pwv-sigma-budget\/2: /);
    });
  });
});

describe('VMF1 per-epoch coefficients for the estimator (vmf1_coefficients, options.wet_mapping "vmf1")', () => {
  const api = useApp();
  // Invented coefficients of the size the VMF1 grids give (a_h ≈ 1.2e-3, a_w ≈ 5e-4..6e-4; common practice).
  const rows = [
    { epoch: iso(T0 - 3600_000), a_h: 0.00123, a_w: 0.00052 },
    { epoch: iso(T_END + 3600_000), a_h: 0.00125, a_w: 0.00061 },
  ];
  const vmfBody = (coefficients = rows) => body({ site: SITE, vmf1_coefficients: coefficients, options: { wet_mapping: 'vmf1' } });

  /** The same estimate in-process: the estimator called directly with the body's (rounded) numbers. */
  function inProcess(coefficients = rows) {
    const obs = requestBody.observations;
    return estimateZwd({
      latitudeRad: SITE.latitude_deg * DEG,
      heightM: SITE.height_m - 51.39,
      observations: {
        epochMs: obs.map((o) => Date.parse(o.epoch)),
        satellite: obs.map((o) => o.satellite),
        elevationRad: obs.map((o) => o.elevation_deg * DEG),
        azimuthRad: obs.map((o) => o.azimuth_deg * DEG),
        residualM: obs.map((o) => o.residual_m),
      },
      options: {
        ...toEstimatorOptions(DEFAULT_ZWD_OPTIONS),
        wetMapping: {
          model: 'vmf1',
          coefficients: {
            epochMs: coefficients.map((c) => Date.parse(c.epoch)),
            ah: coefficients.map((c) => c.a_h),
            aw: coefficients.map((c) => c.a_w),
          },
        },
      },
    });
  }

  it('the HTTP result equals the in-process estimate with the same coefficients; a wrong coefficient changes it', async () => {
    const r = await api().post('/v1/zwd-estimates').send(vmfBody()).expect(200);
    const local = inProcess();
    expect(r.body.zwd_nodes).toHaveLength(local.zwdNodes.length);
    r.body.zwd_nodes.forEach((n: { correction_m: number; sigma_m: number }, j: number) => {
      expect(Math.abs(n.correction_m - local.zwdNodes[j]!.correctionM)).toBeLessThan(1e-9 * M);
      expect(Math.abs(n.sigma_m - local.zwdNodes[j]!.sigmaM)).toBeLessThan(1e-9 * M);
    });
    expect(r.body.models.wet_mapping).toBe('vmf1');
    expect(r.body.models.mapping).toMatch(/a_w of vmf1_coefficients linear in time/);

    const niell = await api()
      .post('/v1/zwd-estimates')
      .send(body({ site: SITE }))
      .expect(200);
    expect(niell.body.model_fingerprint).not.toBe(r.body.model_fingerprint);

    const wrong = rows.map((c) => ({ ...c, a_w: c.a_w * 1.6 }));
    const w = await api().post('/v1/zwd-estimates').send(vmfBody(wrong)).expect(200);
    const largest = Math.max(
      ...w.body.zwd_nodes.map((n: { correction_m: number }, j: number) => Math.abs(n.correction_m - r.body.zwd_nodes[j].correction_m)),
    );
    expect(largest).toBeGreaterThan(1e-5 * M);
    expect(Math.abs(w.body.zwd_nodes[0].correction_m - inProcess(wrong).zwdNodes[0]!.correctionM)).toBeLessThan(1e-9 * M);
  });

  it.each([
    {
      what: 'coefficients that do not span the observations',
      coefficients: [rows[0]!, { ...rows[1]!, epoch: iso(T_END - 600_000) }],
      field: 'vmf1_coefficients',
    },
    { what: 'a duplicate epoch', coefficients: [rows[0]!, rows[1]!, { ...rows[0]! }], field: 'vmf1_coefficients.2' },
    { what: 'a_w out of range', coefficients: [rows[0]!, { ...rows[1]!, a_w: 0.02 }], field: 'vmf1_coefficients.1.a_w' },
    {
      what: 'a misspelt key',
      coefficients: [rows[0]!, { epoch: rows[1]!.epoch, a_h: 0.0012, aw: 0.0005 }],
      field: 'vmf1_coefficients.1.aw',
    },
    { what: 'vmf1 without coefficients', coefficients: undefined, field: 'vmf1_coefficients' },
  ])('$what: 400 naming $field', async ({ coefficients, field }) => {
    const b = vmfBody(coefficients as typeof rows);
    if (coefficients === undefined) delete (b as Record<string, unknown>).vmf1_coefficients;
    const r = await api().post('/v1/zwd-estimates').send(b).expect(400);
    expect(problemFields(r.body)).toContain(field);
  });

  it('coefficients with another wet mapping: 400 naming vmf1_coefficients', async () => {
    const r = await api()
      .post('/v1/zwd-estimates')
      .send(body({ site: SITE, vmf1_coefficients: rows }))
      .expect(400);
    expect(problemFields(r.body)).toEqual(['vmf1_coefficients']);
  });
});

describe('option query parameters with a JSON body are refused, not ignored', () => {
  const api = useApp();

  it('POST /v1/zwd-estimates?zwd_interval_s=600 with a JSON body: 400 naming query.zwd_interval_s', async () => {
    const r = await api()
      .post('/v1/zwd-estimates')
      .query({ zwd_interval_s: '600', latitude_deg: '46.2' })
      .send(body({ site: SITE }))
      .expect(400);
    expect(problemFields(r.body).sort()).toEqual(['query.latitude_deg', 'query.zwd_interval_s']);
    expect(r.body.detail).toMatch(/with a JSON body give it in the body/);
  });

  it('the station route keeps ?source= with a JSON body and refuses an option there', async () => {
    const { api: a, auth } = archive;
    const { site: _site, ...stationBody } = body(); // the station is the site
    await a()
      .put('/v1/stations/QURY')
      .set('authorization', auth)
      .send({ name: 'Query Hollow (invented)', ...SITE })
      .expect(201);
    const ok = await a()
      .post('/v1/stations/QURY/zwd-estimates')
      .query({ source: 'trial' })
      .set('authorization', auth)
      .send(stationBody)
      .expect(200);
    expect(ok.body.stored.source).toBe('trial');
    const r = await a()
      .post('/v1/stations/QURY/zwd-estimates')
      .query({ source: 'trial', gradients: 'off' })
      .set('authorization', auth)
      .send(stationBody)
      .expect(400);
    expect(problemFields(r.body)).toEqual(['query.gradients']);
  });
  const archive = useArchiveApp(sqliteBackend);
});

describe('the station estimation stores a ZWD only where a direct deposit would (STORED_ZWD_RANGE_M, 0..1 m)', () => {
  const archive = useArchiveApp(sqliteBackend);
  // A dry atmosphere: the truth ZWD starts at 0 and random-walks 10 mm/√h, so some epochs are below 0.
  const dry = generateSyntheticResiduals({
    durationS: 2 * H,
    samplingS: 120,
    latitudeDeg: SITE.latitude_deg,
    seed: 5,
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialM: 0 },
  });
  const dryObservations = toRequestBody(dry).observations;

  it('epochs with a ZWD below 0: ZTD stored, ZWD null, counted in a warning', async () => {
    const { api: a, auth } = archive;
    await a()
      .put('/v1/stations/DRYX')
      .set('authorization', auth)
      .send({ name: 'Dry Cirque (invented)', ...SITE })
      .expect(201);
    const r = await a()
      .post('/v1/stations/DRYX/zwd-estimates')
      .set('authorization', auth)
      .send({ observations: dryObservations, apriori: { zhd_m: 2.17, zwd_m: 0 } })
      .expect(200);
    const negative = r.body.series.filter((e: { zwd_m: number }) => e.zwd_m < 0).length;
    expect(negative).toBeGreaterThan(0);
    expect(warningsOf(r.body)).toMatch(new RegExp(`${negative} of ${r.body.series.length} epochs have a ZWD outside the stored range`));
    const stored = await a()
      .get('/v1/stations/DRYX/delays')
      .query({ from: iso(T0 - H * 1000), to: iso(T0 + 3 * H * 1000) })
      .expect(200);
    const records = stored.body.records as { ztd_m: number; zwd_m: number | null }[];
    expect(records).toHaveLength(r.body.series.length);
    expect(records.filter((x) => x.zwd_m === null)).toHaveLength(negative);
    expect(records.every((x) => x.ztd_m > 2)).toBe(true);
  });

  it('residuals with the opposite sign (median ZWD below −10 mm): 422, nothing stored', async () => {
    const { api: a, auth } = archive;
    await a()
      .put('/v1/stations/FLIP')
      .set('authorization', auth)
      .send({ name: 'Flip Ridge (invented)', ...SITE })
      .expect(201);
    const flipped = requestBody.observations.map((o) => ({ ...o, residual_m: -o.residual_m }));
    const r = await a()
      .post('/v1/stations/FLIP/zwd-estimates')
      .set('authorization', auth)
      .send({ observations: flipped, apriori: { zhd_m: 2.17, zwd_m: 0 } })
      .expect(422);
    expect(problemFields(r.body)).toEqual(['observations']);
    expect(r.body.detail).toMatch(/opposite sign.*nothing stored/);
    const stored = await a()
      .get('/v1/stations/FLIP/delays')
      .query({ from: iso(T0 - H * 1000), to: iso(T0 + 3 * H * 1000) })
      .expect(200);
    expect(stored.body.records ?? []).toHaveLength(0);
  });
});
