/**
 * Issue 15: keys as configuration. TROPODELAY_API_KEYS (name:role:secret,...), TROPODELAY_API_KEYS_FILE
 * (one key per line, a container secret), the deprecated TROPO_API_KEYS (role write, key-1 ...) with
 * a start-up warning, and TROPODELAY_DELETE_RETENTION_DAYS. A secret never appears in an error.
 * Expected values: the formats as documented in README's configuration table (common practice).
 */

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { configWarnings, configuredApiKeys, loadConfig } from '../src/config.js';

const S1 = 'first-secret-0123456789';
const S2 = 'second-secret-0123456789';

describe('API keys from the configuration', () => {
  it('reads name:role:secret entries, then the file, then the deprecated list as write keys', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tropodelay-keys-'));
    try {
      const file = join(dir, 'keys');
      writeFileSync(file, `# keys of the field campaign\n\nfield-reader:read:${S2}\r\nlegacy-colon:admin:with:colons-0123456789\n`);
      const config = loadConfig({
        TROPODELAY_API_KEYS: ` ops-admin:admin:${S1} `,
        TROPODELAY_API_KEYS_FILE: file,
        TROPO_API_KEYS: 'old-key-a-0123456789,old-key-b-0123456789',
      });
      expect(configuredApiKeys(config)).toEqual([
        { name: 'ops-admin', role: 'admin', secret: S1 },
        { name: 'field-reader', role: 'read', secret: S2 },
        { name: 'legacy-colon', role: 'admin', secret: 'with:colons-0123456789' },
        { name: 'key-1', role: 'write', secret: 'old-key-a-0123456789' },
        { name: 'key-2', role: 'write', secret: 'old-key-b-0123456789' },
      ]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('refuses bad entries naming the problem, never echoing a secret', () => {
    for (const [value, message] of [
      [`ops:root:${S1}`, /role "root" must be read, write or admin/],
      [`ops:write:short`, /at least 16 characters/],
      [`bad name:write:${S1}`, /key name "bad name"/],
      [S1, /not of the form name:role:secret/],
    ] as const) {
      expect(() => loadConfig({ TROPODELAY_API_KEYS: value })).toThrow(message);
      expect(() => loadConfig({ TROPODELAY_API_KEYS: value })).toThrow(/TROPODELAY_API_KEYS=\(value hidden\)/);
      try {
        loadConfig({ TROPODELAY_API_KEYS: value });
      } catch (err) {
        expect(String(err)).not.toContain(S1);
      }
    }
  });

  it('refuses a repeated name, a repeated secret, an unreadable file and a bad file line (by number, without the secret)', () => {
    expect(() => configuredApiKeys(loadConfig({ TROPODELAY_API_KEYS: `a:read:${S1},a:write:${S2}` }))).toThrow(/name a is given twice/);
    expect(() => configuredApiKeys(loadConfig({ TROPODELAY_API_KEYS: `a:read:${S1},b:write:${S1}` }))).toThrow(/key b has the same secret/);
    const missing = loadConfig({ TROPODELAY_API_KEYS_FILE: '/nonexistent/tropodelay-keys' });
    expect(() => configuredApiKeys(missing)).toThrow(
      /TROPODELAY_API_KEYS_FILE="\/nonexistent\/tropodelay-keys": cannot be read \(ENOENT\)/,
    );
    const withBadLine = loadConfig({ TROPODELAY_API_KEYS_FILE: '/keys' });
    const read = () => `ok:read:${S1}\nbroken:writer:${S2}\n`;
    expect(() => configuredApiKeys(withBadLine, read)).toThrow(/line 2: key broken: role "writer"/);
    try {
      configuredApiKeys(withBadLine, read);
    } catch (err) {
      expect(String(err)).not.toContain(S2);
    }
  });

  it('warns at start that TROPO_API_KEYS is deprecated, and only when it is set', () => {
    expect(configWarnings({ TROPO_API_KEYS: 'old-key-a-0123456789' }).join('\n')).toMatch(
      /TROPO_API_KEYS is deprecated.*role write.*key-1/,
    );
    expect(configWarnings({ TROPODELAY_API_KEYS: `a:read:${S1}` })).toEqual([]);
  });

  it('TROPODELAY_DELETE_RETENTION_DAYS: default 30, a number of days in [0, 36500]', () => {
    expect(loadConfig({}).TROPODELAY_DELETE_RETENTION_DAYS).toBe(30);
    expect(loadConfig({ TROPODELAY_DELETE_RETENTION_DAYS: '0' }).TROPODELAY_DELETE_RETENTION_DAYS).toBe(0);
    expect(loadConfig({ TROPODELAY_DELETE_RETENTION_DAYS: '7.5' }).TROPODELAY_DELETE_RETENTION_DAYS).toBe(7.5);
    expect(() => loadConfig({ TROPODELAY_DELETE_RETENTION_DAYS: '-1' })).toThrow(
      /TROPODELAY_DELETE_RETENTION_DAYS="-1": must be a number of days in \[0, 36500\]/,
    );
  });
});
