/**
 * Residual deposits by station-day against a running service (the routes of the campaigns work):
 * an observation CSV of three days is cut into days, an upload interrupted after the first day resumes
 * with only the two missing days (counted at a proxy in front of the service), every day is stored once
 * with the observation count of the file, and a day changed in the file or replaced on the service is
 * sent again. The expected counts are those of the input file, counted here without the client's code.
 */

import { spawn } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../client/src/cli.js';
import { depositResiduals } from '../../client/src/residual-deposit.js';
import { Service, ServiceError } from '../../client/src/service.js';
import {
  adminJson,
  capturedIo,
  CountingProxy,
  createStation,
  runCli as runCliAt,
  startRunningService,
  WRITE_KEY,
  type RunningService,
} from './running-service.js';
import { buildSyntheticCsv, rowsPerDay } from './synthetic-files.js';

let svc: RunningService;
let proxy: CountingProxy;
beforeAll(async () => {
  svc = await startRunningService();
  proxy = await new CountingProxy(svc.baseUrl).start();
  await createStation(svc.baseUrl, 'DEPO1');
});
afterAll(async () => {
  await proxy?.stop();
  await svc?.stop();
});

const PUTS = /^\/v1\/stations\/DEPO1\/residuals\/\d{4}-\d\d-\d\d$/;

