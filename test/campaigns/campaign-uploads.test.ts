/**
 * Campaigns whose residuals are uploaded with them (docs/campaigns.md, "Residuals uploaded with a
 * campaign"), on every backend: items wait in awaiting_residuals until their day arrives, run as it
 * arrives, store each day once under the campaign's fingerprint following the generator's known ZWD
 * truth (scripts/synthetic-residuals.ts); the close of the uploads ends the items that got nothing as
 * no_residuals and the report lists them without calling the results inhomogeneous; bad input is a
 * 4xx naming the field.
 */

import { describe, expect, it } from 'vitest';
import { truthZwdAt } from '../../scripts/synthetic-residuals.js';
import { waitForCampaign } from '../helpers/campaign-progress.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { inventedStations, stationDay, type StationDayData } from '../helpers/campaign-network.js';
import { BACKENDS } from '../helpers/storage.js';

const MM = 1e-3;
const STATIONS = inventedStations(2);
const DAYS = ['2026-07-01', '2026-07-02'];
/** Short days keep the test quick: 3 h at 300 s. */
const HOURS = 3;
const SAMPLING_S = 300;

/** Objects → column arrays (the other JSON form a deposit takes). */
function asColumns(body: StationDayData['body']) {
  const o = body.observations;
  return {
    observations: {
      epoch: o.map((r) => r.epoch),
      satellite: o.map((r) => r.satellite),
      elevation_deg: o.map((r) => r.elevation_deg),
      azimuth_deg: o.map((r) => r.azimuth_deg),
      residual_m: o.map((r) => r.residual_m),
    },
  };
}

