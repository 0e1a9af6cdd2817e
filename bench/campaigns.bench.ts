/**
 * `npm run bench -- campaigns`: a reprocessing campaign of 1 000 station-days (issue 14 item 2, "done
 * when") on two replicas (child processes) and PostgreSQL, with `kill -9` of one replica when half the
 * items are done. Reports the wall time, items and CPU time per replica (the runner's measure: process
 * CPU while an item was in hand), station-days per CPU-second per replica (≈ per core: each replica
 * works one item at a time with one estimation worker), and checks every station-day stored exactly
 * once (one row per observation epoch, one fingerprint) and the report homogeneous.
 *
 * Network: invented stations CAMP01 …, days of residuals from the committed synthetic generator at
 * BENCH_CAMPAIGN_SAMPLING_S (default 300 s: 288 epochs, about 2 000–3 000 observations a day).
 * BENCH_CAMPAIGN_STATION_DAYS (default 1000) = stations × days (20 stations × 50 days by default).
 * BENCH_CAMPAIGN_RESIDUALS=uploaded: the campaign is submitted first with `residuals: "uploaded"` and the
 * station-days are uploaded to it through replica a while its items run (each as its day arrives); the
 * kill comes when half are done, as with deposits.
 * BENCH_DATABASE_URL (default postgres://postgres@127.0.0.1:5432/test); skipped when none answers.
 */

import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import {
  call,
  consecutiveDays,
  depositNetwork,
  inventedStations,
  replicaEnv,
  stationDay,
  type StationDayData,
} from '../test/helpers/campaign-network.js';
import { startServerProcess, type ServerProcess } from '../test/helpers/server-process.js';
import { randomBytes } from 'node:crypto';

const DATABASE_URL = process.env.BENCH_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:5432/test';
const STATION_DAYS = Number(process.env.BENCH_CAMPAIGN_STATION_DAYS ?? 1000);
const SAMPLING_S = Number(process.env.BENCH_CAMPAIGN_SAMPLING_S ?? 300);
const STATIONS = 20;
const ITEM_TIMEOUT_S = 20;
const UPLOADED = process.env.BENCH_CAMPAIGN_RESIDUALS === 'uploaded';

const load = () => loadavg()[0]!.toFixed(1);

