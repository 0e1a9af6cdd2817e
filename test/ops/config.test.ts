import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../src/config.js';

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
