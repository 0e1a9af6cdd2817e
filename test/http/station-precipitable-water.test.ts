/**
 * PWV retrieval from stored series, checked against an independent computation written out here
 * from the published formulas (not by calling the code under test):
 *
 *   ZHD = 0.0022768 P / (1 − 0.00266 cos 2φ − 0.28e-6 H)  [m]   IERS Conventions (2010) eq. 9.11 (from memory)
 *   Tm  = 70.2 + 0.72 Ts  [K]                               Bevis et al. (1992) (from memory)
 *   Π   = 10^6 / (ρw Rv (k3/Tm + k2'))                       Bevis et al. (1994); ρw 1000 kg/m³, Rv 461.5 J/(kg K),
 *                                                            k3 3739 K²/Pa, k2' 0.221 K/Pa (from memory)
 *   PWV = Π (ZTD − ZHD);  σ_PWV² = (Π σ_ZTD)² + (ZWD ∂Π/∂Tm σ_Tm)², σ_Tm = 4.74 K (Bevis 1992 scatter, from memory)
 *   met at a delay epoch: linear in time between the bracketing records (common practice)
 *   met sensor below the antenna: P_ant = P exp(−g0 Δh / (Rd T̄)), T_ant = T − 0.0065 Δh
 *     (hypsometric equation, Wallace & Hobbs 2006 eq. 3.29; g0 9.80665, Rd 287.05; lapse rate USSA 1976)
 * and against the known truth of the synthetic network generator (scripts/synthetic/network.ts).
 */

import { describe, expect, it } from 'vitest';
import { DEMO_NETWORK, round1, truthSeries } from '../../scripts/synthetic/network.js';
import { problemFields } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const H = 3_600_000;
const T0 = Date.UTC(2026, 6, 10);
const iso = (ms: number) => new Date(ms).toISOString();

const LAT_DEG = 45.3;
const HEIGHT_M = 210.4;
const STATION = { name: 'Fernholt Meadow (invented)', latitude_deg: LAT_DEG, longitude_deg: 7.7, height_m: HEIGHT_M };

function zhdM(pHpa: number): number {
  return (0.0022768 * pHpa) / (1 - 0.00266 * Math.cos((2 * LAT_DEG * Math.PI) / 180) - 0.28e-6 * HEIGHT_M);
}
const tmK = (tC: number) => 70.2 + 0.72 * (tC + 273.15);
// Bevis et al. (1994) eq. 6 with k2' [K/Pa] and k3 [K²/Pa] (constants from memory)
const pi = (tm: number, k2 = 0.221, k3 = 3739) => 1e6 / (1000 * 461.5 * (k3 / tm + k2));
/**
 * The stored-series PWV and its σ budget written out: delay σ; pressure σ 0.5 hPa and surface
 * temperature σ 0.5 K (the documented defaults; stored met has no sigmas); the ±0.0000005 m/hPa of
 * the Saastamoinen constant (IERS 2010 eq. 9.11, from memory); the 4.74 K scatter of the Bevis Tm;
 * k2' ± 2.2 K/hPa and k3 ± 0.012e5 K²/hPa (Bevis et al. 1994, from memory).
 */
function expected(ztd: number, sigma: number | null, pHpa: number, tC: number) {
  const tm = tmK(tC);
  const zwd = ztd - zhdM(pHpa);
  const dPiDTm = (pi(tm + 0.01) - pi(tm - 0.01)) / 0.02;
  const dPiDk2 = (pi(tm, 0.221 + 1e-4) - pi(tm, 0.221 - 1e-4)) / 2e-4;
  const dPiDk3 = (pi(tm, 0.221, 3739 + 0.01) - pi(tm, 0.221, 3739 - 0.01)) / 0.02;
  const pressureM = (zhdM(pHpa + 0.5) - zhdM(pHpa - 0.5)) / 2; // σ_P = 0.5 hPa
  const zhdModelM = zhdM(pHpa) * (0.0000005 / 0.0022768);
  const zwdSigma = sigma === null ? null : Math.hypot(sigma, pressureM, zhdModelM);
  return {
    zhd_m: zhdM(pHpa),
    zwd_m: zwd,
    zwd_sigma_m: zwdSigma,
    tm_k: tm,
    conversion_factor: pi(tm),
    pwv_mm: pi(tm) * zwd * 1000,
    pwv_sigma_mm:
      zwdSigma === null
        ? null
        : Math.hypot(pi(tm) * zwdSigma, zwd * dPiDTm * 4.74, zwd * dPiDTm * 0.72 * 0.5, zwd * dPiDk2 * 0.022, zwd * dPiDk3 * 12) * 1000,
  };
}

