/**
 * The audit trim (Repository.trimAuditEventsBefore, TROPODELAY_AUDIT_RETENTION_DAYS): how long deleting
 * ~1 M old audit events takes, and whether it holds anything up while it runs. Invented events: ROWS rows
 * over 500 days, of which OLD_SHARE are older than the cutoff (a trail first trimmed after 500 days of an
 * agency writing hourly from ~80 stations, or a few weeks of 1 000 stations switched on at once).
 *
 * On SQLite (a file in a temporary directory, synchronous=FULL) and on PostgreSQL when one answers
 * (BENCH_DATABASE_URL, default 127.0.0.1:5432/test; a schema of its own, dropped afterwards). During the
 * trim a writer appends one audit event every 5 ms through the same repository (what the audit plugin does
 * for each write) and the bench records the slowest append; the event loop's longest delay
 * (monitorEventLoopDelay) shows the longest batch on SQLite, which runs on the loop. The same writer runs
 * 5 s alone before each trim: the slowest append and loop delay the (shared, loaded) machine gives anyway. For each batch size in
 * BATCHES (env AUDIT_TRIM_BATCHES, comma-separated; default the service's AUDIT_TRIM_BATCH_ROWS) and RUNS
 * runs, the table is filled again. `npm run bench -- audit-trim`; AUDIT_TRIM_ROWS to change the size.
 */

import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import Database from 'better-sqlite3';
import pg from 'pg';
import { AUDIT_TRIM_BATCH_ROWS, type AuditEvent } from '../src/storage/access-rows.js';
import { createRepository, type StorageConfig } from '../src/storage/factory.js';
import type { Repository } from '../src/storage/repository.js';
import { SQLITE_FILE_NAME } from '../src/storage/sqlite/sqlite-repository.js';
import { BENCH_PG_URL, pgAvailable } from './postgres-available.js';

const ROWS = Number(process.env.AUDIT_TRIM_ROWS ?? 1_250_000);
const OLD_SHARE = 0.8;
const RUNS = 2;
const BATCHES = (process.env.AUDIT_TRIM_BATCHES ?? String(AUDIT_TRIM_BATCH_ROWS)).split(',').map(Number);
const DAY_MS = 86_400_000;
const SPAN_DAYS = 500;
const NOW_MS = Date.UTC(2026, 11, 1);
const FIRST_MS = NOW_MS - SPAN_DAYS * DAY_MS;
/** Events are spread evenly over the span, so this cutoff leaves OLD_SHARE of them before it. */
const CUTOFF_MS = FIRST_MS + OLD_SHARE * SPAN_DAYS * DAY_MS;
const STEP_MS = (SPAN_DAYS * DAY_MS) / ROWS;

/** The same invented event row in both dialects (ids and times from the row number `i`). */
const fillSelect = (i: string) =>
  `${FIRST_MS} + CAST(CAST(${i} AS BIGINT) * ${STEP_MS} AS BIGINT), 'field-writer-' || (${i} % 7), '192.0.2.' || (${i} % 200), 'POST',
   '/v1/stations/:station_id/met', '/v1/stations/ST' || (${i} % 1000) || '/met', 'ST' || (${i} % 1000), 'sensor-a',
   24, 20, 3, 1, 200, 'req-' || ${i}`;
const COLUMNS =
  'at_ms, key_name, client_address, method, route, path, station_id, source, records, inserted, updated, unchanged, status, request_id';

const liveEvent = (i: number): AuditEvent => ({
  atMs: NOW_MS + i,
  keyName: 'live-writer',
  clientAddress: '192.0.2.250',
  method: 'POST',
  route: '/v1/stations/:station_id/met',
  path: '/v1/stations/LIVE/met',
  stationId: 'LIVE',
  source: 'sensor-a',
  records: 1,
  inserted: 1,
  updated: 0,
  unchanged: 0,
  status: 200,
  requestId: `live-${i}`,
});

async function fillSqlite(dir: string): Promise<void> {
  const db = new Database(join(dir, SQLITE_FILE_NAME));
  db.pragma('journal_mode = WAL');
  db.prepare('DELETE FROM audit_events').run();
  db.prepare(
    `WITH RECURSIVE g(i) AS (SELECT 0 UNION ALL SELECT i + 1 FROM g WHERE i < ${ROWS - 1})
     INSERT INTO audit_events (${COLUMNS}) SELECT ${fillSelect('i')} FROM g`,
  ).run();
  db.close();
}

async function fillPostgres(schema: string): Promise<string> {
  const client = new pg.Client({ connectionString: BENCH_PG_URL });
  await client.connect();
  try {
    await client.query(`SET search_path TO "${schema}"`);
    await client.query('TRUNCATE audit_events');
    await client.query(`INSERT INTO audit_events (${COLUMNS}) SELECT ${fillSelect('i')} FROM generate_series(0, ${ROWS - 1}) AS i`);
    await client.query('VACUUM ANALYZE audit_events');
    const size = await client.query<{ s: string }>(`SELECT pg_size_pretty(pg_total_relation_size('audit_events')) AS s`);
    return size.rows[0]!.s;
  } finally {
    await client.end();
  }
}

