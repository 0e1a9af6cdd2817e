/// <reference lib="dom" />
/**
 * Soundings on the workspace page (issue 13, "a sounding appears with its statistics"), in Debian's
 * chromium: invented soundings of the first station (scripts/synthetic/soundings.ts, from the same truth
 * as its GNSS series) appear as points of the sounding colour on the PWV chart, and the bias, SD and count
 * next to the chart are those of GET /v1/stations/{id}/sounding-comparison (itself checked against
 * simple-statistics in test/http/station-soundings.test.ts). axe-core and the origin check as in
 * workspace-page.test.ts. Screenshot: test-artifacts/workspace/soundings.png.
 */

import { mkdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import type { FastifyInstance } from 'fastify';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildWeb } from '../../scripts/build-web.js';
import { truthSeries } from '../../scripts/synthetic/network.js';
import { syntheticSounding } from '../../scripts/synthetic/soundings.js';
import { buildApp } from '../../src/http/app.js';
import { TEST_KEY } from '../helpers/archive-app.js';
import { browserSkipReason, launchBrowser } from '../helpers/browser.js';
import { sqliteBackend } from '../helpers/storage.js';
import { seedWorkspaceNetwork } from '../helpers/workspace-network.js';

const skipReason = browserSkipReason();
if (skipReason) console.warn(skipReason);

const ARTIFACTS = join(process.cwd(), 'test-artifacts', 'workspace');
const START_MS = Date.UTC(2026, 6, 10);
const H = 3_600_000;
/**
 * Inside the day the page shows first (ending at the latest seeded hour, 2026-07-11T23Z): on a GNSS epoch,
 * between two, and one more.
 */
const SOUNDING_EPOCHS_MS = [24 * H, 30 * H + 2.5 * 60_000, 36 * H].map((d) => START_MS + d);

describe.skipIf(skipReason !== null)('soundings on the workspace page in chromium', () => {
  let app: FastifyInstance;
  let cleanup: () => Promise<void>;
  let browser: Browser;
  let page: Page;
  let origin: string;
  const outside: string[] = [];

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    await buildWeb();
    const fresh = await sqliteBackend.fresh();
    cleanup = fresh.cleanup;
    app = await buildApp({
      archive: { storage: fresh.config, apiKeys: [TEST_KEY], keyDir: fresh.config.dataDir, readKeysRequired: false, maxReadRangeDays: 366 },
    });
    const [first] = await seedWorkspaceNetwork(app.repository, { stations: 3, days: 2, stepMin: 5, startMs: START_MS });
    for (const [k, epochMs] of SOUNDING_EPOCHS_MS.entries()) {
      // The seeded station's truth (seed 1 for the first station) at the sounding epoch.
      const truth = truthSeries(first!, epochMs, 1, 1, 1)[0]!;
      const sounding = syntheticSounding(first!, truth, { seed: 50 + k, ...(k === 1 ? { humidityTopHpa: 400 } : {}) });
      const res = await app.inject({
        method: 'PUT',
        url: `/v1/stations/${first!.stationId}/soundings/${sounding.epoch}`,
        headers: { authorization: `Bearer ${TEST_KEY}` },
        payload: sounding.body,
      });
      expect(res.statusCode).toBe(201);
    }
    await app.listen({ port: 0, host: '127.0.0.1' });
    origin = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}`;
    browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 1280, height: 1000 } });
    await context.route('**/*', (route) => {
      const url = route.request().url();
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

  it('shows the soundings as points on the PWV chart and their GNSS − sounding bias, SD and count beside it', async () => {
    await page.waitForSelector('body[data-station="WS0001"][data-soundings="3"]', { timeout: 30_000 });
    const api = (await (
      await fetch(`${origin}/v1/stations/WS0001/sounding-comparison?from=2026-07-11T00:00:00.000Z&to=2026-07-11T23:59:59.999Z`)
    ).json()) as { statistics: { count: number; bias_mm: number; sd_mm: number } };
    expect(api.statistics.count).toBe(3);
    const text = (await page.locator('#sounding-stats').textContent())!;
    expect(text).toContain('pairs with GNSS3 (within ±30 min)');
    expect(text).toContain(`bias (GNSS − sounding)${api.statistics.bias_mm.toFixed(2)} mm`);
    expect(text).toContain(`SD${api.statistics.sd_mm.toFixed(2)} mm`);
    expect(text).toContain('humidity extended aloft1 of 3');
    // The demo's story: soundings made from the station's truth agree with its GNSS PWV within a few mm.
    expect(Math.abs(api.statistics.bias_mm)).toBeLessThan(2);
    // Pixels of the sounding colour #d55e00 (213, 94, 0) on the PWV canvas: three points of 11 px.
    const soundingPixels = await page.$eval('#pwv-chart canvas', (canvas) => {
      const c = canvas as HTMLCanvasElement;
      const data = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
      let n = 0;
      for (let i = 0; i < data.length; i += 4) {
        if (Math.abs(data[i]! - 213) <= 12 && Math.abs(data[i + 1]! - 94) <= 12 && data[i + 2]! <= 20 && data[i + 3]! > 200) n++;
      }
      return n;
    });
    expect(soundingPixels).toBeGreaterThan(3 * 40);
    await page.screenshot({ path: join(ARTIFACTS, 'soundings.png'), fullPage: true });
  });

  it('a station without soundings says so, with no sounding points', async () => {
    await page.selectOption('#station-select', 'WS0002');
    await page.waitForSelector('body[data-station="WS0002"][data-soundings="0"]', { timeout: 30_000 });
    const text = (await page.locator('#sounding-stats').textContent())!;
    expect(text).toContain('soundings in this span0');
    expect(text).toContain('bias (GNSS − sounding)–');
  });

  it('has no serious or critical accessibility violation (axe-core) and sent nothing outside the origin', async () => {
    const require = createRequire(import.meta.url);
    await page.evaluate(readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8'));
    const result = (await page.evaluate(() => (window as unknown as { axe: { run(): Promise<unknown> } }).axe.run())) as {
      violations: { id: string; impact: string | null }[];
    };
    expect(result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id)).toEqual([]);
    expect(outside).toEqual([]);
  });
});