// Met: hourly records 00..03 h, then an outage to 09 h (longer than the 3 h limit); 10 h has temperature only.
const MET = [
  { h: 0, p: 990.2, t: 24.1 },
  { h: 1, p: 990.6, t: 23.5 },
  { h: 2, p: 991.4, t: 22.9 },
  { h: 3, p: 991.0, t: 22.0 },
  { h: 9, p: 993.0, t: 18.0 },
  { h: 10, p: null, t: 17.5 },
];
// Delays: on a met epoch, between two, in the outage, with a large sigma, without sigma, at the temperature-only epoch.
const DELAYS = [
  { h: 1, ztd: 2.4731, sigma: 0.0042 },
  { h: 1.25, ztd: 2.4702, sigma: 0.0042 },
  { h: 2.5, ztd: 2.465, sigma: 0.025 },
  { h: 3, ztd: 2.4611, sigma: null },
  { h: 5, ztd: 2.45, sigma: 0.004 },
  { h: 10, ztd: 2.44, sigma: 0.004 },
];

/**
 * CSV of the station PWV retrieval pinned byte for byte (regression pin, captured from the
 * implementation at commit c921cd2, before the batch fast path; σ cells re-captured when the σ budget
 * became complete, issue 10): the header, epoch text, rounding
 * (1 µm, 0.0001 mm, 0.0001 hPa/K, Π 1e-8), empty cells for null, negative values and quality flags.
 * Its PWV cells are checked against the written-out formulas in the test below.
 */
const PINNED_HEADER =
  'epoch,source,model_fingerprint,ztd_m,ztd_sigma_m,pressure_hpa,temperature_c,zhd_m,zwd_m,zwd_sigma_m,tm_k,tm_sigma_k,conversion_factor,pwv_mm,pwv_sigma_mm,quality,pressure_quality,temperature_quality,warnings';
