/**
 * What keys and the audit trail cost a caller (issue 15): a small write (PUT of a station that exists,
 * 200) through HTTP on a loopback socket and in-process (app.inject), on SQLite (a file in a temporary
 * directory, synchronous=FULL) and on PostgreSQL when one answers (BENCH_DATABASE_URL, default
 * 127.0.0.1:5432/test), against the same app's open read of that station (no key, no audit) as a
 * baseline. The write pays the key match (cached digests), the station upsert and the audit insert;
 * `repository.appendAuditEvent` alone is timed too. Medians of 200 calls per run, ranges over 5 runs,
 * after 50 warm-up calls of each kind.
 */

import { mkdtempSync, rmSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../src/http/app.js';
import type { StorageConfig } from '../src/storage/factory.js';

const KEY = 'bench-admin-0123456789abcdef';
const CALLS = 200;
const RUNS = 5;
const WARMUP = 50;
const PG_URL = process.env.BENCH_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:5432/test';
const BODY = JSON.stringify({ name: 'Benchford (invented)', latitude_deg: 47, longitude_deg: 8, height_m: 400 });

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const range = (xs: number[], digits = 2) => `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)} ms`;

function overHttp(port: number, method: string, path: string, body?: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const start = performance.now();
    const req = httpRequest(
      {
        host: '127.0.0.1',
        port,
        method,
        path,
        agent: false,
        headers: body
          ? { authorization: `Bearer ${KEY}`, 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) }
          : {},
      },
      (res) => {
        res.resume();
        res.on('end', () =>
          res.statusCode! < 300 ? resolve(performance.now() - start) : reject(new Error(`${method} ${path}: ${res.statusCode}`)),
        );
      },
    );
    req.on('error', reject);
    req.end(body);
  });
}

async function inProcess(app: FastifyInstance, method: 'PUT' | 'GET', body?: string): Promise<number> {
  const start = performance.now();
  const res = await app.inject({
    method,
    url: '/v1/stations/BENCH1',
    ...(body ? { headers: { authorization: `Bearer ${KEY}`, 'content-type': 'application/json' }, payload: body } : {}),
  });
  if (res.statusCode >= 300) throw new Error(`${method}: ${res.statusCode}`);
  return performance.now() - start;
}

async function runOn(name: string, storage: StorageConfig): Promise<string[]> {
  const app = await buildApp({
    archive: {
      storage,
      apiKeys: [{ name: 'bench-admin', role: 'admin', secret: KEY }],
      readKeysRequired: false,
      maxReadRangeDays: 366,
      schedulePurge: false,
    },
  });
  try {
    await app.listen({ port: 0, host: '127.0.0.1' });
    const port = (app.server.address() as AddressInfo).port;
    await inProcess(app, 'PUT', BODY);
    for (let i = 0; i < WARMUP; i++) {
      await overHttp(port, 'PUT', '/v1/stations/BENCH1', BODY);
      await overHttp(port, 'GET', '/v1/stations/BENCH1');
      await inProcess(app, 'PUT', BODY);
      await inProcess(app, 'GET');
    }
    const figures = {
      httpWrite: [] as number[],
      httpRead: [] as number[],
      injectWrite: [] as number[],
      injectRead: [] as number[],
      audit: [] as number[],
    };
    for (let run = 0; run < RUNS; run++) {
      const w: number[] = [];
      const r: number[] = [];
      const iw: number[] = [];
      const ir: number[] = [];
      const a: number[] = [];
      for (let i = 0; i < CALLS; i++) {
        w.push(await overHttp(port, 'PUT', '/v1/stations/BENCH1', BODY));
        r.push(await overHttp(port, 'GET', '/v1/stations/BENCH1'));
        iw.push(await inProcess(app, 'PUT', BODY));
        ir.push(await inProcess(app, 'GET'));
        const start = performance.now();
        await app.repository.appendAuditEvent({
          atMs: Date.now(),
          keyName: 'bench-admin',
          clientAddress: '127.0.0.1',
          method: 'PUT',
          route: '/v1/stations/:station_id',
          path: '/v1/stations/BENCH1',
          stationId: 'BENCH1',
          source: null,
          records: null,
          inserted: null,
          updated: null,
          unchanged: null,
          status: 200,
          requestId: 'bench',
        });
        a.push(performance.now() - start);
      }
      figures.httpWrite.push(median(w));
      figures.httpRead.push(median(r));
      figures.injectWrite.push(median(iw));
      figures.injectRead.push(median(ir));
      figures.audit.push(median(a));
    }
    return [
      `${name}: PUT station (key + upsert + audit) over HTTP ${range(figures.httpWrite)}, in-process ${range(figures.injectWrite)} (median per call, ${RUNS} runs × ${CALLS})`,
      `${name}: GET station (open read, no audit) over HTTP ${range(figures.httpRead)}, in-process ${range(figures.injectRead)}`,
      `${name}: appendAuditEvent alone ${range(figures.audit, 3)}`,
    ];
  } finally {
    await app.close();
  }
}

export default async function (): Promise<string[]> {
  const dir = mkdtempSync(join(tmpdir(), 'tropodelay-bench-access-'));
  const lines: string[] = [];
  try {
    lines.push(...(await runOn('sqlite', { dataDir: dir })));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  const probe = new pg.Client({ connectionString: PG_URL, connectionTimeoutMillis: 2000 });
  try {
    await probe.connect();
  } catch {
    lines.push(`postgres: skipped (nothing answers at ${PG_URL.replace(/\/\/[^@]*@/, '//')})`);
    return lines;
  }
  const schema = `bench_access_${randomBytes(4).toString('hex')}`;
  try {
    lines.push(
      ...(await runOn('postgres', {
        dataDir: mkdtempSync(join(tmpdir(), 'tropodelay-bench-access-pg-')),
        databaseUrl: PG_URL,
        pgSchema: schema,
      })),
    );
  } finally {
    await probe.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
    await probe.end();
  }
  return lines;
}
