/**
 * Workspace figures (issue 13), ranges over runs:
 *  - GET /v1/network/precipitable-water for 1 000 stations at one epoch (records, hourly means,
 *    latest), in-process (app.inject) and over HTTP on loopback (fetch), on SQLite and PostgreSQL
 *    (127.0.0.1:5432, database test, a schema of its own; skipped when none answers) — target < 200 ms;
 *  - the page in Debian's chromium (playwright-core): navigation to the network view drawn (map,
 *    legend, table, values at the top of the hour) with 1 000 stations — target < 1 s — and to the hourly
 *    means drawn over it; a station-year at 5-min sampling
 *    (105 120 points) drawn by the station view (from the data in memory to the charts painted) —
 *    target < 0.5 s; also its fetch of ~105 000 records.
 * Data: test/helpers/workspace-network.ts (1 000 invented stations, 3 h at 30 s; one station with a year at 5 min).
 */

import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import type { CDPSession } from 'playwright-core';
import { buildWeb } from '../scripts/build-web.js';
import { buildApp } from '../src/http/app.js';
import type { StorageConfig } from '../src/storage/factory.js';
import { chromiumAvailable, launchBrowser } from '../test/helpers/browser.js';
import { seedWorkspaceNetwork } from '../test/helpers/workspace-network.js';
import { BENCH_PG_URL, pgAvailable } from './postgres-available.js';

const KEY = 'bench-key-0123456789abcdef';
const PG_URL = BENCH_PG_URL;
const STATIONS = 1000;
const T0 = Date.UTC(2026, 6, 10);
const RUNS = 10;

const fmt = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return `median ${s[Math.floor(s.length / 2)]!.toFixed(0)} ms, range ${s[0]!.toFixed(0)}–${s[s.length - 1]!.toFixed(0)} ms over ${s.length} runs`;
};

