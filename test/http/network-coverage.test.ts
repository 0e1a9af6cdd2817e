/**
 * GET /v1/network/coverage on both backends: first/last epoch, record count and gaps per station and
 * source, against series built here with holes cut at known places (the expected values are counted
 * by hand below, not by the code under test). Definition of a gap (documented in the route): a spacing
 * between consecutive records of one station and source longer than gap_min_s (default 3600 s).
 */

import { beforeAll, describe, expect, it } from 'vitest';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const MIN = 60_000;
const DAY0 = Date.UTC(2026, 6, 10); // 2026-07-10T00:00Z
const iso = (ms: number) => new Date(ms).toISOString();
const at = (hh: number, mm: number) => DAY0 + (hh * 60 + mm) * MIN;

/**
 * Station CVA, source "alpha": every 5 min over the day 00:00–23:55 (288 epochs) without
 * 06:00–08:55 (36 epochs) and 14:00–14:40 (9 epochs): 243 records. Spacings: 05:55 → 09:00 (11 100 s)
 * and 13:55 → 14:45 (3 000 s), all others 300 s.
 * Source "beta": every 30 min 12:00–18:00 (13 records), no spacing above 1800 s.
 */
const ALPHA = Array.from({ length: 288 }, (_, k) => DAY0 + k * 5 * MIN).filter(
  (t) => !(t >= at(6, 0) && t <= at(8, 55)) && !(t >= at(14, 0) && t <= at(14, 40)),
);
const BETA = Array.from({ length: 13 }, (_, k) => at(12, 0) + k * 30 * MIN);

const STATIONS = [
  { id: 'CVA', lat: 47.2, lon: 8.1 },
  { id: 'CVB', lat: 47.9, lon: 9.3 }, // no records
  { id: 'CVC', lat: -20.5, lon: 140.2 }, // outside the box of the bbox test
];

for (const backend of BACKENDS) {
  describe(`GET /v1/network/coverage on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);
    const get = (query: Record<string, string | number>) => api().get('/v1/network/coverage').query(query);

    beforeAll(async () => {
      for (const s of STATIONS) {
        await api()
          .put(`/v1/stations/${s.id}`)
          .set('authorization', auth)
          .send({ name: `${s.id} (invented)`, latitude_deg: s.lat, longitude_deg: s.lon, height_m: 400 })
          .expect(201);
      }
      const deposit = (id: string, source: string, epochs: number[]) =>
        api()
          .post(`/v1/stations/${id}/delays`)
          .set('authorization', auth)
          .send({ source, models: { test: 'invented' }, records: epochs.map((t) => ({ epoch: iso(t), ztd_m: 2.3, ztd_sigma_m: 0.004 })) })
          .expect(200);
      await deposit('CVA', 'alpha', ALPHA);
      await deposit('CVA', 'beta', BETA);
      await deposit('CVC', 'alpha', [at(0, 0), at(0, 30)]);
    });

    it('gives first/last epoch, count and the gaps longer than 1 h by default', async () => {
      const res = await get({}).expect(200);
      expect(res.body.gap_min_s).toBe(3600);
      expect(res.body.stations.map((s: { station_id: string }) => s.station_id)).toEqual(['CVA', 'CVB', 'CVC']);
      const [a, b] = res.body.stations;
      expect(a.sources).toEqual([
        {
          source: 'alpha',
          first_epoch: iso(at(0, 0)),
          last_epoch: iso(at(23, 55)),
          record_count: 243,
          gap_count: 1,
          gap_total_s: 11_100,
          gaps: [{ from: iso(at(5, 55)), to: iso(at(9, 0)), length_s: 11_100 }],
        },
        {
          source: 'beta',
          first_epoch: iso(at(12, 0)),
          last_epoch: iso(at(18, 0)),
          record_count: 13,
          gap_count: 0,
          gap_total_s: 0,
          gaps: [],
        },
      ]);
      expect(b.sources).toEqual([]);
      expect(res.body.summary).toEqual({
        station_count: 3,
        stations_with_records: 2,
        source_series: 3,
        record_count: 243 + 13 + 2,
        gap_count: 1,
        first_epoch: iso(at(0, 0)),
        last_epoch: iso(at(23, 55)),
      });
    });

    it('a shorter gap_min_s finds the 50-min hole; max_gaps keeps the longest, all still counted', async () => {
      const res = await get({ stations: 'CVA', gap_min_s: 1800 }).expect(200);
      const alpha = res.body.stations[0].sources[0];
      expect(alpha.gap_count).toBe(2);
      expect(alpha.gap_total_s).toBe(11_100 + 3000);
      expect(alpha.gaps.map((g: { length_s: number }) => g.length_s)).toEqual([11_100, 3000]); // time order
      // beta's 30-min spacing is not longer than 1800 s: no gap.
      expect(res.body.stations[0].sources[1].gap_count).toBe(0);
      const one = await get({ stations: 'CVA', gap_min_s: 1800, max_gaps: 1 }).expect(200);
      expect(one.body.stations[0].sources[0].gaps).toEqual([{ from: iso(at(5, 55)), to: iso(at(9, 0)), length_s: 11_100 }]);
      expect(one.body.stations[0].sources[0].gap_count).toBe(2);
    });

    it('from/to restrict the records looked at (dates are whole UTC days)', async () => {
      const res = await get({ stations: 'CVA', from: iso(at(10, 0)), to: iso(at(15, 0)), gap_min_s: 1800 }).expect(200);
      // alpha 10:00–15:00 every 5 min (61 epochs) without 14:00–14:40 (9): 52; one gap 13:55 → 14:45.
      expect(res.body.stations[0].sources[0]).toMatchObject({
        first_epoch: iso(at(10, 0)),
        last_epoch: iso(at(15, 0)),
        record_count: 52,
        gap_count: 1,
      });
      // beta 12:00–15:00: 7 records.
      expect(res.body.stations[0].sources[1]).toMatchObject({ record_count: 7 });
      const day = await get({ stations: 'CVA', from: '2026-07-11' }).expect(200);
      expect(day.body.stations[0].sources).toEqual([]);
      const whole = await get({ stations: 'CVA', from: '2026-07-10', to: '2026-07-10' }).expect(200);
      expect(whole.body.stations[0].sources[0].record_count).toBe(243);
    });

    it('bbox and stations select as for the network PWV read', async () => {
      const res = await get({ bbox: '0,40,20,50' }).expect(200);
      expect(res.body.stations.map((s: { station_id: string }) => s.station_id)).toEqual(['CVA', 'CVB']);
      const missing = await get({ stations: 'CVA,NOPE' }).expect(404);
      expect(missing.body.detail).toContain('"NOPE"');
    });

    it('refuses bad input with a 400 naming the field and the range', async () => {
      const low = await get({ gap_min_s: 10 }).expect(400);
      expect(JSON.stringify(low.body)).toMatch(/gap_min_s/);
      expect(JSON.stringify(low.body)).toMatch(/\[60, 31622400\]/);
      const gaps = await get({ max_gaps: 5000 }).expect(400);
      expect(JSON.stringify(gaps.body)).toMatch(/max_gaps/);
      const order = await get({ from: '2026-07-11', to: '2026-07-10' }).expect(400);
      expect(order.body.detail).toMatch(/must not be after/);
      await get({ gap_s: 60 }).expect(400); // strict: an unknown parameter is refused, not ignored
    });
  });
}
