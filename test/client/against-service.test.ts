/**
 * The client (library and `tropo-client` CLI) against a running service: met uploads read back, an
 * interrupted met upload resumed, an estimation from a file, series downloads, and the progress output.
 * The expected values are the input files themselves (what was uploaded must read back) and the service's
 * own answers fetched directly, without the client (what the client writes must be what the service said).
 */

import { copyFileSync, existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { NetCDFReader } from 'netcdfjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { uploadMet } from '../../client/src/met-upload.js';
import { Service, ServiceError } from '../../client/src/service.js';
import { buildSyntheticCsv } from './synthetic-files.js';
import { adminJson, runCli, CountingProxy, createStation, startRunningService, WRITE_KEY, type RunningService } from './running-service.js';

let svc: RunningService;
beforeAll(async () => {
  svc = await startRunningService();
  for (const id of ['BRAKE', 'SALTY', 'QUILT', 'RESUM', 'SERIE']) await createStation(svc.baseUrl, id);
});
afterAll(async () => {
  await svc?.stop();
});

const cli = (args: string[], terminal = false) => runCli(svc.baseUrl, args, terminal);

/** A fixture copied into the work folder (its resume state is written next to it). */
function workCopy(fixture: string, name = fixture.split('/').pop()!): string {
  const path = join(svc.workDir, name);
  copyFileSync(fixture, path);
  return path;
}

async function storedMet(stationId: string, from: string, to: string): Promise<any[]> {
  return (await adminJson(svc.baseUrl, 'GET', `/v1/stations/${stationId}/met?from=${from}&to=${to}`)).body.records;
}

describe('met-upload: CSV, RINEX and JSON files, read back', () => {
  it('uploads the 3-day CSV day by day and every row reads back as written; a rerun sends nothing', async () => {
    const file = workCopy('fixtures/demo/BRACK-met.csv');
    const first = await cli(['met-upload', '--station', 'BRAKE', '--file', file, '--source', 'mast', '--json']);
    expect(first.code, first.stderr).toBe(0);
    const result = JSON.parse(first.stdout);
    expect(result).toMatchObject({ format: 'csv', daysTotal: 3, daysSent: 3, daysSkipped: 0, inserted: 72, updated: 0, unchanged: 0 });
    expect(first.stderr).toBe(''); // --json: no progress

    const stored = await storedMet('BRAKE', '2026-03-01T00:00:00Z', '2026-03-03T23:59:59Z');
    const rows = readFileSync(file, 'utf8').trim().split('\n').slice(1);
    expect(stored).toHaveLength(rows.length);
    for (const [i, row] of rows.entries()) {
      const [epoch, p, t, rh] = row.split(',');
      expect(stored[i]).toMatchObject({
        epoch,
        source: 'mast',
        pressure_hpa: Number(p),
        temperature_c: Number(t),
        relative_humidity_pct: Number(rh),
      });
    }

    const again = JSON.parse((await cli(['met-upload', '--station', 'BRAKE', '--file', file, '--source', 'mast', '--json'])).stdout);
    expect(again).toMatchObject({ daysSent: 0, daysSkipped: 3, inserted: 0 });
    // the same file under another source is another upload: every day sent, stored beside the first
    const other = JSON.parse((await cli(['met-upload', '--station', 'BRAKE', '--file', file, '--source', 'mast-2', '--json'])).stdout);
    expect(other).toMatchObject({ daysSent: 3, daysSkipped: 0, inserted: 72 });
  });

  it('uploads a 2-day RINEX 2.11 met file as two RINEX parts; the GPS-time warning is passed on', async () => {
    const file = workCopy('fixtures/demo/SALTM-met-days1-2.26m');
    const out = await cli(['met-upload', '--station', 'SALTY', '--file', file, '--source', 'rinex', '--json']);
    expect(out.code, out.stderr).toBe(0);
    const result = JSON.parse(out.stdout);
    expect(result).toMatchObject({ format: 'rinex-met', daysSent: 2, inserted: 48, rejected: [] });
    expect(result.warnings.join(' ')).toMatch(/GPS time/);
    const stored = await storedMet('SALTY', '2026-03-01T00:00:00Z', '2026-03-02T23:59:59Z');
    expect(stored).toHaveLength(48);
    // first record of the file: " 26  3  1  0  0 18 1000.7   -1.3   83.6", 00:00:18 GPS = 00:00:00 UTC (GPS − UTC = 18 s)
    expect(stored[0]).toMatchObject({
      epoch: '2026-03-01T00:00:00.000Z',
      pressure_hpa: 1000.7,
      temperature_c: -1.3,
      relative_humidity_pct: 83.6,
    });
  });

  it('uploads JSON records; a rejected record is reported at its index in the file and the exit code is 1', async () => {
    const fixture = JSON.parse(readFileSync('fixtures/demo/QUILL-met.json', 'utf8'));
    const records = fixture.records.slice(0, 30);
    records[27] = { ...records[27], pressure_hpa: 1500 }; // outside 300..1100 hPa, on the second day
    const file = join(svc.workDir, 'quill.json');
    writeFileSync(file, JSON.stringify({ source: fixture.source, records }));
    const out = await cli(['met-upload', '--station', 'QUILT', '--file', file, '--json']);
    expect(out.code).toBe(1);
    const result = JSON.parse(out.stdout);
    expect(result.inserted).toBe(29);
    expect(result.rejected).toEqual([
      { day: records[27].epoch.slice(0, 10), index: 27, reason: expect.stringMatching(/pressure_hpa.*300, 1100/) },
    ]);
  });

  it('refuses a file that is not there (exit 1, its path named) and a station that does not exist (exit 1, the service’s words)', async () => {
    const missing = await cli(['met-upload', '--station', 'BRAKE', '--file', join(svc.workDir, 'nope.csv')]);
    expect(missing.code).toBe(1);
    expect(missing.stderr).toMatch(/nope\.csv/);
    const file = workCopy('fixtures/demo/BRACK-met.csv', 'other.csv');
    const unknown = await cli(['met-upload', '--station', 'NOSUCH', '--file', file, '--progress', 'none']);
    expect(unknown.code).toBe(1);
    expect(unknown.stderr).toMatch(/POST \/v1\/stations\/NOSUCH\/met: 404/);
  });
});

describe('an interrupted met upload resumes', () => {
  it('after the service goes away at the second day, the rerun sends only the days not accepted', async () => {
    const proxy = await new CountingProxy(svc.baseUrl).start();
    try {
      const file = workCopy('fixtures/demo/BRACK-met.csv', 'resume-met.csv');
      const service = new Service({ baseUrl: proxy.url, key: WRITE_KEY, retries: 0 });
      proxy.failAfter('POST', 1);
      const error = await uploadMet(service, { stationId: 'RESUM', file, source: 'mast' }).catch((e: unknown) => e);
      expect(error).toBeInstanceOf(ServiceError);
      expect((error as ServiceError).status).toBe(503);
      expect(proxy.count('POST', /\/met$/)).toBe(1);
      expect(existsSync(`${file}.tropo-state.json`)).toBe(true);

      proxy.reset();
      const rerun = await uploadMet(service, { stationId: 'RESUM', file, source: 'mast' });
      expect(rerun).toMatchObject({ daysSkipped: 1, daysSent: 2, inserted: 48, unchanged: 0 });
      expect(proxy.count('POST', /\/met$/)).toBe(2);
      // 24 + 48 rows, each stored once
      expect(await storedMet('RESUM', '2026-03-01T00:00:00Z', '2026-03-03T23:59:59Z')).toHaveLength(72);
    } finally {
      await proxy.stop();
    }
  });
});

describe('estimate: an estimation from a file', () => {
  it('writes the answer the service gives to the same CSV body and query', async () => {
    const file = join(svc.workDir, 'half-hour.csv');
    writeFileSync(file, buildSyntheticCsv({ hours: 0.5 }));
    const params = {
      latitude_deg: '46.2',
      longitude_deg: '7.4',
      height_m: '520',
      zwd_interval_s: '900',
      gradients: 'off',
      apriori_zhd_m: '2.1689',
    };
    const out = join(svc.workDir, 'answer.json');
    const run = await cli([
      'estimate',
      '--file',
      file,
      ...Object.entries(params).flatMap(([k, v]) => ['--param', `${k}=${v}`]),
      '--out',
      out,
    ]);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toMatch(/wrote .*answer\.json \(61 epochs/);
    const direct = await fetch(`${svc.baseUrl}/v1/zwd-estimates?${new URLSearchParams(params)}`, {
      method: 'POST',
      headers: { 'content-type': 'text/csv' },
      body: readFileSync(file),
    });
    const written = JSON.parse(readFileSync(out, 'utf8'));
    expect(written.zwd_nodes).toEqual((await direct.json()).zwd_nodes);
    expect(written.zwd_nodes).toHaveLength(3); // 00:00, 00:15, 00:30 (900 s nodes over half an hour)
  });

  it('without --out writes the answer alone on stdout, also with --json (one JSON document)', async () => {
    const file = join(svc.workDir, 'stdout.csv');
    writeFileSync(file, buildSyntheticCsv({ hours: 0.5 }));
    const params = ['latitude_deg=46.2', 'longitude_deg=7.4', 'height_m=520', 'zwd_interval_s=900', 'gradients=off'];
    const run = await cli(['estimate', '--file', file, ...params.flatMap((p) => ['--param', p]), '--json']);
    expect(run.code, run.stderr).toBe(0);
    expect(JSON.parse(run.stdout).zwd_nodes).toHaveLength(3);
  });

  it('passes the service’s refusal on with the field it names (exit 1)', async () => {
    const file = join(svc.workDir, 'no-site.csv');
    writeFileSync(file, buildSyntheticCsv({ hours: 0.1 }));
    const run = await cli(['estimate', '--file', file, '--param', 'latitude_deg=146']);
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/400.*latitude_deg/);
  });
});

describe('series: downloads of a stored series', () => {
  beforeAll(async () => {
    const met = await cli(['met-upload', '--station', 'SERIE', '--file', workCopy('fixtures/demo/BRACK-met.csv', 'serie.csv'), '--quiet']);
    expect(met.code).toBe(0);
    const records = [0, 1, 2, 3].map((h) => ({ epoch: `2026-03-01T0${h}:00:00Z`, ztd_m: 2.1 + h / 1000, ztd_sigma_m: 0.004 }));
    const delays = await adminJson(svc.baseUrl, 'POST', '/v1/stations/SERIE/delays', {
      source: 'run-a',
      models: { mapping: 'niell' },
      records,
    });
    expect(delays.status).toBe(200);
  });

  const range = ['--from', '2026-03-01T00:00:00Z', '--to', '2026-03-01T03:00:00Z'];

  it('writes delays as JSON and CSV byte for byte as the service answers them, with the homogeneity it states', async () => {
    for (const format of ['json', 'csv'] as const) {
      const out = join(svc.workDir, `delays.${format}`);
      const run = await cli(['series', '--station', 'SERIE', '--kind', 'delays', '--format', format, ...range, '--out', out]);
      expect(run.code, run.stderr).toBe(0);
      expect(run.stdout).toMatch(/, homogeneous\)/);
      const query = `from=2026-03-01T00:00:00Z&to=2026-03-01T03:00:00Z${format === 'csv' ? '&format=csv' : ''}`;
      const direct = await (await fetch(`${svc.baseUrl}/v1/stations/SERIE/delays?${query}`)).text();
      expect(readFileSync(out, 'utf8')).toBe(direct);
    }
  });

  it('writes PWV as netCDF (CF timeSeries of the network read) with the four stored epochs', async () => {
    const out = join(svc.workDir, 'pwv.nc');
    const run = await cli(['series', '--station', 'SERIE', '--kind', 'pwv', '--format', 'netcdf', ...range, '--out', out]);
    expect(run.code, run.stderr).toBe(0);
    const reader = new NetCDFReader(readFileSync(out));
    expect(reader.dimensions.find((d: { name: string }) => d.name === 'time')?.size).toBe(4);
    expect(reader.variables.map((v: { name: string }) => v.name)).toContain('pwv');
  });

  it('refuses netCDF for delays before any request (exit 2: the service has no such form)', async () => {
    const run = await cli(['series', '--station', 'SERIE', '--kind', 'delays', '--format', 'netcdf', '--out', join(svc.workDir, 'x.nc')]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/netcdf is available for pwv only/);
  });
});

