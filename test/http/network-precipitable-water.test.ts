/**
 * GET /v1/network/precipitable-water on both backends: PWV of many stations in one call, checked
 * against the formulas written out here (not the code under test):
 *
 *   ZHD = 0.0022768 P / (1 − 0.00266 cos 2φ − 0.28e-6 H)  [m]   IERS Conventions (2010) eq. 9.11 (from memory)
 *   Tm  = 70.2 + 0.72 Ts  [K]                               Bevis et al. (1992) (from memory)
 *   Π   = 10^6 / (ρw Rv (k3/Tm + k2'))                       Bevis et al. (1994);
 *                                                            ρw 1000, Rv 461.5, k3 3739 K²/Pa, k2' 0.221 K/Pa (from memory)
 *   PWV = Π (ZTD − ZHD);  σ_PWV: the σ budget written out in expectedPwv (sources there)
 *   met between hourly records: linear in time (common practice)
 * and against the documented rules of the route: source preference, interval means (arithmetic mean,
 * σ of the mean = mean σ for fully correlated errors, sample SD), time selections and limits.
 */

import { parse } from 'csv-parse/sync';
import { NetCDFReader } from 'netcdfjs';
import { describe, expect, it } from 'vitest';
import { networkPwvResponse } from '../../src/http/schemas/network-precipitable-water.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const MIN = 60_000;
const H = 3_600_000;
const T0 = Date.UTC(2026, 6, 10, 10); // 2026-07-10T10:00Z
const iso = (ms: number) => new Date(ms).toISOString();

interface TestStation {
  id: string;
  name: string;
  lat: number;
  lon: number;
  h: number;
}
// Invented stations (names and places are made up for this test).
const STATIONS: TestStation[] = [
  { id: 'NWA', name: 'Ashcombe Ridge (invented)', lat: 52.1, lon: 5.2, h: 40 },
  { id: 'NWB', name: 'Brindel Moor (invented)', lat: 48.0, lon: 11.0, h: 520 },
  { id: 'NWC', name: 'Corvath Plain (invented)', lat: 40.0, lon: -3.5, h: 660 },
  { id: 'NWD', name: 'Dunmere Point (invented)', lat: -33.0, lon: 151.0, h: 30 },
  { id: 'NWE', name: 'Eskholm (invented, no delays)', lat: 60.0, lon: 10.0, h: 100 },
];

/** Hourly met 10..14 h: pressure and temperature per station (invented values). */
const metAt = (s: TestStation, hour: number) => ({ p: 1000 - s.h / 9 + 0.6 * hour, t: 24 - 0.0065 * s.h - 0.8 * hour });
/** Met at a time [h after 10:00], linear between the hourly records. */
function metInterpolated(s: TestStation, hoursAfter: number) {
  const i = Math.floor(hoursAfter);
  const f = hoursAfter - i;
  const a = metAt(s, i);
  const b = metAt(s, i + 1);
  return { p: a.p + f * (b.p - a.p), t: a.t + f * (b.t - a.t) };
}

function expectedPwv(s: TestStation, ztd: number, sigma: number, pHpa: number, tC: number) {
  const zhdOf = (p: number) => (0.0022768 * p) / (1 - 0.00266 * Math.cos((2 * s.lat * Math.PI) / 180) - 0.28e-6 * s.h);
  const tm = 70.2 + 0.72 * (tC + 273.15);
  const pi = (x: number, k2 = 0.221, k3 = 3739) => 1e6 / (1000 * 461.5 * (k3 / x + k2));
  const zwd = ztd - zhdOf(pHpa);
  const dPi = (pi(tm + 0.01) - pi(tm - 0.01)) / 0.02;
  const dPiDk2 = (pi(tm, 0.221 + 1e-4) - pi(tm, 0.221 - 1e-4)) / 2e-4;
  const dPiDk3 = (pi(tm, 0.221, 3739 + 0.01) - pi(tm, 0.221, 3739 - 0.01)) / 0.02;
  // σ budget of the stored-series retrieval: delay σ; pressure σ 0.5 hPa and surface temperature σ 0.5 K
  // (the documented defaults: stored met has no sigmas); ±0.0000005 m/hPa of the Saastamoinen constant
  // (IERS 2010 eq. 9.11, from memory); 4.74 K scatter of the Bevis Tm; k2' ± 2.2 K/hPa and
  // k3 ± 0.012e5 K²/hPa (Bevis et al. 1994, from memory).
  const pressureM = (zhdOf(pHpa + 0.5) - zhdOf(pHpa - 0.5)) / 2;
  const zhdModelM = zhdOf(pHpa) * (0.0000005 / 0.0022768);
  const zwdSigma = Math.hypot(sigma, pressureM, zhdModelM);
  const pwvSigma = Math.hypot(pi(tm) * zwdSigma, zwd * dPi * 4.74, zwd * dPi * 0.72 * 0.5, zwd * dPiDk2 * 0.022, zwd * dPiDk3 * 12);
  return { pwv: pi(tm) * zwd * 1000, sigma: pwvSigma * 1000 };
}

