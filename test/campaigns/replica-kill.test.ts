/**
 * A campaign on two replicas (child processes) and PostgreSQL, with `kill -9` of one replica after a
 * few items are done (issue 14 item 2, "done when", at test size: 40 station-days; the 1 000-station-day
 * run is `npm run bench -- campaigns`). Every station-day must end stored exactly once — one series per
 * day with one row per epoch, each item done once — and the report homogeneous. An item the killed
 * replica held is delivered again after TROPODELAY_CAMPAIGN_ITEM_TIMEOUT_S and done by the other.
 * The same with residuals uploaded to the campaign while it runs (20 station-days, kill -9 after 3).
 * Needs TEST_DATABASE_URL (skipped without it).
 */

import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { call, consecutiveDays, depositNetwork, inventedStations, replicaEnv, stationDay } from '../helpers/campaign-network.js';
import { startServerProcess, type ServerProcess } from '../helpers/server-process.js';
import { postgresBackend, TEST_PG_URL } from '../helpers/storage.js';

const STATIONS = inventedStations(4);
const DAYS = consecutiveDays('2026-05-01', 10);
/** A killed replica's item is delivered again after this long [s]. */
const ITEM_TIMEOUT_S = 15;

describe.skipIf(!TEST_PG_URL)('a campaign survives kill -9 of one of two replicas (PostgreSQL)', () => {
  const cleanups: (() => Promise<unknown>)[] = [];
  afterAll(async () => {
    for (const c of cleanups.reverse()) await c().catch(() => undefined);
  });

  /** Two replicas (replica-a, replica-b) on the schema, each with a data directory of its own; stopped and removed after the test. */
  async function startReplicas(schema: string): Promise<[ServerProcess, ServerProcess]> {
    const replicas: ServerProcess[] = [];
    for (const name of ['replica-a', 'replica-b']) {
      const dir = mkdtempSync(join(tmpdir(), `tropodelay-${name}-`));
      cleanups.push(async () => rmSync(dir, { recursive: true, force: true }));
      const r = await startServerProcess(replicaEnv(TEST_PG_URL!, schema, dir, name, ITEM_TIMEOUT_S));
      cleanups.push(() => r.stop());
      replicas.push(r);
    }
    return replicas as [ServerProcess, ServerProcess];
  }

  it('stores every station-day exactly once and reports homogeneous', { timeout: 600_000 }, async () => {
    const fresh = await postgresBackend.fresh();
    cleanups.push(fresh.cleanup);
    const schema = fresh.config.pgSchema!;
    const [a, b] = await startReplicas(schema);
    const deposited = await depositNetwork(a.baseUrl, STATIONS, DAYS, 6, 120);

    const db = new pg.Client({ connectionString: TEST_PG_URL });
    await db.connect();
    cleanups.push(() => db.end());
    const itemsOf = async (id: string) =>
      (
        await db.query<{ station_id: string; day: string; state: string; attempts: string; replica: string }>(
          `SELECT station_id, day, state, attempts, replica FROM "${schema}".campaign_items WHERE campaign_id = $1`,
          [id],
        )
      ).rows;

    const submitted = await call(b.baseUrl, 'POST', '/v1/campaigns', { name: 'kill test', start_date: DAYS[0], end_date: DAYS.at(-1) });
    expect(submitted.status).toBe(202);
    expect(submitted.body.items_total).toBe(STATIONS.length * DAYS.length);
    const id = submitted.body.campaign_id as string;

    // Kill replica b with -9 once a few items are done, while it holds one (it works one item at a time).
    let heldByKilled: { station_id: string; day: string }[] = [];
    for (let polls = 0; ; polls++) {
      const items = await itemsOf(id);
      const done = items.filter((i) => i.state === 'done').length;
      heldByKilled = items.filter((i) => i.state === 'running' && i.replica === 'replica-b');
      if (done >= 5 && heldByKilled.length > 0) break;
      if (polls > 30000 || done >= 30) throw new Error(`no moment with replica-b holding an item after 5 were done (${done} done)`);
      await new Promise((r) => setTimeout(r, 5));
    }
    b.child.kill('SIGKILL');
    await new Promise((r) => b.child.once('exit', r));

    const deadline = Date.now() + 300_000;
    let status;
    for (;;) {
      status = (await call(a.baseUrl, 'GET', `/v1/campaigns/${id}`)).body;
      if (status.state === 'finished') break;
      if (Date.now() > deadline) throw new Error(`not finished: ${JSON.stringify(status)}`);
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toMatchObject({ items_done: 40, items_failed: 0, items_pending: 0, items_running: 0, items_cancelled: 0 });

    // Exactly once: every item done, each station-day's series has one row per observation epoch.
    const items = await itemsOf(id);
    expect(items.every((i) => i.state === 'done')).toBe(true);
    expect(heldByKilled.length).toBeGreaterThan(0);
    for (const held of heldByKilled) {
      const item = items.find((i) => i.station_id === held.station_id && i.day === held.day)!;
      // Delivered again and done by the surviving replica.
      expect(Number(item.attempts)).toBeGreaterThanOrEqual(2);
      expect(item.replica).toBe('replica-a');
    }
    const rows = await db.query<{ station_id: string; day: string; n: string; fingerprints: string }>(
      `SELECT station_id, to_char(to_timestamp(epoch_ms / 1000.0) AT TIME ZONE 'UTC', 'YYYY-MM-DD') AS day, COUNT(*) AS n,
              COUNT(DISTINCT model_fingerprint) AS fingerprints
       FROM "${schema}".delay_rows WHERE source = 'zwd-estimates' GROUP BY 1, 2`,
    );
    expect(rows.rows).toHaveLength(40);
    for (const r of rows.rows) {
      const d = deposited.get(`${r.station_id}|${r.day}`)!;
      expect(Number(r.n)).toBe(new Set(d.data.observations.epochMs).size);
      expect(Number(r.fingerprints)).toBe(1);
    }
    const report = (await call(a.baseUrl, 'GET', `/v1/campaigns/${id}/report`)).body;
    expect(report).toMatchObject({ homogeneous: true, exceptions: [], items: { total: 40, done: 40 } });
    expect(report.fingerprints).toEqual([{ fingerprint: submitted.body.model_fingerprint, station_days: 40 }]);
    const perReplica = Object.fromEntries(
      report.throughput.per_replica.map((r: { replica: string; items_done: number }) => [r.replica, r.items_done]),
    );
    expect(perReplica['replica-a']).toBeGreaterThan(0);
    expect((perReplica['replica-a'] ?? 0) + (perReplica['replica-b'] ?? 0)).toBe(40);
  });

  it(
    'residuals uploaded while the campaign runs: every station-day stored exactly once after kill -9 of a replica',
    { timeout: 600_000 },
    async () => {
      const fresh = await postgresBackend.fresh();
      cleanups.push(fresh.cleanup);
      const schema = fresh.config.pgSchema!;
      const [a, b] = await startReplicas(schema);
      const stations = STATIONS;
      const days = DAYS.slice(0, 5);
      for (const s of stations) expect((await call(a.baseUrl, 'PUT', `/v1/stations/${s.id}`, s.body)).status).toBe(201);
      const submitted = await call(b.baseUrl, 'POST', '/v1/campaigns', {
        name: 'kill test, uploads',
        residuals: 'uploaded',
        stations: stations.map((s) => s.id),
        start_date: days[0],
        end_date: days.at(-1),
      });
      expect(submitted.status).toBe(202);
      expect(submitted.body).toMatchObject({ items_total: 20, items_awaiting_residuals: 20 });
      const id = submitted.body.campaign_id as string;

      const db = new pg.Client({ connectionString: TEST_PG_URL });
      await db.connect();
      cleanups.push(() => db.end());
      const itemsOf = async () =>
        (
          await db.query<{ station_id: string; day: string; state: string; attempts: string; replica: string }>(
            `SELECT station_id, day, state, attempts, replica FROM "${schema}".campaign_items WHERE campaign_id = $1`,
            [id],
          )
        ).rows;

      // The uploads go on through replica a while the items run; b is killed with -9 while it holds one. A day's
      // stations are uploaded together, so that both replicas have items at once, and at 30 s, so that an item runs
      // long enough to be seen running (at 120 s one took a few ms and the polls below could miss every one of b's).
      const uploaded = new Map<string, ReturnType<typeof stationDay>>();
      const uploads = (async () => {
        for (const day of days) {
          await Promise.all(
            stations.map(async (s, k) => {
              const d = stationDay(s, k, day, 6, 30);
              const r = await call(a.baseUrl, 'PUT', `/v1/campaigns/${id}/residuals/${s.id}/${day}`, d.body);
              if (r.status !== 201) throw new Error(`upload ${s.id} ${day}: ${r.status} ${JSON.stringify(r.body)}`);
              uploaded.set(`${s.id}|${day}`, d);
            }),
          );
        }
      })();
      let heldByKilled: { station_id: string; day: string }[] = [];
      for (let polls = 0; ; polls++) {
        const items = await itemsOf();
        const done = items.filter((i) => i.state === 'done').length;
        heldByKilled = items.filter((i) => i.state === 'running' && i.replica === 'replica-b');
        if (done >= 3 && heldByKilled.length > 0) break;
        if (polls > 30000 || done >= 16) throw new Error(`no moment with replica-b holding an item after 3 were done (${done} done)`);
        await new Promise((r) => setTimeout(r, 5));
      }
      b.child.kill('SIGKILL');
      await new Promise((r) => b.child.once('exit', r));
      await uploads;

      const deadline = Date.now() + 300_000;
      let status;
      for (;;) {
        status = (await call(a.baseUrl, 'GET', `/v1/campaigns/${id}`)).body;
        if (status.state === 'finished') break;
        if (Date.now() > deadline) throw new Error(`not finished: ${JSON.stringify(status)}`);
        await new Promise((r) => setTimeout(r, 250));
      }
      expect(status).toMatchObject({ items_done: 20, items_failed: 0, items_awaiting_residuals: 0, items_no_residuals: 0 });
      const items = await itemsOf();
      for (const held of heldByKilled) {
        const item = items.find((i) => i.station_id === held.station_id && i.day === held.day)!;
        expect(Number(item.attempts)).toBeGreaterThanOrEqual(2);
        expect(item.replica).toBe('replica-a');
      }
      const rows = await db.query<{ station_id: string; day: string; n: string; fingerprints: string }>(
        `SELECT station_id, to_char(to_timestamp(epoch_ms / 1000.0) AT TIME ZONE 'UTC', 'YYYY-MM-DD') AS day, COUNT(*) AS n,
              COUNT(DISTINCT model_fingerprint) AS fingerprints
       FROM "${schema}".delay_rows WHERE source = 'zwd-estimates' GROUP BY 1, 2`,
      );
      expect(rows.rows).toHaveLength(20);
      for (const r of rows.rows) {
        expect(Number(r.n)).toBe(new Set(uploaded.get(`${r.station_id}|${r.day}`)!.data.observations.epochMs).size);
        expect(Number(r.fingerprints)).toBe(1);
      }
      const report = (await call(a.baseUrl, 'GET', `/v1/campaigns/${id}/report`)).body;
      expect(report).toMatchObject({ homogeneous: true, exceptions: [], items: { total: 20, done: 20 } });
    },
  );
});
