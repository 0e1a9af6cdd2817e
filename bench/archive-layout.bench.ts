/**
 * Archive layout figures (issue 14 item 4 and 5, issue 13's network call), on SQLite and PostgreSQL
 * (127.0.0.1:5432, database test, schemas of their own, dropped afterwards; skipped when none answers):
 *  - a 50-station-year archive (50 stations × 105 120 epochs of 5-min delays with all eight values and
 *    5-min met P, T, RH) stored in ARRIVAL ORDER (every station's hour, then the next hour, as hourly
 *    ingest stores it), in the layout before migration 4 and in the archive layout: disk per
 *    station-year of each;
 *  - a station-year read: the repository's readDelays / readZenithDelays / readPages against the raw
 *    driver read of the same rows (better-sqlite3 raw arrays, pg rowMode 'array'; no service code), and
 *    the raw read of the earlier layout;
 *  - the network read at one epoch (readZenithDelaysMany, every station), and the earlier layout's
 *    per-station primary-key probes;
 *  - the migration of the earlier archive (time per station-year, size after);
 *  - GET /v1/network/precipitable-water?epoch=… for 1 000 stations (test/helpers/workspace-network.ts,
 *    3 h at 30 s, hourly met) in-process.
 * CPU time (process.cpuUsage of this process; PostgreSQL's own CPU is not in it) and wall time, ranges
 * over runs. ARCHIVE_BENCH_STATIONS and ARCHIVE_BENCH_DAYS shrink the archive for a quick try. The full
 * run needs about 5 GB of temporary disk and took 46 min at load 9–25 (mostly the fills); the lines are
 * printed at the end.
 */

import { randomBytes } from 'node:crypto';
import { copyFileSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import pg from 'pg';
import { BENCH_PG_URL, pgAvailable } from './postgres-available.js';
import { buildApp } from '../src/http/app.js';
import { provenance } from '../src/domain/provenance.js';
import { createRepository, type StorageConfig } from '../src/storage/factory.js';
import { MIGRATIONS } from '../src/storage/migrations.js';
import { migratePostgres } from '../src/storage/postgres/postgres-repository.js';
import type { Repository } from '../src/storage/repository.js';
import { SQLITE_FILE_NAME, migrateSqlite } from '../src/storage/sqlite/sqlite-repository.js';
import { seedWorkspaceNetwork } from '../test/helpers/workspace-network.js';

const PG_URL = BENCH_PG_URL;
const STATIONS = Number(process.env.ARCHIVE_BENCH_STATIONS ?? 50);
const DAYS = Number(process.env.ARCHIVE_BENCH_DAYS ?? 365);
const FIVE_MIN = 300_000;
const HOUR = 3_600_000;
const T0 = Date.UTC(2025, 0, 1);
const EPOCHS = DAYS * 288;
const RUNS = 7;
const LAYOUT = MIGRATIONS.find((m) => m.name.startsWith('archive layout'))!;
const BEFORE_LAYOUT = MIGRATIONS.filter((m) => m.version < LAYOUT.version);
const MODELS = provenance({ producer: 'archive layout bench', mapping: 'niell' });
const FP = MODELS.model_fingerprint;
const stationIds = Array.from({ length: STATIONS }, (_, i) => `AL${String(i).padStart(3, '0')}`);

/** One delay row's eight values (invented, smooth, full precision). */
function delayValues(s: number, k: number): number[] {
  const t = k / 288;
  return [
    2.3 + 0.1 * Math.sin(t + s),
    0.004 + 1e-4 * Math.cos(k),
    0.15 + 0.05 * Math.sin(t * 3 + s),
    0.003,
    1e-4 * Math.sin(t),
    1e-4 * Math.cos(t),
    3e-5,
    3e-5,
  ];
}
const metValues = (s: number, k: number): number[] => [
  1000 + 10 * Math.sin(k / 500 + s),
  10 + 8 * Math.sin(k / 288),
  60 + 20 * Math.cos(k / 144),
];

/** Rows of one day in arrival order: hour by hour, every station's 12 epochs of that hour. */
function* dayInArrivalOrder(day: number): Generator<[number, string, number]> {
  for (let h = 0; h < 24; h++) {
    for (const [s, id] of stationIds.entries()) {
      for (let m = 0; m < 12; m++) {
        const k = day * 288 + h * 12 + m;
        yield [s, id, k];
      }
    }
  }
}

interface Figures {
  cpuMs: number[];
  wallMs: number[];
}
async function measure(runs: number, work: () => Promise<unknown> | unknown): Promise<Figures> {
  await work(); // warm-up
  const f: Figures = { cpuMs: [], wallMs: [] };
  for (let i = 0; i < runs; i++) {
    const cpu = process.cpuUsage();
    const start = performance.now();
    await work();
    f.wallMs.push(performance.now() - start);
    const used = process.cpuUsage(cpu);
    f.cpuMs.push((used.user + used.system) / 1000);
  }
  return f;
}
const range = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const d = s[s.length - 1]! < 10 ? 2 : s[s.length - 1]! < 100 ? 1 : 0;
  return `${s[0]!.toFixed(d)}–${s[s.length - 1]!.toFixed(d)} (median ${s[Math.floor(s.length / 2)]!.toFixed(d)})`;
};
const show = (f: Figures) => `CPU ${range(f.cpuMs)} ms, wall ${range(f.wallMs)} ms`;
const medianOf = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const load = () => `load average ${loadavg()[0]!.toFixed(1)}`;
const mb = (bytes: number) => `${(bytes / 1e6).toFixed(1)} MB`;