describe('progress output', () => {
  it('draws a bar on a terminal, lines on a pipe, and nothing with --json or --quiet', async () => {
    const file = workCopy('fixtures/demo/BRACK-met.csv', 'progress.csv');
    const base = ['met-upload', '--station', 'BRAKE', '--file', file, '--force'];
    const terminal = await cli(base, true);
    expect(terminal.code).toBe(0);
    expect(terminal.stderr).toMatch(/met BRAKE \[#+-*\] \d+% \| \d\/3/);
    expect(terminal.stderr).toMatch(/met BRAKE \[#{40}\] 100% \| 3\/3/);
    expect(terminal.stderr).toContain('\u001b['); // redrawn in place (cursor control)

    const pipe = await cli(base, false);
    expect(pipe.stderr.split('\n').filter(Boolean)).toEqual([
      'met BRAKE: 3 steps',
      expect.stringMatching(/^1\/3 2026-03-01 /),
      expect.stringMatching(/^2\/3 2026-03-02 /),
      expect.stringMatching(/^3\/3 2026-03-03 /),
      expect.stringMatching(/^met BRAKE: 3 day\(s\) sent/),
    ]);

    for (const flag of ['--json', '--quiet']) {
      const silent = await cli([...base, flag], true);
      expect(silent.code).toBe(0);
      expect(silent.stderr, flag).toBe('');
    }
  });
});
