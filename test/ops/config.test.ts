import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  ConfigError,
  configSchema,
  configWarnings,
  configurationTable,
  configuredApiKeys,
  deprecatedName,
  environmentName,
  loadConfig,
  withConfigurationTable,
} from '../../src/config.js';
import { cpuQuotaCores, defaultWorkerCount, type ReadText } from '../../src/cpu-quota.js';
import { archiveOptionsFromConfig } from '../../src/http/app.js';

describe('configuration from the environment', () => {
  it('has documented defaults', () => {
    const c = loadConfig({});
    expect(c.PORT).toBe(8080);
    expect(c.HOST).toBe('127.0.0.1');
    expect(c.LOG_LEVEL).toBe('info');
    expect(c.RATE_LIMIT_PER_MINUTE).toBe(0);
    expect(c.SECURITY_HEADERS).toBe(false);
    expect(c.TRUST_PROXY).toBe(false);
    expect(c.DB_CONNECT_TIMEOUT_MS).toBe(5_000);
    expect(c.DB_STATEMENT_TIMEOUT_MS).toBe(30_000);
    expect(c.READY_CHECK_TIMEOUT_MS).toBe(2_000);
    expect(c.TROPO_MIN_FREE_DISK_MB).toBe(64);
    expect(c.TROPODELAY_CAMPAIGN_CONCURRENCY).toBe(1);
    expect(c.TROPODELAY_CAMPAIGN_ITEM_TIMEOUT_S).toBe(600);
    expect(c.TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S).toBe(60);
    expect(c.TROPODELAY_CAMPAIGN_SWEEP_GRACE_S).toBe(60);
    expect(c.TROPODELAY_AUDIT_RETENTION_DAYS).toBe(400);
    expect(c.TROPODELAY_REPLICA_NAME).toBeUndefined();
    expect(c.TROPODELAY_WARM_UP_ESTIMATIONS).toBe(40); // chosen by measurement: DEVELOPERS.md, "The warm-up at start"
    expect(loadConfig({ TROPODELAY_WARM_UP_ESTIMATIONS: '0' }).TROPODELAY_WARM_UP_ESTIMATIONS).toBe(0); // 0 = off
  });

  it.each([
    ['PORT', 'eighty', /PORT="eighty": must be a whole number in 0..65535/],
    ['PORT', '70000', /PORT="70000"/],
    ['LOG_LEVEL', 'loud', /LOG_LEVEL="loud": must be one of/],
    ['SECURITY_HEADERS', 'maybe', /SECURITY_HEADERS="maybe": must be true or false/],
    ['ESTIMATION_WORKERS', '0', /ESTIMATION_WORKERS="0"/],
    ['DB_STATEMENT_TIMEOUT_MS', '50', /DB_STATEMENT_TIMEOUT_MS="50": must be a whole number in 100..3600000/],
    ['READY_CHECK_TIMEOUT_MS', '90000', /READY_CHECK_TIMEOUT_MS="90000"/],
    ['TRUST_PROXY', '*', /TRUST_PROXY="\*": must be false, a hop count/],
    ['TROPODELAY_WARM_UP_ESTIMATIONS', '-1', /TROPODELAY_WARM_UP_ESTIMATIONS="-1": must be a whole number in 0\.\.1000/],
    ['TROPODELAY_WARM_UP_ESTIMATIONS', '1001', /TROPODELAY_WARM_UP_ESTIMATIONS="1001": must be a whole number in 0\.\.1000/],
    ['TROPODELAY_WARM_UP_ESTIMATIONS', 'many', /TROPODELAY_WARM_UP_ESTIMATIONS="many": must be a whole number in 0\.\.1000/],
  ])('rejects %s=%s naming the variable', (name, value, message) => {
    expect(() => loadConfig({ [name]: value })).toThrow(ConfigError);
    expect(() => loadConfig({ [name]: value })).toThrow(message);
  });

  it('an invalid value stops the real start with exit code 2 and a message naming the variable', () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
      env: { ...process.env, PORT: '-1', LOG_LEVEL: 'silent' },
      encoding: 'utf8',
      timeout: 20_000,
    });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/invalid configuration: PORT="-1"/);
  });
});

