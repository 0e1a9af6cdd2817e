/**
 * Surface met in network requests (top-level `met[]`, each record naming its station), through HTTP.
 *
 * References:
 * - Point positioning (satellite clocks known, or one station) splits the network into independent
 *   single-station solutions (issue 12, common practice), so every station's series with its met must
 *   equal POST /v1/zwd-estimates with the same data, met and options, to 1e-9 m: ZHD from the
 *   pressure (bridged across met gaps), ZWD = ZTD − ZHD, Tm, PWV and its σ budget. That route is
 *   tested against Saastamoinen, Bevis and handbook values in test/http/zwd-estimates.test.ts.
 * - The PWV/ZWD conversion factor Π is 0.15–0.16 at mid-latitude Tm (Bevis et al. 1994, Eq. 6 with
 *   Tm ≈ 270–290 K): pwv_sigma_mm / sigma_m stays within [0.14, 0.17] per mm, so with the clocks
 *   estimated PWV carries the (large) σ of the absolute ZWD.
 * - The stored rows (GET /v1/stations/{id}/delays) of the network storing route equal those the
 *   single-station storing route stores for the same data and met; without met in the request, a
 *   station's stored met serves, as it does on the single-station storing route (same rows to 1e-9 m).
 * Stations, places and met values are invented.
 */

import { describe, expect, it } from 'vitest';
import { problemFields, useApp } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';
import { APRIORI, csvOf, MM, networkBody, observationsOf, putStations, SHARED_MODEL, sim, siteOf, TOL_M } from './network-fixtures.js';

/** Met every 10 min from 05:50 to 07:10 with a 40-min gap (06:10–06:50) longer than MET_OPTIONS.met_max_gap_s. */
const MET_EPOCHS = ['05:50', '06:00', '06:10', '06:50', '07:00', '07:10'].map((t) => `2026-06-21T${t}:00.000Z`);
const MET_OPTIONS = { ...SHARED_MODEL, met_max_gap_s: 1200 };

/** Invented surface met of station number `i`: a slowly falling pressure and a warming morning. */
function metOf(i: number) {
  return MET_EPOCHS.map((epoch, k) => ({
    epoch,
    pressure_hpa: 1004 - 3 * i - 0.4 * k,
    temperature_c: 14 + i + 0.8 * k,
    relative_humidity_pct: 70 - k,
  }));
}

const SERIES_NUMBERS = ['zwd_m', 'ztd_m', 'zhd_m', 'sigma_m', 'tm_k', 'pwv_mm', 'pwv_sigma_mm', 'pwv_total_sigma_mm'] as const;

type Entry = Record<string, number | string | undefined>;

/** Every series entry of the network station equals the single-station route's, to 1e-9 m (same fields present). */
function expectSameSeries(network: Entry[], single: Entry[]) {
  expect(network).toHaveLength(single.length);
  network.forEach((e, k) => {
    const o = single[k]!;
    expect(e.epoch).toBe(o.epoch);
    expect(e.met).toBe(o.met);
    expect(e.zhd_source).toBe(o.zhd_source);
    for (const f of SERIES_NUMBERS) {
      if (o[f] === undefined) {
        expect(e[f]).toBeUndefined();
        continue;
      }
      expect(Math.abs((e[f] as number) - (o[f] as number)), `${f} at ${e.epoch}`).toBeLessThan(TOL_M);
    }
  });
}

