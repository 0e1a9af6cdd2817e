/**
 * Writes under contention and storage faults, through HTTP (issue 11, items 5 and 11):
 *
 * - opposite-order concurrent uploads of the same keys (every backend): no 500 in 40 rounds, and
 *   the stored rows equal one of the two uploads (no mix: each upload is one transaction);
 * - SQLite: a disk that is full (SQLITE_FULL, provoked with SQLite's own max_page_count limit, which
 *   raises the same error as a full file system: https://sqlite.org/pragma.html#pragma_max_page_count),
 *   and a database file whose write lock another process holds (SQLITE_BUSY after the busy timeout):
 *   503 with Retry-After, no driver text, nothing stored, and the same request succeeds once the
 *   fault is gone;
 * - readiness notices a data directory below its free-space floor.
 *
 * Expected behaviour from the issue ("deadlocks answer 500", "disk full answers 500").
 */

import { join } from 'node:path';
import Database from 'better-sqlite3';
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/http/app.js';
import { TEST_KEY, useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS, sqliteBackend } from '../helpers/storage.js';

const T0 = Date.UTC(2026, 4, 1);
const MIN = 60_000;
const STATION = { name: 'Fenwick Hollow (invented)', latitude_deg: 52.1, longitude_deg: 5.2, height_m: 12 };
const iso = (ms: number) => new Date(ms).toISOString();

function metRecords(round: number, n: number, pressureHpa: number) {
  return Array.from({ length: n }, (_, j) => ({ epoch: iso(T0 + (round * n + j) * MIN), pressure_hpa: pressureHpa, temperature_c: 10 }));
}

for (const backend of BACKENDS) {
  describe(`opposite-order concurrent uploads on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);
    const ROUNDS = 40;
    const N = 2000;

    it(`${ROUNDS} rounds: 0 x 500, and the stored rows are those of one upload`, async () => {
      await api().put('/v1/stations/FENW').set('authorization', auth).send(STATION).expect(201);
      const statuses: number[] = [];
      for (let round = 0; round < ROUNDS; round++) {
        const a = metRecords(round, N, 1001);
        const b = metRecords(round, N, 1002).reverse();
        const [ra, rb] = await Promise.all([
          api().post('/v1/stations/FENW/met').set('authorization', auth).send({ source: 'race', records: a }),
          api().post('/v1/stations/FENW/met').set('authorization', auth).send({ source: 'race', records: b }),
        ]);
        statuses.push(ra.status, rb.status);
        const stored = await api()
          .get('/v1/stations/FENW/met')
          .query({ from: iso(T0 + round * N * MIN), to: iso(T0 + (round * N + N - 1) * MIN) })
          .expect(200);
        const pressures = new Set((stored.body.records as { pressure_hpa: number }[]).map((r) => r.pressure_hpa));
        expect(stored.body.records).toHaveLength(N);
        expect(pressures.size, `round ${round}: rows of both uploads mixed`).toBe(1);
      }
      expect(statuses.filter((s) => s >= 500)).toEqual([]);
      expect(statuses.every((s) => s === 200)).toBe(true);
    }, 180_000);
  });
}

describe('SQLite disk full (SQLITE_FULL)', () => {
  const { api, app, auth } = useArchiveApp(sqliteBackend);

  it('an upload answers 503 with Retry-After and stores nothing; the same upload succeeds once there is room', async () => {
    await api().put('/v1/stations/FULL1').set('authorization', auth).send(STATION).expect(201);
    const db = (app().repository as unknown as { db: Database.Database }).db;
    const pages = db.pragma('page_count', { simple: true }) as number;
    db.pragma(`max_page_count = ${pages}`);
    const records = metRecords(0, 5000, 1003);
    const full = await api().post('/v1/stations/FULL1/met').set('authorization', auth).send({ source: 'disk', records });
    expect(full.status).toBe(503);
    expect(full.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(Number(full.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    expect(full.body.detail).toMatch(/storage is full/);
    expect(full.body.detail).not.toMatch(/SQLITE|database or disk/);
    const none = await api()
      .get('/v1/stations/FULL1/met')
      .query({ from: iso(T0), to: iso(T0 + 5000 * MIN) })
      .expect(200);
    expect(none.body.records).toHaveLength(0);

    db.pragma('max_page_count = 1073741823');
    const ok = await api().post('/v1/stations/FULL1/met').set('authorization', auth).send({ source: 'disk', records }).expect(200);
    expect(ok.body.inserted).toBe(5000);
  });
});

describe('SQLite file locked by another process (SQLITE_BUSY)', () => {
  let app: FastifyInstance;
  let cleanup: () => Promise<void>;
  let dataDir: string;
  beforeAll(async () => {
    const fresh = await sqliteBackend.fresh();
    cleanup = fresh.cleanup;
    dataDir = fresh.config.dataDir;
    app = await buildApp({
      archive: {
        storage: { ...fresh.config, statementTimeoutMs: 200 },
        apiKeys: [TEST_KEY],
        readKeysRequired: false,
        maxReadRangeDays: 366,
      },
    });
  });
  afterAll(async () => {
    await app?.close();
    await cleanup?.();
  });

  it('a write waits the busy timeout, retries, then answers 503 with Retry-After; it succeeds once the lock is gone', async () => {
    const auth = `Bearer ${TEST_KEY}`;
    await request(app.server).put('/v1/stations/BUSY1').set('authorization', auth).send(STATION).expect(201);
    const other = new Database(join(dataDir, 'tropodelay.sqlite'));
    other.exec('BEGIN IMMEDIATE');
    try {
      const busy = await request(app.server)
        .post('/v1/stations/BUSY1/met')
        .set('authorization', auth)
        .send({ source: 'lock', records: metRecords(0, 10, 1004) });
      expect(busy.status).toBe(503);
      expect(busy.headers['retry-after']).toBe('1');
      expect(busy.body.detail).toMatch(/busy/);
    } finally {
      other.exec('ROLLBACK');
      other.close();
    }
    const ok = await request(app.server)
      .post('/v1/stations/BUSY1/met')
      .set('authorization', auth)
      .send({ source: 'lock', records: metRecords(0, 10, 1004) });
    expect(ok.status).toBe(200);
    expect(ok.body.inserted).toBe(10);
  });
});

describe('readiness and the data directory', () => {
  let app: FastifyInstance;
  let cleanup: () => Promise<void>;
  afterAll(async () => {
    await app?.close();
    await cleanup?.();
  });

  it('answers 503 naming the data directory when its free space is below the floor (TROPO_MIN_FREE_DISK_MB)', async () => {
    const fresh = await sqliteBackend.fresh();
    cleanup = fresh.cleanup;
    // A floor of 1 EiB: no test machine has that much free space, so statfs must report "full".
    app = await buildApp({
      archive: {
        storage: { ...fresh.config, minFreeDiskBytes: 2 ** 60 },
        apiKeys: [TEST_KEY],
        readKeysRequired: false,
        maxReadRangeDays: 366,
      },
    });
    const r = await request(app.server).get('/v1/ready').expect(503);
    expect(r.body.checks).toEqual({ database: 'ok', data_dir: 'the storage is full; nothing was written' });
    await app.close();
    app = await buildApp({
      archive: { storage: { ...fresh.config, minFreeDiskBytes: 1 }, apiKeys: [TEST_KEY], readKeysRequired: false, maxReadRangeDays: 366 },
    });
    const ok = await request(app.server).get('/v1/ready').expect(200);
    expect(ok.body.checks).toEqual({ database: 'ok', data_dir: 'ok' });
  });
});
