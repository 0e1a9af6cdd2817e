/**
 * Retention of the audit trail (TROPODELAY_AUDIT_RETENTION_DAYS, src/http/plugins/retention.ts): the
 * events older than the retention period are deleted by the retention run (at start, hourly) and by
 * POST /v1/admin/purge, whose answer says how many and up to when; 0 keeps the trail forever. On every
 * backend. Expected values: the events written here and the cutoff now − days × 86 400 000 ms (the
 * setting's documented meaning; a retention period as a whole number of days is common practice).
 */

import { describe, expect, it } from 'vitest';
import { buildApp } from '../../src/http/app.js';
import { createRepository } from '../../src/storage/factory.js';
import type { AuditEvent } from '../../src/storage/access-rows.js';
import { DEFAULT_AUDIT_RETENTION_DAYS, loadConfig } from '../../src/config.js';
import { TEST_KEY, TEST_KEY_NAME, useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const DAY_MS = 86_400_000;

/** An invented audit event `ageDays` before `nowMs`. */
const eventAged = (nowMs: number, ageDays: number, i: number): AuditEvent => ({
  atMs: nowMs - ageDays * DAY_MS,
  keyName: 'field-writer',
  clientAddress: '192.0.2.44',
  method: 'POST',
  route: '/v1/stations/:station_id/met',
  path: '/v1/stations/AUD1/met',
  stationId: 'AUD1',
  source: 'sensor-a',
  records: 24,
  inserted: 24,
  updated: 0,
  unchanged: 0,
  status: 200,
  requestId: `aged-${i}`,
});

for (const backend of BACKENDS) {
  describe(`audit retention of 30 days on ${backend.name}`, () => {
    const { api, app, auth } = useArchiveApp(backend, { auditRetentionDays: 30, schedulePurge: false });

    it('POST /v1/admin/purge deletes the events older than 30 days, keeps the newer ones, and says so', async () => {
      const now = Date.now();
      const ages = [400, 90, 31, 30.01, 29.9, 1]; // days; the first four are past 30 days
      for (const [i, age] of ages.entries()) await app().repository.appendAuditEvent(eventAged(now, age, i));
      const before = Date.now();
      const answer = await api().post('/v1/admin/purge').set('authorization', auth).expect(200);
      expect(answer.body.purged).toEqual([]);
      expect(answer.body.audit_events_trimmed).toBe(4);
      expect(answer.body.audit_retention_days).toBe(30);
      const cutoffMs = Date.parse(answer.body.audit_events_cutoff);
      expect(cutoffMs).toBeGreaterThanOrEqual(before - 30 * DAY_MS);
      expect(cutoffMs).toBeLessThanOrEqual(Date.now() - 30 * DAY_MS);
      const left = await app().repository.listAuditEvents({ limit: 100 });
      // The two young invented events stay, and so does the purge's own event (audited after it ran).
      expect(left.filter((e) => e.requestId.startsWith('aged-')).map((e) => e.requestId)).toEqual(['aged-5', 'aged-4']);
      expect(left.some((e) => e.route === '/v1/admin/purge' && e.keyName === TEST_KEY_NAME)).toBe(true);
      // Run again: nothing more to delete.
      const again = await api().post('/v1/admin/purge').set('authorization', auth).expect(200);
      expect(again.body.audit_events_trimmed).toBe(0);
    });

    it('a later run (the hourly one) deletes what has aged past the period since', async () => {
      const now = Date.now();
      await app().repository.appendAuditEvent(eventAged(now, 29, 100));
      expect((await app().trimAuditTrail(now)).trimmed).toBe(0);
      const later = await app().trimAuditTrail(now + 2 * DAY_MS);
      expect(later.trimmed).toBeGreaterThanOrEqual(1);
      expect(later.cutoff).toBe(new Date(now + 2 * DAY_MS - 30 * DAY_MS).toISOString());
      expect((await app().repository.listAuditEvents({ limit: 100 })).map((e) => e.requestId)).not.toContain('aged-100');
    });
  });

  describe(`audit retention of 0 days (kept forever) on ${backend.name}`, () => {
    const { api, app, auth } = useArchiveApp(backend, { auditRetentionDays: 0, schedulePurge: false });

    it('deletes nothing, however old, and answers a null cutoff', async () => {
      await app().repository.appendAuditEvent(eventAged(Date.now(), 20 * 365, 1));
      const answer = await api().post('/v1/admin/purge').set('authorization', auth).expect(200);
      expect(answer.body).toMatchObject({ audit_events_trimmed: 0, audit_events_cutoff: null, audit_retention_days: 0 });
      expect((await app().repository.listAuditEvents({ limit: 100 })).map((e) => e.requestId)).toContain('aged-1');
    });
  });

  describe(`the scheduled retention run on ${backend.name}`, () => {
    it('trims the audit trail when the app is ready', { timeout: 60_000 }, async () => {
      const fresh = await backend.fresh();
      const repository = await createRepository(fresh.config);
      const now = Date.now();
      for (let i = 0; i < 5; i++) await repository.appendAuditEvent(eventAged(now, 500 + i, i));
      await repository.appendAuditEvent(eventAged(now, 10, 9));
      const app = await buildApp({
        archive: {
          storage: fresh.config,
          repository,
          apiKeys: [{ name: TEST_KEY_NAME, role: 'admin', secret: TEST_KEY }],
          readKeysRequired: false,
          maxReadRangeDays: 366,
          auditRetentionDays: 400,
          schedulePurge: true,
        },
      });
      try {
        // The run starts at onReady without being awaited: wait for its result (at most 30 s).
        let ids: string[] = [];
        for (let k = 0; k < 300; k++) {
          ids = (await repository.listAuditEvents({ limit: 100 })).map((e) => e.requestId);
          if (ids.length === 1) break;
          await new Promise((r) => setTimeout(r, 100));
        }
        expect(ids).toEqual(['aged-9']);
      } finally {
        await app.close();
        await fresh.cleanup();
      }
    });
  });
}

describe('TROPODELAY_AUDIT_RETENTION_DAYS', () => {
  it('defaults to 400 days (a year and a month: audit trails are often kept a year or more, common practice); 0 = forever', () => {
    expect(DEFAULT_AUDIT_RETENTION_DAYS).toBe(400);
    expect(loadConfig({}).TROPODELAY_AUDIT_RETENTION_DAYS).toBe(400);
    expect(loadConfig({ TROPODELAY_AUDIT_RETENTION_DAYS: '0' }).TROPODELAY_AUDIT_RETENTION_DAYS).toBe(0);
    expect(loadConfig({ TROPODELAY_AUDIT_RETENTION_DAYS: '36500' }).TROPODELAY_AUDIT_RETENTION_DAYS).toBe(36500);
  });

  it.each(['-1', '1.5', '36501', 'forever'])('refuses %s naming the variable and the range', (value) => {
    expect(() => loadConfig({ TROPODELAY_AUDIT_RETENTION_DAYS: value })).toThrow(
      new RegExp(`TROPODELAY_AUDIT_RETENTION_DAYS="${value}": must be a whole number in 0\\.\\.36500`),
    );
  });
});
