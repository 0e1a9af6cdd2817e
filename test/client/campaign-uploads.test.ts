/**
 * Campaigns of uploaded residuals and station-windows through the client, against a running service on
 * SQLite: a campaign of 48-hour windows submitted by the CLI, a station's CSV of three days uploaded to it
 * (the day outside the campaign's span not sent), the upload interrupted after its first day at a proxy
 * and resumed with only the missing day, a third run sending nothing; the campaign followed with a bar
 * to the end and its report homogeneous; a campaign whose uploads are closed without any ends with its
 * items without residuals. Expected counts are those of the input file, counted here without the client.
 */

import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { depositResiduals } from '../../client/src/residual-deposit.js';
import { Service, ServiceError } from '../../client/src/service.js';
import { adminJson, CountingProxy, createStation, runCli, startRunningService, WRITE_KEY, type RunningService } from './running-service.js';
import { buildSyntheticCsv, rowsPerDay } from './synthetic-files.js';

let svc: RunningService;
let proxy: CountingProxy;
beforeAll(async () => {
  svc = await startRunningService();
  proxy = await new CountingProxy(svc.baseUrl).start();
  await createStation(svc.baseUrl, 'UPLD1');
});
afterAll(async () => {
  await proxy?.stop();
  await svc?.stop();
});

const UPLOAD_PUTS = /^\/v1\/campaigns\/[^/]+\/residuals\/UPLD1\/\d{4}-\d\d-\d\d$/;

describe('campaign upload: windows over uploaded residuals, interrupted and resumed', () => {
  // 5-minute epochs from 2026-03-14T00:00Z for just under three days; the campaign spans the first two
  const csv = buildSyntheticCsv({ hours: 71.9, samplingS: 300, seed: 11 });
  const expected = rowsPerDay(csv);
  let campaignId = '';
  let file = '';

  it('submits a campaign of 48-hour windows every 24 hours awaiting uploads', async () => {
    expect(Object.keys(expected)).toEqual(['2026-03-14', '2026-03-15', '2026-03-16']);
    const run = await runCli(svc.baseUrl, [
      'campaign',
      'submit',
      '--start-date',
      '2026-03-14',
      '--end-date',
      '2026-03-15',
      '--stations',
      'UPLD1',
      '--residuals',
      'uploaded',
      '--window-hours',
      '48',
      '--step-hours',
      '24',
      '--json',
    ]);
    expect(run.code, run.stderr).toBe(0);
    const submitted = JSON.parse(run.stdout);
    expect(submitted).toMatchObject({
      residuals: 'uploaded',
      window: { length_hours: 48, step_hours: 24 },
      items_total: 2,
      items_awaiting_residuals: 2,
    });
    campaignId = submitted.campaign_id;
  });

  it('sends only the missing day after an interruption, skips the day outside the span, and nothing on a third run', async () => {
    file = join(svc.workDir, 'upld1.csv');
    writeFileSync(file, csv);
    proxy.reset();
    proxy.failAfter('PUT', 1);
    const interrupted = await depositResiduals(new Service({ baseUrl: proxy.url, key: WRITE_KEY, retries: 0 }), {
      campaignId,
      stationId: 'UPLD1',
      file,
    }).catch((e: unknown) => e);
    expect(interrupted).toBeInstanceOf(ServiceError);
    expect(proxy.count('PUT', UPLOAD_PUTS)).toBe(1);

    proxy.reset();
    const rerun = await runCli(proxy.url, ['campaign', 'upload', campaignId, '--station', 'UPLD1', '--file', file, '--json']);
    expect(rerun.code, rerun.stderr).toBe(0);
    expect(proxy.count('PUT', UPLOAD_PUTS)).toBe(1);
    expect(proxy.counts.get(`PUT /v1/campaigns/${campaignId}/residuals/UPLD1/2026-03-14`)).toBeUndefined();
    const result = JSON.parse(rerun.stdout);
    // Both windows read both days of the span: both become ready with the second day.
    expect(result).toMatchObject({ daysTotal: 2, daysSent: 1, daysSkipped: 1, daysOutsideSpan: 1, itemsReady: 2 });

    const listed = await adminJson(svc.baseUrl, 'GET', `/v1/campaigns/${campaignId}/residuals`);
    expect(listed.body.days.map((d: { day: string; observation_count: number }) => [d.day, d.observation_count])).toEqual([
      ['2026-03-14', expected['2026-03-14']],
      ['2026-03-15', expected['2026-03-15']],
    ]);

    proxy.reset();
    const third = await runCli(proxy.url, ['campaign', 'upload', campaignId, '--station', 'UPLD1', '--file', file], true);
    expect(third.code, third.stderr).toBe(0);
    expect(proxy.count('PUT', UPLOAD_PUTS)).toBe(0);
    expect(third.stdout).toMatch(/0 day\(s\) uploaded .*2 already held, 1 outside the span/);
    // The progress bar on a terminal: both days of the span, each already held.
    expect(third.stderr).toMatch(new RegExp(`campaign ${campaignId} UPLD1 \\[#{40}\\] 100% \\| 2/2`));
  });

  it('follows the campaign with a bar to the end; the report is homogeneous over both windows', async () => {
    const follow = await runCli(svc.baseUrl, ['campaign', 'follow', campaignId, '--interval-s', '0.2'], true);
    expect(follow.code, follow.stderr).toBe(0);
    expect(follow.stdout).toMatch(/finished: 2 done, 0 failed/);
    expect(follow.stderr).toMatch(new RegExp(`campaign ${campaignId} \\[#{40}\\] 100% \\| 2/2`));
    const report = await runCli(svc.baseUrl, ['campaign', 'report', campaignId, '--json']);
    const body = JSON.parse(report.stdout);
    expect(body).toMatchObject({ homogeneous: true, exceptions: [], items: { total: 2, done: 2 } });
    expect(body.fingerprints).toEqual([{ fingerprint: body.model_fingerprint, station_days: 2 }]);
  });

  it('close-uploads without any upload ends the items without residuals (exit 0), and later uploads are refused (exit 1)', async () => {
    const submitted = await runCli(svc.baseUrl, [
      'campaign',
      'submit',
      '--start-date',
      '2026-03-14',
      '--end-date',
      '2026-03-14',
      '--stations',
      'UPLD1',
      '--residuals',
      'uploaded',
      '--json',
    ]);
    const id = JSON.parse(submitted.stdout).campaign_id as string;
    const closed = await runCli(svc.baseUrl, ['campaign', 'close-uploads', id]);
    expect(closed.code, closed.stderr).toBe(0);
    expect(closed.stdout).toMatch(/finished: 0 done, 0 failed, 0 running, 0 pending, 1 without residuals/);
    const late = await runCli(svc.baseUrl, ['campaign', 'upload', id, '--station', 'UPLD1', '--file', file]);
    expect(late.code).toBe(1);
    expect(late.stderr).toMatch(/409/);
  });

  it('refuses --step-hours without --window-hours (usage error, exit 2) and passes the service range on (exit 1)', async () => {
    const span = ['campaign', 'submit', '--start-date', '2026-03-14', '--end-date', '2026-03-14'];
    expect((await runCli(svc.baseUrl, [...span, '--step-hours', '6'])).code).toBe(2);
    expect((await runCli(svc.baseUrl, [...span, '--window-hours', 'six'])).code).toBe(2);
    const tooLong = await runCli(svc.baseUrl, [...span, '--window-hours', '500']);
    expect(tooLong.code).toBe(1);
    expect(tooLong.stderr).toMatch(/window\.length_hours/);
  });
});
