/**
 * The access part of the repository contract (src/storage/repository.ts, issue 15), on every backend
 * in BACKENDS: soft delete (hidden, id reserved, restorable, purged after a cutoff with its series),
 * API keys (unique names, revocation) and the audit trail (filters, newest first, limit; the trim of events
 * older than a cutoff, in batches, idempotent, on two replicas at once).
 * Expected values follow from the contract and the scenario written here (common practice).
 */

import { createHash } from 'node:crypto';
import { afterEach, describe, expect, it } from 'vitest';
import { provenance } from '../../src/domain/provenance.js';
import { MIGRATIONS } from '../../src/storage/migrations.js';
import { createRepository } from '../../src/storage/factory.js';
import type { AuditEvent, StoredApiKey } from '../../src/storage/access-rows.js';
import { StationDeletedError, UnknownStationError, type Repository } from '../../src/storage/repository.js';
import { BACKENDS } from '../helpers/storage.js';

const T0 = Date.UTC(2026, 4, 2, 0, 0, 0);
const STATION = {
  name: 'Brackenfold (invented)',
  latitudeDeg: 52.1,
  longitudeDeg: -1.3,
  heightM: 120,
  metHeightM: null,
  description: null,
};
const MET = {
  epochMs: T0,
  source: 'sensor-a',
  pressureHpa: 1001,
  temperatureC: 11,
  relativeHumidityPct: null,
  dewpointC: null,
  vapourPressureHpa: null,
};
const MODELS = provenance({ mapping: 'niell' });

const key = (name: string, role: StoredApiKey['role'], secret: string): StoredApiKey => ({
  name,
  role,
  secretSha256: createHash('sha256').update(secret).digest('hex'),
  createdAt: '2026-05-01T00:00:00.000Z',
  createdBy: null,
  revokedAt: null,
});

const event = (i: number, over: Partial<AuditEvent> = {}): AuditEvent => ({
  atMs: T0 + i * 60_000,
  keyName: 'ops-writer',
  clientAddress: '192.0.2.10',
  method: 'POST',
  route: '/v1/stations/:station_id/met',
  path: '/v1/stations/BRK/met',
  stationId: 'BRK',
  source: 'sensor-a',
  records: 10,
  inserted: 8,
  updated: 1,
  unchanged: 1,
  status: 200,
  requestId: `req-${i}`,
  ...over,
});

