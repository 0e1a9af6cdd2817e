/// <reference lib="dom" />
/**
 * The workspace page at / in a real headless browser (Debian's chromium via playwright-core), on an
 * invented network seeded from the synthetic truth (test/helpers/workspace-network.ts):
 *   - the map shows every station; its colours are the hourly means of the network API, in viridis
 *     (d3-scale-chromatic's interpolateViridis as the reference, 0–60 mm);
 *   - choosing another hour (keyboard on the hour slider) recolours the map;
 *   - choosing a station draws its PWV series with the σ band and the flagged epochs (pixels of the
 *     band and flag colours on the chart canvas), and the met panel;
 *   - the CSV and netCDF downloads parse (csv-parse, netcdfjs) and agree; the PNG download is a PNG;
 *   - axe-core finds no serious or critical accessibility violation;
 *   - the keyboard alone reaches every control;
 *   - no request leaves the service's origin (every request is intercepted and checked).
 * Screenshots of each view go to test-artifacts/workspace/ (gitignored).
 */

import { mkdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { interpolateViridis } from 'd3-scale-chromatic';
import { NetCDFReader } from 'netcdfjs';
import type { FastifyInstance } from 'fastify';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildWeb } from '../../scripts/build-web.js';
import { buildApp } from '../../src/http/app.js';
import { TEST_KEY } from '../helpers/archive-app.js';
import { browserSkipReason, launchBrowser } from '../helpers/browser.js';
import { sqliteBackend } from '../helpers/storage.js';
import { seedWorkspaceNetwork } from '../helpers/workspace-network.js';

const skipReason = browserSkipReason();
if (skipReason) console.warn(skipReason);

const ARTIFACTS = join(process.cwd(), 'test-artifacts', 'workspace');
const START_MS = Date.UTC(2026, 6, 10);
const STATIONS = 12;
/** Epochs of one station from the seeded start to the end of the hour 2026-07-11T17Z, every 5 min. */
const EPOCHS_SHOWN = (24 + 18) * 12;

interface AxeResult {
  violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[];
}

