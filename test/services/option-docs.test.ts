/** docs/zwd-estimation.md lists the options from the table; this fails when the list is stale. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { optionsMarkdown, withOptionsTable, ZWD_OPTIONS } from '../../src/services/zwd-options.js';

describe('the option list of docs/zwd-estimation.md', () => {
  const doc = readFileSync(new URL('../../docs/zwd-estimation.md', import.meta.url), 'utf8');
  it('equals the list generated from the table (run `npm run docs:options` when this fails)', () => {
    expect(withOptionsTable(doc)).toBe(doc);
  });
  it('has one row per option, with its JSON path and query name', () => {
    const table = optionsMarkdown();
    for (const s of ZWD_OPTIONS) {
      const json = 'group' in s ? `options.${s.group}.${s.name}` : `options.${s.name}`;
      expect(table).toContain(`| \`${json}\` | \`${s.flatName}\` |`);
    }
  });
});