export default async function campaignsBench(): Promise<string[]> {
  const probe = new pg.Client({ connectionString: DATABASE_URL });
  try {
    await probe.connect();
  } catch {
    return [`skipped: no PostgreSQL at ${DATABASE_URL}`];
  } finally {
    await probe.end().catch(() => undefined);
  }
  const schema = `bench_campaigns_${randomBytes(4).toString('hex')}`;
  const replicas: ServerProcess[] = [];
  const dirs: string[] = [];
  const out: string[] = [];
  try {
    for (const name of ['replica-a', 'replica-b']) {
      const dir = mkdtempSync(join(tmpdir(), `tropodelay-bench-${name}-`));
      dirs.push(dir);
      replicas.push(await startServerProcess(replicaEnv(DATABASE_URL, schema, dir, name, ITEM_TIMEOUT_S)));
    }
    const [a, b] = replicas as [ServerProcess, ServerProcess];
    const stations = inventedStations(STATIONS);
    const days = consecutiveDays('2026-01-01', Math.ceil(STATION_DAYS / STATIONS));
    let t0 = performance.now();
    let deposited = new Map<string, StationDayData>();
    let uploads: Promise<void> = Promise.resolve();
    if (!UPLOADED) {
      deposited = await depositNetwork(a.baseUrl, stations, days, 24, SAMPLING_S);
      const observations = [...deposited.values()].reduce((n, d) => n + d.body.observations.length, 0);
      out.push(
        `deposits: ${deposited.size} station-days, ${observations} observations (${(observations / deposited.size).toFixed(0)} a day at ${SAMPLING_S} s), ` +
          `${((performance.now() - t0) / 1000).toFixed(1)} s through HTTP (load average ${load()})`,
      );
    } else {
      for (const s of stations) await call(a.baseUrl, 'PUT', `/v1/stations/${s.id}`, s.body);
    }

    t0 = performance.now();
    const submitted = await call(b.baseUrl, 'POST', '/v1/campaigns', {
      name: 'bench',
      start_date: days[0],
      end_date: days.at(-1),
      ...(UPLOADED ? { residuals: 'uploaded', stations: stations.map((s) => s.id) } : {}),
    });
    if (submitted.status !== 202) throw new Error(`submit: ${submitted.status} ${JSON.stringify(submitted.body)}`);
    const id = submitted.body.campaign_id as string;
    const total = submitted.body.items_total as number;
    if (UPLOADED) {
      // Day by day across the network, so that items become ready from the start while the uploads go on.
      uploads = (async () => {
        const u0 = performance.now();
        let observations = 0;
        for (const day of days) {
          for (const [k, s] of stations.entries()) {
            const d = stationDay(s, k, day, 24, SAMPLING_S);
            const r = await call(a.baseUrl, 'PUT', `/v1/campaigns/${id}/residuals/${s.id}/${day}`, d.body);
            if (r.status !== 201) throw new Error(`upload ${s.id} ${day}: ${r.status} ${JSON.stringify(r.body)}`);
            deposited.set(`${s.id}|${day}`, d);
            observations += d.body.observations.length;
          }
        }
        out.push(
          `uploads to the campaign: ${deposited.size} station-days, ${observations} observations, ${((performance.now() - u0) / 1000).toFixed(1)} s ` +
            `through HTTP while the items ran (load average ${load()})`,
        );
      })();
    }
    let killedAt = -1;
    let status;
    for (;;) {
      status = (await call(a.baseUrl, 'GET', `/v1/campaigns/${id}`)).body;
      if (killedAt < 0 && status.items_done >= total / 2) {
        b.child.kill('SIGKILL');
        killedAt = status.items_done;
        out.push(
          `kill -9 of replica-b at ${killedAt} of ${total} items done, ${((performance.now() - t0) / 1000).toFixed(1)} s in (load average ${load()})`,
        );
      }
      if (status.state === 'finished') break;
      await new Promise((r) => setTimeout(r, 250));
    }
    await uploads;
    const wallS = (performance.now() - t0) / 1000;
    const report = (await call(a.baseUrl, 'GET', `/v1/campaigns/${id}/report`)).body;
    out.push(
      `campaign: ${status.items_done} done, ${status.items_failed} failed of ${total} in ${wallS.toFixed(1)} s wall ` +
        `(${(status.items_done / wallS).toFixed(1)} station-days/s; load average ${load()})`,
    );
    let cpuTotal = 0;
    for (const r of report.throughput.per_replica as {
      replica: string;
      items_done: number;
      cpu_s: number;
      station_days_per_cpu_s: number;
    }[]) {
      cpuTotal += r.cpu_s;
      out.push(
        `  ${r.replica}: ${r.items_done} station-days, ${r.cpu_s.toFixed(1)} CPU-s, ${r.station_days_per_cpu_s.toFixed(1)} station-days per CPU-second`,
      );
    }
    out.push(`  per core (all replicas): ${(status.items_done / cpuTotal).toFixed(1)} station-days per CPU-second`);

    const db = new pg.Client({ connectionString: DATABASE_URL });
    await db.connect();
    try {
      const rows = await db.query<{ station_id: string; day: string; n: string; f: string }>(
        `SELECT station_id, to_char(to_timestamp(epoch_ms / 1000.0) AT TIME ZONE 'UTC', 'YYYY-MM-DD') AS day, COUNT(*) AS n,
                COUNT(DISTINCT model_fingerprint) AS f FROM "${schema}".delay_rows WHERE source = 'zwd-estimates' GROUP BY 1, 2`,
      );
      const wrong = rows.rows.filter((r) => {
        const d = deposited.get(`${r.station_id}|${r.day}`);
        return !d || Number(r.n) !== new Set(d.data.observations.epochMs).size || Number(r.f) !== 1;
      });
      const retried = await db.query<{ n: string }>(
        `SELECT COUNT(*) AS n FROM "${schema}".campaign_items WHERE campaign_id = $1 AND attempts > 1`,
        [id],
      );
      out.push(
        `exactly once: ${rows.rows.length} station-day series stored, ${wrong.length} with a wrong row count or fingerprint; ` +
          `${retried.rows[0]!.n} items delivered more than once; report homogeneous: ${report.homogeneous} (${report.exceptions.length} exceptions)`,
      );
    } finally {
      await db.end();
    }
  } finally {
    for (const r of replicas) await r.stop().catch(() => undefined);
    for (const d of dirs) rmSync(d, { recursive: true, force: true });
    const db = new pg.Client({ connectionString: DATABASE_URL });
    await db.connect();
    await db.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`).finally(() => db.end());
  }
  return out;
}
