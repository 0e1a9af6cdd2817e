/// <reference lib="dom" />
/**
 * The workspace page when reads need a key (TROPO_READ_KEYS_REQUIRED=true), in headless chromium:
 *   - without a key the page says so (the 401 of the service) and puts the focus on the key field;
 *   - a wrong key gets the 403 message; the right key (role read) draws the network view;
 *   - the key is kept in sessionStorage only (not localStorage, not a cookie, never in a URL) and sent
 *     as `Authorization: Bearer` on every data call, the downloads included (fetch + blob: the CSV
 *     download parses).
 */

import { readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { parse } from 'csv-parse/sync';
import type { FastifyInstance } from 'fastify';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildWeb } from '../../scripts/build-web.js';
import { buildApp } from '../../src/http/app.js';
import { browserSkipReason, launchBrowser } from '../helpers/browser.js';
import { sqliteBackend } from '../helpers/storage.js';
import { seedWorkspaceNetwork } from '../helpers/workspace-network.js';

const skipReason = browserSkipReason();
const READ_KEY = 'page-reader-0123456789abcdef';
const ADMIN_KEY = 'page-admin-0123456789abcdef';
const STATIONS = 4;

describe.skipIf(skipReason !== null)('workspace page with read keys required', () => {
  let app: FastifyInstance;
  let cleanup: () => Promise<void>;
  let browser: Browser;
  let page: Page;
  /** Data calls of the page (v1/...): URL and Authorization header. */
  const calls: { url: string; authorization: string | undefined }[] = [];

  beforeAll(async () => {
    await buildWeb();
    const fresh = await sqliteBackend.fresh();
    cleanup = fresh.cleanup;
    app = await buildApp({
      archive: {
        storage: fresh.config,
        apiKeys: [
          { name: 'page-admin', role: 'admin', secret: ADMIN_KEY },
          { name: 'page-reader', role: 'read', secret: READ_KEY },
        ],
        keyDir: fresh.config.dataDir,
        readKeysRequired: true,
        maxReadRangeDays: 366,
      },
    });
    await seedWorkspaceNetwork(app.repository, { stations: STATIONS, days: 1, stepMin: 10, startMs: Date.UTC(2026, 6, 10) });
    await app.listen({ port: 0, host: '127.0.0.1' });
    const origin = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}`;
    browser = await launchBrowser();
    const context = await browser.newContext({ acceptDownloads: true });
    page = await context.newPage();
    page.on('request', (r) => {
      if (new URL(r.url()).pathname.startsWith('/v1/')) calls.push({ url: r.url(), authorization: r.headers().authorization });
    });
    await page.goto(`${origin}/`);
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await cleanup?.();
  });

  it('without a key: says a read key is needed and focuses the key field', async () => {
    await page.waitForSelector('#key-status.refused');
    await expect(page.locator('#key-status').textContent()).resolves.toMatch(/needs a read key/);
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('read-key');
    expect(await page.getAttribute('#read-key', 'type')).toBe('password');
    expect(await page.getAttribute('body', 'data-ready')).toBeNull();
  });

  it('a key that is not accepted: says it was refused', async () => {
    await page.fill('#read-key', 'not-a-key-0123456789abcdef');
    await page.press('#read-key', 'Enter');
    await page.waitForFunction(() => document.querySelector('#key-status')?.textContent?.includes('refused'));
    expect(await page.getAttribute('#key-status', 'class')).toBe('refused');
  });

  it('the read key: the page loads, the key stays in sessionStorage only and goes with every call', async () => {
    calls.length = 0;
    await page.fill('#read-key', READ_KEY);
    await page.click('#key-form button[type="submit"]');
    await page.waitForSelector('body[data-ready="true"]', { timeout: 30_000 });
    expect(await page.locator('#map circle.station').count()).toBe(STATIONS);
    expect(await page.inputValue('#read-key')).toBe(''); // not left in the field
    const stored = await page.evaluate(() => ({
      session: sessionStorage.getItem('tropodelay.read-key'),
      local: localStorage.length,
      cookie: document.cookie,
    }));
    expect(stored).toEqual({ session: READ_KEY, local: 0, cookie: '' });
    expect(calls.length).toBeGreaterThan(3);
    for (const c of calls) {
      expect(c.authorization).toBe(`Bearer ${READ_KEY}`);
      expect(c.url).not.toContain(READ_KEY);
    }
  });

  it('downloads carry the key (fetch + blob): the network CSV parses', async () => {
    calls.length = 0;
    const [file] = await Promise.all([page.waitForEvent('download'), page.click('#network-csv')]);
    const rows = parse(readFileSync((await file.path())!, 'utf8'), { columns: true }) as Record<string, string>[];
    expect(rows.length).toBe(STATIONS - 1); // the last seeded station holds no delays
    expect(file.suggestedFilename()).toMatch(/^network-pwv-.*\.csv$/);
    expect(calls.filter((c) => c.url.includes('format=csv')).map((c) => c.authorization)).toEqual([`Bearer ${READ_KEY}`]);
  });
});
