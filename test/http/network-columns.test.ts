/**
 * Columnar and Arrow bodies of the network routes (issue 14 item 1: "the estimation routes"): the
 * observations as column arrays with a `station` column, or as an Apache Arrow IPC table with the
 * rest of the request in the schema metadata "request", give the identical answer to the object form
 * (itself checked against the single-station route and the simulator's truth in
 * network-estimates.test.ts). A bad value in a column gets the object form's message, naming the
 * column and the row. The Arrow tables are written with the apache-arrow package's own writer.
 * Stations and places are invented.
 */

import { describe, expect, it } from 'vitest';
import { problemFields, useApp } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';
import { APRIORI, arrowBody, networkBody, observationsOf, putStations, sim } from './network-fixtures.js';

const ARROW = 'application/vnd.apache.arrow.stream';

type Row = Record<string, unknown>;

/** Rows → one array per field; a field missing on a row is null there. */
const columnsOf = (rows: Row[]) => {
  const keys = [...new Set(rows.flatMap((r) => Object.keys(r)))];
  return Object.fromEntries(keys.map((k) => [k, rows.map((r) => (k in r ? r[k] : null))])) as Record<string, unknown[]>;
};

const s = sim(51, 'estimated');
const metFor = (name: string, i: number) =>
  ['2026-06-21T06:00:00Z', '2026-06-21T06:30:00Z', '2026-06-21T07:00:00Z'].map((epoch, k) => ({
    station: name,
    epoch,
    pressure_hpa: 1001 - 2 * i - 0.5 * k,
    temperature_c: 16 + k,
  }));
const met = s.stations.slice(0, 2).flatMap((st, i) => metFor(st.name, i));
const OPTIONS = { zwd_interval_s: 600 };

