/**
 * Station archive figures (issue 4), on SQLite and on PostgreSQL (127.0.0.1:5432, database test,
 * a schema of its own, dropped afterwards; skipped when none answers):
 *  - ingest of 100 000 met records through POST /v1/stations/{id}/met, as JSON and as CSV
 *    (parse, per-record validation, one transaction) — target < 5 s on SQLite;
 *  - PWV retrieval of one station-year of 5-minute records (105 120 delay rows with met at the same
 *    epochs) as CSV — target < 1 s.
 * In-process (app.inject), so the figures exclude the network but include HTTP parsing and serialisation.
 */

import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { BENCH_PG_URL, pgAvailable } from './postgres-available.js';
import { DEMO_NETWORK, round1, truthSeries } from '../scripts/synthetic/network.js';
import { buildApp } from '../src/http/app.js';
import type { StorageConfig } from '../src/storage/factory.js';

const KEY = 'bench-key-0123456789abcdef';
const PG_URL = BENCH_PG_URL;
const FIVE_MIN = 300_000;
const YEAR_RECORDS = 365 * 288; // 105 120
const INGEST_RECORDS = 100_000;
const T0 = Date.UTC(2025, 0, 1);

async function timed<T>(work: () => Promise<T>): Promise<[T, number]> {
  const start = performance.now();
  const result = await work();
  return [result, performance.now() - start];
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

async function runOn(name: string, storage: StorageConfig): Promise<string[]> {
  const app = await buildApp({ archive: { storage, apiKeys: [KEY], readKeysRequired: false, maxReadRangeDays: 366 } });
  const headers = { authorization: `Bearer ${KEY}` };
  const lines: string[] = [];
  try {
    const station = DEMO_NETWORK[0]!;
    const put = (id: string) =>
      app.inject({
        method: 'PUT',
        url: `/v1/stations/${id}`,
        headers,
        payload: { name: station.name, latitude_deg: station.latitudeDeg, longitude_deg: station.longitudeDeg, height_m: station.heightM },
      });
    await put('INGJ');
    await put('INGC');
    await put('YEAR');

    const truth = truthSeries(station, T0, YEAR_RECORDS, FIVE_MIN, 7);
    const metRecords = truth.map((t) => ({
      epoch: new Date(t.epochMs).toISOString(),
      pressure_hpa: round1(t.pressureHpa),
      temperature_c: round1(t.temperatureC),
      relative_humidity_pct: round1(t.relativeHumidityPct),
    }));

    // Ingest, JSON
    const jsonBody = JSON.stringify({ records: metRecords.slice(0, INGEST_RECORDS), source: 'bench' });
    const [jsonRes, jsonMs] = await timed(() =>
      app.inject({
        method: 'POST',
        url: '/v1/stations/INGJ/met',
        headers: { ...headers, 'content-type': 'application/json' },
        payload: jsonBody,
      }),
    );
    if (jsonRes.statusCode !== 200 || JSON.parse(jsonRes.body).inserted !== INGEST_RECORDS)
      throw new Error(`JSON ingest failed: ${jsonRes.body.slice(0, 300)}`);
    lines.push(
      `${name}: ingest ${INGEST_RECORDS} met records as JSON (${(jsonBody.length / 1e6).toFixed(1)} MB): ${(jsonMs / 1000).toFixed(2)} s`,
    );

    // Ingest, CSV
    const csvBody =
      'epoch,pressure_hpa,temperature_c,relative_humidity_pct\n' +
      metRecords
        .slice(0, INGEST_RECORDS)
        .map((r) => `${r.epoch},${r.pressure_hpa},${r.temperature_c},${r.relative_humidity_pct}`)
        .join('\n');
    const [csvRes, csvMs] = await timed(() =>
      app.inject({
        method: 'POST',
        url: '/v1/stations/INGC/met?source=bench',
        headers: { ...headers, 'content-type': 'text/csv' },
        payload: csvBody,
      }),
    );
    if (csvRes.statusCode !== 200 || JSON.parse(csvRes.body).inserted !== INGEST_RECORDS)
      throw new Error(`CSV ingest failed: ${csvRes.body.slice(0, 300)}`);
    lines.push(
      `${name}: ingest ${INGEST_RECORDS} met records as CSV (${(csvBody.length / 1e6).toFixed(1)} MB): ${(csvMs / 1000).toFixed(2)} s`,
    );

    // One station-year of 5-min met and delays, then the PWV retrieval as CSV.
    for (let k = 0; k < YEAR_RECORDS; k += 50_000) {
      const res = await app.inject({
        method: 'POST',
        url: '/v1/stations/YEAR/met',
        headers,
        payload: { records: metRecords.slice(k, k + 50_000), source: 'bench' },
      });
      if (res.statusCode !== 200) throw new Error(res.body);
    }
    for (let k = 0; k < YEAR_RECORDS; k += 50_000) {
      const res = await app.inject({
        method: 'POST',
        url: '/v1/stations/YEAR/delays',
        headers,
        payload: {
          source: 'bench',
          models: { mapping: 'niell' },
          records: truth.slice(k, k + 50_000).map((t) => ({ epoch: new Date(t.epochMs).toISOString(), ztd_m: t.ztdM, ztd_sigma_m: 0.004 })),
        },
      });
      if (res.statusCode !== 200) throw new Error(res.body);
    }
    const url = `/v1/stations/YEAR/precipitable-water?from=${new Date(T0).toISOString()}&to=${new Date(T0 + (YEAR_RECORDS - 1) * FIVE_MIN).toISOString()}&format=csv`;
    const runs: number[] = [];
    let bytes = 0;
    let rows = 0;
    for (let i = 0; i < 3; i++) {
      const [res, ms] = await timed(() => app.inject({ method: 'GET', url }));
      if (res.statusCode !== 200) throw new Error(res.body.slice(0, 300));
      bytes = res.body.length;
      rows = res.body.split('\n').length - 2;
      runs.push(ms);
    }
    lines.push(
      `${name}: PWV retrieval, one station-year of 5-min records (${rows} rows, ${(bytes / 1e6).toFixed(1)} MB CSV): median ${(median(runs) / 1000).toFixed(2)} s of 3 (${runs.map((m) => (m / 1000).toFixed(2)).join(', ')})`,
    );
    const jsonUrl = url.replace('format=csv', 'format=json');
    const [jsonPwv, jsonPwvMs] = await timed(() => app.inject({ method: 'GET', url: jsonUrl }));
    if (jsonPwv.statusCode !== 200) throw new Error(jsonPwv.body.slice(0, 300));
    lines.push(`${name}: the same as JSON (${(jsonPwv.body.length / 1e6).toFixed(1)} MB): ${(jsonPwvMs / 1000).toFixed(2)} s`);
  } finally {
    await app.close();
  }
  return lines;
}

export default async function archiveBench(): Promise<string[]> {
  const lines: string[] = [];
  const dir = mkdtempSync(join(tmpdir(), 'tropodelay-bench-'));
  try {
    lines.push(...(await runOn('sqlite', { dataDir: dir })));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  if (await pgAvailable()) {
    const schema = `bench_${randomBytes(4).toString('hex')}`;
    try {
      lines.push(...(await runOn('postgres', { dataDir: ':memory:', databaseUrl: PG_URL, pgSchema: schema })));
    } finally {
      const client = new pg.Client({ connectionString: PG_URL });
      await client.connect();
      await client.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
      await client.end();
    }
  } else {
    lines.push(`postgres: skipped (nothing answers at ${PG_URL.replace(/\/\/[^@]*@/, '//')})`);
  }
  return lines;
}