describe.skipIf(skipReason !== null)('workspace page in chromium', () => {
  let app: FastifyInstance;
  let cleanup: () => Promise<void>;
  let browser: Browser;
  let context: BrowserContext;
  let page: Page;
  let origin: string;
  const outside: string[] = [];
  const requested: string[] = [];

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    await buildWeb();
    const fresh = await sqliteBackend.fresh();
    cleanup = fresh.cleanup;
    app = await buildApp({
      archive: { storage: fresh.config, apiKeys: [TEST_KEY], keyDir: fresh.config.dataDir, readKeysRequired: false, maxReadRangeDays: 366 },
    });
    await seedWorkspaceNetwork(app.repository, { stations: STATIONS, days: 2, stepMin: 5, startMs: START_MS });
    await app.listen({ port: 0, host: '127.0.0.1' });
    origin = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}`;
    browser = await launchBrowser();
    context = await browser.newContext({ acceptDownloads: true, viewport: { width: 1280, height: 1000 } });
    await context.route('**/*', (route) => {
      const url = route.request().url();
      requested.push(url);
      if (new URL(url).origin !== origin) {
        outside.push(url);
        return route.abort();
      }
      return route.continue();
    });
    page = await context.newPage();
    await page.goto(`${origin}/`);
    await page.waitForSelector('body[data-ready="true"]', { timeout: 30_000 });
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await cleanup?.();
  });

  const hourlyMeans = async (epoch: string) => {
    const res = await fetch(`${origin}/v1/network/precipitable-water?epoch=${epoch}&interval=PT1H`);
    const body = (await res.json()) as { intervals: { station_id: string; pwv_mm: number | null }[] };
    return new Map(body.intervals.map((m) => [m.station_id, m.pwv_mm]));
  };
  const mapState = () =>
    page.$$eval('#map circle.station', (cs) =>
      cs.map((c) => ({ id: c.getAttribute('data-station'), fill: c.getAttribute('fill'), pwv: c.getAttribute('data-pwv-mm') })),
    );

  it('shows every station on the map, coloured by the hourly mean PWV of the API (viridis, 0–60 mm)', async () => {
    const circles = await mapState();
    expect(circles.map((c) => c.id).sort()).toEqual(Array.from({ length: STATIONS }, (_, i) => `WS${String(i + 1).padStart(4, '0')}`));
    const hour = await page.getAttribute('body', 'data-hour');
    expect(hour).toBe('2026-07-11T23:00:00Z'); // the latest hour of the seeded two days
    const means = await hourlyMeans(hour!);
    for (const c of circles) {
      const v = means.get(c.id!) ?? null;
      if (v === null) {
        expect(c.fill).toBe('none');
        continue;
      }
      expect(Number(c.pwv)).toBeCloseTo(v, 1);
      expect(c.fill).toBe(interpolateViridis(Math.min(1, v / 60)));
    }
    expect(circles.filter((c) => c.fill === 'none').map((c) => c.id)).toEqual([`WS00${STATIONS}`]); // the station without delays
    expect(await page.locator('#station-table tbody tr').count()).toBe(STATIONS);
    await expect(page.locator('.caution').textContent()).resolves.toMatch(/not use them for safety-of-life decisions/);
    await page.screenshot({ path: join(ARTIFACTS, 'network.png'), fullPage: true });
  });

  it('recolours the map when another hour is chosen with the keyboard', async () => {
    const before = await mapState();
    await page.focus('#hour');
    for (let i = 0; i < 6; i++) await page.keyboard.press('ArrowLeft');
    await page.waitForSelector('body[data-hour="2026-07-11T17:00:00Z"]');
    await page.waitForFunction(() => document.querySelector('#table-status')?.textContent?.includes('2026-07-11T17Z:'));
    const after = await mapState();
    const means = await hourlyMeans('2026-07-11T17:00:00Z');
    let changed = 0;
    for (const c of after) {
      const v = means.get(c.id!) ?? null;
      expect(c.fill).toBe(v === null ? 'none' : interpolateViridis(Math.min(1, v / 60)));
      if (c.fill !== before.find((b) => b.id === c.id)!.fill) changed++;
    }
    expect(changed).toBeGreaterThan(STATIONS / 2);
  });

  it('sorts the table by PWV from the header button', async () => {
    await page.click('#station-table thead button[data-key="pwvMm"]');
    const values = await page.$$eval('#station-table tbody tr td:nth-child(6)', (tds) => tds.map((td) => td.textContent));
    const numbers = values.filter((v) => v !== '–').map(Number);
    expect(numbers).toEqual([...numbers].sort((a, b) => a - b));
    expect(await page.getAttribute('#station-table thead th:nth-child(6)', 'aria-sort')).toBe('ascending');
  });

  it('draws the chosen station: PWV with its σ band and flagged epochs, the met panel, flag counts, coverage', async () => {
    await page.click('#station-table tbody button[aria-label="Show the series of WS0002"]');
    await page.waitForSelector('body[data-station="WS0002"]');
    await page.click('.spans button[data-days="7"]');
    await page.waitForFunction(
      () =>
        document.querySelector('#station-status')?.textContent?.includes('WS0002') &&
        !document.querySelector('#station-status')?.textContent?.includes('Loading'),
    );
    // Pixels on the PWV canvas (transparent where nothing is drawn): the band rgba(35,57,91,0.18) and the flag colour #b5179e.
    const pixels = await page.$eval('#pwv-chart canvas', (canvas) => {
      const ctx = (canvas as HTMLCanvasElement).getContext('2d')!;
      const data = ctx.getImageData(0, 0, (canvas as HTMLCanvasElement).width, (canvas as HTMLCanvasElement).height).data;
      let band = 0;
      let flag = 0;
      for (let i = 0; i < data.length; i += 4) {
        const [r, g, b, a] = [data[i]!, data[i + 1]!, data[i + 2]!, data[i + 3]!];
        if (Math.abs(r - 35) <= 8 && Math.abs(g - 57) <= 8 && Math.abs(b - 91) <= 8 && a >= 35 && a <= 60) band++;
        if (Math.abs(r - 181) <= 12 && Math.abs(g - 23) <= 12 && Math.abs(b - 158) <= 12 && a > 200) flag++;
      }
      return { band, flag };
    });
    expect(pixels.band).toBeGreaterThan(200);
    expect(pixels.flag).toBeGreaterThan(20);
    expect(await page.locator('#met-chart canvas').count()).toBe(1);
    // Altitude above sea level beside the ellipsoidal height (GET /v1/stations/{id} has the same numbers).
    const place = (await (await page.request.get(`${origin}/v1/stations/WS0002`)).json()) as { altitude_m: number; height_m: number };
    const status = await page.locator('#station-status').textContent();
    expect(status).toContain(`${place.altitude_m.toFixed(1)} m above sea level`);
    expect(status).toContain(`ellipsoidal ${place.height_m.toFixed(1)} m`);
    const flags = await page.locator('#flag-list').textContent();
    // The week ends at the chosen hour 2026-07-11T17Z: epochs k = 0..503 of 5 min; WS0002 has ztd_sigma_m 0.03 m at every 7th: 72
    expect(flags).toContain(`delay-sigma-large: ${EPOCHS_SHOWN / 7}`);
    const coverage = await page.locator('#coverage').textContent();
    expect(coverage).toContain('2026-07-10T00:00Z');
    expect(coverage).toContain(`gnss-run (${EPOCHS_SHOWN})`);
    await page.screenshot({ path: join(ARTIFACTS, 'station.png'), fullPage: true });
  });

  it('downloads: the CSV parses and matches the API, the PNG is a PNG', async () => {
    const [csvDownload] = await Promise.all([page.waitForEvent('download'), page.click('#station-csv')]);
    const text = readFileSync((await csvDownload.path())!, 'utf8');
    const rows = parse(text, { columns: true }) as Record<string, string>[];
    expect(rows).toHaveLength(EPOCHS_SHOWN);
    expect(new Set(rows.map((r) => r.station_id))).toEqual(new Set(['WS0002']));
    expect(rows.filter((r) => r.quality === 'delay-sigma-large')).toHaveLength(EPOCHS_SHOWN / 7);
    const [pngDownload] = await Promise.all([page.waitForEvent('download'), page.click('#chart-png')]);
    const png = readFileSync((await pngDownload.path())!);
    expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const [netDownload] = await Promise.all([page.waitForEvent('download'), page.click('#network-csv')]);
    const network = parse(readFileSync((await netDownload.path())!, 'utf8'), { columns: true }) as Record<string, string>[];
    expect(network.length).toBe(STATIONS - 1);
    expect(Object.keys(network[0]!)).toContain('latitude_deg');
    const [ncDownload] = await Promise.all([page.waitForEvent('download'), page.click('#station-nc')]);
    const nc = new NetCDFReader(readFileSync((await ncDownload.path())!));
    expect(nc.getAttribute('featureType')).toBe('timeSeries');
    expect(nc.dimensions.find((d) => d.name === 'time')!.size).toBe(EPOCHS_SHOWN);
    const pwv = nc.getDataVariable('pwv') as number[];
    expect(pwv).toHaveLength(rows.length);
    const worst = Math.max(...pwv.map((v, i) => Math.abs(v - Number(rows[i]!.pwv_mm))));
    expect(worst).toBeLessThan(2e-4); // float32 of ~20 mm (2e-6 mm) plus the CSV's 0.0001 mm rounding
  });

  it('lists the data coverage of every station (GET /v1/network/coverage): sources, first, last, records, gaps', async () => {
    const rows = await page.$$eval('#network-coverage tbody tr', (trs) =>
      trs.map((tr) => Array.from(tr.children).map((td) => td.textContent ?? '')),
    );
    expect(rows).toHaveLength(STATIONS);
    // The seeded network (test/helpers/workspace-network.ts): source gnss-run every 5 min over the two days
    // 2026-07-10/11 without a hole (2 × 288 = 576 records, no gap); the last station holds no delays.
    for (const [k, row] of rows.slice(0, STATIONS - 1).entries()) {
      expect(row).toEqual([`WS${String(k + 1).padStart(4, '0')}`, 'gnss-run', '2026-07-10T00:00Z', '2026-07-11T23:55Z', '576', '0', '–']);
    }
    expect(rows[STATIONS - 1]!.slice(0, 3)).toEqual([`WS00${STATIONS}`, '–', 'no records']);
    await expect(page.locator('#network-coverage-status').textContent()).resolves.toBe(
      `${STATIONS - 1} of ${STATIONS} stations hold delays; ${(STATIONS - 1) * 576} records; 0 gaps longer than 1 h.`,
    );
  });

  it('has no serious or critical accessibility violation (axe-core)', async () => {
    const require = createRequire(import.meta.url);
    // Evaluated through the debugging protocol: the page's own CSP (script-src 'self') refuses injected script tags.
    await page.evaluate(readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8'));
    const result = (await page.evaluate(() => (window as unknown as { axe: { run(): Promise<unknown> } }).axe.run())) as AxeResult;
    const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
    expect(bad.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`)).toEqual([]);
  });

  it('reaches every control with the keyboard alone', async () => {
    const controls = await page.$$eval('button, select, input, a[href], [tabindex]:not([tabindex="-1"])', (els) =>
      els
        .filter((e) => !(e as HTMLElement).hidden && (e as HTMLElement).offsetParent !== null)
        .map((e, i) => {
          e.setAttribute('data-control', String(i));
          return String(i);
        }),
    );
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await page.mouse.click(5, 5);
    const reached = new Set<string>();
    for (let i = 0; i < controls.length + 10; i++) {
      await page.keyboard.press('Tab');
      const id = await page.evaluate(() => document.activeElement?.getAttribute('data-control') ?? null);
      if (id !== null) reached.add(id);
    }
    expect(controls.filter((c) => !reached.has(c))).toEqual([]);
  });

  it('sent no request outside the service origin', () => {
    expect(requested.length).toBeGreaterThan(5);
    expect(outside).toEqual([]);
  });
});
