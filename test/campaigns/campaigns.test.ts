/**
 * Reprocessing campaigns in one process (SQLite: the in-process queue; PostgreSQL: pg-boss), on every
 * backend: a campaign over deposited station-days stores every day's series once under its fingerprint,
 * the stored ZTD follows the generator's known ZWD truth (scripts/synthetic-residuals.ts), the report is
 * homogeneous — until a second campaign re-estimates one station-day with other options, which the
 * first report then lists; bad input, cancel, and the claim/guard that makes the results exactly-once.
 */

import { describe, expect, it } from 'vitest';
import { truthZwdAt } from '../../scripts/synthetic-residuals.js';
import { runItem } from '../../src/services/campaigns/campaign-runner.js';
import { CampaignStore } from '../../src/storage/campaigns/campaign-store.js';
import { GuardRefusedError } from '../../src/storage/sql-executor.js';
import { waitForCampaign } from '../helpers/campaign-progress.js';
import { useArchiveApp, type ArchiveApp } from '../helpers/archive-app.js';
import { inventedStations, stationDay, type StationDayData } from '../helpers/campaign-network.js';
import { BACKENDS, ztdOnlyRow } from '../helpers/storage.js';

const MM = 1e-3;
const STATIONS = inventedStations(2);
const DAYS = ['2026-04-01', '2026-04-02'];
/** Short days keep the test quick: 3 h at 300 s. */
const HOURS = 3;
const SAMPLING_S = 300;

async function setUpNetwork(t: ArchiveApp): Promise<Map<string, StationDayData>> {
  const days = new Map<string, StationDayData>();
  for (const [k, s] of STATIONS.entries()) {
    await t.api().put(`/v1/stations/${s.id}`).set('Authorization', t.auth).send(s.body).expect(201);
    for (const day of DAYS) {
      const d = stationDay(s, k, day, HOURS, SAMPLING_S);
      days.set(`${s.id}|${day}`, d);
      await t.api().put(`/v1/stations/${s.id}/residuals/${day}`).set('Authorization', t.auth).send(d.body).expect(201);
    }
  }
  return days;
}

const waitUntilDone = (t: ArchiveApp, id: string) =>
  waitForCampaign(t, id, (b: { state: string }) => b.state === 'finished' || b.state === 'cancelled');

