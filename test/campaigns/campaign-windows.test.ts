/**
 * Campaigns of station-windows (docs/campaigns.md, "Station-windows"), on every backend: each item
 * estimates from its whole window and stores the centre `step_hours` of it, so every epoch of the span
 * is stored exactly once; the stored series follows the generator's known ZWD truth
 * (scripts/synthetic-residuals.ts, one continuous truth over three days) and equals, in the kept part,
 * the single-station estimation of the window's observations (POST /v1/zwd-estimates). With uploaded
 * residuals a window waits for every day it reads; closing the uploads runs it with what arrived.
 */

import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toRequestBody, truthZwdAt, type SyntheticData } from '../../scripts/synthetic-residuals.js';
import { waitForCampaign } from '../helpers/campaign-progress.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { inventedStations } from '../helpers/campaign-network.js';
import { BACKENDS } from '../helpers/storage.js';

const MM = 1e-3;
const HOUR_MS = 3_600_000;
const DAYS = ['2026-08-01', '2026-08-02', '2026-08-03'];
const STATION = inventedStations(1)[0]!;
const SAMPLING_S = 900;

/** Three days of one continuous synthetic truth at the invented station. */
function threeDays(): SyntheticData {
  return generateSyntheticResiduals({
    seed: 31,
    startIso: `${DAYS[0]}T00:00:00Z`,
    durationS: 72 * 3600 - SAMPLING_S,
    samplingS: SAMPLING_S,
    latitudeDeg: STATION.body.latitude_deg,
    longitudeDeg: STATION.body.longitude_deg,
    heightM: STATION.body.height_m,
  });
}

type Observation = ReturnType<typeof toRequestBody>['observations'][number];
const within = (all: readonly Observation[], fromMs: number, toMs: number) =>
  all.filter((o) => Date.parse(o.epoch) >= fromMs && Date.parse(o.epoch) < toMs);
const dayMs = (day: string) => Date.parse(`${day}T00:00:00Z`);

