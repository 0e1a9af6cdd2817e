/**
 * Usage errors of `tropo-client`: exit code 2 and a message naming the option and what it accepts
 * (as scripts/cli.ts does for the generators), before any request is sent. One case runs the real
 * program in a child process (exit code and streams as a shell sees them); the rest call `main`.
 */

import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { main } from '../../client/src/cli.js';
import { freePort } from '../helpers/server-process.js';
import { capturedIo } from './running-service.js';

// a port fetch refuses to use at all: a usage error must be reported before any connection is tried
const NOWHERE = 'http://127.0.0.1:9';

async function run(args: string[]) {
  const io = capturedIo();
  const code = await main([...args, '--url', NOWHERE], io);
  return { code, stdout: io.stdout.text, stderr: io.stderr.text };
}

describe('tropo-client as a program', () => {
  it('exits 2 with the message on stderr for a missing required option; --help exits 0', () => {
    const bad = spawnSync(process.execPath, ['--import', 'tsx', 'client/src/cli.ts', 'series', '--station', 'FERN', '--out', 'x.json'], {
      encoding: 'utf8',
    });
    expect(bad.status).toBe(2);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toMatch(/series: --kind is required/);
    const help = spawnSync(process.execPath, ['--import', 'tsx', 'client/src/cli.ts', '--help'], { encoding: 'utf8' });
    expect(help.status).toBe(0);
    expect(help.stdout).toMatch(/^Usage: tropo-client <command>/);
  });
});

describe('usage errors (exit 2)', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['unknown command', ['upload-everything'], /unknown command "upload-everything": one of met-upload, /],
    ['unknown campaign action', ['campaign', 'pause', 'c1'], /unknown command "campaign pause"/],
    ['unknown option', ['met-upload', '--station', 'A', '--file', 'f.csv', '--colour'], /Unknown option '--colour'/],
    ['missing value', ['met-upload', '--station', 'A', '--file'], /--file/],
    [
      'value not among the choices',
      ['series', '--station', 'A', '--kind', 'zhd', '--out', 'x'],
      /--kind must be one of delays, pwv, met, got "zhd"/,
    ],
    ['progress mode', ['campaign', 'list', '--progress', 'fancy'], /--progress must be one of auto, bar, lines, none/],
    ['missing campaign id', ['campaign', 'report'], /campaign report takes CAMPAIGN_ID, got nothing/],
    ['extra argument', ['campaign', 'list', 'all'], /campaign list takes no arguments besides options, got all/],
    [
      'bad date',
      ['campaign', 'submit', '--start-date', '2026-3-1', '--end-date', '2026-03-31'],
      /--start-date must be a date YYYY-MM-DD, got "2026-3-1"/,
    ],
    [
      'options not JSON',
      ['campaign', 'submit', '--start-date', '2026-03-01', '--end-date', '2026-03-31', '--options', '{zwd'],
      /--options must be a JSON object or @file\.json/,
    ],
    [
      'options not an object',
      ['campaign', 'submit', '--start-date', '2026-03-01', '--end-date', '2026-03-31', '--options', '[1]'],
      /--options must be a JSON object/,
    ],
    ['poll interval', ['campaign', 'follow', 'c1', '--interval-s', '0'], /--interval-s must be a number of seconds in \[0.05, 3600\]/],
    ['query parameter', ['estimate', '--file', 'f.csv', '--param', 'latitude_deg'], /--param must be NAME=VALUE, got "latitude_deg"/],
    [
      'netCDF of delays',
      ['series', '--station', 'A', '--kind', 'delays', '--format', 'netcdf', '--out', 'x.nc'],
      /netcdf is available for pwv only/,
    ],
  ];
  for (const [what, args, message] of cases)
    it(what, async () => {
      const r = await run(args);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).toMatch(/see tropo-client/);
      expect(r.stdout).toBe('');
    });

  it('refuses a URL that is not http(s)', async () => {
    const io = capturedIo();
    expect(await main(['campaign', 'list', '--url', 'ftp://example.invalid'], io)).toBe(2);
    expect(io.stderr.text).toMatch(/--url: the service URL must start with http:\/\/ or https:\/\//);
  });

  it('says the service cannot be reached (exit 1), not a usage error', async () => {
    const io = capturedIo();
    const r = { code: await main(['campaign', 'list', '--url', `http://127.0.0.1:${await freePort()}`], io), stderr: io.stderr.text };
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/the service cannot be reached \(ECONNREFUSED\); check --url/);
  });
});

describe('help', () => {
  it('describes every command with its options and examples', async () => {
    for (const command of [
      ['met-upload'],
      ['residuals-deposit'],
      ['estimate'],
      ['series'],
      ['campaign', 'submit'],
      ['campaign', 'follow'],
    ]) {
      const io = capturedIo();
      expect(await main([...command, '--help'], io)).toBe(0);
      expect(io.stdout.text).toContain(`Usage: tropo-client ${command.join(' ')}`);
      expect(io.stdout.text).toMatch(/Examples:\n {2}tropo-client /);
    }
  });
});
