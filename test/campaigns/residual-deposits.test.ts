/**
 * Residual deposits (PUT/GET/DELETE /v1/stations/{id}/residuals/{day}), on every backend: the forms the
 * estimation routes take give one canonical stored form (same sha256), epochs outside the day are a 400
 * naming the row, the data come back as sent, and the stored form is smaller than the JSON sent.
 * Data: the committed synthetic generator (scripts/synthetic-residuals.ts) for an invented station.
 */

import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toCsv, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { decodeResidualDay, encodeResidualDay } from '../../src/formats/residual-day-form.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const DAY = '2026-03-14';
/** An invented station. */
const STATION = { name: 'Test station Alpha', latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const data = generateSyntheticResiduals({ startIso: `${DAY}T00:00:00Z`, durationS: 4 * 3600, samplingS: 300, seed: 3 });
const objects = toRequestBody(data).observations;

function columnsOf(list: typeof objects) {
  return {
    epoch: list.map((o) => o.epoch),
    satellite: list.map((o) => o.satellite),
    elevation_deg: list.map((o) => o.elevation_deg),
    azimuth_deg: list.map((o) => o.azimuth_deg),
    residual_m: list.map((o) => o.residual_m),
  };
}

describe('the compact stored form (src/formats/residual-day-form.ts)', () => {
  it('round-trips every value exactly and ignores the row order (canonical form)', () => {
    const day = {
      epochMs: objects.map((o) => Date.parse(o.epoch)),
      satellite: objects.map((o) => o.satellite),
      elevationDeg: objects.map((o) => o.elevation_deg),
      azimuthDeg: objects.map((o) => o.azimuth_deg),
      residualM: objects.map((o) => o.residual_m),
    };
    const a = encodeResidualDay(DAY, day);
    const reversed = Object.fromEntries(Object.entries(day).map(([k, v]) => [k, [...(v as unknown[])].reverse()])) as typeof day;
    expect(encodeResidualDay(DAY, reversed).sha256).toBe(a.sha256);
    const back = decodeResidualDay(DAY, a.bytes);
    expect(back.epochMs.length).toBe(objects.length);
    // Every (epoch, satellite) row comes back with its values unchanged (float64 kept as sent).
    const sent = new Map(objects.map((o) => [`${o.epoch}|${o.satellite}`, o]));
    for (let k = 0; k < back.epochMs.length; k++) {
      const o = sent.get(`${new Date(back.epochMs[k]!).toISOString()}|${back.satellite[k]}`)!;
      expect([back.elevationDeg[k], back.azimuthDeg[k], back.residualM[k]]).toEqual([o.elevation_deg, o.azimuth_deg, o.residual_m]);
    }
    expect(back.sigmaM).toBeUndefined();
  });
});

for (const backend of BACKENDS) {
  describe(`residual deposits on ${backend.name}`, () => {
    const t = useArchiveApp(backend);
    const put = (day: string, body: unknown, type = 'application/json') =>
      t
        .api()
        .put(`/v1/stations/ALPHA1/residuals/${day}`)
        .set('Authorization', t.auth)
        .set('Content-Type', type)
        .send(body as object);

    it('stores a day (201), answers the same sha256 for objects, columns and CSV (200, replaced)', async () => {
      await t.api().put('/v1/stations/ALPHA1').set('Authorization', t.auth).send(STATION).expect(201);
      const first = await put(DAY, { observations: objects }).expect(201);
      expect(first.body).toMatchObject({ station_id: 'ALPHA1', day: DAY, observation_count: objects.length });
      expect(first.body.sha256).toMatch(/^[0-9a-f]{64}$/);
      // The compact form is much smaller than the JSON sent (common practice: a columnar, compressed form).
      expect(first.body.stored_bytes).toBeLessThan(JSON.stringify({ observations: objects }).length / 3);
      const columns = await put(DAY, { observations: columnsOf(objects) }).expect(200);
      expect(columns.body.sha256).toBe(first.body.sha256);
      const csv = await put(DAY, toCsv(data), 'text/csv').expect(200);
      expect(csv.body.sha256).toBe(first.body.sha256);
    });

    it('lists the days with start/end filters and gives the observations back as columns and as CSV', async () => {
      await put('2026-03-15', {
        observations: objects.slice(0, 10).map((o) => ({ ...o, epoch: o.epoch.replace(DAY, '2026-03-15') })),
      }).expect(201);
      const all = await t.api().get('/v1/stations/ALPHA1/residuals').expect(200);
      expect(all.body.days.map((d: { day: string }) => d.day)).toEqual([DAY, '2026-03-15']);
      const one = await t.api().get('/v1/stations/ALPHA1/residuals?start=2026-03-15&end=2026-03-15').expect(200);
      expect(one.body.days).toHaveLength(1);
      expect(one.body.days[0].observation_count).toBe(10);
      const back = await t.api().get(`/v1/stations/ALPHA1/residuals/${DAY}`).expect(200);
      expect(back.body.observations.epoch).toHaveLength(objects.length);
      // Sending the answer back stores the same canonical form.
      const again = await put(DAY, { observations: back.body.observations }).expect(200);
      expect(again.body.sha256).toBe(all.body.days[0].sha256);
      const csv = await t.api().get(`/v1/stations/ALPHA1/residuals/${DAY}`).set('Accept', 'text/csv').expect(200);
      expect(csv.text.split('\n')[0]).toBe('epoch,satellite,elevation_deg,azimuth_deg,residual_m');
      expect(csv.text.trim().split('\n')).toHaveLength(objects.length + 1);
    });

    it('refuses an epoch outside the day with a 400 naming the row, and bad input naming the field', async () => {
      const outside = objects.slice(0, 5).map((o) => ({ ...o }));
      outside[3]!.epoch = '2026-03-15T00:00:00.000Z';
      const r = await put(DAY, { observations: outside }).expect(400);
      expect(r.body.errors[0].field).toBe('observations.3.epoch');
      expect(r.body.errors[0].message).toContain(DAY);
      const bad = objects.slice(0, 3).map((o) => ({ ...o }));
      bad[1]!.elevation_deg = 95;
      expect((await put(DAY, { observations: bad }).expect(400)).body.errors[0].field).toBe('observations.1.elevation_deg');
      const repeated = [objects[0], objects[0]];
      expect((await put(DAY, { observations: repeated }).expect(400)).body.errors[0].field).toBe('observations.1');
      expect((await put('2026-02-30', { observations: objects.slice(0, 2) }).expect(400)).body.errors[0].field).toContain('day');
      expect((await put(DAY, { observations: objects.slice(0, 2), options: {} }).expect(400)).body.errors[0].field).toContain('options');
      await t
        .api()
        .put(`/v1/stations/NOSUCH/residuals/${DAY}`)
        .set('Authorization', t.auth)
        .send({ observations: objects.slice(0, 2) })
        .expect(404);
      await t
        .api()
        .put(`/v1/stations/ALPHA1/residuals/${DAY}`)
        .send({ observations: objects.slice(0, 2) })
        .expect(401);
    });

    it('deletes a day (admin key) and then answers 404', async () => {
      await t.api().delete('/v1/stations/ALPHA1/residuals/2026-03-15').set('Authorization', t.auth).expect(204);
      await t.api().get('/v1/stations/ALPHA1/residuals/2026-03-15').expect(404);
      await t.api().delete('/v1/stations/ALPHA1/residuals/2026-03-15').set('Authorization', t.auth).expect(404);
    });
  });
}