const PINNED_CSV_PINA = [
  PINNED_HEADER,
  '2026-07-10T01:00:00.000Z,ref,55b7ed3531923e75,2.4731,0.0042,990.6,23.5,2.255468,0.217632,0.00438,283.788,4.74,0.16174934,35.2018,0.924,ok,measured,measured,',
  '2026-07-10T01:15:00.000Z,ref,55b7ed3531923e75,2.4702,0.0042,990.8,23.35,2.255924,0.214276,0.00438,283.68,4.74,0.1616888,34.6461,0.918,met-interpolated,interpolated,interpolated,',
  '2026-07-10T02:00:00.000Z,low,2bb4e1e1d0fa5616,2.1,0.004,991.4,22.9,2.25729,-0.15729,0.004188,283.356,4.74,0.16150717,-25.4034,0.8009,ok,measured,measured,wet-delay-negative',
  '2026-07-10T02:30:00.000Z,ref,55b7ed3531923e75,2.465,0.025,991.2,22.45,2.256834,0.208166,0.025031,283.032,4.74,0.16132554,33.5825,4.0778,delay-sigma-large,interpolated,interpolated,delay-sigma-large',
  '2026-07-10T03:00:00.000Z,ref,55b7ed3531923e75,2.4611,,991,22,2.256379,0.204721,,282.708,4.74,0.1611439,32.9896,,delay-sigma-unknown,measured,measured,delay-sigma-unknown',
  '2026-07-10T05:00:00.000Z,ref,55b7ed3531923e75,2.45,0.004,,,,,,,,,,,met-missing,missing,missing,met-missing',
  '2026-07-10T10:00:00.000Z,ref,55b7ed3531923e75,2.44,0.004,993.6,17.5,2.262299,0.177701,0.004188,279.468,4.74,0.1593271,28.3126,0.8245,met-interpolated,interpolated,measured,',
  '2026-07-10T11:00:00.000Z,ref,55b7ed3531923e75,2.43,0.004,994.2,,2.263665,0.166335,,,,,,,met-missing,measured,missing,met-missing',
  '',
].join('\n');
const PINNED_CSV_PINB = [
  PINNED_HEADER,
  '2026-07-10T01:00:00.000Z,ref,55b7ed3531923e75,2.4731,0.0042,990.3719,23.487,2.254949,0.218151,0.00438,283.7786,4.74,0.16174409,35.2847,0.9249,ok,measured,measured,',
  '2026-07-10T01:15:00.000Z,ref,55b7ed3531923e75,2.4702,0.0042,990.5717,23.337,2.255404,0.214796,0.00438,283.6706,4.74,0.16168355,34.729,0.9189,met-interpolated,interpolated,interpolated,',
  '2026-07-10T02:00:00.000Z,low,2bb4e1e1d0fa5616,2.1,0.004,991.1712,22.887,2.256769,-0.156769,0.004188,283.3466,4.74,0.16150192,-25.3184,0.8001,ok,measured,measured,wet-delay-negative',
  '2026-07-10T02:30:00.000Z,ref,55b7ed3531923e75,2.465,0.025,990.9709,22.437,2.256313,0.208687,0.025031,283.0226,4.74,0.16132029,33.6655,4.0779,delay-sigma-large,interpolated,interpolated,delay-sigma-large',
  '2026-07-10T03:00:00.000Z,ref,55b7ed3531923e75,2.4611,,990.7706,21.987,2.255857,0.205243,,282.6986,4.74,0.16113865,33.0726,,delay-sigma-unknown,measured,measured,delay-sigma-unknown',
  '2026-07-10T05:00:00.000Z,ref,55b7ed3531923e75,2.45,0.004,,,,,,,,,,,met-missing,missing,missing,met-missing',
  '2026-07-10T10:00:00.000Z,ref,55b7ed3531923e75,2.44,0.004,993.3664,17.487,2.261767,0.178233,0.004188,279.4586,4.74,0.15932185,28.3964,0.8254,met-interpolated,interpolated,measured,',
  '2026-07-10T11:00:00.000Z,ref,55b7ed3531923e75,2.43,0.004,,,,,,,,,,,met-missing,measured,missing,met-missing',
  '',
].join('\n');

/**
 * Agreement with the written-out formulas [mm of PWV]: the output precision, 0.0001 mm (a wrong
 * coefficient, e.g. 0.002277 for 0.0022768 m/hPa, moves PWV by about 0.03 mm).
 */
const TOL_PWV_MM = 0.51e-4;