async function networkCalls(name: string, storage: StorageConfig): Promise<string[]> {
  const app = await buildApp({ archive: { storage, apiKeys: [KEY], readKeysRequired: false, maxReadRangeDays: 366 } });
  const lines: string[] = [];
  try {
    const seedStart = performance.now();
    await seedWorkspaceNetwork(app.repository, { stations: STATIONS, days: 0.125, stepMin: 0.5, startMs: T0 });
    lines.push(`${name}: seeded ${STATIONS} stations × 360 epochs in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`);
    await app.listen({ port: 0, host: '127.0.0.1' });
    const base = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}`;
    const queries: [string, string][] = [
      ['one epoch, records', `epoch=${new Date(T0 + 3_600_000).toISOString()}`],
      ['one epoch, hourly means (120 epochs per station)', `epoch=${new Date(T0 + 3_600_000).toISOString()}&interval=PT1H`],
      ['latest=true', 'latest=true'],
    ];
    for (const [label, query] of queries) {
      const url = `/v1/network/precipitable-water?${query}`;
      const inProcess: number[] = [];
      const http: number[] = [];
      let count = 0;
      for (let i = 0; i < RUNS + 1; i++) {
        let start = performance.now();
        const res = await app.inject({ method: 'GET', url });
        const t1 = performance.now() - start;
        if (res.statusCode !== 200) throw new Error(`${url}: ${res.statusCode} ${res.body.slice(0, 200)}`);
        start = performance.now();
        const body = (await (await fetch(base + url)).json()) as { stations: unknown[] };
        const t2 = performance.now() - start;
        count = body.stations.length;
        if (i > 0) {
          inProcess.push(t1);
          http.push(t2);
        } // the first run warms up
      }
      lines.push(`${name}: ${label} (${count} stations): in-process ${fmt(inProcess)}; HTTP ${fmt(http)}`);
    }
  } finally {
    await app.close();
  }
  return lines;
}

/**
 * The renderer's main-thread busy time so far [ms] (DevTools Performance.getMetrics TaskDuration):
 * CPU-side, less inflated by load than wall time. Cumulative since the page was created, so the
 * network figure also holds work before navigation start (it can exceed the wall figure).
 */
async function mainThreadMs(cdp: CDPSession): Promise<number> {
  const { metrics } = await cdp.send('Performance.getMetrics');
  return 1000 * (metrics.find((m) => m.name === 'TaskDuration')?.value ?? 0);
}

/** The browser figures alone (also run by `run`). */
export async function page(): Promise<string[]> {
  if (!chromiumAvailable) return ['page: skipped (no chromium at /usr/bin/chromium)'];
  await buildWeb();
  const dir = mkdtempSync(join(tmpdir(), 'tropodelay-bench-'));
  const app = await buildApp({ archive: { storage: { dataDir: dir }, apiKeys: [KEY], readKeysRequired: false, maxReadRangeDays: 366 } });
  const browser = await launchBrowser();
  const lines: string[] = [];
  try {
    await seedWorkspaceNetwork(app.repository, { stations: STATIONS, days: 0.125, stepMin: 0.5, startMs: T0 });
    // One station-year at 5 min ending at the network's hours: 105 120 delay rows and hourly met.
    const yearStart = T0 + 3 * 3_600_000 - 365 * 86_400_000;
    // WS0001 again, now with a year of data.
    await seedWorkspaceNetwork(app.repository, { stations: 1, days: 365, stepMin: 5, startMs: yearStart });
    await app.listen({ port: 0, host: '127.0.0.1' });
    const base = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}/`;
    const network: number[] = [];
    const networkMeans: number[] = [];
    const draw: number[] = [];
    const fetchYear: number[] = [];
    const networkBusy: number[] = [];
    const yearBusy: number[] = [];
    for (let i = 0; i < 6; i++) {
      const context = await browser.newContext({ viewport: { width: 1280, height: 1000 } });
      const p = await context.newPage();
      const cdp = await context.newCDPSession(p);
      await cdp.send('Performance.enable');
      await p.goto(base);
      await p.waitForFunction(() => performance.getEntriesByName('network-drawn').length > 0, undefined, { timeout: 60_000 });
      const busyAtDrawn = await mainThreadMs(cdp);
      const drawn = await p.evaluate(() => performance.getEntriesByName('network-drawn')[0]!.startTime);
      await p.waitForSelector('body[data-ready="true"]', { timeout: 60_000 });
      const meansDrawn = await p.evaluate(() => performance.getEntriesByName('network-means-drawn')[0]!.startTime);
      // WS0001 is also the station start() shows: clear its mark so the wait below is for this selection's draw,
      // not a measure of it still in flight when the year is clicked.
      await p.evaluate(() => delete document.body.dataset.station);
      await p.selectOption('#station-select', 'WS0001');
      await p.waitForFunction(() => document.body.dataset.station === 'WS0001');
      const clicked = await p.evaluate(() => {
        performance.clearMeasures();
        return performance.now();
      });
      const busyBeforeYear = await mainThreadMs(cdp);
      await p.click('.spans button[data-days="365"]');
      await p.waitForFunction(() => performance.getEntriesByName('station-draw').length > 0, undefined, { timeout: 120_000 });
      const busyYear = (await mainThreadMs(cdp)) - busyBeforeYear;
      const [drawMs, dataAt, points] = await p.evaluate(() => {
        const m = performance.getEntriesByName('station-draw')[0]!;
        return [
          m.duration,
          m.startTime,
          Number(/(\d+) epochs/.exec(document.querySelector('#station-status')!.textContent ?? '')?.[1] ?? 0),
        ];
      });
      if (i > 0) {
        network.push(drawn);
        networkMeans.push(meansDrawn);
        draw.push(drawMs);
        fetchYear.push(dataAt - clicked);
        networkBusy.push(busyAtDrawn);
        yearBusy.push(busyYear);
      }
      if (i === 1) lines.push(`page: station-year of ${points} points`);
      await context.close();
    }
    lines.push(`page: ${STATIONS} stations, navigation to the network view drawn (values at the hour): ${fmt(network)}`);
    lines.push(`page: ${STATIONS} stations, navigation to the hourly means drawn over it: ${fmt(networkMeans)}`);
    lines.push(`page: station-year drawn (data in memory → charts painted): ${fmt(draw)}`);
    lines.push(`page: station-year fetched and parsed (click → data in memory): ${fmt(fetchYear)}`);
    lines.push(`page: main-thread busy time (CPU side), navigation → network view drawn: ${fmt(networkBusy)}`);
    lines.push(`page: main-thread busy time (CPU side), click → station-year drawn (fetch, JSON parse, columns, charts): ${fmt(yearBusy)}`);
  } finally {
    await browser.close();
    await app.close();
    rmSync(dir, { recursive: true, force: true });
  }
  return lines;
}

export default async function run(): Promise<string[]> {
  const lines: string[] = [];
  const dir = mkdtempSync(join(tmpdir(), 'tropodelay-bench-'));
  try {
    lines.push(...(await networkCalls('sqlite', { dataDir: dir })));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  if (await pgAvailable()) {
    const schema = `b_${randomBytes(6).toString('hex')}`;
    const pgDir = mkdtempSync(join(tmpdir(), 'tropodelay-bench-'));
    try {
      lines.push(...(await networkCalls('postgres', { dataDir: pgDir, databaseUrl: PG_URL, pgSchema: schema })));
    } finally {
      const client = new pg.Client({ connectionString: PG_URL });
      await client.connect();
      await client.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
      await client.end();
      rmSync(pgDir, { recursive: true, force: true });
    }
  } else lines.push('postgres: skipped (no server at BENCH_DATABASE_URL)');
  lines.push(...(await page()));
  return lines;
}