for (const backend of BACKENDS) {
  describe(`station-windows on ${backend.name}`, () => {
    const t = useArchiveApp(backend);
    const data = threeDays();
    const request = toRequestBody(data, {
      latitudeDeg: STATION.body.latitude_deg,
      longitudeDeg: STATION.body.longitude_deg,
      heightM: STATION.body.height_m,
    });
    const all = request.observations;

    it('36-hour windows every 12 hours: every epoch stored once, from the window around it, following the known truth', async () => {
      await t.api().put(`/v1/stations/${STATION.id}`).set('Authorization', t.auth).send(STATION.body).expect(201);
      for (const day of DAYS) {
        const observations = within(all, dayMs(day), dayMs(day) + 24 * HOUR_MS);
        await t.api().put(`/v1/stations/${STATION.id}/residuals/${day}`).set('Authorization', t.auth).send({ observations }).expect(201);
      }
      const submitted = await t
        .api()
        .post('/v1/campaigns')
        .set('Authorization', t.auth)
        .send({ start_date: DAYS[0], end_date: DAYS[2], window: { length_hours: 36, step_hours: 12 } })
        .expect(202);
      // 3 days / 12 h = 6 kept parts, each with a window of 12 h on either side.
      expect(submitted.body).toMatchObject({ items_total: 6, window: { length_hours: 36, step_hours: 12 }, residuals: 'deposited' });
      const id = submitted.body.campaign_id;
      const done = await waitForCampaign(t, id, (b) => b.state === 'finished', 180_000);
      expect(done).toMatchObject({ items_done: 6, items_failed: 0 });

      const rows = await t
        .app()
        .repository.readDelays(STATION.id, { fromMs: dayMs(DAYS[0]!), toMs: dayMs(DAYS[2]!) + 24 * HOUR_MS - 1 }, 'zwd-estimates');
      // Exactly once per epoch: one row for every observation epoch of the three days, none twice.
      const epochs = new Set(data.observations.epochMs);
      expect(rows.length).toBe(epochs.size);
      expect(new Set(rows.map((r) => r.epochMs)).size).toBe(rows.length);
      expect(new Set(rows.map((r) => r.modelFingerprint))).toEqual(new Set([submitted.body.model_fingerprint]));
      // ZTD(t) − ZTD(t0) follows the generator's ZWD truth within 10 mm across the window seams (common
      // practice for a 5-min random walk of 1 cm/√h with σ0 = 3 mm, as in campaigns.test.ts).
      const t0 = rows[0]!;
      for (const r of rows) {
        const truth = truthZwdAt(data.truth, r.epochMs) - truthZwdAt(data.truth, t0.epochMs);
        expect(Math.abs(r.ztdM - t0.ztdM - truth)).toBeLessThan(10 * MM);
      }

      // The item kept [08-02 00:00, 12:00) is the centre of the estimation over its window
      // [08-01 12:00, 08-03 00:00): the same values as POST /v1/zwd-estimates on those observations.
      const keep = { fromMs: dayMs(DAYS[1]!), toMs: dayMs(DAYS[1]!) + 12 * HOUR_MS };
      const estimateOf = async (fromMs: number, toMs: number) => {
        const answer = await t
          .api()
          .post('/v1/zwd-estimates')
          .send({ site: request.site, observations: within(all, fromMs, toMs), options: {} })
          .expect(200);
        return new Map<number, number>(answer.body.series.map((s: { epoch: string; ztd_m: number }) => [Date.parse(s.epoch), s.ztd_m]));
      };
      const window = await estimateOf(keep.fromMs - 12 * HOUR_MS, keep.toMs + 12 * HOUR_MS);
      const keptOnly = await estimateOf(keep.fromMs, keep.toMs);
      const kept = rows.filter((r) => r.epochMs >= keep.fromMs && r.epochMs < keep.toMs);
      expect(kept.length).toBeGreaterThan(40);
      let differsFromKeptOnly = 0;
      for (const r of kept) {
        expect(Math.abs(r.ztdM - window.get(r.epochMs)!)).toBeLessThan(0.001 * MM);
        differsFromKeptOnly = Math.max(differsFromKeptOnly, Math.abs(r.ztdM - keptOnly.get(r.epochMs)!));
      }
      // …and not the estimation of the kept part alone (its ends are constrained from one side only).
      expect(differsFromKeptOnly).toBeGreaterThan(0.01 * MM);

      const report = await t.api().get(`/v1/campaigns/${id}/report`).expect(200);
      expect(report.body).toMatchObject({ homogeneous: true, exceptions: [] });
      expect(report.body.fingerprints).toEqual([{ fingerprint: submitted.body.model_fingerprint, station_days: 6 }]);
    });

    it('with uploads, a window waits for every day it reads; closing the uploads runs the rest with what arrived', async () => {
      const submitted = await t
        .api()
        .post('/v1/campaigns')
        .set('Authorization', t.auth)
        .send({
          residuals: 'uploaded',
          stations: [STATION.id],
          start_date: DAYS[0],
          end_date: DAYS[2],
          window: { length_hours: 48, step_hours: 24 },
          options: { elevation_cutoff_deg: 5 },
        })
        .expect(202);
      expect(submitted.body).toMatchObject({ items_total: 3, items_awaiting_residuals: 3 });
      const id = submitted.body.campaign_id;
      const upload = (day: string) =>
        t
          .api()
          .put(`/v1/campaigns/${id}/residuals/${STATION.id}/${day}`)
          .set('Authorization', t.auth)
          .send({ observations: within(all, dayMs(day), dayMs(day) + 24 * HOUR_MS) });
      // The first window (kept: day 1) reads days 1 and 2 (day 0 is outside the span): ready with day 2.
      expect((await upload(DAYS[0]!).expect(201)).body.items_ready).toBe(0);
      expect((await upload(DAYS[1]!).expect(201)).body.items_ready).toBe(1);
      await waitForCampaign(t, id, (b) => b.items_done === 1, 180_000);
      // Day 3 never comes: closing runs the window of day 2 with days 1-2, and the window of day 3 has
      // nothing in its kept part (no input).
      await t.api().post(`/v1/campaigns/${id}/uploads-complete`).set('Authorization', t.auth).expect(200);
      const done = await waitForCampaign(t, id, (b) => b.state === 'finished', 180_000);
      expect(done).toMatchObject({ items_done: 2, items_no_residuals: 1, items_failed: 0 });
      const report = await t.api().get(`/v1/campaigns/${id}/report`).expect(200);
      expect(report.body.homogeneous).toBe(true);
      expect(report.body.exceptions).toEqual([
        expect.objectContaining({
          day: DAYS[2],
          kept_from: `${DAYS[2]}T00:00:00Z`,
          kept_to: '2026-08-04T00:00:00Z',
          reason: expect.stringContaining('no input'),
        }),
      ]);
    });
  });
}
