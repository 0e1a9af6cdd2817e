/**
 * The campaign sweep's settings come from the environment (TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S,
 * TROPODELAY_CAMPAIGN_SWEEP_GRACE_S, src/config.ts): their defaults, the bounds refused with a message naming
 * the variable and the range, and the values reaching the sweep of src/http/plugins/campaigns.ts through
 * archiveOptionsFromConfig and buildApp (the path server.ts takes). The sweep runs on PostgreSQL only (SQLite's
 * single-process queue takes up every unfinished item at start), so the last part needs TEST_DATABASE_URL.
 * Expected values: the settings given here (the configuration's documented meaning, common practice).
 */

import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { DEFAULT_CAMPAIGN_SWEEP_GRACE_S, DEFAULT_CAMPAIGN_SWEEP_INTERVAL_S, loadConfig } from '../../src/config.js';
import { archiveOptionsFromConfig, buildApp } from '../../src/http/app.js';
import { CampaignService } from '../../src/services/campaigns/campaigns.js';
import { TEST_PG_URL } from '../helpers/storage.js';

describe('TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S and TROPODELAY_CAMPAIGN_SWEEP_GRACE_S', () => {
  it('default to a minute each, and reach the archive options', () => {
    expect(DEFAULT_CAMPAIGN_SWEEP_INTERVAL_S).toBe(60);
    expect(DEFAULT_CAMPAIGN_SWEEP_GRACE_S).toBe(60);
    expect(archiveOptionsFromConfig(loadConfig({})).campaigns).toMatchObject({ sweepIntervalS: 60, sweepGraceS: 60 });
    const set = loadConfig({ TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S: '15', TROPODELAY_CAMPAIGN_SWEEP_GRACE_S: '300' });
    expect(archiveOptionsFromConfig(set).campaigns).toMatchObject({ sweepIntervalS: 15, sweepGraceS: 300 });
  });

  it.each([
    ['TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S', '0'],
    ['TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S', '86401'],
    ['TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S', '2.5'],
    ['TROPODELAY_CAMPAIGN_SWEEP_GRACE_S', '0'],
    ['TROPODELAY_CAMPAIGN_SWEEP_GRACE_S', '-60'],
    ['TROPODELAY_CAMPAIGN_SWEEP_GRACE_S', 'minute'],
  ])('refuses %s=%s naming the variable and the range 1..86400', (name, value) => {
    expect(() => loadConfig({ [name]: value })).toThrow(`${name}=${JSON.stringify(value)}: must be a whole number in 1..86400`);
  });
});

describe.skipIf(!TEST_PG_URL)('the configured sweep on PostgreSQL', () => {
  const cleanups: (() => Promise<void>)[] = [];
  afterEach(async () => {
    vi.restoreAllMocks();
    for (const c of cleanups.splice(0).reverse()) await c();
  });

  it('runs at the configured interval with the configured grace', { timeout: 90_000 }, async () => {
    const schema = `t_${randomBytes(6).toString('hex')}`;
    const dir = mkdtempSync(join(tmpdir(), 'tropodelay-test-'));
    cleanups.push(async () => {
      rmSync(dir, { recursive: true, force: true });
      const client = new pg.Client({ connectionString: TEST_PG_URL });
      await client.connect();
      await client.query(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
      await client.end();
    });
    const graces: number[] = [];
    const sweep = vi.spyOn(CampaignService.prototype, 'sweepUnqueued').mockImplementation(async (graceMs: number) => {
      graces.push(graceMs);
      return [];
    });
    const config = loadConfig({
      DATABASE_URL: TEST_PG_URL,
      TROPODELAY_PG_SCHEMA: schema,
      TROPODELAY_DATA_DIR: dir,
      TROPODELAY_API_KEYS: 'sweep-admin:admin:sweep-admin-secret-0123456789',
      TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S: '1',
      TROPODELAY_CAMPAIGN_SWEEP_GRACE_S: '7',
    });
    const app = await buildApp({ config, archive: { ...archiveOptionsFromConfig(config), schedulePurge: false } });
    cleanups.push(() => app.close());
    // At start, then every second: three sweeps come within a few seconds (the default, a minute, gives one).
    // The queue starts after onReady without being awaited; wait for the sweeps, at most 60 s.
    for (let k = 0; k < 600 && sweep.mock.calls.length < 3; k++) await new Promise((r) => setTimeout(r, 100));
    expect(sweep.mock.calls.length).toBeGreaterThanOrEqual(3);
    expect(new Set(graces)).toEqual(new Set([7000]));
  });
});
