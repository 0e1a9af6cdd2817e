/**
 * Campaigns through the client against a running service on SQLite (its single-process queue): residuals
 * of two station-days deposited by the client, a campaign submitted and followed with a bar until
 * finished, its report homogeneous with the campaign's one fingerprint, the stored delays carrying that
 * fingerprint; a second campaign cancelled; the list. Needs the campaign routes (branch `campaigns`).
 */

import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { adminJson, createStation, startRunningService, runCli, type RunningService } from './running-service.js';
import { buildSyntheticCsv } from './synthetic-files.js';

let svc: RunningService;
beforeAll(async () => {
  svc = await startRunningService();
  await createStation(svc.baseUrl, 'CAMP1');
  const file = join(svc.workDir, 'camp1.csv');
  // two UTC days of 5-minute residuals (2026-03-14 and 15) from the committed generator
  writeFileSync(file, buildSyntheticCsv({ hours: 47.9, samplingS: 300, seed: 3 }));
  const deposit = await cli(['residuals-deposit', '--station', 'CAMP1', '--file', file, '--quiet']);
  expect(deposit.code, deposit.stderr).toBe(0);
});
afterAll(async () => {
  await svc?.stop();
});

const cli = (args: string[], terminal = false) => runCli(svc.baseUrl, args, terminal);

const SPAN = ['--start-date', '2026-03-14', '--end-date', '2026-03-15', '--stations', 'CAMP1'];

describe('campaign submit --follow, report, list', () => {
  let campaignId = '';
  let fingerprint = '';

  it('submits, follows with a bar to the end, and exits 0 when every item is done', async () => {
    const run = await cli(
      ['campaign', 'submit', ...SPAN, '--name', 'client test', '--options', '{"zwd_interval_s":900}', '--follow', '--interval-s', '0.2'],
      true,
    );
    expect(run.code, run.stderr).toBe(0);
    const id = /campaign (\S+): finished: 2 done, 0 failed/.exec(run.stdout)?.[1];
    expect(id, run.stdout).toBeDefined();
    campaignId = id!;
    expect(run.stderr).toMatch(new RegExp(`campaign ${campaignId} \\[#{40}\\] 100% \\| 2/2`));
  });

  it('fetches a homogeneous report: one fingerprint for both station-days, no exceptions', async () => {
    const run = await cli(['campaign', 'report', campaignId, '--json']);
    expect(run.code, run.stderr).toBe(0);
    const report = JSON.parse(run.stdout);
    expect(report).toMatchObject({ campaign_id: campaignId, state: 'finished', homogeneous: true, exceptions: [] });
    expect(report.items).toMatchObject({ total: 2, done: 2, failed: 0 });
    expect(report.fingerprints).toEqual([{ fingerprint: report.model_fingerprint, station_days: 2 }]);
    fingerprint = report.model_fingerprint;
  });

  it('the station series downloaded by the client carries the campaign fingerprint', async () => {
    const out = join(svc.workDir, 'camp1-delays.json');
    const run = await cli([
      'series',
      '--station',
      'CAMP1',
      '--kind',
      'delays',
      '--from',
      '2026-03-14',
      '--to',
      '2026-03-15',
      '--out',
      out,
      '--json',
    ]);
    expect(run.code, run.stderr).toBe(0);
    expect(JSON.parse(run.stdout)).toMatchObject({ homogeneous: true, modelFingerprints: [fingerprint] });
  });

  it('cancels a second campaign and lists both', async () => {
    const submitted = await cli(['campaign', 'submit', ...SPAN, '--json']);
    expect(submitted.code, submitted.stderr).toBe(0);
    const second = JSON.parse(submitted.stdout).campaign_id as string;
    const cancel = await cli(['campaign', 'cancel', second, '--json']);
    expect(cancel.code, cancel.stderr).toBe(0);
    // cancelled while queued or running; one that finished first stays finished (nothing left to cancel)
    expect(['cancelled', 'finished']).toContain(JSON.parse(cancel.stdout).state);
    const status = await adminJson(svc.baseUrl, 'GET', `/v1/campaigns/${second}`);
    expect(status.body.state).toBe(JSON.parse(cancel.stdout).state);

    const list = await cli(['campaign', 'list', '--json']);
    expect(JSON.parse(list.stdout).campaigns.map((c: any) => c.campaign_id)).toEqual(expect.arrayContaining([campaignId, second]));
  });

  it('passes a refusal of the campaign on with the field named (exit 1)', async () => {
    const run = await cli(['campaign', 'submit', '--start-date', '2026-03-15', '--end-date', '2026-03-14', '--stations', 'CAMP1']);
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/POST \/v1\/campaigns: 400/);
  });
});