describe('POST /v1/network-estimates with met: every station as POST /v1/zwd-estimates with the same met', () => {
  const api = useApp();

  it('a network of one station with met equals the single-station route, met gap bridged alike', { timeout: 60_000 }, async () => {
    const s = sim(41, 'known');
    const st = s.stations[0]!;
    const met = metOf(0);
    const res = await api()
      .post('/v1/network-estimates')
      .send({
        stations: [{ id: st.name, site: siteOf(st), apriori: APRIORI }],
        observations: observationsOf(s).filter((o) => o.station === st.name),
        met: met.map((r) => ({ station: st.name, ...r })),
        options: MET_OPTIONS,
      })
      .expect(200);
    const single = await api()
      .post('/v1/zwd-estimates')
      .send({ site: siteOf(st), apriori: APRIORI, observations: observationsOf(s, st.name), met, options: MET_OPTIONS })
      .expect(200);
    const series = res.body.stations[0].series as Entry[];
    expectSameSeries(series, single.body.series);
    // The gap is there on both sides: measured, interpolated and bridged epochs.
    const sources = new Set(series.map((e) => e.zhd_source));
    expect([...sources].sort()).toEqual(['met', 'met-bridged']);
    expect(series.some((e) => e.met === 'measured')).toBe(true);
    expect(series.some((e) => e.met === 'interpolated')).toBe(true);
    const missing = series.filter((e) => e.met === 'missing');
    expect(missing.length).toBeGreaterThan(10);
    expect(missing.every((e) => e.pwv_mm === undefined && e.zhd_source === 'met-bridged')).toBe(true);
    expect(res.body.warnings.join('\n')).toMatch(
      new RegExp(`station ${st.name}: ${missing.length} of ${series.length} epochs have no met`),
    );
    expect(res.body.models.zwd_definition).toBe(single.body.models.zwd_definition);
  });

  it('point positioning: each station with its own met (one without) equals the single-station route', { timeout: 120_000 }, async () => {
    const s = sim(42, 'known');
    const withMet = s.stations.slice(0, 3).map((st) => st.name);
    const met = withMet.flatMap((name, i) => metOf(i).map((r) => ({ station: name, ...r })));
    // The records in any order: the network splits them by station.
    met.reverse();
    const res = await api()
      .post('/v1/network-estimates')
      .send({ ...networkBody(s, { ...MET_OPTIONS, satellite_clocks: 'known' }), met })
      .expect(200);
    for (const st of res.body.stations) {
      const i = withMet.indexOf(st.station);
      const single = await api()
        .post('/v1/zwd-estimates')
        .send({
          site: siteOf(s.stations.find((x) => x.name === st.station)!),
          apriori: APRIORI,
          observations: observationsOf(s, st.station),
          ...(i >= 0 ? { met: metOf(i) } : {}),
          options: MET_OPTIONS,
        })
        .expect(200);
      expectSameSeries(st.series, single.body.series);
      if (i < 0) expect(st.series.every((e: Entry) => e.zhd_source === 'apriori' && e.met === undefined)).toBe(true);
    }
  });

  it('clocks estimated: PWV carries the σ of the absolute ZWD (Π 0.14–0.17, Bevis et al. 1994)', { timeout: 120_000 }, async () => {
    const s = sim(43, 'estimated');
    const met = s.stations.flatMap((st, i) => metOf(i).map((r) => ({ station: st.name, ...r })));
    const res = await api()
      .post('/v1/network-estimates')
      .send({ ...networkBody(s, MET_OPTIONS), met })
      .expect(200);
    for (const st of res.body.stations) {
      const measured = st.series.filter((e: Entry) => e.pwv_mm !== undefined);
      expect(measured.length).toBeGreaterThan(0);
      for (const e of measured) {
        const ratio = e.pwv_sigma_mm / (e.sigma_m * 1000);
        expect(ratio).toBeGreaterThan(0.14);
        expect(ratio).toBeLessThan(0.17);
        expect(e.pwv_total_sigma_mm).toBeGreaterThanOrEqual(e.pwv_sigma_mm);
      }
      // A 300-km network, 1 h: σ of the absolute ZWD is centimetres, so is σ of PWV ×1/Π (issue 12).
      expect(st.sigma_m).toBeGreaterThan(5 * MM);
    }
  });

  it('met of a station not in stations: 400 naming met.<i>.station', async () => {
    const s = sim(44, 'known');
    const met = [...metOf(0).map((r) => ({ station: s.stations[0]!.name, ...r })), { station: 'NOWHERE', ...metOf(1)[0]! }];
    const res = await api()
      .post('/v1/network-estimates')
      .send({ ...networkBody(s, {}), met })
      .expect(400);
    expect(problemFields(res.body)).toEqual([`met.${met.length - 1}.station`]);
    expect(res.body.detail).toMatch(/NOWHERE is not in stations/);
  });

  it('a repeated epoch of one station: 400 naming the second record and the first; the same epoch at two stations is fine', async () => {
    const s = sim(45, 'known');
    const [a, b] = [s.stations[0]!.name, s.stations[1]!.name];
    const met = [
      { station: a, ...metOf(0)[0]! },
      { station: b, ...metOf(1)[0]! },
      { station: a, ...metOf(0)[1]! },
      { station: a, ...metOf(0)[0]!, pressure_hpa: 990 },
    ];
    const res = await api()
      .post('/v1/network-estimates')
      .send({ ...networkBody(s, {}), met })
      .expect(400);
    expect(problemFields(res.body)).toEqual(['met.3']);
    expect(res.body.detail).toMatch(/also met\.0/);
  });

  it('a met record without pressure, or an unknown key in it: 400 naming the field', async () => {
    const s = sim(46, 'known');
    const { pressure_hpa: _, ...noPressure } = metOf(0)[0]!;
    const res = await api()
      .post('/v1/network-estimates')
      .send({ ...networkBody(s, {}), met: [{ station: s.stations[0]!.name, ...noPressure }] })
      .expect(400);
    expect(problemFields(res.body)).toEqual(['met.0.pressure_hpa']);
    const typo = await api()
      .post('/v1/network-estimates')
      .send({ ...networkBody(s, {}), met: [{ station: s.stations[0]!.name, ...metOf(0)[0]!, pressure_hPa: 1000 }] })
      .expect(400);
    expect(typo.body.detail).toMatch(/pressure_hPa/);
  });
});