describe('one prefix, TROPODELAY_, with the old names as deprecated aliases (issue 15 item 6)', () => {
  it('reads every setting under its TROPODELAY_ name', () => {
    const c = loadConfig({ TROPODELAY_PORT: '9001', TROPODELAY_DATA_DIR: '/srv/delays', TROPODELAY_PG_SCHEMA: 'archive' });
    expect(c.PORT).toBe(9001);
    expect(c.TROPO_DATA_DIR).toBe('/srv/delays');
    expect(c.TROPO_PG_SCHEMA).toBe('archive');
  });

  it('derives each name from the setting: PORT → TROPODELAY_PORT, TROPO_DATA_DIR → TROPODELAY_DATA_DIR', () => {
    expect(environmentName('PORT')).toBe('TROPODELAY_PORT');
    expect(environmentName('TROPO_DATA_DIR')).toBe('TROPODELAY_DATA_DIR');
    expect(environmentName('TROPODELAY_LOG_FORMAT')).toBe('TROPODELAY_LOG_FORMAT');
    expect(deprecatedName('DATABASE_URL')).toBe('DATABASE_URL');
    expect(deprecatedName('TROPODELAY_DATABASE_PASSWORD')).toBeUndefined();
  });

  it('still takes an old name, with a warning naming the new one', () => {
    expect(loadConfig({ PORT: '9002' }).PORT).toBe(9002);
    expect(configWarnings({ PORT: '9002', TROPO_DATA_DIR: '/d' })).toEqual([
      'PORT is deprecated: rename it to TROPODELAY_PORT',
      'TROPO_DATA_DIR is deprecated: rename it to TROPODELAY_DATA_DIR',
    ]);
    expect(configWarnings({ TROPODELAY_PORT: '9002' })).toEqual([]);
  });

  it('accepts an old and a new name set to the same value (with the warning), refuses different values naming both', () => {
    expect(loadConfig({ PORT: '9003', TROPODELAY_PORT: '9003' }).PORT).toBe(9003);
    expect(() => loadConfig({ PORT: '9003', TROPODELAY_PORT: '9004' })).toThrow(
      /PORT \(deprecated\) and TROPODELAY_PORT are both set to different values \("9003" and "9004"\): keep TROPODELAY_PORT only/,
    );
  });

  it('never shows a secret in a conflict message', () => {
    let message = '';
    try {
      loadConfig({ DATABASE_URL: 'postgres://u:hunter2-old@db/x', TROPODELAY_DATABASE_URL: 'postgres://u:hunter2-new@db/x' });
    } catch (err) {
      message = (err as Error).message;
    }
    expect(message).toMatch(/DATABASE_URL \(deprecated\) and TROPODELAY_DATABASE_URL are both set to different values: keep/);
    expect(message).not.toMatch(/hunter2/);
  });

  it('names the variable actually used in a validation message', () => {
    expect(() => loadConfig({ TROPODELAY_PORT: 'eighty' })).toThrow(/TROPODELAY_PORT="eighty": must be a whole number/);
  });

  it('warns about TRUST_PROXY=true under either name', () => {
    expect(configWarnings({ TROPODELAY_TRUST_PROXY: 'true' })).toEqual([
      expect.stringMatching(/^TROPODELAY_TRUST_PROXY=true is taken as 1/),
    ]);
  });
});