for (const backend of BACKENDS) {
  describe(`repository access contract on ${backend.name}`, () => {
    const opened: Repository[] = [];
    const cleanups: (() => Promise<void>)[] = [];
    afterEach(async () => {
      for (const r of opened.splice(0)) await r.close();
      for (const c of cleanups.splice(0)) await c();
    });
    async function fresh(): Promise<Repository> {
      const { config, cleanup } = await backend.fresh();
      cleanups.push(cleanup);
      const repo = await createRepository(config);
      opened.push(repo);
      return repo;
    }

    it('the schema ends at the last migration (MIGRATIONS.at(-1)), and ping accepts it', async () => {
      const repo = await fresh();
      await expect(repo.ping()).resolves.toBeUndefined();
      expect(MIGRATIONS.at(-1)!.version).toBeGreaterThanOrEqual(2);
    });

    it('a deleted station is hidden, refuses writes, keeps its id and series until restored', async () => {
      const repo = await fresh();
      await repo.putStation('BRK', STATION);
      await repo.putStation('KEEP', STATION);
      await repo.writeMet('BRK', [MET]);
      expect(await repo.deleteStation('BRK', '2026-05-02T10:00:00.000Z')).toBe(true);
      expect(await repo.deleteStation('BRK', '2026-05-02T11:00:00.000Z')).toBe(false); // already marked
      expect(await repo.getStation('BRK')).toBeNull();
      expect((await repo.listStations()).map((s) => s.stationId)).toEqual(['KEEP']);
      await expect(repo.writeMet('BRK', [MET])).rejects.toBeInstanceOf(UnknownStationError);
      await expect(
        repo.writeDelays('BRK', [], { modelFingerprint: MODELS.model_fingerprint, models: MODELS.models }),
      ).rejects.toBeInstanceOf(UnknownStationError);
      const reuse = repo.putStation('BRK', STATION);
      await expect(reuse).rejects.toBeInstanceOf(StationDeletedError);
      await expect(reuse).rejects.toMatchObject({ deletedAt: '2026-05-02T10:00:00.000Z' });
      expect(await repo.listDeletedStations()).toEqual([{ stationId: 'BRK', name: STATION.name, deletedAt: '2026-05-02T10:00:00.000Z' }]);

      expect(await repo.restoreStation('BRK')).toBe(true);
      expect(await repo.restoreStation('BRK')).toBe(false);
      expect((await repo.getStation('BRK'))?.name).toBe(STATION.name);
      expect(await repo.readMet('BRK', { fromMs: T0, toMs: T0 })).toHaveLength(1);
      expect(await repo.listDeletedStations()).toEqual([]);
    });

    it('the purge removes the stations marked at or before the cutoff, with their series, and frees the id', async () => {
      const repo = await fresh();
      for (const id of ['OLD1', 'OLD2', 'NEW1', 'LIVE']) await repo.putStation(id, STATION);
      await repo.writeMet('OLD1', [MET]);
      await repo.deleteStation('OLD1', '2026-03-01T00:00:00.000Z');
      await repo.deleteStation('OLD2', '2026-04-01T00:00:00.000Z');
      await repo.deleteStation('NEW1', '2026-04-01T00:00:00.001Z');
      expect(await repo.purgeDeletedBefore('2026-04-01T00:00:00.000Z')).toEqual(['OLD1', 'OLD2']);
      expect(await repo.purgeDeletedBefore('2026-04-01T00:00:00.000Z')).toEqual([]);
      expect((await repo.listDeletedStations()).map((s) => s.stationId)).toEqual(['NEW1']);
      expect((await repo.listStations()).map((s) => s.stationId)).toEqual(['LIVE']);
      // The id is free again, and the old series is gone with the station.
      expect((await repo.putStation('OLD1', STATION)).created).toBe(true);
      expect(await repo.readMet('OLD1', { fromMs: 0, toMs: T0 * 2 })).toEqual([]);
      // purgeStation removes a live or a marked station at once.
      expect(await repo.purgeStation('NEW1')).toBe(true);
      expect(await repo.purgeStation('LIVE')).toBe(true);
      expect(await repo.purgeStation('LIVE')).toBe(false);
    });

    it('keys: a name is stored once, secrets as digests, revoked keys stay listed', async () => {
      const repo = await fresh();
      expect(await repo.createApiKey(key('ops-reader', 'read', 'reader-secret-0123456789'))).toBe(true);
      expect(await repo.createApiKey(key('ops-reader', 'admin', 'other-secret-0123456789'))).toBe(false);
      expect(await repo.createApiKey(key('ops-admin', 'admin', 'admin-secret-0123456789'))).toBe(true);
      const listed = await repo.listApiKeys();
      expect(listed.map((k) => [k.name, k.role])).toEqual([
        ['ops-admin', 'admin'],
        ['ops-reader', 'read'],
      ]);
      // SHA-256 of the secret in hex: 64 hex digits, and not the secret.
      expect(listed[1]!.secretSha256).toMatch(/^[0-9a-f]{64}$/);
      expect(await repo.revokeApiKey('ops-reader', '2026-05-02T12:00:00.000Z')).toBe(true);
      expect(await repo.revokeApiKey('ops-reader', '2026-05-02T13:00:00.000Z')).toBe(false);
      expect(await repo.revokeApiKey('nobody', '2026-05-02T13:00:00.000Z')).toBe(false);
      expect((await repo.listApiKeys()).find((k) => k.name === 'ops-reader')?.revokedAt).toBe('2026-05-02T12:00:00.000Z');
    });

    it('audit events come back newest first, filtered by time, station and key, with their counts', async () => {
      const repo = await fresh();
      await repo.appendAuditEvent(event(0));
      await repo.appendAuditEvent(
        event(1, {
          stationId: 'OTHER',
          keyName: 'ops-admin',
          method: 'DELETE',
          records: null,
          inserted: null,
          updated: null,
          unchanged: null,
          status: 204,
        }),
      );
      await repo.appendAuditEvent(event(2, { keyName: null, clientAddress: '2001:db8::7', status: 403 }));
      const all = await repo.listAuditEvents({ limit: 100 });
      expect(all.map((e) => e.requestId)).toEqual(['req-2', 'req-1', 'req-0']);
      expect(all[2]).toMatchObject({ ...event(0), eventId: expect.any(Number) });
      expect(all[1]).toMatchObject({ method: 'DELETE', records: null, status: 204 });
      expect((await repo.listAuditEvents({ limit: 100, stationId: 'BRK' })).map((e) => e.requestId)).toEqual(['req-2', 'req-0']);
      expect((await repo.listAuditEvents({ limit: 100, keyName: 'ops-admin' })).map((e) => e.requestId)).toEqual(['req-1']);
      expect((await repo.listAuditEvents({ limit: 100, fromMs: T0 + 60_000, toMs: T0 + 60_000 })).map((e) => e.requestId)).toEqual([
        'req-1',
      ]);
      expect((await repo.listAuditEvents({ limit: 1 })).map((e) => e.requestId)).toEqual(['req-2']);
    });

    // The audit trim (TROPODELAY_AUDIT_RETENTION_DAYS): strictly older than the cutoff goes, the cutoff's own
    // millisecond and later stay; a second run finds nothing (idempotent). Contract of repository.ts.
    it('the audit trim deletes the events before the cutoff in batches, keeps the rest, and finds nothing the second time', async () => {
      const repo = await fresh();
      for (let i = 0; i < 23; i++) await repo.appendAuditEvent(event(i)); // one a minute from T0
      const cutoffMs = T0 + 10 * 60_000; // events 0..9 are older; event 10 is at the cutoff and stays
      expect(await repo.trimAuditEventsBefore(cutoffMs, { batchRows: 3 })).toBe(10); // 4 batches: 3 + 3 + 3 + 1
      const left = await repo.listAuditEvents({ limit: 100 });
      expect(left.map((e) => e.requestId)).toEqual(Array.from({ length: 13 }, (_, k) => `req-${22 - k}`));
      expect(Math.min(...left.map((e) => e.atMs))).toBe(cutoffMs);
      expect(await repo.trimAuditEventsBefore(cutoffMs, { batchRows: 3 })).toBe(0);
      // The default batch size as well, with a later cutoff.
      expect(await repo.trimAuditEventsBefore(T0 + 20 * 60_000)).toBe(10);
      expect((await repo.listAuditEvents({ limit: 100 })).map((e) => e.requestId)).toEqual(['req-22', 'req-21', 'req-20']);
    });

    it('two trims at once (two replicas) delete each old event once between them, and nothing newer', async () => {
      const repo = await fresh();
      for (let i = 0; i < 40; i++) await repo.appendAuditEvent(event(i));
      const cutoffMs = T0 + 30 * 60_000;
      const [a, b] = await Promise.all([
        repo.trimAuditEventsBefore(cutoffMs, { batchRows: 4 }),
        repo.trimAuditEventsBefore(cutoffMs, { batchRows: 4 }),
      ]);
      expect(a + b).toBe(30);
      expect((await repo.listAuditEvents({ limit: 100 })).map((e) => e.atMs)).toEqual(
        Array.from({ length: 10 }, (_, k) => T0 + (39 - k) * 60_000),
      );
    });

    it('an aborted trim stops after its current batch; the next run goes on where it stopped', async () => {
      const repo = await fresh();
      for (let i = 0; i < 10; i++) await repo.appendAuditEvent(event(i));
      const stop = new AbortController();
      stop.abort();
      expect(await repo.trimAuditEventsBefore(T0 + 8 * 60_000, { batchRows: 3, signal: stop.signal })).toBe(3);
      expect(await repo.trimAuditEventsBefore(T0 + 8 * 60_000, { batchRows: 3 })).toBe(5);
      expect(await repo.listAuditEvents({ limit: 100 })).toHaveLength(2);
    });
  });
}