for (const backend of BACKENDS) {
  describe(`precipitable water from stored series on ${backend.name} (IERS 2010 eq. 9.11, Bevis 1992/1994)`, () => {
    const { api, auth } = useArchiveApp(backend);

    it('gives the published-formula PWV per delay epoch, with the documented quality flags', async () => {
      await api().put('/v1/stations/FERN').set('authorization', auth).send(STATION).expect(201);
      await api()
        .post('/v1/stations/FERN/met')
        .set('authorization', auth)
        .send({ records: MET.map((m) => ({ epoch: iso(T0 + m.h * H), pressure_hpa: m.p, temperature_c: m.t })) })
        .expect(200);
      await api()
        .post('/v1/stations/FERN/delays')
        .set('authorization', auth)
        .send({ source: 'ref', records: DELAYS.map((d) => ({ epoch: iso(T0 + d.h * H), ztd_m: d.ztd, ztd_sigma_m: d.sigma })) })
        .expect(200);
      const res = await api()
        .get('/v1/stations/FERN/precipitable-water')
        .query({ from: iso(T0), to: iso(T0 + 12 * H) })
        .expect(200);
      const r = res.body.records;
      expect(r).toHaveLength(6);

      // 01:00, met measured at the epoch → "ok"
      const e0 = expected(2.4731, 0.0042, 990.6, 23.5);
      expect(r[0]).toMatchObject({ quality: 'ok', pressure_quality: 'measured', pressure_hpa: 990.6, temperature_c: 23.5 });
      expect(r[0].zhd_m).toBeCloseTo(e0.zhd_m, 5); // output precision 1 µm
      expect(r[0].tm_k).toBeCloseTo(e0.tm_k, 3);
      expect(r[0].conversion_factor).toBeCloseTo(e0.conversion_factor, 7);
      expect(Math.abs(r[0].pwv_mm - e0.pwv_mm)).toBeLessThan(TOL_PWV_MM);
      expect(r[0].pwv_sigma_mm).toBeCloseTo(e0.pwv_sigma_mm!, 3);

      // 01:15, a quarter of the way from 01:00 to 02:00 → "met-interpolated"
      const p1 = 990.6 + 0.25 * (991.4 - 990.6);
      const t1 = 23.5 + 0.25 * (22.9 - 23.5);
      const e1 = expected(2.4702, 0.0042, p1, t1);
      expect(r[1]).toMatchObject({ quality: 'met-interpolated', pressure_quality: 'interpolated', temperature_quality: 'interpolated' });
      expect(r[1].pressure_hpa).toBeCloseTo(p1, 3);
      expect(Math.abs(r[1].pwv_mm - e1.pwv_mm)).toBeLessThan(TOL_PWV_MM);

      // 02:30, sigma 25 mm > 10 mm → "delay-sigma-large", PWV still given
      const e2 = expected(2.465, 0.025, (991.4 + 991.0) / 2, (22.9 + 22.0) / 2);
      expect(r[2].quality).toBe('delay-sigma-large');
      expect(Math.abs(r[2].pwv_mm - e2.pwv_mm)).toBeLessThan(TOL_PWV_MM);
      expect(r[2].pwv_sigma_mm).toBeCloseTo(e2.pwv_sigma_mm!, 3);

      // 03:00 without sigma → PWV, no sigma, "delay-sigma-unknown"
      const e3 = expected(2.4611, null, 991.0, 22.0);
      expect(r[3]).toMatchObject({ quality: 'delay-sigma-unknown', pwv_sigma_mm: null, zwd_sigma_m: null });
      expect(Math.abs(r[3].pwv_mm - e3.pwv_mm)).toBeLessThan(TOL_PWV_MM);

      // 05:00 in a 6 h outage (limit 3 h) → no PWV, "met-missing"
      expect(r[4]).toMatchObject({ quality: 'met-missing', pwv_mm: null, zhd_m: null, pressure_quality: 'missing' });
      // 10:00 temperature measured, no pressure → no PWV, never a defaulted pressure
      expect(r[5]).toMatchObject({ quality: 'met-missing', pwv_mm: null, pressure_hpa: null, temperature_quality: 'measured' });
      expect(res.body.warnings.join(' ')).toMatch(/2 of 6 record\(s\) have no PWV/);

      // The gap limit is a parameter: 6 h bridges the outage. met_max_gap_s is its name (as on the
      // estimation); the old max_met_gap_s still works, with a deprecation warning.
      const wide = await api()
        .get('/v1/stations/FERN/precipitable-water')
        .query({ from: iso(T0), to: iso(T0 + 12 * H), met_max_gap_s: 6 * 3600 })
        .expect(200);
      const p4 = 991.0 + (2 / 6) * (993.0 - 991.0);
      const t4 = 22.0 + (2 / 6) * (18.0 - 22.0);
      expect(Math.abs(wide.body.records[4].pwv_mm - expected(2.45, 0.004, p4, t4).pwv_mm)).toBeLessThan(TOL_PWV_MM);
      expect(wide.body.retrieval).toMatchObject({ met_max_gap_s: 6 * 3600 });
      expect(wide.body.warnings.join(' ')).not.toMatch(/deprecated/);
      const alias = await api()
        .get('/v1/stations/FERN/precipitable-water')
        .query({ from: iso(T0), to: iso(T0 + 12 * H), max_met_gap_s: 6 * 3600 })
        .expect(200);
      expect(alias.body.records).toEqual(wide.body.records);
      expect(alias.body.warnings.join(' ')).toMatch(/query\.max_met_gap_s is deprecated: use met_max_gap_s/);
      const both = await api()
        .get('/v1/stations/FERN/precipitable-water')
        .query({ from: iso(T0), to: iso(T0 + 12 * H), met_max_gap_s: 600, max_met_gap_s: 6 * 3600 })
        .expect(400);
      expect(problemFields(both.body)).toEqual(['query.max_met_gap_s']);
    });

    it('answers CSV byte for byte as pinned (regression pin of the text format, rounding and flags)', async () => {
      // Two stations: met at the antenna (PINA) and a met sensor 2 m below it (PINB). The series cover
      // every flag, a pressure-only epoch (ZHD without PWV at PINA), a negative wet delay and two sources.
      const met = [...MET, { h: 11, p: 994.2, t: null }];
      const delays = [...DELAYS, { h: 11, ztd: 2.43, sigma: 0.004 }, { h: 2, ztd: 2.1, sigma: 0.004 }];
      for (const [id, metHeightM] of [
        ['PINA', null],
        ['PINB', HEIGHT_M - 2],
      ] as const) {
        await api()
          .put(`/v1/stations/${id}`)
          .set('authorization', auth)
          .send({ ...STATION, met_height_m: metHeightM })
          .expect(201);
        await api()
          .post(`/v1/stations/${id}/met`)
          .set('authorization', auth)
          .send({ records: met.map((m) => ({ epoch: iso(T0 + m.h * H), pressure_hpa: m.p, temperature_c: m.t })) })
          .expect(200);
        await api()
          .post(`/v1/stations/${id}/delays`)
          .set('authorization', auth)
          .send({
            source: 'ref',
            records: delays.filter((d) => d.ztd > 2.2).map((d) => ({ epoch: iso(T0 + d.h * H), ztd_m: d.ztd, ztd_sigma_m: d.sigma })),
          })
          .expect(200);
        await api()
          .post(`/v1/stations/${id}/delays`)
          .set('authorization', auth)
          .send({
            source: 'low',
            records: delays.filter((d) => d.ztd <= 2.2).map((d) => ({ epoch: iso(T0 + d.h * H), ztd_m: d.ztd, ztd_sigma_m: d.sigma })),
          })
          .expect(200);
      }
      const csvOf = async (id: string) =>
        (
          await api()
            .get(`/v1/stations/${id}/precipitable-water`)
            .query({ from: iso(T0), to: iso(T0 + 12 * H), format: 'csv' })
            .expect(200)
        ).text;
      expect(await csvOf('PINA')).toBe(PINNED_CSV_PINA);
      expect(await csvOf('PINB')).toBe(PINNED_CSV_PINB);
      // The pinned PWV cells themselves agree with the written-out formulas (met at the antenna).
      for (const line of PINNED_CSV_PINA.trim().split('\n').slice(1)) {
        const c = line.split(',');
        if (c[13] === '') continue;
        const e = expected(Number(c[3]), c[4] === '' ? null : Number(c[4]), Number(c[5]), Number(c[6]));
        expect(Math.abs(Number(c[13]) - e.pwv_mm)).toBeLessThan(1e-4); // output precision 0.0001 mm, plus 0.5e-4 hPa of pressure rounding
        if (c[14] !== '') expect(Math.abs(Number(c[14]) - e.pwv_sigma_mm!)).toBeLessThan(1e-4); // the whole σ budget
        if (c[9] !== '') expect(Math.abs(Number(c[9]) - e.zwd_sigma_m!)).toBeLessThan(1e-6);
      }
    });

    it('reduces met measured below the antenna to the antenna height (hypsometric equation, −6.5 K/km)', async () => {
      const dh = 12.5; // antenna 12.5 m above the sensor
      await api()
        .put('/v1/stations/MAST')
        .set('authorization', auth)
        .send({ ...STATION, met_height_m: HEIGHT_M - dh })
        .expect(201);
      await api()
        .post('/v1/stations/MAST/met')
        .set('authorization', auth)
        .send({ records: [{ epoch: iso(T0), pressure_hpa: 1000, temperature_c: 20 }] })
        .expect(200);
      await api()
        .post('/v1/stations/MAST/delays')
        .set('authorization', auth)
        .send({ source: 'ref', records: [{ epoch: iso(T0), ztd_m: 2.5, ztd_sigma_m: 0.004 }] })
        .expect(200);
      const res = await api()
        .get('/v1/stations/MAST/precipitable-water')
        .query({ from: iso(T0), to: iso(T0) })
        .expect(200);
      const tSensorK = 293.15;
      const tAntK = tSensorK - 0.0065 * dh;
      const pAnt = 1000 * Math.exp((-9.80665 * dh) / (287.05 * ((tSensorK + tAntK) / 2)));
      const rec = res.body.records[0];
      expect(rec.pressure_hpa).toBeCloseTo(pAnt, 3); // Rd 287.05 vs 287.0464 differ by 2e-5 hPa here
      expect(rec.temperature_c).toBeCloseTo(20 - 0.0065 * dh, 3);
      expect(Math.abs(rec.pwv_mm - expected(2.5, 0.004, pAnt, 20 - 0.0065 * dh).pwv_mm)).toBeLessThan(0.001);
    });

    it('recovers the known truth of the synthetic generator (5-min met rounded to 0.1, one day)', async () => {
      const station = DEMO_NETWORK[0]!;
      await api()
        .put(`/v1/stations/${station.stationId}`)
        .set('authorization', auth)
        .send({ name: station.name, latitude_deg: station.latitudeDeg, longitude_deg: station.longitudeDeg, height_m: station.heightM })
        .expect(201);
      const truth = truthSeries(station, T0, 288, 5 * 60_000, 42);
      await api()
        .post(`/v1/stations/${station.stationId}/met`)
        .set('authorization', auth)
        .send({
          records: truth.map((t) => ({
            epoch: iso(t.epochMs),
            pressure_hpa: round1(t.pressureHpa),
            temperature_c: round1(t.temperatureC),
          })),
        })
        .expect(200);
      // Delays every 15 min, offset by 2.5 min so that every met value is interpolated.
      const delayTruth = truthSeries(station, T0 + 150_000, 95, 15 * 60_000, 42);
      await api()
        .post(`/v1/stations/${station.stationId}/delays`)
        .set('authorization', auth)
        .send({ source: 'truth', records: delayTruth.map((t) => ({ epoch: iso(t.epochMs), ztd_m: t.ztdM, ztd_sigma_m: 0.004 })) })
        .expect(200);
      const res = await api()
        .get(`/v1/stations/${station.stationId}/precipitable-water`)
        .query({ from: iso(T0), to: iso(T0 + 24 * H) })
        .expect(200);
      expect(res.body.records).toHaveLength(95);
      let worst = 0;
      res.body.records.forEach((r: { pwv_mm: number; quality: string }, i: number) => {
        expect(r.quality).toBe('met-interpolated');
        worst = Math.max(worst, Math.abs(r.pwv_mm - delayTruth[i]!.pwvMm));
      });
      // Met rounding (0.05 hPa → 0.02 mm) and linear interpolation of smooth 5-min met: well under 0.05 mm.
      expect(worst).toBeLessThan(0.05);
      // CSV: one header row with the same field names as the JSON records.
      const csv = await api()
        .get(`/v1/stations/${station.stationId}/precipitable-water`)
        .query({ from: iso(T0), to: iso(T0 + 24 * H), format: 'csv' })
        .expect(200);
      const lines = csv.text.trim().split('\n');
      // The record fields, then the CSV's own `warnings` column (codes of the row's warnings; none here).
      expect(lines[0]!.split(',')).toEqual([...Object.keys(res.body.records[0]), 'warnings']);
      expect(lines).toHaveLength(96);
      for (const k of [0, 50, 94]) {
        expect(lines[k + 1]!.split(',')).toEqual([
          ...Object.values(res.body.records[k]).map((v) => (v === null ? '' : String(v as string | number | boolean))),
          '',
        ]);
      }
    });
  });
}
