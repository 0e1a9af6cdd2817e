/**
 * POST /v1/network/days/{day}/zwd-estimates: the network estimation from the stations' residual
 * deposits of a day (the path for networks larger than one request body), on every backend.
 *
 * Reference: the route must give what POST /v1/network/zwd-estimates gives for the same observations
 * in the body (the deposits as GET /v1/stations/{id}/residuals/{day} returns them) — that route is
 * checked against dense double-difference and zero-difference references in
 * test/estimation/network/ — to 1e-9 m in every series value, with the same model fingerprint, and
 * must store the same rows. Stations, places and residuals are invented (seeded simulation).
 */

import { describe, expect, it } from 'vitest';
import { problemFields } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';
import { APRIORI, observationsOf, sim, siteOf, TOL_M } from './network-fixtures.js';

const DAY = '2026-06-21';
const OPTIONS = { parametrisation: 'nodes', correlated_noise: false, zwd_interval_s: 600 };

type Entry = Record<string, number | string | undefined>;

for (const backend of BACKENDS) {
  describe(`POST /v1/network/days/{day}/zwd-estimates on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);
    const s = sim(61, 'estimated');

    async function deposit(stations = s.stations) {
      for (const st of stations) {
        await api()
          .put(`/v1/stations/${st.name}`)
          .set('authorization', auth)
          .send({ name: `${st.name} (invented)`, ...siteOf(st) })
          .expect((r) => expect([200, 201]).toContain(r.status));
        await api()
          .put(`/v1/stations/${st.name}/residuals/${DAY}`)
          .set('authorization', auth)
          .send({ observations: observationsOf(s, st.name) })
          .expect((r) => expect([200, 201]).toContain(r.status));
      }
    }

    it('equals POST /v1/network/zwd-estimates on the deposited observations, and stores the same rows', { timeout: 180_000 }, async () => {
      await deposit();
      const stations = s.stations.map((st) => ({ id: st.name, apriori: APRIORI }));
      const byDay = await api()
        .post(`/v1/network/days/${DAY}/zwd-estimates?source=net-day`)
        .set('authorization', auth)
        .send({ stations, options: OPTIONS })
        .expect(200);
      // The same observations as the archive holds them, sent in the body.
      const observations = [];
      for (const st of s.stations) {
        const back = await api().get(`/v1/stations/${st.name}/residuals/${DAY}`).expect(200);
        const cols = back.body.observations as Record<string, unknown[]>;
        for (let k = 0; k < cols.epoch!.length; k++)
          observations.push({
            station: st.name,
            epoch: cols.epoch![k],
            satellite: cols.satellite![k],
            elevation_deg: cols.elevation_deg![k],
            azimuth_deg: cols.azimuth_deg![k],
            residual_m: cols.residual_m![k],
          });
      }
      const byBody = await api()
        .post('/v1/network/zwd-estimates?source=net-body')
        .set('authorization', auth)
        .send({ stations, observations, options: OPTIONS })
        .expect(200);
      expect(byDay.body.model_fingerprint).toBe(byBody.body.model_fingerprint);
      expect(byDay.body.statistics.observations_total).toBe(observations.length);
      expect(byDay.body.stored.map((x: { met_used: string }) => x.met_used)).toEqual(s.stations.map(() => 'none'));
      for (const [i, st] of byDay.body.stations.entries()) {
        const a = st.series as Entry[];
        const b = byBody.body.stations[i].series as Entry[];
        expect(a.length).toBeGreaterThan(50);
        expect(a).toHaveLength(b.length);
        a.forEach((e, k) => {
          expect(e.epoch).toBe(b[k]!.epoch);
          for (const f of ['zwd_m', 'sigma_m', 'relative_sigma_m', 'north_gradient_m', 'east_gradient_sigma_m'])
            expect(Math.abs((e[f] as number) - (b[k]![f] as number)), `${st.station} ${f}`).toBeLessThan(TOL_M);
        });
        expect(byDay.body.stored[i].inserted).toBe(a.length);
        const read = async (source: string) =>
          (
            await api()
              .get(`/v1/stations/${st.station}/delays`)
              .query({ from: '2026-06-21T00:00:00Z', to: '2026-06-22T00:00:00Z', source })
              .expect(200)
          ).body.records as Record<string, number>[];
        const [day, body] = [await read('net-day'), await read('net-body')];
        expect(day).toHaveLength(body.length);
        day.forEach((r, k) => expect(Math.abs(r.ztd_m! - body[k]!.ztd_m!)).toBeLessThan(TOL_M));
      }
    });

    it('a station without a deposit that day: 404 naming stations.<i>.id, nothing stored', { timeout: 60_000 }, async () => {
      await deposit(s.stations.slice(0, 2));
      await api()
        .put('/v1/stations/NODEPOSIT')
        .set('authorization', auth)
        .send({ name: 'No deposit (invented)', ...siteOf(s.stations[3]!) });
      const res = await api()
        .post(`/v1/network/days/${DAY}/zwd-estimates?source=net-missing`)
        .set('authorization', auth)
        .send({ stations: [{ id: s.stations[0]!.name }, { id: 'NODEPOSIT' }], options: OPTIONS })
        .expect(404);
      expect(problemFields(res.body)).toEqual(['stations.1.id']);
      expect(res.body.errors[0].message).toContain(`PUT /v1/stations/NODEPOSIT/residuals/${DAY}`);
      const stored = await api()
        .get(`/v1/stations/${s.stations[0]!.name}/delays`)
        .query({ from: '2026-06-21T00:00:00Z', to: '2026-06-22T00:00:00Z', source: 'net-missing' })
        .expect(200);
      expect(stored.body.records).toHaveLength(0);
    });

    it('a station not in the archive: 404 naming it; a bad day: 400 naming it', async () => {
      const res = await api()
        .post(`/v1/network/days/${DAY}/zwd-estimates`)
        .set('authorization', auth)
        .send({ stations: [{ id: s.stations[0]!.name }, { id: 'NOSUCHSTN' }], options: OPTIONS })
        .expect(404);
      expect(problemFields(res.body)).toEqual(['stations.1.id']);
      const bad = await api()
        .post('/v1/network/days/2026-02-30/zwd-estimates')
        .set('authorization', auth)
        .send({ stations: [{ id: s.stations[0]!.name }], options: OPTIONS })
        .expect(400);
      expect(problemFields(bad.body)[0]).toMatch(/day/);
    });

    it('writes need a key', async () => {
      await api()
        .post(`/v1/network/days/${DAY}/zwd-estimates`)
        .send({ stations: [{ id: s.stations[0]!.name }], options: OPTIONS })
        .expect(401);
    });
  });
}

for (const backend of BACKENDS) {
  describe(`POST /v1/network/days/{day}/zwd-estimates on ${backend.name}, a replica set to 5 000 stations × observations`, () => {
    const { api, auth } = useArchiveApp(backend, { networkDayMaxStationObservations: 5_000 });
    const s = sim(61, 'estimated');

    it('past the setting: 413 naming stations and the setting, nothing stored', { timeout: 60_000 }, async () => {
      for (const st of s.stations) {
        await api()
          .put(`/v1/stations/${st.name}`)
          .set('authorization', auth)
          .send({ name: `${st.name} (invented)`, ...siteOf(st) });
        await api()
          .put(`/v1/stations/${st.name}/residuals/${DAY}`)
          .set('authorization', auth)
          .send({ observations: observationsOf(s, st.name) })
          .expect(201);
      }
      const total = observationsOf(s).length;
      expect(4 * total).toBeGreaterThan(5_000);
      const res = await api()
        .post(`/v1/network/days/${DAY}/zwd-estimates?source=net-big`)
        .set('authorization', auth)
        .send({ stations: s.stations.map((st) => ({ id: st.name })), options: OPTIONS })
        .expect(413);
      expect(problemFields(res.body)).toEqual(['stations']);
      expect(res.body.errors[0].message).toContain(`4 stations × ${total} deposited observations`);
      expect(res.body.errors[0].message).toContain('TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS');
      const stored = await api()
        .get(`/v1/stations/${s.stations[0]!.name}/delays`)
        .query({ from: '2026-06-21T00:00:00Z', to: '2026-06-22T00:00:00Z', source: 'net-big' })
        .expect(200);
      expect(stored.body.records).toHaveLength(0);
    });
  });
}
