/**
 * A PostgreSQL campaign whose jobs were never queued (the submitting replica died between the campaign's
 * rows and the queue send) is not left pending: the sweep of src/http/plugins/campaigns.ts queues the
 * pending items that carry no queued mark once they have been ready for the grace time, and the campaign
 * finishes with every station-day stored once. Needs TEST_DATABASE_URL (skipped without it); SQLite's
 * single-process queue takes unfinished items up at start instead (campaigns.test.ts).
 */

import { describe, expect, it } from 'vitest';
import { CampaignStore } from '../../src/storage/campaigns/campaign-store.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { inventedStations, stationDay } from '../helpers/campaign-network.js';
import { postgresBackend, TEST_PG_URL } from '../helpers/storage.js';

const STATIONS = inventedStations(2);
const DAY = '2026-09-01';

describe.skipIf(!TEST_PG_URL)('the sweep queues the items of a campaign whose jobs were never sent (PostgreSQL)', () => {
  const t = useArchiveApp(postgresBackend, { campaigns: { sweepIntervalS: 1, sweepGraceS: 2 } });

  it('a campaign made without its queue send finishes once the sweep has queued its items', { timeout: 120_000 }, async () => {
    for (const [k, s] of STATIONS.entries()) {
      await t.api().put(`/v1/stations/${s.id}`).set('Authorization', t.auth).send(s.body).expect(201);
      await t
        .api()
        .put(`/v1/stations/${s.id}/residuals/${DAY}`)
        .set('Authorization', t.auth)
        .send(stationDay(s, k, DAY, 3, 300).body)
        .expect(201);
    }
    // What CampaignService.submit writes before its queue send, and nothing after it (the replica died there).
    const store = new CampaignStore(t.app().repository.sqlExecutor());
    const campaignId = 'never-queued';
    const createdMs = Date.now();
    await store.create(
      {
        campaignId,
        name: 'died before the queue send',
        state: 'queued',
        startDate: DAY,
        endDate: DAY,
        optionsJson: '{}',
        modelFingerprint: 'unknown',
        source: 'zwd-estimates',
        inputKind: 'deposits',
        windowLengthMs: null,
        windowStepMs: null,
        uploadsClosedAt: null,
        createdAt: new Date(createdMs).toISOString(),
        startedAt: null,
        finishedAt: null,
      },
      STATIONS.map((s) => ({ stationId: s.id, day: DAY })),
    );
    const queuedAt = async () =>
      (
        await t
          .app()
          .repository.sqlExecutor()
          .all<{ queued_at_ms: string | null }>('SELECT queued_at_ms FROM campaign_items WHERE campaign_id = ?', [campaignId])
      ).map((r) => (r.queued_at_ms === null ? null : Number(r.queued_at_ms)));
    expect(await queuedAt()).toEqual([null, null]);

    const deadline = Date.now() + 90_000;
    let status;
    for (;;) {
      status = (await t.api().get(`/v1/campaigns/${campaignId}`).expect(200)).body;
      if (status.state === 'finished') break;
      if (Date.now() > deadline) throw new Error(`still ${status.state}: ${JSON.stringify(status)}`);
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toMatchObject({ items_done: 2, items_pending: 0, items_failed: 0 });
    // Queued by the sweep, not before the grace time (2 s) had passed.
    for (const q of await queuedAt()) expect(q! - createdMs).toBeGreaterThanOrEqual(2000);
    // Nothing left for a later sweep.
    expect(await t.app().campaigns.sweepUnqueued(0)).toEqual([]);
    for (const s of STATIONS) {
      const rows = await t
        .app()
        .repository.readDelays(s.id, { fromMs: Date.parse(`${DAY}T00:00:00Z`), toMs: Date.parse(`${DAY}T23:59:59Z`) }, 'zwd-estimates');
      expect(rows.length).toBe(36); // 3 h at 300 s: one row per observation epoch (the generator's sampling)
    }
  });
});