const YEAR = { fromMs: T0, toMs: T0 + (EPOCHS - 1) * FIVE_MIN };
const ONE_EPOCH_MS = T0 + Math.floor(EPOCHS / 2) * FIVE_MIN;

// ---------------------------------------------------------------- SQLite

function fillSqlite(path: string, layout: 'before' | 'archive'): number {
  const db = new Database(path);
  db.pragma('journal_mode = WAL');
  db.pragma('synchronous = OFF'); // the fill's durability is not what is measured; the page layout is
  migrateSqlite(db, layout === 'before' ? BEFORE_LAYOUT : MIGRATIONS);
  const now = new Date().toISOString();
  const start = performance.now();
  db.transaction(() => {
    db.prepare('INSERT INTO model_sets (model_fingerprint, models_json) VALUES (?, ?)').run(FP, JSON.stringify(MODELS.models));
    for (const id of stationIds) {
      db.prepare(
        'INSERT INTO stations (station_id, name, latitude_deg, longitude_deg, height_m, created_at, updated_at) VALUES (?, ?, 48, 9, 300, ?, ?)',
      ).run(id, id, now, now);
      if (layout === 'archive') {
        db.prepare('INSERT INTO met_series VALUES (?, ?, ?, ?)').run(id, 'met-sensor', YEAR.fromMs, YEAR.toMs);
        db.prepare(
          'INSERT INTO delay_segments (station_id, source, model_fingerprint, first_epoch_ms, last_epoch_ms) VALUES (?, ?, ?, ?, ?)',
        ).run(id, 'gnss-run', FP, YEAR.fromMs, YEAR.toMs);
      }
    }
  })();
  const segmentOf = new Map<string, number>();
  if (layout === 'archive') {
    for (const [id, seg] of db.prepare('SELECT station_id, segment_id FROM delay_segments').raw(true).all() as [string, number][]) {
      segmentOf.set(id, seg);
    }
  }
  const insertDelay = db.prepare(
    layout === 'before'
      ? 'INSERT INTO delay_records (station_id, epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)'
      : 'INSERT INTO delay_records (station_id, epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, segment_id) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)',
  );
  const insertMet = db.prepare(
    'INSERT INTO met_records (station_id, epoch_ms, source, pressure_hpa, temperature_c, relative_humidity_pct) VALUES (?, ?, ?, ?, ?, ?)',
  );
  for (let day = 0; day < DAYS; day++) {
    db.transaction(() => {
      for (const [s, id, k] of dayInArrivalOrder(day)) {
        const epochMs = T0 + k * FIVE_MIN;
        insertDelay.run(id, epochMs, 'gnss-run', ...delayValues(s, k), layout === 'before' ? FP : segmentOf.get(id));
        insertMet.run(id, epochMs, 'met-sensor', ...metValues(s, k));
      }
    })();
  }
  const fillMs = performance.now() - start;
  db.pragma('wal_checkpoint(TRUNCATE)');
  db.close();
  return fillMs;
}

