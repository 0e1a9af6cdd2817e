/**
 * Backups (issue 15 item 4). SQLite: `npm run backup` (scripts/backup.ts) run as its own process while the
 * service takes a write load produces a file that passes PRAGMA integrity_check (SQLite documentation,
 * "PRAGMA integrity_check": the single row "ok" means no problem found) and holds every row acknowledged
 * before the backup began; the file restores into a working archive. PostgreSQL: the pg_dump / pg_restore
 * commands of docs/operations.md, run against the CI's PostgreSQL, restore every row into a fresh database.
 * Station names are invented.
 */

import { spawn, spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import Database from 'better-sqlite3';
import type { FastifyInstance } from 'fastify';
import pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/http/app.js';
import type { StorageConfig } from '../../src/storage/factory.js';
import { SQLITE_FILE_NAME } from '../../src/storage/sqlite/sqlite-repository.js';
import { TEST_PG_URL, postgresBackend } from '../helpers/storage.js';

const KEY = 'backup-test-key-0123456789';
const AUTH = `Bearer ${KEY}`;
const STATION = { name: 'Brackenmoor Weir (invented)', latitude_deg: 51.7, longitude_deg: 6.1, height_m: 31.5 };
const ROWS_PER_UPLOAD = 50;
const T0 = Date.UTC(2026, 5, 1);
const iso = (ms: number) => new Date(ms).toISOString();

function metCsv(k: number): string {
  const lines = ['epoch,pressure_hpa,temperature_c,relative_humidity_pct'];
  for (let i = 0; i < ROWS_PER_UPLOAD; i++)
    lines.push(`${iso(T0 + (k * ROWS_PER_UPLOAD + i) * 60_000)},${1000 + (i % 7)},${10 + (i % 5)},${50 + (i % 9)}`);
  return lines.join('\n');
}

async function archiveApp(storage: StorageConfig): Promise<FastifyInstance> {
  return buildApp({
    validateResponses: true,
    archive: { storage, apiKeys: [KEY], keyDir: storage.dataDir, readKeysRequired: false, maxReadRangeDays: 366 },
  });
}

/** Writes station + met uploads until stopped; `acked` lists the uploads whose 200 has been received. */
function writeLoad(app: FastifyInstance) {
  const acked: number[] = [];
  let stop = false;
  const done = (async () => {
    for (let k = 0; !stop; k++) {
      const id = `W${String(k).padStart(4, '0')}`;
      await request(app.server).put(`/v1/stations/${id}`).set('authorization', AUTH).send(STATION).expect(201);
      const res = await request(app.server)
        .post(`/v1/stations/${id}/met`)
        .set('authorization', AUTH)
        .set('content-type', 'text/csv')
        .send(metCsv(k));
      expect(res.status).toBe(200);
      expect(res.body.inserted).toBe(ROWS_PER_UPLOAD);
      acked.push(k);
    }
  })();
  return { acked, stop: async () => ((stop = true), await done) };
}

function runBackup(args: string[], env: NodeJS.ProcessEnv = {}): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/backup.ts', ...args], { env: { ...process.env, ...env } });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

describe('SQLite: npm run backup during a write load', { timeout: 180_000 }, () => {
  let dir: string;
  let app: FastifyInstance;
  let backupPath: string;
  let ackedBefore: number[] = [];
  let ackedAfter = 0;
  let report: Record<string, unknown>;

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'tropodelay-backup-'));
    app = await archiveApp({ dataDir: join(dir, 'live') });
    backupPath = join(dir, 'copies', 'backup.sqlite');
    const load = writeLoad(app);
    while (load.acked.length < 10) await new Promise((r) => setTimeout(r, 20));
    ackedBefore = [...load.acked];
    const result = await runBackup(['--data-dir', join(dir, 'live'), '--out', backupPath]);
    await load.stop();
    ackedAfter = load.acked.length;
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    report = JSON.parse(result.stdout) as Record<string, unknown>;
  });
  afterAll(async () => {
    await app?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('the service kept writing while the backup ran', () => {
    expect(ackedAfter).toBeGreaterThan(ackedBefore.length);
  });

  it('the copy passes PRAGMA integrity_check (checked here, independently of the command)', () => {
    const db = new Database(backupPath, { readonly: true });
    try {
      expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    } finally {
      db.close();
    }
    expect(report).toMatchObject({ path: backupPath, integrity: 'ok' });
  });

  it('holds every station and met row acknowledged before the backup began', () => {
    const db = new Database(backupPath, { readonly: true });
    try {
      const count = db.prepare('SELECT COUNT(*) AS n FROM met_records WHERE station_id = ?');
      for (const k of ackedBefore) {
        const id = `W${String(k).padStart(4, '0')}`;
        expect(db.prepare('SELECT name FROM stations WHERE station_id = ?').get(id)).toEqual({ name: STATION.name });
        expect((count.get(id) as { n: number }).n).toBe(ROWS_PER_UPLOAD);
      }
      const reported = report['rowCounts'] as Record<string, number>;
      expect(reported['met_records']).toBe((db.prepare('SELECT COUNT(*) AS n FROM met_records').get() as { n: number }).n);
    } finally {
      db.close();
    }
  });

  it('restores: an archive started on the copy answers reads as the original did', async () => {
    const restoredDir = join(dir, 'restored');
    const restoredFile = join(restoredDir, SQLITE_FILE_NAME);
    rmSync(restoredDir, { recursive: true, force: true });
    mkdirSync(restoredDir);
    copyFileSync(backupPath, restoredFile);
    const restored = await archiveApp({ dataDir: restoredDir });
    try {
      expect((await request(restored.server).get('/v1/ready')).status).toBe(200);
      for (const k of ackedBefore) {
        const id = `W${String(k).padStart(4, '0')}`;
        const path = `/v1/stations/${id}/met?from=${iso(T0)}&to=${iso(T0 + 86_400_000)}`;
        const [original, copy] = await Promise.all([request(app.server).get(path), request(restored.server).get(path)]);
        expect(copy.status).toBe(200);
        expect(copy.body).toEqual(original.body);
      }
    } finally {
      await restored.close();
    }
  });

  it('never overwrites an existing file, and leaves no partial file', async () => {
    const again = await runBackup(['--data-dir', join(dir, 'live'), '--out', backupPath]);
    expect(again.code).toBe(1);
    expect(again.stderr).toMatch(/exists already: choose a new file name/);
    expect(existsSync(`${backupPath}.partial`)).toBe(false);
  });

  it('refuses when the service is configured for PostgreSQL, pointing to pg_dump', async () => {
    const r = await runBackup([], { TROPODELAY_DATABASE_URL: 'postgres://db.invalid:5432/x', DATABASE_URL: '' });
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/PostgreSQL: back it up with pg_dump/);
  });
});