for (const backend of BACKENDS) {
  describe(`campaigns on ${backend.name}`, () => {
    const t = useArchiveApp(backend);
    let days: Map<string, StationDayData>;
    let firstId = '';
    let firstFingerprint = '';

    it('runs a campaign over every deposited station-day; each series stored once under its fingerprint, following the known truth', async () => {
      days = await setUpNetwork(t);
      const submitted = await t
        .api()
        .post('/v1/campaigns')
        .set('Authorization', t.auth)
        .send({ name: 'first pass', start_date: DAYS[0], end_date: DAYS[1], options: {} })
        .expect(202);
      expect(submitted.body).toMatchObject({ items_total: 4, name: 'first pass' });
      expect(['queued', 'running', 'finished']).toContain(submitted.body.state);
      firstId = submitted.body.campaign_id;
      firstFingerprint = submitted.body.model_fingerprint;
      const done = await waitUntilDone(t, firstId);
      expect(done).toMatchObject({ state: 'finished', items_done: 4, items_failed: 0, items_pending: 0, items_running: 0 });
      expect(done.replicas.reduce((a: number, r: { items_done: number }) => a + r.items_done, 0)).toBe(4);

      for (const [key, d] of days) {
        const [id, day] = key.split('|') as [string, string];
        const rows = (
          await t.app().repository.readDelays(id, { fromMs: Date.parse(`${day}T00:00:00Z`), toMs: Date.parse(`${day}T23:59:59Z`) })
        ).filter((r) => r.source === 'zwd-estimates');
        // One row per observation epoch of the day, each with the campaign's fingerprint.
        expect(rows.length).toBe(new Set(d.data.observations.epochMs).size);
        expect(new Set(rows.map((r) => r.modelFingerprint))).toEqual(new Set([firstFingerprint]));
        // ZTD(t) − ZTD(t0) follows the generator's ZWD truth (the a-priori cancels): within 10 mm
        // (common practice for a 5-min random walk of 1 cm/√h with σ0 = 3 mm; the formal σ is about 3-5 mm).
        const t0 = rows[0]!;
        for (const r of rows) {
          const truth = truthZwdAt(d.data.truth, r.epochMs) - truthZwdAt(d.data.truth, t0.epochMs);
          expect(Math.abs(r.ztdM - t0.ztdM - truth)).toBeLessThan(10 * MM);
        }
      }
      const report = await t.api().get(`/v1/campaigns/${firstId}/report`).expect(200);
      expect(report.body).toMatchObject({ homogeneous: true, model_fingerprint: firstFingerprint, exceptions: [] });
      expect(report.body.fingerprints).toEqual([{ fingerprint: firstFingerprint, station_days: 4 }]);
      expect(report.body.items).toMatchObject({ total: 4, done: 4, failed: 0, cancelled: 0 });
    });

    it('a station-day re-estimated with other options by a second campaign makes the first report non-homogeneous, naming it', async () => {
      const second = await t
        .api()
        .post('/v1/campaigns')
        .set('Authorization', t.auth)
        .send({ stations: ['CAMP02'], start_date: DAYS[1], end_date: DAYS[1], options: { elevation_cutoff_deg: 10 } })
        .expect(202);
      expect(second.body.items_total).toBe(1);
      expect(second.body.model_fingerprint).not.toBe(firstFingerprint);
      await waitUntilDone(t, second.body.campaign_id);
      const first = await t.api().get(`/v1/campaigns/${firstId}/report`).expect(200);
      expect(first.body.homogeneous).toBe(false);
      expect(first.body.exceptions).toEqual([
        expect.objectContaining({ station_id: 'CAMP02', day: DAYS[1], fingerprint: second.body.model_fingerprint }),
      ]);
      expect(first.body.fingerprints).toEqual(
        expect.arrayContaining([
          { fingerprint: firstFingerprint, station_days: 3 },
          { fingerprint: second.body.model_fingerprint, station_days: 1 },
        ]),
      );
      const secondReport = await t.api().get(`/v1/campaigns/${second.body.campaign_id}/report`).expect(200);
      expect(secondReport.body.homogeneous).toBe(true);
      const list = await t.api().get('/v1/campaigns').expect(200);
      expect(list.body.campaigns.map((c: { campaign_id: string }) => c.campaign_id)).toEqual([second.body.campaign_id, firstId]);
    });

    it('answers bad input with a 4xx naming the field', async () => {
      const post = (body: object) => t.api().post('/v1/campaigns').set('Authorization', t.auth).send(body);
      const field = async (body: object, status: number) => (await post(body).expect(status)).body.errors[0].field;
      expect(await field({ start_date: DAYS[1], end_date: DAYS[0] }, 400)).toBe('end_date');
      expect(await field({ start_date: '2026-13-01', end_date: DAYS[0] }, 400)).toBe('start_date');
      expect(await field({ stations: ['NOSUCH'], start_date: DAYS[0], end_date: DAYS[1] }, 400)).toBe('stations.0');
      expect(await field({ start_date: DAYS[0], end_date: DAYS[1], options: { elevation_cutof_deg: 5 } }, 400)).toContain('options');
      expect(await field({ start_date: DAYS[0], end_date: DAYS[1], options: { wet_mapping: 'vmf1' } }, 400)).toBe('options.wet_mapping');
      expect(await field({ start_date: DAYS[0], end_date: DAYS[1], colour: 'red' }, 400)).toBe('colour');
      expect(await field({ start_date: '2025-01-01', end_date: '2025-01-31' }, 422)).toBe('start_date');
      await t.api().post('/v1/campaigns').send({ start_date: DAYS[0], end_date: DAYS[1] }).expect(401);
      await t.api().get('/v1/campaigns/nosuch').expect(404);
      await t.api().get('/v1/campaigns/nosuch/report').expect(404);
      await t.api().post('/v1/campaigns/nosuch/cancel').set('Authorization', t.auth).expect(404);
      await t.api().post(`/v1/campaigns/${firstId}/cancel`).set('Authorization', t.auth).expect(409);
    });

    it('exactly once: a claim taken over by a redelivery stores nothing, and a done item is not run again', async () => {
      const store = new CampaignStore(t.app().repository.sqlExecutor());
      const item = { stationId: 'CAMP01', day: DAYS[0]! };
      const campaignId = 'exactly-once-test';
      await store.create(
        {
          campaignId,
          name: null,
          state: 'queued',
          startDate: DAYS[0]!,
          endDate: DAYS[0]!,
          optionsJson: '{}',
          modelFingerprint: 'f0',
          source: 'exactly-once',
          inputKind: 'deposits',
          windowLengthMs: null,
          windowStepMs: null,
          uploadsClosedAt: null,
          createdAt: new Date().toISOString(),
          startedAt: null,
          finishedAt: null,
        },
        [item],
      );
      expect(await store.claim(campaignId, item, 'token-a', 'replica-a', new Date().toISOString())).toBe(true);
      // The job expired; another replica claims the item again.
      expect(await store.claim(campaignId, item, 'token-b', 'replica-b', new Date().toISOString())).toBe(true);
      const row = ztdOnlyRow(Date.parse(`${DAYS[0]}T01:00:00Z`), 'exactly-once', 2.4, 'f0', 0.003);
      const modelSet = { modelFingerprint: 'f0', models: { test: 'exactly-once' } };
      const done = { residualSha256: 'x', modelFingerprint: 'f0', cpuMs: 1, finishedAtMs: Date.now() };
      // The first replica, presumed dead, finishes late: its guard refuses and nothing is stored.
      await expect(
        t.app().repository.writeDelays('CAMP01', [row], modelSet, store.doneGuard(campaignId, item, 'token-a', done)),
      ).rejects.toThrow(GuardRefusedError);
      expect(await t.app().repository.readDelays('CAMP01', { fromMs: row.epochMs, toMs: row.epochMs }, 'exactly-once')).toEqual([]);
      await t.app().repository.writeDelays('CAMP01', [row], modelSet, store.doneGuard(campaignId, item, 'token-b', done));
      expect(await t.app().repository.readDelays('CAMP01', { fromMs: row.epochMs, toMs: row.epochMs }, 'exactly-once')).toHaveLength(1);
      // A redelivery of the done item: not claimed, nothing estimated.
      let estimated = 0;
      const outcome = await runItem(
        { campaignId, ...item },
        {
          repository: t.app().repository,
          campaigns: store,
          residuals: undefined as never,
          uploads: undefined as never,
          estimate: async () => {
            estimated++;
            return { ok: false, reason: 'must not run' };
          },
          replica: 'replica-c',
        },
      );
      expect(outcome).toBe('skipped');
      expect(estimated).toBe(0);
      const items = await store.items(campaignId);
      expect(items[0]).toMatchObject({ state: 'done', attempts: 2, replica: 'replica-b' });
    });
  });

  describe(`cancelling a campaign on ${backend.name} (a replica that takes no items)`, () => {
    const t = useArchiveApp(backend, { campaigns: { concurrency: 0 } });
    it('cancels the pending items; cancelling again keeps it cancelled', async () => {
      await setUpNetwork(t);
      const submitted = await t
        .api()
        .post('/v1/campaigns')
        .set('Authorization', t.auth)
        .send({ start_date: DAYS[0], end_date: DAYS[1] })
        .expect(202);
      expect(submitted.body).toMatchObject({ state: 'queued', items_pending: 4 });
      const cancelled = await t.api().post(`/v1/campaigns/${submitted.body.campaign_id}/cancel`).set('Authorization', t.auth).expect(200);
      expect(cancelled.body).toMatchObject({ state: 'cancelled', items_pending: 0, items_cancelled: 4, items_done: 0 });
      expect(cancelled.body.finished_at).not.toBeNull();
      await t.api().post(`/v1/campaigns/${submitted.body.campaign_id}/cancel`).set('Authorization', t.auth).expect(200);
      const report = await t.api().get(`/v1/campaigns/${submitted.body.campaign_id}/report`).expect(200);
      expect(report.body).toMatchObject({ state: 'cancelled', items: { total: 4, done: 0, cancelled: 4 }, fingerprints: [] });
    });
  });
}