describe('POST /v1/network-estimates: observations as objects, columns or an Arrow table answer alike', () => {
  const api = useApp();

  it('column arrays with a station column (sigma_m null on some rows) answer exactly as objects', { timeout: 120_000 }, async () => {
    const body = { ...networkBody(s, OPTIONS), met };
    body.observations = body.observations.map((o, i) => (i % 3 === 0 ? { ...o, sigma_m: 0.004 } : o));
    const objects = await api().post('/v1/network-estimates').send(body).expect(200);
    const columns = await api()
      .post('/v1/network-estimates')
      .send({ ...body, observations: columnsOf(body.observations) })
      .expect(200);
    expect(columns.body).toEqual(objects.body);
    // Not a trivial answer: rejections, met and the clocks at work.
    expect(objects.body.statistics.observations_rejected).toBeGreaterThan(0);
    expect(objects.body.stations[0].series.some((e: Row) => e.pwv_mm !== undefined)).toBe(true);
    expect(objects.body.common_mode.mean_zwd_sigma_clocks_estimated_m).not.toBeNull();
  });

  it(
    'an Arrow table of observations (stations, met and options in the metadata) answers exactly as JSON',
    { timeout: 120_000 },
    async () => {
      const { observations, ...rest } = { ...networkBody(s, OPTIONS), met };
      const json = await api()
        .post('/v1/network-estimates')
        .send({ ...rest, observations })
        .expect(200);
      const arrow = await api().post('/v1/network-estimates').set('content-type', ARROW).send(arrowBody(observations, rest)).expect(200);
      expect(arrow.body).toEqual(json.body);
    },
  );

  it('a bad value in a column gets the message of the object form, naming column and row', async () => {
    const body = networkBody(s, OPTIONS);
    const bad = body.observations.map((o, i) => (i === 5 ? { ...o, elevation_deg: -3 } : i === 7 ? { ...o, station: 'bad id!' } : o));
    const ref = await api()
      .post('/v1/network-estimates')
      .send({ ...body, observations: bad })
      .expect(400);
    const res = await api()
      .post('/v1/network-estimates')
      .send({ ...body, observations: columnsOf(bad) })
      .expect(400);
    expect(problemFields(ref.body).sort()).toEqual(['observations.5.elevation_deg', 'observations.7.station']);
    expect(problemFields(res.body).sort()).toEqual(['observations.elevation_deg.5', 'observations.station.7']);
    const message = (b: { errors: { field: string; message: string }[] }, part: string) =>
      b.errors.find((e) => e.field.includes(part))!.message;
    expect(message(res.body, 'elevation_deg')).toBe(message(ref.body, 'elevation_deg'));
    expect(message(res.body, 'station')).toBe(message(ref.body, 'station'));
  });

  it('a station not in stations: 400 naming observations.station.<row>, with the object form’s message', async () => {
    const body = networkBody(s, OPTIONS);
    const bad = body.observations.map((o, i) => (i === 9 ? { ...o, station: 'NOWHERE' } : o));
    const ref = await api()
      .post('/v1/network-estimates')
      .send({ ...body, observations: bad })
      .expect(400);
    const res = await api()
      .post('/v1/network-estimates')
      .send({ ...body, observations: columnsOf(bad) })
      .expect(400);
    expect(problemFields(ref.body)).toEqual(['observations.9.station']);
    expect(problemFields(res.body)).toEqual(['observations.station.9']);
    expect(res.body.errors[0].message).toBe(ref.body.errors[0].message);
  });

  it('a missing station column, columns of different lengths, an unknown column: 400 naming each', async () => {
    const body = networkBody(s, OPTIONS);
    const { station: _, ...noStation } = columnsOf(body.observations);
    const r1 = await api()
      .post('/v1/network-estimates')
      .send({ ...body, observations: noStation })
      .expect(400);
    expect(problemFields(r1.body)).toEqual(['observations.station']);
    const cols = columnsOf(body.observations);
    const r2 = await api()
      .post('/v1/network-estimates')
      .send({ ...body, observations: { ...cols, residual_m: cols.residual_m!.slice(1), stations: cols.station } })
      .expect(400);
    expect(problemFields(r2.body).sort()).toEqual(['observations.residual_m', 'observations.stations']);
  });

  it('an Arrow body that is not Arrow: 400 naming body', async () => {
    const res = await api().post('/v1/network-estimates').set('content-type', ARROW).send(Buffer.from('not arrow')).expect(400);
    expect(problemFields(res.body)).toEqual(['body']);
  });
});

for (const backend of BACKENDS) {
  describe(`POST /v1/network/zwd-estimates with columns and Arrow on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);

    it('stores the same series as the object form', { timeout: 180_000 }, async () => {
      await putStations(api, auth, s);
      const rest = { stations: s.stations.map((st) => ({ id: st.name, apriori: APRIORI })), met, options: OPTIONS };
      const observations = observationsOf(s);
      const send = (source: string) => api().post(`/v1/network/zwd-estimates?source=${source}`).set('authorization', auth);
      const objects = await send('objects')
        .send({ ...rest, observations })
        .expect(200);
      const columns = await send('columns')
        .send({ ...rest, observations: columnsOf(observations) })
        .expect(200);
      const arrow = await send('arrow').set('content-type', ARROW).send(arrowBody(observations, rest)).expect(200);
      const strip = (b: Row) => ({ ...b, stored: (b.stored as Row[]).map(({ source: _, ...x }) => x) });
      expect(strip(columns.body)).toEqual(strip(objects.body));
      expect(strip(arrow.body)).toEqual(strip(objects.body));
      const range = { from: '2026-06-21T05:00:00Z', to: '2026-06-21T08:00:00Z' };
      for (const st of s.stations) {
        const read = async (source: string) =>
          (
            (
              await api()
                .get(`/v1/stations/${st.name}/delays`)
                .query({ ...range, source })
                .expect(200)
            ).body.records as Row[]
          ).map(({ source: _, ...r }) => r);
        const stored = await read('objects');
        expect(stored.length).toBeGreaterThan(50);
        expect(await read('columns')).toEqual(stored);
        expect(await read('arrow')).toEqual(stored);
      }
    });
  });
}