const pgDumpOnPath = spawnSync('pg_dump', ['--version']).status === 0;

describe.runIf(TEST_PG_URL && pgDumpOnPath)(
  'PostgreSQL: pg_dump and pg_restore as docs/operations.md shows them',
  { timeout: 180_000 },
  () => {
    let storage: StorageConfig;
    let cleanup: () => Promise<void>;
    let app: FastifyInstance;
    let dumpDir: string;
    const restoreDb = `restore_${randomBytes(5).toString('hex')}`;
    const restoreUrl = () => {
      const url = new URL(TEST_PG_URL!);
      url.pathname = `/${restoreDb}`;
      return url.toString();
    };
    const admin = async <T>(url: string, work: (c: pg.Client) => Promise<T>): Promise<T> => {
      const client = new pg.Client({ connectionString: url });
      await client.connect();
      try {
        return await work(client);
      } finally {
        await client.end();
      }
    };
    /** Every row of every table of the schema, in key order, as text. */
    const allRows = (url: string, schema: string) =>
      admin(url, async (c) => {
        const tables = (
          await c.query<{ table_name: string }>(
            'SELECT table_name FROM information_schema.tables WHERE table_schema = $1 ORDER BY table_name',
            [schema],
          )
        ).rows.map((r) => r.table_name);
        const out: Record<string, string[]> = {};
        for (const t of tables) {
          const rows = await c.query(`SELECT to_jsonb(x)::text AS j FROM "${schema}"."${t}" x`);
          out[t] = rows.rows.map((r: { j: string }) => r.j).sort();
        }
        return out;
      });

    beforeAll(async () => {
      const fresh = await postgresBackend.fresh();
      storage = fresh.config;
      cleanup = fresh.cleanup;
      app = await archiveApp(storage);
      for (let k = 0; k < 5; k++) {
        const id = `P${k}`;
        await request(app.server).put(`/v1/stations/${id}`).set('authorization', AUTH).send(STATION).expect(201);
        await request(app.server)
          .post(`/v1/stations/${id}/met`)
          .set('authorization', AUTH)
          .set('content-type', 'text/csv')
          .send(metCsv(k))
          .expect(200);
      }
      dumpDir = mkdtempSync(join(tmpdir(), 'tropodelay-pgdump-'));
      // The campaign queue (pg-boss) starts after the app is ready without holding it up, creating its
      // tables as it goes; dump once it has, so that the schema does not change under the dump.
      for (const deadline = Date.now() + 30_000; ;) {
        const started = await admin(TEST_PG_URL!, (c) =>
          c.query(`SELECT 1 FROM "${storage.pgSchema}".queue WHERE name = 'tropodelay-campaign-items'`).then(
            (r) => r.rowCount === 1,
            () => false,
          ),
        );
        if (started) break;
        if (Date.now() > deadline) throw new Error('the campaign queue did not start within 30 s');
        await new Promise((r) => setTimeout(r, 100));
      }
    });
    afterAll(async () => {
      await app?.close();
      await admin(TEST_PG_URL!, (c) => c.query(`DROP DATABASE IF EXISTS "${restoreDb}"`));
      await cleanup?.();
      rmSync(dumpDir, { recursive: true, force: true });
    });

    it('pg_dump --format=custom of the schema, pg_restore into a fresh database: every row comes back, and the service is ready on it', async () => {
      const dump = join(dumpDir, 'tropodelay.dump');
      const dumped = spawnSync('pg_dump', ['--format=custom', `--schema=${storage.pgSchema}`, `--file=${dump}`, TEST_PG_URL!], {
        encoding: 'utf8',
      });
      expect(dumped.stderr).toBe('');
      expect(dumped.status).toBe(0);
      await admin(TEST_PG_URL!, (c) => c.query(`CREATE DATABASE "${restoreDb}"`));
      const restored = spawnSync('pg_restore', ['--no-owner', '--exit-on-error', `--dbname=${restoreUrl()}`, dump], { encoding: 'utf8' });
      expect(restored.stderr).toBe('');
      expect(restored.status).toBe(0);

      const original = await allRows(TEST_PG_URL!, storage.pgSchema!);
      const copy = await allRows(restoreUrl(), storage.pgSchema!);
      expect(original['met_records']).toHaveLength(5 * ROWS_PER_UPLOAD);
      expect(Object.keys(copy)).toEqual(Object.keys(original));
      expect(copy).toEqual(original);

      const onCopy = await archiveApp({ ...storage, databaseUrl: restoreUrl() });
      try {
        expect((await request(onCopy.server).get('/v1/ready')).status).toBe(200);
        await request(onCopy.server).get('/v1/stations/P3').expect(200);
      } finally {
        await onCopy.close();
      }
    });
  },
);