for (const backend of BACKENDS) {
  describe(`POST /v1/network/zwd-estimates with met on ${backend.name}: stores what the single-station storing route stores`, () => {
    const { api, auth } = useArchiveApp(backend);
    const s = sim(47, 'known');

    it(
      'every stored row (ZTD, ZWD from met and bridged, σ, gradients) equals the single-station route’s',
      { timeout: 120_000 },
      async () => {
        await putStations(api, auth, s);
        const met = s.stations.flatMap((st, i) => metOf(i).map((r) => ({ station: st.name, ...r })));
        const network = await api()
          .post('/v1/network/zwd-estimates?source=net-met')
          .set('authorization', auth)
          .send({
            stations: s.stations.map((st) => ({ id: st.name, apriori: APRIORI })),
            observations: observationsOf(s),
            met,
            options: { ...MET_OPTIONS, satellite_clocks: 'known' },
          })
          .expect(200);
        expect(network.body.stored.every((x: { inserted: number }) => x.inserted > 0)).toBe(true);
        const range = { from: '2026-06-21T05:00:00Z', to: '2026-06-21T08:00:00Z' };
        for (const [i, st] of s.stations.entries()) {
          await api()
            .post(`/v1/stations/${st.name}/zwd-estimates?source=single-met`)
            .set('authorization', auth)
            .send({ apriori: APRIORI, observations: observationsOf(s, st.name), met: metOf(i), options: MET_OPTIONS })
            .expect(200);
          const read = async (source: string) =>
            (
              await api()
                .get(`/v1/stations/${st.name}/delays`)
                .query({ ...range, source })
                .expect(200)
            ).body.records as Record<string, number | string | null>[];
          const [net, single] = [await read('net-met'), await read('single-met')];
          expect(net.length).toBeGreaterThan(50);
          expect(net).toHaveLength(single.length);
          net.forEach((r, k) => {
            const o = single[k]!;
            expect(r.epoch).toBe(o.epoch);
            for (const f of ['ztd_m', 'ztd_sigma_m', 'zwd_m', 'zwd_sigma_m', 'north_gradient_m', 'east_gradient_sigma_m']) {
              expect(Math.abs((r[f] as number) - (o[f] as number)), `${st.name} ${f} at ${r.epoch}`).toBeLessThan(TOL_M);
            }
          });
          // The stored ZWD is the answer's (ZTD − ZHD of the met), not a-priori ZWD + δw.
          const answer = network.body.stations[i].series;
          expect(net[0]!.zwd_m).toBeCloseTo(answer[0].zwd_m, 12);
          expect(Math.abs(answer[0].zwd_m - (APRIORI.zwd_m + answer[0].correction_m))).toBeGreaterThan(1 * MM);
        }
      },
    );
  });
}