interface Run {
  trimmedRows: number;
  seconds: number;
  slowestAppendMs: number;
  appends: number;
  loopMaxMs: number;
  /** The same writer for BASELINE_MS before the trim, without one: what the machine gives anyway. */
  baselineAppendMs: number;
  baselineLoopMaxMs: number;
}

const BASELINE_MS = 5_000;

/** Appends one event every 5 ms while `during` runs; the slowest append and the loop's longest delay. */
async function withWriter<T>(
  repo: Repository,
  during: () => Promise<T>,
): Promise<{ result: T; slowestAppendMs: number; appends: number; loopMaxMs: number }> {
  let writing = true;
  let slowestAppendMs = 0;
  let appends = 0;
  const writer = (async () => {
    while (writing) {
      const t = performance.now();
      await repo.appendAuditEvent(liveEvent(nextLive++));
      appends++;
      slowestAppendMs = Math.max(slowestAppendMs, performance.now() - t);
      await new Promise((r) => setTimeout(r, 5));
    }
  })();
  const loop = monitorEventLoopDelay({ resolution: 5 });
  loop.enable();
  try {
    return { result: await during(), slowestAppendMs, appends, loopMaxMs: loop.max / 1e6 };
  } finally {
    loop.disable();
    writing = false;
    await writer;
  }
}
let nextLive = 0;

async function trimRun(config: StorageConfig, batchRows: number): Promise<Run> {
  const repo = await createRepository(config);
  try {
    const baseline = await withWriter(repo, () => new Promise((r) => setTimeout(r, BASELINE_MS)));
    const t = performance.now();
    const trim = await withWriter(repo, () => repo.trimAuditEventsBefore(CUTOFF_MS, { batchRows }));
    const seconds = (performance.now() - t) / 1000;
    return {
      trimmedRows: trim.result,
      seconds,
      slowestAppendMs: trim.slowestAppendMs,
      appends: trim.appends,
      loopMaxMs: trim.loopMaxMs,
      baselineAppendMs: baseline.slowestAppendMs,
      baselineLoopMaxMs: baseline.loopMaxMs,
    };
  } finally {
    await repo.close();
  }
}

const span = (xs: number[], digits: number) =>
  Math.min(...xs) === Math.max(...xs)
    ? Math.min(...xs).toFixed(digits)
    : `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)}`;

function report(label: string, batchRows: number, runs: Run[], extra = ''): string {
  return (
    `${label}, batches of ${batchRows}: ${runs[0]!.trimmedRows} rows deleted in ${span(
      runs.map((r) => r.seconds),
      1,
    )} s (${span(
      runs.map((r) => r.trimmedRows / r.seconds / 1000),
      0,
    )} k rows/s); slowest audit append meanwhile ${span(
      runs.map((r) => r.slowestAppendMs),
      0,
    )} ms (${span(
      runs.map((r) => r.appends),
      0,
    )} appends); event loop's longest delay ${span(
      runs.map((r) => r.loopMaxMs),
      0,
    )} ms (without a trim, ${BASELINE_MS / 1000} s of the writer alone: slowest append ${span(
      runs.map((r) => r.baselineAppendMs),
      0,
    )} ms, loop ${span(
      runs.map((r) => r.baselineLoopMaxMs),
      0,
    )} ms)` + extra
  );
}

export default async function auditTrimBench(): Promise<string[]> {
  const lines = [
    `${ROWS} invented audit events over ${SPAN_DAYS} days, ${Math.round(OLD_SHARE * ROWS)} before the cutoff; ${RUNS} runs per batch size`,
  ];
  const dir = mkdtempSync(join(tmpdir(), 'tropodelay-audit-trim-'));
  try {
    await (await createRepository({ dataDir: dir })).close(); // the schema
    for (const batchRows of BATCHES) {
      const runs: Run[] = [];
      for (let k = 0; k < RUNS; k++) {
        await fillSqlite(dir);
        runs.push(await trimRun({ dataDir: dir }, batchRows));
      }
      lines.push(report('SQLite', batchRows, runs));
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  if (!(await pgAvailable())) return [...lines, `PostgreSQL: none answers at ${BENCH_PG_URL.replace(/\/\/[^@]*@/, '//')}`];
  const schema = `bench_${randomBytes(6).toString('hex')}`;
  const pgDir = mkdtempSync(join(tmpdir(), 'tropodelay-audit-trim-'));
  const config: StorageConfig = { dataDir: pgDir, databaseUrl: BENCH_PG_URL, pgSchema: schema };
  try {
    await (await createRepository(config)).close();
    for (const batchRows of BATCHES) {
      const runs: Run[] = [];
      let size = '';
      for (let k = 0; k < RUNS; k++) {
        size = await fillPostgres(schema);
        runs.push(await trimRun(config, batchRows));
      }
      lines.push(report('PostgreSQL', batchRows, runs, `; table with indexes before: ${size}`));
    }
  } finally {
    rmSync(pgDir, { recursive: true, force: true });
    const client = new pg.Client({ connectionString: BENCH_PG_URL });
    await client.connect();
    await client.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
    await client.end();
  }
  return lines;
}