describe('secrets from files: <NAME>_FILE (a container secret mounted as a file)', () => {
  let dir: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'tropodelay-config-'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const file = (name: string, text: string) => {
    const path = join(dir, name);
    writeFileSync(path, text);
    return path;
  };

  it('reads the password from TROPODELAY_DATABASE_PASSWORD_FILE, removing one trailing newline (LF or CRLF) only', () => {
    expect(loadConfig({ TROPODELAY_DATABASE_PASSWORD_FILE: file('pw1', 's3cret-pass\n') }).TROPODELAY_DATABASE_PASSWORD).toBe(
      's3cret-pass',
    );
    expect(loadConfig({ TROPODELAY_DATABASE_PASSWORD_FILE: file('pw2', 'pass-crlf\r\n') }).TROPODELAY_DATABASE_PASSWORD).toBe('pass-crlf');
    expect(loadConfig({ TROPODELAY_DATABASE_PASSWORD_FILE: file('pw3', 'two-lines\n\n') }).TROPODELAY_DATABASE_PASSWORD).toBe(
      'two-lines\n',
    );
    expect(loadConfig({ TROPODELAY_DATABASE_PASSWORD_FILE: file('pw4', ' spaced ') }).TROPODELAY_DATABASE_PASSWORD).toBe(' spaced ');
  });

  it('reads the keys (one name:role:secret a line) and the database URL from files too', () => {
    const config = loadConfig({
      TROPODELAY_API_KEYS_FILE: file('keys', 'uploader:write:key-one-0123456789\nreader:read:key-two-0123456789\n'),
    });
    expect(configuredApiKeys(config)).toEqual([
      { name: 'uploader', role: 'write', secret: 'key-one-0123456789' },
      { name: 'reader', role: 'read', secret: 'key-two-0123456789' },
    ]);
    expect(loadConfig({ TROPODELAY_DATABASE_URL_FILE: file('url', 'postgres://db:5432/x\n') }).DATABASE_URL).toBe('postgres://db:5432/x');
  });

  it('refuses a variable and its _FILE form together', () => {
    expect(() => loadConfig({ TROPODELAY_DATABASE_PASSWORD: 'a', TROPODELAY_DATABASE_PASSWORD_FILE: file('pw5', 'b') })).toThrow(
      /TROPODELAY_DATABASE_PASSWORD and TROPODELAY_DATABASE_PASSWORD_FILE are both set: set one of them/,
    );
  });

  it('names the _FILE variable and the reason when the file cannot be read, never any content', () => {
    expect(() => loadConfig({ TROPODELAY_DATABASE_PASSWORD_FILE: join(dir, 'missing') })).toThrow(
      /TROPODELAY_DATABASE_PASSWORD_FILE=".*missing": cannot read the file \(ENOENT\)/,
    );
  });

  it('has no _FILE form for settings that are not secrets', () => {
    expect(loadConfig({ TROPODELAY_PORT_FILE: file('port', '9999') }).PORT).toBe(8080);
  });

  it('passes the password to the storage apart from the URL', () => {
    const config = loadConfig({
      TROPODELAY_DATABASE_URL: 'postgres://tropodelay@db:5432/delays',
      TROPODELAY_DATABASE_PASSWORD: 'pw-apart',
    });
    const storage = archiveOptionsFromConfig(config).storage;
    expect(storage.databaseUrl).toBe('postgres://tropodelay@db:5432/delays');
    expect(storage.databasePassword).toBe('pw-apart');
  });
});

describe('worker count from the container CPU quota (Linux kernel documentation, "Control Group v2": cpu.max; "CFS Bandwidth Control": cpu.cfs_quota_us, cpu.cfs_period_us — from memory)', () => {
  const files =
    (entries: Record<string, string>): ReadText =>
    (path) =>
      entries[path];

  it('cgroup v2 "150000 100000" is 1.5 cores: 2 workers on an 8-core host', () => {
    const read = files({ '/proc/self/cgroup': '0::/\n', '/sys/fs/cgroup/cpu.max': '150000 100000\n' });
    expect(cpuQuotaCores(read)).toBeCloseTo(1.5, 12);
    expect(defaultWorkerCount(read, 8)).toBe(2);
  });

  it('cgroup v2 reads the process own group from /proc/self/cgroup', () => {
    const read = files({ '/proc/self/cgroup': '0::/kubepods/pod1/c1\n', '/sys/fs/cgroup/kubepods/pod1/c1/cpu.max': '50000 100000' });
    expect(defaultWorkerCount(read, 8)).toBe(1);
  });

  it('cgroup v2 "max 100000" is no quota: the core count', () => {
    expect(defaultWorkerCount(files({ '/sys/fs/cgroup/cpu.max': 'max 100000\n' }), 6)).toBe(6);
  });

  it('cgroup v1: quota 300000 per period 100000 is 3 cores; quota -1 is none', () => {
    const v1 = (quota: string) =>
      files({ '/sys/fs/cgroup/cpu/cpu.cfs_quota_us': `${quota}\n`, '/sys/fs/cgroup/cpu/cpu.cfs_period_us': '100000\n' });
    expect(defaultWorkerCount(v1('300000'), 16)).toBe(3);
    expect(defaultWorkerCount(v1('-1'), 16)).toBe(16);
  });

  it('never more workers than cores, never fewer than one', () => {
    expect(defaultWorkerCount(files({ '/sys/fs/cgroup/cpu.max': '800000 100000' }), 2)).toBe(2);
    expect(defaultWorkerCount(files({ '/sys/fs/cgroup/cpu.max': '1000 100000' }), 2)).toBe(1);
  });

  it('no control group files at all: the core count', () => {
    expect(defaultWorkerCount(files({}), 4)).toBe(4);
  });
});

describe('README configuration table', () => {
  it('is the one generated from configSchema (run npm run docs:config after changing src/config.ts)', () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    expect(withConfigurationTable(readme)).toBe(readme);
  });

  it('lists every setting under its TROPODELAY_ name', () => {
    const table = configurationTable();
    for (const setting of Object.keys(configSchema.shape)) expect(table).toContain(`| \`${environmentName(setting)}\``);
  });
});