for (const backend of BACKENDS) {
  describe(`POST /v1/network/zwd-estimates on ${backend.name}: a station without met in the request uses its stored met`, () => {
    const { api, auth } = useArchiveApp(backend);
    const s = sim(53, 'known');
    // Stored met for the first two stations (the second's sensor 12 m below the antenna),
    // request met for the third, none for the fourth.
    const [archived, offset, inRequest, without] = s.stations;

    async function setUp() {
      for (const [i, st] of s.stations.entries()) {
        const metHeight = st === offset ? { met_height_m: siteOf(st).height_m - 12 } : {};
        await api()
          .put(`/v1/stations/${st.name}`)
          .set('authorization', auth)
          .send({ name: `${st.name} (invented)`, ...siteOf(st), ...metHeight })
          .expect((r) => expect([200, 201]).toContain(r.status));
        if (st === archived || st === offset)
          await api()
            .post(`/v1/stations/${st.name}/met`)
            .set('authorization', auth)
            .send({ records: metOf(i) })
            .expect(200);
      }
    }

    const read = async (station: string, source: string) =>
      (
        await api()
          .get(`/v1/stations/${station}/delays`)
          .query({ from: '2026-06-21T05:00:00Z', to: '2026-06-21T08:00:00Z', source })
          .expect(200)
      ).body.records as Record<string, number | string | null>[];

    it('met_used per station, and every stored row equals the single-station storing route’s', { timeout: 180_000 }, async () => {
      await setUp();
      const network = await api()
        .post('/v1/network/zwd-estimates?source=net-stored-met')
        .set('authorization', auth)
        .send({
          stations: s.stations.map((st) => ({ id: st.name, apriori: APRIORI })),
          observations: observationsOf(s),
          met: metOf(2).map((r) => ({ station: inRequest!.name, ...r })),
          options: { ...MET_OPTIONS, satellite_clocks: 'known' },
        })
        .expect(200);
      expect(network.body.stored.map((x: { met_used: string }) => x.met_used)).toEqual(['archive', 'archive', 'request', 'none']);
      expect(network.body.warnings.join(' ')).toContain(`station ${archived!.name}: met from 6 records of the station's stored met series`);
      for (const [i, st] of s.stations.entries()) {
        // The single-station storing route reads the stored met itself when the body has none.
        const met = st === inRequest ? { met: metOf(i) } : {};
        const single = await api()
          .post(`/v1/stations/${st.name}/zwd-estimates?source=single-stored-met`)
          .set('authorization', auth)
          .send({ apriori: APRIORI, observations: observationsOf(s, st.name), ...met, options: MET_OPTIONS })
          .expect(200);
        expect(single.body.met_used).toBe(network.body.stored[i].met_used);
        const [net, one] = [await read(st.name, 'net-stored-met'), await read(st.name, 'single-stored-met')];
        expect(net.length).toBeGreaterThan(50);
        expect(net).toHaveLength(one.length);
        net.forEach((r, k) => {
          for (const f of ['ztd_m', 'zwd_m', 'zwd_sigma_m', 'east_gradient_m']) {
            expect(Math.abs((r[f] as number) - (one[k]![f] as number)), `${st.name} ${f} at ${r.epoch}`).toBeLessThan(TOL_M);
          }
        });
        const series = network.body.stations[i].series as Entry[];
        if (st === without) expect(series.every((e) => e.pwv_mm === undefined)).toBe(true);
        else expect(series.some((e) => typeof e.pwv_mm === 'number')).toBe(true);
      }
      // The sensor 12 m below the antenna: its stored pressure is reduced to the antenna (about 1.4 hPa less,
      // ≈ 3 mm less ZHD; 1 hPa ≈ 8 m near sea level, common practice), so its ZHD is not the raw record's.
      const raw = await api()
        .post('/v1/network-estimates')
        .send({
          stations: [{ id: offset!.name, site: siteOf(offset!), apriori: APRIORI }],
          observations: observationsOf(s, offset!.name).map((o) => ({ ...o, station: offset!.name })),
          met: metOf(1).map((r) => ({ station: offset!.name, ...r })),
          options: { ...MET_OPTIONS, satellite_clocks: 'known' },
        });
      expect(raw.status).toBe(200);
      const reducedZhd = (network.body.stations[1].series as Entry[])[0]!.zhd_m as number;
      const rawZhd = (raw.body.stations[0].series as Entry[])[0]!.zhd_m as number;
      expect((rawZhd - reducedZhd) * 1000).toBeGreaterThan(2.5);
      expect((rawZhd - reducedZhd) * 1000).toBeLessThan(3.5);
    });

    it('a CSV request (which carries no met) uses the stored met too', { timeout: 120_000 }, async () => {
      await setUp();
      const query = [
        ...s.stations.map((st) => `station=${st.name},${APRIORI.zhd_m},${APRIORI.zwd_m}`),
        'satellite_clocks=known',
        'parametrisation=nodes',
        'correlated_noise=false',
        'scale_sigmas=false',
        'zwd_interval_s=300',
        'met_max_gap_s=1200',
        'source=net-csv',
      ].join('&');
      const res = await api()
        .post(`/v1/network/zwd-estimates?${query}`)
        .set('authorization', auth)
        .set('content-type', 'text/csv')
        .send(csvOf(observationsOf(s)))
        .expect(200);
      expect(res.body.stored.map((x: { met_used: string }) => x.met_used)).toEqual(['archive', 'archive', 'none', 'none']);
    });

    it('stored met beyond the read range: 400 naming observations, nothing stored', async () => {
      await setUp();
      const far = observationsOf(s).map((o, k) => (k === 0 ? { ...o, epoch: '2025-01-01T00:00:00.000Z' } : o));
      const res = await api()
        .post('/v1/network/zwd-estimates?source=net-far')
        .set('authorization', auth)
        .send({
          stations: s.stations.map((st) => ({ id: st.name, apriori: APRIORI })),
          observations: far,
          options: { ...MET_OPTIONS, satellite_clocks: 'known' },
        })
        .expect(400);
      expect(problemFields(res.body)).toEqual(['observations']);
      expect(res.body.errors[0].message).toContain('send `met` in the request or split the observations');
      expect(await read(archived!.name, 'net-far')).toHaveLength(0);
    });
  });
}
