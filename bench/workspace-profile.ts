/**
 * Profile of the workspace page's two draws (issue 13) in Debian's chromium, with the DevTools
 * Protocol's Profiler: `npx tsx bench/workspace-profile.ts` prints the functions with the most self
 * time while (1) the network view of 1 000 stations loads and (2) a station-year at 5 min is drawn,
 * and the page's own performance marks. The bundle is rebuilt unminified so the names are readable.
 * Not a *.bench.ts: `npm run bench` does not run it (the figures are in workspace.bench.ts).
 */

import { mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import type { Page } from 'playwright-core';
import { buildWeb, WEB_OUT_DIR } from '../scripts/build-web.js';
import { buildApp } from '../src/http/app.js';
import { launchBrowser } from '../test/helpers/browser.js';
import { seedWorkspaceNetwork } from '../test/helpers/workspace-network.js';

const T0 = Date.UTC(2026, 6, 10);

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  hitCount?: number;
}
interface Profile {
  nodes: ProfileNode[];
  samples?: number[];
  timeDeltas?: number[];
}

function topSelf(profile: Profile, n = 25): string[] {
  const byNode = new Map(profile.nodes.map((x) => [x.id, x]));
  const self = new Map<string, number>();
  const samples = profile.samples ?? [];
  const deltas = profile.timeDeltas ?? [];
  let total = 0;
  for (let i = 0; i < samples.length; i++) {
    const node = byNode.get(samples[i]!)!;
    const f = node.callFrame;
    const key = `${f.functionName || '(anonymous)'} ${f.url.split('/').pop()}:${f.lineNumber + 1}`;
    const dt = (deltas[i + 1] ?? 0) / 1000;
    self.set(key, (self.get(key) ?? 0) + dt);
    total += dt;
  }
  const rows = [...self].sort((a, b) => b[1] - a[1]).slice(0, n);
  return [`total ${total.toFixed(0)} ms`, ...rows.map(([k, ms]) => `${ms.toFixed(1).padStart(8)} ms  ${k}`)];
}

async function profiled(page: Page, label: string, action: () => Promise<void>): Promise<void> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Profiler.enable');
  await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
  await cdp.send('Profiler.start');
  await action();
  const { profile } = (await cdp.send('Profiler.stop')) as unknown as { profile: Profile };
  console.log(`\n### ${label}`);
  for (const line of topSelf(profile)) console.log(line);
}

const dir = mkdtempSync(join(tmpdir(), 'tropodelay-profile-'));
const app = await buildApp({
  archive: { storage: { dataDir: dir }, apiKeys: ['profile-key-0123456789abcdef'], readKeysRequired: false, maxReadRangeDays: 366 },
});
const browser = await launchBrowser();
try {
  await buildWeb();
  await build({
    entryPoints: { app: join(WEB_OUT_DIR, '..', '..', 'web', 'src', 'main.ts') },
    outdir: join(WEB_OUT_DIR, 'assets'),
    bundle: true,
    format: 'esm',
    target: 'es2020',
    minify: false,
    logLevel: 'warning',
  });
  await seedWorkspaceNetwork(app.repository, { stations: 1000, days: 0.125, stepMin: 0.5, startMs: T0 });
  await seedWorkspaceNetwork(app.repository, { stations: 1, days: 365, stepMin: 5, startMs: T0 + 3 * 3_600_000 - 365 * 86_400_000 });
  await app.listen({ port: 0, host: '127.0.0.1' });
  const base = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}/`;
  for (let run = 0; run < 2; run++) {
    const context = await browser.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    await profiled(page, `run ${run}: network view (navigation → network-drawn)`, async () => {
      await page.goto(base);
      await page.waitForFunction(() => performance.getEntriesByName('network-drawn').length > 0, undefined, { timeout: 60_000 });
    });
    await page.waitForSelector('body[data-ready="true"]', { timeout: 60_000 });
    await page.selectOption('#station-select', 'WS0001');
    await page.waitForFunction(() => document.body.dataset.station === 'WS0001');
    await page.evaluate(() => performance.clearMeasures());
    await profiled(page, `run ${run}: station-year (click → station-draw)`, async () => {
      await page.click('.spans button[data-days="365"]');
      await page.waitForFunction(() => performance.getEntriesByName('station-draw').length > 0, undefined, { timeout: 120_000 });
    });
    const marks = await page.evaluate(() =>
      performance
        .getEntries()
        .filter((e) => e.entryType === 'mark' || e.entryType === 'measure')
        .map((e) => `${e.entryType} ${e.name} @${e.startTime.toFixed(0)} +${e.duration.toFixed(0)}`),
    );
    console.log(marks.join('\n'));
    await context.close();
  }
} finally {
  await browser.close();
  await app.close();
  rmSync(dir, { recursive: true, force: true });
}
