/**
 * The environment the tests start the service with (test/helpers/server-process.ts): every setting
 * under its current TROPODELAY_ name, so that the service starts without deprecation warnings, while
 * the callers may still name a setting by its earlier name. Checked against the service's own reading
 * of the environment (src/config.ts loadConfig, configWarnings), which names every deprecated alias.
 */

import { describe, expect, it } from 'vitest';
import { configWarnings, loadConfig } from '../../src/config.js';
import { serverEnvironment } from '../helpers/server-process.js';

describe('serverEnvironment: settings under their TROPODELAY_ names', () => {
  it('port, host and log level by their current names; the service reads them without a deprecation warning', () => {
    const env = serverEnvironment(43210, {}, { PATH: '/usr/bin' });
    expect(env).toMatchObject({ TROPODELAY_PORT: '43210', TROPODELAY_HOST: '127.0.0.1', TROPODELAY_LOG_LEVEL: 'warn', PATH: '/usr/bin' });
    expect(env.PORT).toBeUndefined();
    expect(env.HOST).toBeUndefined();
    expect(env.LOG_LEVEL).toBeUndefined();
    expect(configWarnings(env)).toEqual([]);
    const config = loadConfig(env);
    expect(config.PORT).toBe(43210);
    expect(config.LOG_LEVEL).toBe('warn');
  });

  it('a caller’s deprecated name is renamed, and one inherited from the parent is dropped', () => {
    // The old form, as the helper wrote it before: the service warns about each alias.
    expect(configWarnings({ PORT: '1', HOST: '127.0.0.1', LOG_LEVEL: 'warn' }).join('\n')).toMatch(/PORT.*TROPODELAY_PORT/);
    const env = serverEnvironment(43211, { ESTIMATION_WORKERS: '1', LOG_LEVEL: 'info', EXTRA_THING: 'x' }, { PORT: '8080', HOME: '/h' });
    expect(env).toMatchObject({
      TROPODELAY_ESTIMATION_WORKERS: '1',
      TROPODELAY_LOG_LEVEL: 'info',
      TROPODELAY_PORT: '43211',
      EXTRA_THING: 'x',
    });
    expect(env.ESTIMATION_WORKERS).toBeUndefined();
    expect(env.PORT).toBeUndefined();
    expect(configWarnings(env)).toEqual([]);
    expect(loadConfig(env).ESTIMATION_WORKERS).toBe(1);
  });
});