for (const backend of BACKENDS) {
  describe(`residuals uploaded with a campaign on ${backend.name}`, () => {
    const t = useArchiveApp(backend);
    const data = new Map<string, StationDayData>();
    let id = '';
    let fingerprint = '';
    const upload = (station: string, day: string, body: object) =>
      t.api().put(`/v1/campaigns/${id}/residuals/${station}/${day}`).set('Authorization', t.auth).send(body);

    it('items await their residuals, run as they arrive, and store each day once following the known truth', async () => {
      for (const [k, s] of STATIONS.entries()) {
        await t.api().put(`/v1/stations/${s.id}`).set('Authorization', t.auth).send(s.body).expect(201);
        for (const day of DAYS) data.set(`${s.id}|${day}`, stationDay(s, k, day, HOURS, SAMPLING_S));
      }
      const submitted = await t
        .api()
        .post('/v1/campaigns')
        .set('Authorization', t.auth)
        .send({ name: 'uploaded', residuals: 'uploaded', stations: ['CAMP01', 'CAMP02'], start_date: DAYS[0], end_date: DAYS[1] })
        .expect(202);
      expect(submitted.body).toMatchObject({
        residuals: 'uploaded',
        window: null,
        state: 'queued',
        items_total: 4,
        items_awaiting_residuals: 4,
        items_pending: 0,
      });
      id = submitted.body.campaign_id;
      fingerprint = submitted.body.model_fingerprint;

      // Nothing is stored in the station archive's deposits: the uploads belong to the campaign.
      const first = await upload('CAMP01', DAYS[0]!, data.get(`CAMP01|${DAYS[0]}`)!.body).expect(201);
      expect(first.body).toMatchObject({ campaign_id: id, station_id: 'CAMP01', day: DAYS[0], items_ready: 1 });
      // The same observations in another JSON form: the same stored form, 200, nothing new to run.
      const again = await upload('CAMP01', DAYS[0]!, asColumns(data.get(`CAMP01|${DAYS[0]}`)!.body)).expect(200);
      expect(again.body).toMatchObject({ sha256: first.body.sha256, items_ready: 0 });
      expect((await t.api().get('/v1/stations/CAMP01/residuals').expect(200)).body.days).toEqual([]);
      await upload('CAMP01', DAYS[1]!, asColumns(data.get(`CAMP01|${DAYS[1]}`)!.body)).expect(201);
      await upload('CAMP02', DAYS[0]!, data.get(`CAMP02|${DAYS[0]}`)!.body).expect(201);

      const progress = await waitForCampaign(t, id, (b) => b.items_done === 3);
      // CAMP02's second day has not arrived: the campaign waits for it.
      expect(progress).toMatchObject({ state: 'running', items_awaiting_residuals: 1, items_pending: 0, items_running: 0 });
      const waiting = await t.api().get(`/v1/campaigns/${id}/report`).expect(200);
      expect(waiting.body.exceptions).toEqual([
        expect.objectContaining({ station_id: 'CAMP02', day: DAYS[1], reason: expect.stringContaining('no input yet') }),
      ]);
      expect(waiting.body.homogeneous).toBe(true);

      const listed = await t.api().get(`/v1/campaigns/${id}/residuals`).expect(200);
      expect(listed.body.days.map((d: { station_id: string; day: string }) => `${d.station_id}|${d.day}`)).toEqual([
        `CAMP01|${DAYS[0]}`,
        `CAMP01|${DAYS[1]}`,
        `CAMP02|${DAYS[0]}`,
      ]);

      for (const key of [`CAMP01|${DAYS[0]}`, `CAMP01|${DAYS[1]}`, `CAMP02|${DAYS[0]}`]) {
        const [station, day] = key.split('|') as [string, string];
        const d = data.get(key)!;
        const rows = await t
          .app()
          .repository.readDelays(
            station,
            { fromMs: Date.parse(`${day}T00:00:00Z`), toMs: Date.parse(`${day}T23:59:59Z`) },
            'zwd-estimates',
          );
        // Exactly once: one row per observation epoch of the day, all of the campaign's fingerprint.
        expect(rows.length).toBe(new Set(d.data.observations.epochMs).size);
        expect(new Set(rows.map((r) => r.modelFingerprint))).toEqual(new Set([fingerprint]));
        // ZTD(t) − ZTD(t0) follows the generator's ZWD truth within 10 mm (common practice for a 5-min
        // random walk of 1 cm/√h with σ0 = 3 mm; the formal σ is about 3-5 mm).
        const t0 = rows[0]!;
        for (const r of rows) {
          const truth = truthZwdAt(d.data.truth, r.epochMs) - truthZwdAt(d.data.truth, t0.epochMs);
          expect(Math.abs(r.ztdM - t0.ztdM - truth)).toBeLessThan(10 * MM);
        }
      }
    });

    it('refuses to replace a day an item has used (409 naming params.day)', async () => {
      const other = stationDay(STATIONS[0]!, 7, DAYS[0]!, HOURS, SAMPLING_S);
      const r = await upload('CAMP01', DAYS[0]!, other.body).expect(409);
      expect(r.body.errors[0].field).toBe('params.day');
    });

    it('closing the uploads ends the item without residuals as no_residuals; the report lists it and stays homogeneous', async () => {
      const closed = await t.api().post(`/v1/campaigns/${id}/uploads-complete`).set('Authorization', t.auth).expect(200);
      expect(closed.body).toMatchObject({ state: 'finished', items_done: 3, items_no_residuals: 1, items_awaiting_residuals: 0 });
      expect(closed.body.uploads_closed_at).not.toBeNull();
      const report = await t.api().get(`/v1/campaigns/${id}/report`).expect(200);
      expect(report.body).toMatchObject({ homogeneous: true, items: { total: 4, done: 3, no_residuals: 1 } });
      expect(report.body.fingerprints).toEqual([{ fingerprint, station_days: 3 }]);
      expect(report.body.exceptions).toEqual([
        expect.objectContaining({ station_id: 'CAMP02', day: DAYS[1], reason: expect.stringContaining('no input') }),
      ]);
      const late = await upload('CAMP02', DAYS[1]!, data.get(`CAMP02|${DAYS[1]}`)!.body).expect(409);
      expect(late.body.errors[0].field).toBe('params.campaign_id');
    });

    it('answers bad input with a 4xx naming the field and the allowed range', async () => {
      const post = (body: object) => t.api().post('/v1/campaigns').set('Authorization', t.auth).send(body);
      const problem = async (body: object, status: number) => (await post(body).expect(status)).body.errors[0];
      const span = { start_date: DAYS[0], end_date: DAYS[1] };
      expect((await problem({ ...span, residuals: 'uploaded' }, 400)).field).toBe('stations');
      expect((await problem({ ...span, residuals: 'sideways' }, 400)).field).toBe('residuals');
      const step = await problem({ ...span, window: { length_hours: 12, step_hours: 24 } }, 400);
      expect(step).toMatchObject({ field: 'window.step_hours', message: expect.stringContaining('length_hours') });
      const length = await problem({ ...span, window: { length_hours: 241, step_hours: 24 } }, 400);
      expect(length).toMatchObject({ field: 'window.length_hours', message: expect.stringContaining('[1, 240]') });
      expect((await problem({ ...span, window: { length_hours: 1.5, step_hours: 1 } }, 400)).field).toBe('window.length_hours');
      expect((await problem({ ...span, window: { length_hours: 24 } }, 400)).field).toBe('window.step_hours');

      const fresh = await post({ ...span, residuals: 'uploaded', stations: ['CAMP01'] }).expect(202);
      const into = (station: string, day: string, body: object) =>
        t.api().put(`/v1/campaigns/${fresh.body.campaign_id}/residuals/${station}/${day}`).set('Authorization', t.auth).send(body);
      const body = data.get(`CAMP01|${DAYS[0]}`)!.body;
      const outside = await into('CAMP01', '2026-07-03', body).expect(400);
      expect(outside.body.errors[0]).toMatchObject({ field: 'params.day', message: expect.stringContaining(`${DAYS[0]} … ${DAYS[1]}`) });
      expect((await into('CAMP02', DAYS[0]!, body).expect(400)).body.errors[0].field).toBe('params.station_id');
      // Epochs of another day: the deposit's own rule and message.
      const wrongDay = await into('CAMP01', DAYS[1]!, body).expect(400);
      expect(wrongDay.body.errors[0].field).toMatch(/^observations\.\d+\.epoch$/);
      expect((await into('CAMP01', '2026-02-30', body).expect(400)).body.errors[0].field).toBe('params.day');
      await t.api().put(`/v1/campaigns/nosuch/residuals/CAMP01/${DAYS[0]}`).set('Authorization', t.auth).send(body).expect(404);
      await t.api().put(`/v1/campaigns/${fresh.body.campaign_id}/residuals/CAMP01/${DAYS[0]}`).send(body).expect(401);
      await t.api().get('/v1/campaigns/nosuch/residuals').expect(404);

      // A campaign of deposited residuals takes no uploads and has none to close.
      await t.api().put(`/v1/stations/CAMP01/residuals/${DAYS[0]}`).set('Authorization', t.auth).send(body).expect(201);
      const deposits = await post({ ...span, stations: ['CAMP01'] }).expect(202);
      const refused = await t
        .api()
        .put(`/v1/campaigns/${deposits.body.campaign_id}/residuals/CAMP01/${DAYS[0]}`)
        .set('Authorization', t.auth)
        .send(body)
        .expect(409);
      expect(refused.body.errors[0].field).toBe('params.campaign_id');
      await t.api().post(`/v1/campaigns/${deposits.body.campaign_id}/uploads-complete`).set('Authorization', t.auth).expect(409);
      // Cancelling a campaign of uploads cancels its awaiting items.
      const cancelled = await t.api().post(`/v1/campaigns/${fresh.body.campaign_id}/cancel`).set('Authorization', t.auth).expect(200);
      expect(cancelled.body).toMatchObject({ state: 'cancelled', items_awaiting_residuals: 0, items_cancelled: 2 });
    });
  });
}