/** Bytes per table and its indexes (dbstat), and the file. */
function sqliteSizes(path: string): { file: number; tables: Record<string, number> } {
  const db = new Database(path, { readonly: true });
  const tables: Record<string, number> = {};
  for (const [name, bytes] of db.prepare('SELECT name, SUM(pgsize) FROM dbstat GROUP BY name').raw(true).all() as [string, number][]) {
    tables[name] = bytes;
  }
  db.close();
  return { file: statSync(path).size, tables };
}

async function sqliteFigures(): Promise<string[]> {
  const lines: string[] = [];
  const dir = mkdtempSync(join(tmpdir(), 'tropodelay-layout-'));
  const beforeDir = join(dir, 'before');
  const archiveDir = join(dir, 'archive');
  const migratedDir = join(dir, 'migrated');
  try {
    for (const d of [beforeDir, archiveDir, migratedDir]) rmSync(d, { recursive: true, force: true });
    const { mkdirSync } = await import('node:fs');
    for (const d of [beforeDir, archiveDir, migratedDir]) mkdirSync(d);
    const beforePath = join(beforeDir, SQLITE_FILE_NAME);
    const archivePath = join(archiveDir, SQLITE_FILE_NAME);
    const stationYears = (STATIONS * DAYS) / 365;
    const fillBefore = fillSqlite(beforePath, 'before');
    const fillArchive = fillSqlite(archivePath, 'archive');
    lines.push(
      `sqlite: ${STATIONS} stations × ${DAYS} days of 5-min delays and met in arrival order (${((STATIONS * EPOCHS * 2) / 1e6).toFixed(1)} M rows); fill ${(fillBefore / 1000).toFixed(0)} s / ${(fillArchive / 1000).toFixed(0)} s (earlier / archive layout, synchronous=OFF) (${load()})`,
    );
    for (const [name, path] of [
      ['earlier layout', beforePath],
      ['archive layout', archivePath],
    ] as const) {
      const { file, tables } = sqliteSizes(path);
      const detail = Object.entries(tables)
        .filter(([, b]) => b > 1e6)
        .map(([t, b]) => `${t} ${mb(b)}`)
        .join(', ');
      lines.push(
        `sqlite ${name}: file ${mb(file)} = ${mb(file / stationYears)} per station-year (${detail}); 1 000 station-years ≈ ${(((file / stationYears) * 1000) / 1e9).toFixed(1)} GB`,
      );
    }

    // Migration of a copy of the earlier archive.
    copyFileSync(beforePath, join(migratedDir, SQLITE_FILE_NAME));
    const migStart = performance.now();
    const mdb = new Database(join(migratedDir, SQLITE_FILE_NAME));
    mdb.pragma('journal_mode = WAL');
    migrateSqlite(mdb, MIGRATIONS);
    mdb.pragma('wal_checkpoint(TRUNCATE)');
    const freeBytes = (mdb.pragma('freelist_count', { simple: true }) as number) * (mdb.pragma('page_size', { simple: true }) as number);
    mdb.close();
    const migMs = performance.now() - migStart;
    const fileAfter = statSync(join(migratedDir, SQLITE_FILE_NAME)).size;
    lines.push(
      `sqlite: migration ${LAYOUT.version} of the earlier archive: ${(migMs / 1000).toFixed(1)} s (${(migMs / 1000 / stationYears).toFixed(2)} s per station-year); file after it ${mb(fileAfter / stationYears)} per station-year, of which ${mb(freeBytes / stationYears)} free pages of the dropped tables (reused by later writes; VACUUM returns them): ${mb((fileAfter - freeBytes) / stationYears)} in use (rows in key order) (${load()})`,
    );

    // Reads: repository vs raw driver, on the archive layout in arrival order.
    const repo = await createRepository({ dataDir: archiveDir });
    const raw = new Database(archivePath, { readonly: true });
    const station = stationIds[Math.floor(STATIONS / 2)]!;
    const rawSql = (columns: string) =>
      raw
        .prepare(`SELECT ${columns} FROM delay_rows WHERE station_id = ? AND source = ? AND epoch_ms BETWEEN ? AND ? ORDER BY epoch_ms`)
        .raw(true);
    const rawFull = rawSql(
      'epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint',
    );
    const rawZenith = rawSql('epoch_ms, source, ztd_m, ztd_sigma_m, model_fingerprint');
    lines.push(
      ...(await readFigures('sqlite', repo, station, {
        full: () => rawFull.all(station, 'gnss-run', YEAR.fromMs, YEAR.toMs),
        zenith: () => rawZenith.all(station, 'gnss-run', YEAR.fromMs, YEAR.toMs),
      })),
    );
    const oldDb = new Database(beforePath, { readonly: true });
    const oldRead = oldDb
      .prepare(
        'SELECT epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint FROM delay_records WHERE station_id = ? AND epoch_ms BETWEEN ? AND ? ORDER BY epoch_ms, source',
      )
      .raw(true);
    lines.push(
      `sqlite: station-year raw read, earlier layout in arrival order: ${show(await measure(RUNS, () => oldRead.all(station, YEAR.fromMs, YEAR.toMs)))}`,
    );
    const oldProbe = oldDb
      .prepare(
        'SELECT station_id, epoch_ms, source, ztd_m, ztd_sigma_m, model_fingerprint FROM delay_records WHERE station_id = ? AND epoch_ms BETWEEN ? AND ?',
      )
      .raw(true);
    lines.push(
      `sqlite: network read at one epoch, ${STATIONS} stations: archive layout (epoch index) ${show(await measure(RUNS * 3, () => repo.readZenithDelaysMany(stationIds.map((stationId) => ({ stationId, fromMs: ONE_EPOCH_MS, toMs: ONE_EPOCH_MS })))))}; earlier layout, raw per-station probes ${show(await measure(RUNS * 3, () => stationIds.map((id) => oldProbe.all(id, ONE_EPOCH_MS, ONE_EPOCH_MS))))}`,
    );
    const plan = raw
      .prepare(
        'EXPLAIN QUERY PLAN SELECT station_id, epoch_ms FROM delay_rows WHERE epoch_ms BETWEEN 1 AND 2 ORDER BY station_id, epoch_ms, source',
      )
      .all() as { detail: string }[];
    lines.push(`sqlite: plan of the network read: ${plan.map((p) => p.detail).join('; ')}`);
    raw.close();
    oldDb.close();
    await repo.close();
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  return lines;
}

/** Station-year reads through the repository against the raw driver read of the same rows. */
async function readFigures(
  name: string,
  repo: Repository,
  station: string,
  raw: { full: () => unknown; zenith: () => unknown },
): Promise<string[]> {
  const lines: string[] = [];
  const pairs: [string, () => Promise<unknown>, () => unknown][] = [
    ['readDelays (all columns)', () => repo.readDelays(station, YEAR), raw.full],
    ['readZenithDelays (epoch, source, ZTD, σ, fingerprint)', () => repo.readZenithDelays(station, YEAR), raw.zenith],
    [
      'readPages delays, pages of 1 000 rows',
      async () => {
        let n = 0;
        for await (const page of repo.readPages('delays', station, YEAR, { pageRows: 1000 })) n += page.length;
        return n;
      },
      raw.full,
    ],
  ];
  for (const [label, viaRepo, viaDriver] of pairs) {
    const r = await measure(RUNS, viaRepo);
    const d = await measure(RUNS, async () => viaDriver());
    lines.push(
      `${name}: station-year ${label}: repository ${show(r)}; raw driver ${show(d)}; ratio of CPU medians ${(medianOf(r.cpuMs) / medianOf(d.cpuMs)).toFixed(2)}, of wall medians ${(medianOf(r.wallMs) / medianOf(d.wallMs)).toFixed(2)} (${load()})`,
    );
  }
  return lines;
}

// ---------------------------------------------------------------- PostgreSQL

async function fillPostgres(schema: string, layout: 'before' | 'archive'): Promise<number> {
  const pool = new pg.Pool({ connectionString: PG_URL, max: 1, options: `-c search_path=${schema}` });
  try {
    await migratePostgres(pool, schema, layout === 'before' ? BEFORE_LAYOUT : MIGRATIONS);
    const now = new Date().toISOString();
    await pool.query('INSERT INTO model_sets (model_fingerprint, models_json) VALUES ($1, $2)', [FP, JSON.stringify(MODELS.models)]);
    const segmentOf = new Map<string, number>();
    for (const id of stationIds) {
      await pool.query(
        'INSERT INTO stations (station_id, name, latitude_deg, longitude_deg, height_m, created_at, updated_at) VALUES ($1, $1, 48, 9, 300, $2, $2)',
        [id, now],
      );
      if (layout === 'archive') {
        await pool.query('INSERT INTO met_series VALUES ($1, $2, $3, $4)', [id, 'met-sensor', YEAR.fromMs, YEAR.toMs]);
        const seg = await pool.query<{ segment_id: number }>(
          'INSERT INTO delay_segments (station_id, source, model_fingerprint, first_epoch_ms, last_epoch_ms) VALUES ($1, $2, $3, $4, $5) RETURNING segment_id',
          [id, 'gnss-run', FP, YEAR.fromMs, YEAR.toMs],
        );
        segmentOf.set(id, seg.rows[0]!.segment_id);
      }
    }
    const start = performance.now();
    const last = layout === 'before' ? 'model_fingerprint' : 'segment_id';
    const lastType = layout === 'before' ? 'text' : 'int';
    for (let day = 0; day < DAYS; day++) {
      const cols: unknown[][] = Array.from({ length: 12 }, () => []);
      const met: unknown[][] = Array.from({ length: 5 }, () => []);
      for (const [s, id, k] of dayInArrivalOrder(day)) {
        const epochMs = T0 + k * FIVE_MIN;
        const v = delayValues(s, k);
        cols[0]!.push(id);
        cols[1]!.push(epochMs);
        cols[2]!.push('gnss-run');
        for (let j = 0; j < 8; j++) cols[3 + j]!.push(v[j]);
        cols[11]!.push(layout === 'before' ? FP : segmentOf.get(id));
        const m = metValues(s, k);
        met[0]!.push(id);
        met[1]!.push(epochMs);
        met[2]!.push(m[0]);
        met[3]!.push(m[1]);
        met[4]!.push(m[2]);
      }
      await pool.query(
        `INSERT INTO delay_records (station_id, epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, ${last})
         SELECT * FROM unnest($1::text[], $2::bigint[], $3::text[], $4::float8[], $5::float8[], $6::float8[], $7::float8[], $8::float8[], $9::float8[], $10::float8[], $11::float8[], $12::${lastType}[])`,
        cols,
      );
      await pool.query(
        `INSERT INTO met_records (station_id, epoch_ms, source, pressure_hpa, temperature_c, relative_humidity_pct)
         SELECT s, e, 'met-sensor', p, t, h FROM unnest($1::text[], $2::bigint[], $3::float8[], $4::float8[], $5::float8[]) AS u(s, e, p, t, h)`,
        met,
      );
    }
    const fillMs = performance.now() - start;
    await pool.query('VACUUM ANALYZE delay_records');
    await pool.query('VACUUM ANALYZE met_records');
    return fillMs;
  } finally {
    await pool.end();
  }
}

async function pgSizes(schema: string): Promise<{ total: number; detail: string }> {
  const client = new pg.Client({ connectionString: PG_URL });
  await client.connect();
  try {
    const rows = (
      await client.query<{ name: string; bytes: string }>(
        `SELECT c.relname AS name, pg_relation_size(c.oid) AS bytes FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
         WHERE n.nspname = $1 AND c.relkind IN ('r', 'i') ORDER BY 2 DESC`,
        [schema],
      )
    ).rows;
    const total = rows.reduce((sum, r) => sum + Number(r.bytes), 0);
    return {
      total,
      detail: rows
        .filter((r) => Number(r.bytes) > 1e6)
        .map((r) => `${r.name} ${mb(Number(r.bytes))}`)
        .join(', '),
    };
  } finally {
    await client.end();
  }
}

async function postgresFigures(): Promise<string[]> {
  const lines: string[] = [];
  const tag = randomBytes(3).toString('hex');
  const before = `bench_layout_before_${tag}`;
  const archive = `bench_layout_archive_${tag}`;
  const stationYears = (STATIONS * DAYS) / 365;
  const admin = new pg.Client({ connectionString: PG_URL });
  await admin.connect();
  try {
    const fillBefore = await fillPostgres(before, 'before');
    const fillArchive = await fillPostgres(archive, 'archive');
    lines.push(
      `postgres: the same archive; fill ${(fillBefore / 1000).toFixed(0)} s / ${(fillArchive / 1000).toFixed(0)} s (earlier / archive layout) (${load()})`,
    );
    for (const [name, schema] of [
      ['earlier layout', before],
      ['archive layout', archive],
    ] as const) {
      const { total, detail } = await pgSizes(schema);
      lines.push(
        `postgres ${name}: tables and indexes ${mb(total)} = ${mb(total / stationYears)} per station-year (${detail}); 1 000 station-years ≈ ${(((total / stationYears) * 1000) / 1e9).toFixed(1)} GB`,
      );
    }
    const config: StorageConfig = { dataDir: ':memory:', databaseUrl: PG_URL, pgSchema: archive };
    const repo = await createRepository(config);
    const station = stationIds[Math.floor(STATIONS / 2)]!;
    const rawPool = new pg.Pool({ connectionString: PG_URL, max: 2, options: `-c search_path=${archive}` });
    const rawRead = (columns: string) => async () =>
      (
        await rawPool.query({
          text: `SELECT ${columns} FROM delay_rows WHERE station_id = $1 AND source = $2 AND epoch_ms BETWEEN $3 AND $4 ORDER BY epoch_ms`,
          values: [station, 'gnss-run', YEAR.fromMs, YEAR.toMs],
          rowMode: 'array',
        })
      ).rows;
    const full = rawRead(
      'epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint',
    );
    lines.push(
      ...(await readFigures('postgres (arrival order)', repo, station, {
        full,
        zenith: rawRead('epoch_ms, source, ztd_m, ztd_sigma_m, model_fingerprint'),
      })),
    );
    const network = () =>
      repo.readZenithDelaysMany(stationIds.map((stationId) => ({ stationId, fromMs: ONE_EPOCH_MS, toMs: ONE_EPOCH_MS })));
    lines.push(
      `postgres: network read at one epoch, ${STATIONS} stations, archive layout (epoch index): ${show(await measure(RUNS * 3, network))}`,
    );
    const oldPool = new pg.Pool({ connectionString: PG_URL, max: 2, options: `-c search_path=${before}` });
    const oldRead = async () =>
      (
        await oldPool.query({
          text: 'SELECT epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint FROM delay_records WHERE station_id = $1 AND epoch_ms BETWEEN $2 AND $3 ORDER BY epoch_ms, source',
          values: [station, YEAR.fromMs, YEAR.toMs],
          rowMode: 'array',
        })
      ).rows;
    lines.push(`postgres: station-year raw read, earlier layout in arrival order: ${show(await measure(RUNS, oldRead))}`);

    // What physical clustering would buy on PostgreSQL (a heap keeps arrival order): CLUSTER once, read again.
    const clusterStart = performance.now();
    await admin.query(`CLUSTER "${archive}".delay_records USING delay_records_pkey`);
    await admin.query(`ANALYZE "${archive}".delay_records`);
    const clusterMs = performance.now() - clusterStart;
    lines.push(
      `postgres: CLUSTER delay_records (${(clusterMs / 1000).toFixed(0)} s): station-year raw read after it ${show(await measure(RUNS, full))}; network read at one epoch ${show(await measure(RUNS * 3, network))}`,
    );
    await rawPool.end();
    await oldPool.end();
    await repo.close();

    // Migration of the earlier archive in place.
    const migStart = performance.now();
    const pool = new pg.Pool({ connectionString: PG_URL, max: 1 });
    await migratePostgres(pool, before, MIGRATIONS);
    await pool.end();
    const migMs = performance.now() - migStart;
    const after = await pgSizes(before);
    lines.push(
      `postgres: migration ${LAYOUT.version} of the earlier archive: ${(migMs / 1000).toFixed(1)} s (${(migMs / 1000 / stationYears).toFixed(2)} s per station-year); after it ${mb(after.total / stationYears)} per station-year (rows copied in key order) (${load()})`,
    );
  } finally {
    await admin.query(`DROP SCHEMA IF EXISTS "${before}" CASCADE`);
    await admin.query(`DROP SCHEMA IF EXISTS "${archive}" CASCADE`);
    await admin.end();
  }
  return lines;
}

// ---------------------------------------------------------------- the route, 1 000 stations

async function routeFigures(name: string, storage: StorageConfig): Promise<string[]> {
  const app = await buildApp({
    archive: { storage, apiKeys: ['bench-key-0123456789abcdef'], readKeysRequired: false, maxReadRangeDays: 366 },
  });
  try {
    const t0 = Date.UTC(2026, 6, 10);
    await seedWorkspaceNetwork(app.repository, { stations: 1000, days: 0.125, stepMin: 0.5, startMs: t0 });
    const url = `/v1/network/precipitable-water?epoch=${new Date(t0 + HOUR).toISOString()}`;
    let stations = 0;
    const route = await measure(RUNS + 3, async () => {
      const res = await app.inject({ method: 'GET', url });
      if (res.statusCode !== 200) throw new Error(`${url}: ${res.statusCode} ${res.body.slice(0, 200)}`);
      stations = (JSON.parse(res.body) as { stations: unknown[] }).stations.length;
    });
    const ids = (await app.repository.listStations()).map((s) => s.stationId);
    const read = await measure(RUNS + 3, () =>
      app.repository.readZenithDelaysMany(ids.map((stationId) => ({ stationId, fromMs: t0 + HOUR, toMs: t0 + HOUR }))),
    );
    return [
      `${name}: GET ${url.split('?')[0]}?epoch=… for ${stations} stations, in-process: ${show(route)}; its delay read alone (readZenithDelaysMany): ${show(read)} (${load()})`,
    ];
  } finally {
    await app.close();
  }
}

export default async function archiveLayoutBench(): Promise<string[]> {
  const lines: string[] = [];
  const dir = mkdtempSync(join(tmpdir(), 'tropodelay-route-'));
  try {
    lines.push(...(await routeFigures('sqlite', { dataDir: dir })));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  const pgUp = await pgAvailable();
  if (pgUp) {
    const schema = `bench_route_${randomBytes(3).toString('hex')}`;
    try {
      lines.push(...(await routeFigures('postgres', { dataDir: ':memory:', databaseUrl: PG_URL, pgSchema: schema })));
    } finally {
      const c = new pg.Client({ connectionString: PG_URL });
      await c.connect();
      await c.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
      await c.end();
    }
  }
  lines.push(...(await sqliteFigures()));
  if (pgUp) lines.push(...(await postgresFigures()));
  else lines.push(`postgres: skipped (nothing answers at ${PG_URL.replace(/\/\/[^@]*@/, '//')})`);
  return lines;
}