describe('residuals-deposit: three days, interrupted and resumed', () => {
  // 5-minute epochs from 2026-03-14T00:00Z for just under three days: three whole UTC days
  const csv = buildSyntheticCsv({ hours: 71.9, samplingS: 300, seed: 7 });
  const expected = rowsPerDay(csv);

  it('the input has three days', () => {
    expect(Object.keys(expected)).toEqual(['2026-03-14', '2026-03-15', '2026-03-16']);
  });

  it('sends only the missing days after an interruption, and nothing on a third run', async () => {
    const file = join(svc.workDir, 'depo1.csv');
    writeFileSync(file, csv);
    proxy.reset();
    proxy.failAfter('PUT', 1);
    const interrupted = await depositResiduals(new Service({ baseUrl: proxy.url, key: WRITE_KEY, retries: 0 }), {
      stationId: 'DEPO1',
      file,
    }).catch((e: unknown) => e);
    expect(interrupted).toBeInstanceOf(ServiceError);
    expect(proxy.count('PUT', PUTS)).toBe(1);

    // the rerun through the CLI, as an operator would
    proxy.reset();
    const io = capturedIo();
    const code = await main(
      ['residuals-deposit', '--station', 'DEPO1', '--file', file, '--url', proxy.url, '--key', WRITE_KEY, '--json'],
      io,
    );
    expect(code, io.stderr.text).toBe(0);
    expect(proxy.count('PUT', PUTS)).toBe(2);
    expect(proxy.counts.get('PUT /v1/stations/DEPO1/residuals/2026-03-14')).toBeUndefined();
    const result = JSON.parse(io.stdout.text);
    expect(result).toMatchObject({
      daysTotal: 3,
      daysSkipped: 1,
      daysSent: 2,
      observationsSent: expected['2026-03-15']! + expected['2026-03-16']!,
    });

    // every day stored once, with the file's count
    const listing = await adminJson(svc.baseUrl, 'GET', '/v1/stations/DEPO1/residuals');
    expect(listing.body.days.map((d: any) => [d.day, d.observation_count])).toEqual(Object.entries(expected));

    proxy.reset();
    const third = await depositResiduals(new Service({ baseUrl: proxy.url, key: WRITE_KEY }), { stationId: 'DEPO1', file });
    expect(third).toMatchObject({ daysSent: 0, daysSkipped: 3 });
    expect(proxy.count('PUT', PUTS)).toBe(0);
  });

  it('resumes after the CLI process is killed while a day is in flight', async () => {
    await createStation(svc.baseUrl, 'DEPO2');
    const file = join(svc.workDir, 'depo2.csv');
    writeFileSync(file, csv);
    proxy.reset();
    const secondDayArrived = proxy.holdAfter('PUT', 1);
    const child = spawn(
      process.execPath,
      [
        '--import',
        'tsx',
        'client/src/cli.ts',
        'residuals-deposit',
        '--station',
        'DEPO2',
        '--file',
        file,
        '--url',
        proxy.url,
        '--key',
        WRITE_KEY,
      ],
      { stdio: 'ignore' },
    );
    const exited = new Promise<NodeJS.Signals | null>((resolve) => child.once('exit', (_code, signal) => resolve(signal)));
    await secondDayArrived;
    child.kill('SIGKILL');
    expect(await exited).toBe('SIGKILL');
    const listed = await adminJson(svc.baseUrl, 'GET', '/v1/stations/DEPO2/residuals');
    expect(listed.body.days.map((d: any) => d.day)).toEqual(['2026-03-14']);

    proxy.reset();
    const rerun = await runCliAt(proxy.url, ['residuals-deposit', '--station', 'DEPO2', '--file', file, '--json']);
    expect(rerun.code, rerun.stderr).toBe(0);
    expect(JSON.parse(rerun.stdout)).toMatchObject({ daysSkipped: 1, daysSent: 2 });
    expect(proxy.count('PUT', /^\/v1\/stations\/DEPO2\/residuals\//)).toBe(2);
    const after = await adminJson(svc.baseUrl, 'GET', '/v1/stations/DEPO2/residuals');
    expect(after.body.days.map((d: any) => [d.day, d.observation_count])).toEqual(Object.entries(expected));
  });

  it('sends a day again when the file changed on that day or the service holds other content for it', async () => {
    const file = join(svc.workDir, 'depo1.csv');
    // the service's day 15 replaced by one row (another producer)
    const replaced = await fetch(`${svc.baseUrl}/v1/stations/DEPO1/residuals/2026-03-15`, {
      method: 'PUT',
      headers: { authorization: `Bearer ${WRITE_KEY}`, 'content-type': 'text/csv' },
      body: csv.split('\n').slice(0, 1).join('\n') + '\n' + csv.split('\n').find((l) => l.startsWith('2026-03-15'))! + '\n',
    });
    expect(replaced.status).toBe(200);
    // day 16 of the file changed: its last row dropped
    const lines = csv.trim().split('\n');
    writeFileSync(file, lines.slice(0, -1).join('\n') + '\n');

    proxy.reset();
    const rerun = await depositResiduals(new Service({ baseUrl: proxy.url, key: WRITE_KEY }), { stationId: 'DEPO1', file });
    expect(rerun.days.map((d) => [d.day, d.outcome])).toEqual([
      ['2026-03-14', 'skipped'],
      ['2026-03-15', 'sent'],
      ['2026-03-16', 'sent'],
    ]);
    const listing = await adminJson(svc.baseUrl, 'GET', '/v1/stations/DEPO1/residuals');
    expect(listing.body.days.map((d: any) => d.observation_count)).toEqual([
      expected['2026-03-14'],
      expected['2026-03-15'],
      expected['2026-03-16']! - 1,
    ]);
  });

  it('reads back a deposited day with the rows of the file', async () => {
    const back = await fetch(`${svc.baseUrl}/v1/stations/DEPO1/residuals/2026-03-14`, { headers: { accept: 'text/csv' } });
    const fileDay = csv
      .trim()
      .split('\n')
      .filter((l) => l.startsWith('2026-03-14'));
    const stored = (await back.text()).trim().split('\n').slice(1);
    expect(stored).toHaveLength(fileDay.length);
    // same epochs and satellites (the stored form sorts by epoch then satellite, as the file is)
    expect(stored.map((l) => l.split(',').slice(0, 2).join(','))).toEqual(fileDay.map((l) => `${l.slice(0, 24)},${l.split(',')[1]}`));
  });
});