/** Delays of the main source every 10 min 10:00..13:50 (24 rows); σ varies; one large σ at 11:20. */
function mainDelays(s: TestStation) {
  return Array.from({ length: 24 }, (_, k) => ({
    t: T0 + k * 10 * MIN,
    ztd: 2.3 + 0.0003 * k - s.h * 0.0003 + 0.01 * Math.sin(k / 3),
    sigma: k === 8 ? 0.02 : 0.003 + 0.0002 * (k % 5),
  }));
}
const MAIN = 'gnss-main';
const SPARE = 'aa-spare'; // sorts before MAIN by name, but has fewer rows

/** PWV of mainDelays(s)[k] by the written-out formulas. */
function expectedMain(s: TestStation, k: number) {
  const d = mainDelays(s)[k]!;
  const m = metInterpolated(s, (d.t - T0) / H);
  return expectedPwv(s, d.ztd, d.sigma, m.p, m.t);
}

/** PWV agreement [mm]: the output precision 0.0001 mm plus interpolation rounding. */
const TOL_MM = 2e-4;

for (const backend of BACKENDS) {
  describe(`network precipitable water on ${backend.name}`, () => {
    const { api, app, auth } = useArchiveApp(backend);
    const get = (query: Record<string, string>) => api().get('/v1/network/precipitable-water').query(query);

    it('seeds five invented stations', async () => {
      for (const s of STATIONS) {
        await api()
          .put(`/v1/stations/${s.id}`)
          .set('authorization', auth)
          .send({ name: s.name, latitude_deg: s.lat, longitude_deg: s.lon, height_m: s.h })
          .expect(201);
        const met = [0, 1, 2, 3, 4].map((hour) => ({
          epoch: iso(T0 + hour * H),
          pressure_hpa: metAt(s, hour).p,
          temperature_c: metAt(s, hour).t,
        }));
        await api().post(`/v1/stations/${s.id}/met`).set('authorization', auth).send({ records: met }).expect(200);
        if (s.id === 'NWE') continue;
        await api()
          .post(`/v1/stations/${s.id}/delays`)
          .set('authorization', auth)
          .send({
            source: MAIN,
            records: mainDelays(s)
              .filter((d) => !(s.id === 'NWB' && d.t === T0 + H))
              .map((d) => ({ epoch: iso(d.t), ztd_m: d.ztd, ztd_sigma_m: d.sigma })),
          })
          .expect(200);
      }
      // A second source at NWA (12:00..12:30, 4 rows, ZTD 5 cm higher) and NWB (11:00 only: fills the gap of the main source).
      await api()
        .post('/v1/stations/NWA/delays')
        .set('authorization', auth)
        .send({
          source: SPARE,
          records: [0, 1, 2, 3].map((k) => ({ epoch: iso(T0 + 2 * H + k * 10 * MIN), ztd_m: 2.35 + 0.001 * k, ztd_sigma_m: 0.005 })),
        })
        .expect(200);
      await api()
        .post('/v1/stations/NWB/delays')
        .set('authorization', auth)
        .send({ source: SPARE, records: [{ epoch: iso(T0 + H), ztd_m: 2.14, ztd_sigma_m: 0.005 }] })
        .expect(200);
    });

    describe('one epoch, all stations (IERS 2010 eq. 9.11, Bevis 1992/1994)', () => {
      it('gives one record per station with delays at 12:00Z, PWV as the published formulas give it', async () => {
        const res = await get({ epoch: iso(T0 + 2 * H) }).expect(200);
        expect(res.body.interval_s).toBeNull();
        expect(res.body.source).toBe('preferred');
        expect(res.body.stations.map((s: { station_id: string }) => s.station_id)).toEqual(['NWA', 'NWB', 'NWC', 'NWD', 'NWE']);
        const records = res.body.records;
        expect(records.map((r: { station_id: string }) => r.station_id)).toEqual(['NWA', 'NWB', 'NWC', 'NWD']);
        for (const r of records) {
          const s = STATIONS.find((x) => x.id === r.station_id)!;
          const e = expectedMain(s, 12);
          expect(r.source).toBe(MAIN); // NWA: MAIN has 24 rows that day, SPARE 4 → MAIN preferred, also at one epoch
          expect(r.quality).toBe('ok');
          expect(Math.abs(r.pwv_mm - e.pwv)).toBeLessThan(TOL_MM);
          expect(Math.abs(r.pwv_sigma_mm - e.sigma)).toBeLessThan(TOL_MM);
        }
        expect(res.body.stations[0].sources).toEqual([MAIN, SPARE]);
        expect(res.body.stations[4]).toMatchObject({ station_id: 'NWE', sources: [], record_count: 0 });
        expect(res.body.retrieval.models).toBeTypeOf('object');
        expect(networkPwvResponse.safeParse(res.body).error?.issues ?? []).toEqual([]); // the documented response schema
        expect(res.body.model_sets.length).toBeGreaterThan(0);
      });

      it('agrees with the one-station route record by record', async () => {
        const net = await get({ stations: 'NWC', from: iso(T0), to: iso(T0 + 4 * H) }).expect(200);
        const one = await api()
          .get('/v1/stations/NWC/precipitable-water')
          .query({ from: iso(T0), to: iso(T0 + 4 * H) })
          .expect(200);
        expect(net.body.records).toHaveLength(one.body.records.length);
        net.body.records.forEach((r: Record<string, unknown>, i: number) => {
          const o = one.body.records[i];
          expect(r).toMatchObject({ epoch: o.epoch, pwv_mm: o.pwv_mm, pwv_sigma_mm: o.pwv_sigma_mm, quality: o.quality, ztd_m: o.ztd_m });
        });
      });
    });

    describe('source preference (documented: most rows over the UTC day(s) of the range first, ties by name; gaps filled from the next)', () => {
      it('never gives two values for one station and epoch by default', async () => {
        const res = await get({ stations: 'NWA,NWB', from: '2026-07-10', to: '2026-07-10' }).expect(200);
        const keys = res.body.records.map((r: { station_id: string; epoch: string }) => `${r.station_id} ${r.epoch}`);
        expect(new Set(keys).size).toBe(keys.length);
        expect(res.body.records.filter((r: { station_id: string }) => r.station_id === 'NWA')).toHaveLength(24);
        expect(
          res.body.records.filter((r: { source: string; station_id: string }) => r.station_id === 'NWA' && r.source === SPARE),
        ).toHaveLength(0);
        // NWB: the main source lacks 11:00, the spare fills it
        const nwb = res.body.records.filter((r: { station_id: string }) => r.station_id === 'NWB');
        expect(nwb).toHaveLength(24);
        expect(nwb.find((r: { epoch: string }) => r.epoch === iso(T0 + H)).source).toBe(SPARE);
      });

      it('source=all gives every row; source=<name> one source', async () => {
        const all = await get({ stations: 'NWA', from: iso(T0), to: iso(T0 + 4 * H), source: 'all' }).expect(200);
        expect(all.body.records).toHaveLength(28);
        expect(all.body.source).toBe('all');
        const spare = await get({ stations: 'NWA', from: iso(T0), to: iso(T0 + 4 * H), source: SPARE }).expect(200);
        expect(spare.body.records).toHaveLength(4);
        expect(spare.body.records.every((r: { source: string }) => r.source === SPARE)).toBe(true);
      });
    });

    describe('interval means (documented method: arithmetic mean, σ of the mean = mean σ, sample SD)', () => {
      it('gives hourly means with counts, excluding the large-σ record', async () => {
        const res = await get({ stations: 'NWC', from: '2026-07-10', to: '2026-07-10', interval: 'PT1H' }).expect(200);
        expect(res.body.interval_s).toBe(3600);
        expect(networkPwvResponse.safeParse(res.body).error?.issues ?? []).toEqual([]);
        expect(res.body.records).toEqual([]);
        const intervals = res.body.intervals;
        expect(intervals.map((m: { epoch: string }) => m.epoch)).toEqual([0, 1, 2, 3].map((h) => iso(T0 + h * H)));
        const s = STATIONS[2]!;
        for (let hour = 0; hour < 4; hour++) {
          const ks = [0, 1, 2, 3, 4, 5].map((j) => hour * 6 + j).filter((k) => k !== 8); // k = 8: σ 0.02 m > 0.01 m
          const values = ks.map((k) => expectedMain(s, k));
          const mean = values.reduce((a, v) => a + v.pwv, 0) / values.length;
          const sd = Math.sqrt(values.reduce((a, v) => a + (v.pwv - mean) ** 2, 0) / (values.length - 1));
          const sigma = values.reduce((a, v) => a + v.sigma, 0) / values.length;
          const m = intervals[hour];
          expect(m.count).toBe(ks.length);
          expect(m.excluded_count).toBe(6 - ks.length);
          expect(m.interval_end).toBe(iso(T0 + (hour + 1) * H));
          expect(Math.abs(m.pwv_mm - mean)).toBeLessThan(TOL_MM);
          expect(Math.abs(m.pwv_sd_mm - sd)).toBeLessThan(TOL_MM);
          expect(Math.abs(m.pwv_sigma_mm - sigma)).toBeLessThan(TOL_MM);
          // σ of the mean is not shrunk by √n (independent errors would give about sigma / √6)
          expect(m.pwv_sigma_mm).toBeGreaterThan(1.5 * (sigma / Math.sqrt(ks.length)));
          expect(m.ztd_count).toBe(ks.length);
          expect(m.quality_counts['delay-sigma-large']).toBe(hour === 1 ? 1 : 0);
        }
      });

      it('epoch with interval selects the interval that holds it; source=all gives one mean per source', async () => {
        const one = await get({ stations: 'NWA', epoch: iso(T0 + 2 * H + 25 * MIN), interval: 'PT1H' }).expect(200);
        expect(one.body.intervals).toHaveLength(1);
        expect(one.body.intervals[0]).toMatchObject({ epoch: iso(T0 + 2 * H), count: 6, sources: [MAIN] });
        const all = await get({ stations: 'NWA', epoch: iso(T0 + 2 * H), interval: 'PT1H', source: 'all' }).expect(200);
        expect(all.body.intervals.map((m: { sources: string[]; count: number }) => [m.sources, m.count])).toEqual(
          expect.arrayContaining([
            [[MAIN], 6],
            [[SPARE], 4],
          ]),
        );
      });
    });

    describe('time selections', () => {
      it('latest=true: the latest epoch of each station (and its interval)', async () => {
        const res = await get({ latest: 'true' }).expect(200);
        expect(res.body.records.map((r: { epoch: string }) => r.epoch)).toEqual(Array(4).fill(iso(T0 + 3 * H + 50 * MIN)));
        const hourly = await get({ latest: 'true', interval: 'PT1H', stations: 'NWD' }).expect(200);
        expect(hourly.body.intervals).toHaveLength(1);
        expect(hourly.body.intervals[0]).toMatchObject({ epoch: iso(T0 + 3 * H), count: 6 });
      });

      it('since: records after the epoch (exclusive), up to the latest', async () => {
        const res = await get({ since: iso(T0 + 3 * H + 30 * MIN), stations: 'NWB,NWC' }).expect(200);
        expect(res.body.records.map((r: { station_id: string; epoch: string }) => `${r.station_id} ${r.epoch.slice(11, 16)}`)).toEqual([
          'NWB 13:40',
          'NWB 13:50',
          'NWC 13:40',
          'NWC 13:50',
        ]);
      });

      it('bbox selects stations inside it, also across the 180° meridian', async () => {
        const europe = await get({ epoch: iso(T0), bbox: '-10,35,20,55' }).expect(200);
        expect(europe.body.stations.map((s: { station_id: string }) => s.station_id)).toEqual(['NWA', 'NWB', 'NWC']);
        const pacific = await get({ epoch: iso(T0), bbox: '150,-40,-170,-30' }).expect(200);
        expect(pacific.body.stations.map((s: { station_id: string }) => s.station_id)).toEqual(['NWD']);
      });

      it('date-only ranges are whole UTC days, on the one-station routes too', async () => {
        const day = await get({ stations: 'NWD', from: '2026-07-10', to: '2026-07-10' }).expect(200);
        expect(day.body.from).toBe('2026-07-10T00:00:00.000Z');
        expect(day.body.to).toBe('2026-07-10T23:59:59.999Z');
        expect(day.body.records).toHaveLength(24);
        const one = await api().get('/v1/stations/NWD/delays').query({ from: '2026-07-10', to: '2026-07-10' }).expect(200);
        expect(one.body.records).toHaveLength(24);
        const next = await get({ stations: 'NWD', from: '2026-07-11', to: '2026-07-11' }).expect(200);
        expect(next.body.records).toHaveLength(0);
      });
    });

    describe('CSV', () => {
      it('is an attachment with the station coordinates on every row, and parses', async () => {
        const res = await get({ epoch: iso(T0 + 2 * H), format: 'csv' }).expect(200);
        expect(res.headers['content-type']).toMatch(/^text\/csv/);
        expect(res.headers['content-disposition']).toBe('attachment; filename="network-pwv-20260710T1200.csv"');
        const rows = parse(res.text, { columns: true }) as Record<string, string>[];
        expect(rows).toHaveLength(4);
        expect(Object.keys(rows[0]!).slice(0, 7)).toEqual([
          'station_id',
          'latitude_deg',
          'longitude_deg',
          'height_m',
          'geoid_undulation_m',
          'altitude_m',
          'epoch',
        ]);
        expect(rows[1]).toMatchObject({
          station_id: 'NWB',
          latitude_deg: '48.000000',
          longitude_deg: '11.000000',
          height_m: '520.000',
          quality: 'ok',
        });
        const json = await get({ epoch: iso(T0 + 2 * H) }).expect(200);
        expect(rows.map((r) => Number(r.pwv_mm))).toEqual(json.body.records.map((r: { pwv_mm: number }) => r.pwv_mm));
        // One precision per quantity: every cell of a column has the same number of decimals.
        const decimals = (cell: string) => cell.split('.')[1]?.length ?? 0;
        for (const [column, places] of Object.entries({
          ztd_m: 6,
          ztd_sigma_m: 6,
          pressure_hpa: 4,
          temperature_c: 4,
          pwv_mm: 4,
          pwv_sigma_mm: 4,
        })) {
          expect(
            rows.map((r) => decimals(r[column]!)),
            column,
          ).toEqual(rows.map(() => places));
        }
      });

      it('interval CSV has the counts per quality flag as columns', async () => {
        const res = await get({ stations: 'NWC', epoch: iso(T0 + H), interval: 'PT1H', format: 'csv' }).expect(200);
        const rows = parse(res.text, { columns: true }) as Record<string, string>[];
        expect(rows).toHaveLength(1);
        expect(rows[0]).toMatchObject({
          count: '5',
          excluded_count: '1',
          count_delay_sigma_large: '1',
          count_ok: '1',
          count_met_interpolated: '4',
          sources: MAIN,
        });
        expect(rows[0]!.pwv_mm).toMatch(/^-?\d+\.\d{4}$/); // (this invented station's ZTD gives negative PWV: written as computed)
        expect(rows[0]!.ztd_m).toMatch(/^\d\.\d{6}$/);
      });
    });

    describe('netCDF (CF-1.8 timeSeries), read back with netcdfjs', () => {
      const binary = (res: NodeJS.ReadableStream, done: (err: Error | null, body: Buffer) => void) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      };
      it('records: the same PWV as the JSON answer (float32), stations × common epochs, flags', async () => {
        const query = { stations: 'NWA,NWB', from: iso(T0), to: iso(T0 + H - 1) };
        const res = await get({ ...query, format: 'netcdf' })
          .buffer(true)
          .parse(binary as never)
          .expect(200);
        expect(res.headers['content-type']).toBe('application/x-netcdf');
        expect(res.headers['content-disposition']).toBe('attachment; filename="network-pwv-20260710T1000.nc"');
        const nc = new NetCDFReader(res.body as Buffer);
        expect(nc.getAttribute('featureType')).toBe('timeSeries');
        expect(nc.dimensions.map((d) => [d.name, d.size])).toEqual([
          ['station', 2],
          ['time', 6],
          ['id_strlen', 3],
        ]);
        const json = await get(query).expect(200);
        const pwv = nc.getDataVariable('pwv') as number[];
        const times = nc.getDataVariable('time') as number[];
        json.body.records.forEach((r: { station_id: string; epoch: string; pwv_mm: number; quality: string }) => {
          const at = (r.station_id === 'NWA' ? 0 : 6) + times.indexOf(Date.parse(r.epoch) / 1000);
          expect(pwv[at]).toBeCloseTo(r.pwv_mm, 3); // float32 and the JSON's 0.0001 mm rounding
        });
      });

      it('interval means: time_bnds and cell_methods; refused with source=all', async () => {
        const res = await get({ stations: 'NWC', from: '2026-07-10', to: '2026-07-10', interval: 'PT1H', format: 'netcdf' })
          .buffer(true)
          .parse(binary as never)
          .expect(200);
        const nc = new NetCDFReader(res.body as Buffer);
        const t = T0 / 1000;
        expect(nc.getDataVariable('time_bnds')).toEqual([t, t + 3600, t + 3600, t + 7200, t + 7200, t + 10800, t + 10800, t + 14400]);
        const pwvAttrs = Object.fromEntries(
          (nc.variables.find((v) => v.name === 'pwv')!.attributes as unknown as { name: string; value: unknown }[]).map((a) => [
            a.name,
            a.value,
          ]),
        );
        expect(pwvAttrs.cell_methods).toBe('time: mean');
        expect(nc.getDataVariable('count')).toEqual([6, 5, 6, 6]);
        const bad = await get({ stations: 'NWC', epoch: iso(T0), format: 'netcdf', source: 'all' }).expect(400);
        expect(JSON.stringify(bad.body.errors)).toContain('query.format');
      });
    });

    describe('bad input: 4xx problem naming the field', () => {
      const cases: [string, Record<string, string>, number, string][] = [
        ['no time selection', {}, 400, 'query.epoch'],
        ['two time selections', { epoch: iso(T0), since: iso(T0) }, 400, 'query.epoch'],
        ['to without from', { to: iso(T0) }, 400, 'query.from'],
        ['from after to', { from: iso(T0 + H), to: iso(T0) }, 400, 'query.from'],
        ['an interval that does not divide a day', { epoch: iso(T0), interval: 'PT7M' }, 400, 'interval'],
        ['an interval that is not a duration', { epoch: iso(T0), interval: '1h' }, 400, 'interval'],
        ['a bbox with south > north', { epoch: iso(T0), bbox: '0,50,10,40' }, 400, 'bbox'],
        ['a bbox of three numbers', { epoch: iso(T0), bbox: '0,50,10' }, 400, 'bbox'],
        ['a bad station id', { epoch: iso(T0), stations: 'NWA,bad id' }, 400, 'stations'],
        ['an unknown station', { epoch: iso(T0), stations: 'NWA,NOPE' }, 404, 'query.stations'],
        ['a bad date', { epoch: '2026-13-01' }, 400, 'epoch'],
        ['too many station-days', { from: '2026-01-01', to: '2026-12-31' }, 400, 'query.to'],
        ['an unknown parameter', { epoch: iso(T0), intervall: 'PT1H' }, 400, ''],
        ['a bad source', { epoch: iso(T0), source: 'a b' }, 400, 'source'],
      ];
      for (const [what, query, status, field] of cases) {
        it(what, async () => {
          const res = await get(query).expect(status);
          expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
          if (field) expect(JSON.stringify(res.body.errors ?? [])).toContain(field);
        });
      }
      it('a station marked deleted is named as unknown (404), as one never created', async () => {
        await api()
          .put('/v1/stations/NWZ')
          .set('authorization', auth)
          .send({ name: 'Zennor Flats (invented)', latitude_deg: 50, longitude_deg: 1, height_m: 5 })
          .expect(201);
        await get({ epoch: iso(T0), stations: 'NWA,NWZ' }).expect(200);
        expect(await app().repository.deleteStation('NWZ', new Date().toISOString())).toBe(true);
        const res = await get({ epoch: iso(T0), stations: 'NWA,NWZ,NOPE' }).expect(404);
        expect(res.body.detail).toBe('no station "NWZ", "NOPE"; GET /v1/stations lists them');
        expect(res.body.errors).toEqual([{ field: 'query.stations', message: 'unknown station id(s): NWZ, NOPE' }]);
      });
    });
  });
}

describe('network reads are archive reads (TROPO_READ_KEYS_REQUIRED)', () => {
  const { api, auth } = useArchiveApp(BACKENDS[0]!, { readKeysRequired: true });
  it('needs a key when read keys are required', async () => {
    await api().get('/v1/network/precipitable-water').query({ latest: 'true' }).expect(401);
    await api().get('/v1/network/precipitable-water').query({ latest: 'true' }).set('authorization', auth).expect(200);
  });
});
