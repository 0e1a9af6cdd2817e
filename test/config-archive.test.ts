/** Archive configuration variables (issue 4): defaults, and invalid values stop the start naming the variable. */
import { describe, expect, it } from 'vitest';
import { ConfigError, DEFAULT_MAX_READ_RANGE_DAYS, loadConfig } from '../src/config.js';
import { archiveOptionsFromConfig } from '../src/http/app.js';

describe('archive configuration (src/config.ts; README table)', () => {
  it('has the documented defaults', () => {
    const c = loadConfig({});
    expect(c).toMatchObject({
      TROPO_DATA_DIR: './data',
      TROPO_PG_SCHEMA: 'public',
      TROPO_API_KEYS: [],
      TROPO_READ_KEYS_REQUIRED: false,
      TROPO_MAX_READ_RANGE_DAYS: DEFAULT_MAX_READ_RANGE_DAYS,
    });
    expect(c.DATABASE_URL).toBeUndefined();
    expect(DEFAULT_MAX_READ_RANGE_DAYS).toBe(366);
  });

  it('splits keys on commas and reads the flags', () => {
    const c = loadConfig({
      TROPO_API_KEYS: ' key-one-0123456789, key-two-0123456789 ',
      TROPO_READ_KEYS_REQUIRED: 'true',
      DATABASE_URL: 'postgres://u@127.0.0.1:5432/db',
    });
    expect(c.TROPO_API_KEYS).toEqual(['key-one-0123456789', 'key-two-0123456789']);
    expect(c.TROPO_READ_KEYS_REQUIRED).toBe(true);
    expect(c.DATABASE_URL).toBe('postgres://u@127.0.0.1:5432/db');
  });

  it.each([
    ['TROPO_MAX_READ_RANGE_DAYS', '0'],
    ['TROPO_MAX_READ_RANGE_DAYS', 'a year'],
    ['TROPO_READ_KEYS_REQUIRED', 'maybe'],
    ['DATABASE_URL', 'mysql://x'],
    ['TROPO_PG_SCHEMA', 'Robert"); DROP'],
    ['TROPO_API_KEYS', 'short'],
  ])('%s=%s stops the start with a message naming the variable', (name, value) => {
    expect(() => loadConfig({ [name]: value })).toThrow(ConfigError);
    expect(() => loadConfig({ [name]: value })).toThrow(new RegExp(`^invalid configuration: ${name}=`));
  });

  it('with DATABASE_URL and no keys, the generated key file still goes to TROPO_DATA_DIR', () => {
    const archive = archiveOptionsFromConfig(loadConfig({ DATABASE_URL: 'postgres://u@127.0.0.1/db', TROPO_DATA_DIR: '/srv/tropo' }));
    expect(archive).toMatchObject({
      keyDir: '/srv/tropo',
      apiKeys: [],
      storage: { databaseUrl: 'postgres://u@127.0.0.1/db', pgSchema: 'public' },
    });
  });

  it('never echoes a key or a database URL in the message', () => {
    expect(() => loadConfig({ TROPO_API_KEYS: 'short' })).toThrow(/TROPO_API_KEYS=\(value hidden\)/);
    expect(() => loadConfig({ TROPO_API_KEYS: 'short' })).not.toThrow(/short/);
  });
});
