/**
 * An acknowledged write survives a crash (issue 4, Reliability): the real server runs as a child
 * process (tsx), three clients stream met batches at it, the process is killed with SIGKILL in the
 * middle, restarted on the same storage, and every acknowledged record must be there with its
 * values, and every batch must be there whole or not at all (one transaction per request).
 * Runs on every backend of BACKENDS. Loopback only.
 */

import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import type { StorageConfig } from '../../src/storage/factory.js';
import { TEST_KEY } from '../helpers/archive-app.js';
import { serverEnvironment } from '../helpers/server-process.js';
import { BACKENDS } from '../helpers/storage.js';

const ROOT = new URL('../../', import.meta.url).pathname;
const BATCH = 100;
const WRITERS = 3;
const WRITE_FOR_MS = 1500;
const T0 = Date.UTC(2026, 0, 1);
const MIN = 60_000;

interface Server {
  child: ChildProcess;
  base: string;
}

function startServer(storage: StorageConfig): Promise<Server> {
  // Settings under their current names (serverEnvironment); port 0: the log line says which one.
  const env = serverEnvironment(
    0,
    {
      LOG_LEVEL: 'info',
      TROPODELAY_WARM_UP_ESTIMATIONS: '0', // cold threads, as startServerProcess's: the writes use none, the warm-up's CPU would slow the stream
      TROPO_DATA_DIR: storage.dataDir,
      TROPO_API_KEYS: TEST_KEY,
      ...(storage.databaseUrl ? { DATABASE_URL: storage.databaseUrl } : {}),
      ...(storage.pgSchema ? { TROPO_PG_SCHEMA: storage.pgSchema } : {}),
    },
    { PATH: process.env.PATH, HOME: process.env.HOME },
  );
  const child = spawn(process.execPath, ['--import', 'tsx', 'src/server.ts'], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
  return new Promise((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`server did not start: ${out}`)), 30_000);
    const onData = (chunk: Buffer) => {
      out += chunk.toString();
      const m = /listening at (http:\/\/127\.0\.0\.1:\d+)/.exec(out);
      if (m) {
        clearTimeout(timer);
        child.stdout!.off('data', onData);
        child.stdout!.resume();
        resolve({ child, base: m[1]! });
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (c: Buffer) => (out += c.toString()));
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server exited (${code}) before listening: ${out}`));
    });
  });
}

const pressureOf = (epochIndex: number) => 950 + (epochIndex % 1000) / 10;

async function writeBatch(base: string, batch: number): Promise<boolean> {
  const records = Array.from({ length: BATCH }, (_, j) => {
    const k = batch * BATCH + j;
    return { epoch: new Date(T0 + k * MIN).toISOString(), pressure_hpa: pressureOf(k), temperature_c: (k % 400) / 10 - 10 };
  });
  const res = await fetch(`${base}/v1/stations/CRASH/met`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', authorization: `Bearer ${TEST_KEY}` },
    body: JSON.stringify({ records, source: 'stream' }),
  });
  if (res.status !== 200) return false;
  const body = (await res.json()) as { inserted: number };
  return body.inserted === BATCH;
}

for (const backend of BACKENDS) {
  describe(`crash safety on ${backend.name}: SIGKILL during a stream of writes`, () => {
    const children: ChildProcess[] = [];
    let cleanup: (() => Promise<void>) | undefined;
    afterAll(async () => {
      for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
      await cleanup?.();
    });

    it('every acknowledged record is there after the restart, and no batch is half-written', async () => {
      const fresh = await backend.fresh();
      cleanup = fresh.cleanup;
      const first = await startServer(fresh.config);
      children.push(first.child);
      const put = await fetch(`${first.base}/v1/stations/CRASH`, {
        method: 'PUT',
        headers: { 'content-type': 'application/json', authorization: `Bearer ${TEST_KEY}` },
        body: JSON.stringify({ name: 'Crash test (invented)', latitude_deg: 10, longitude_deg: 20, height_m: 30 }),
      });
      expect(put.status).toBe(201);

      const acked: number[] = [];
      let nextBatch = 0;
      let killed = false;
      const writer = async () => {
        while (!killed) {
          const batch = nextBatch++;
          try {
            if (await writeBatch(first.base, batch)) acked.push(batch);
          } catch {
            return; // connection reset by the kill
          }
        }
      };
      const writers = Array.from({ length: WRITERS }, writer);
      await new Promise((r) => setTimeout(r, WRITE_FOR_MS));
      const exited = new Promise((r) => first.child.once('exit', r));
      first.child.kill('SIGKILL');
      killed = true;
      await exited;
      await Promise.all(writers);
      const attempted = nextBatch;
      expect(acked.length).toBeGreaterThan(3);

      if (backend.name === 'sqlite') {
        // The database file is consistent after the kill (SQLite's own check).
        const db = new Database(join(fresh.config.dataDir, 'tropodelay.sqlite'), { readonly: true });
        expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
        db.close();
      }

      const second = await startServer(fresh.config);
      children.push(second.child);
      const res = await fetch(
        `${second.base}/v1/stations/CRASH/met?from=${new Date(T0).toISOString()}&to=${new Date(T0 + attempted * BATCH * MIN).toISOString()}`,
      );
      expect(res.status).toBe(200);
      const stored = ((await res.json()) as { records: { epoch: string; pressure_hpa: number }[] }).records;
      const byIndex = new Map(stored.map((r) => [Math.round((Date.parse(r.epoch) - T0) / MIN), r.pressure_hpa]));
      for (const batch of acked) {
        for (let j = 0; j < BATCH; j++) {
          const k = batch * BATCH + j;
          expect(byIndex.get(k), `record ${k} of acknowledged batch ${batch}`).toBe(pressureOf(k));
        }
      }
      for (let batch = 0; batch < attempted; batch++) {
        let present = 0;
        for (let j = 0; j < BATCH; j++) if (byIndex.has(batch * BATCH + j)) present++;
        expect([0, BATCH], `batch ${batch} has ${present} of ${BATCH} records`).toContain(present);
      }
      expect(stored.length).toBeGreaterThanOrEqual(acked.length * BATCH);
      second.child.kill('SIGTERM');
      await new Promise((r) => second.child.once('exit', r));
    });
  });
}
