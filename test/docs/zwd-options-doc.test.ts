import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { OPTIONS_DOC_BEGIN, OPTIONS_DOC_END, optionsMarkdown } from '../../src/services/zwd-options.js';

// The option list of docs/zwd-estimation.md is generated from the one options table
// (src/services/zwd-options.ts): regenerate it with
//   npx tsx -e "import { optionsMarkdown } from './src/services/zwd-options.ts'; console.log(optionsMarkdown())"
// and paste it between the markers when this fails.
describe('docs/zwd-estimation.md options table', () => {
  it('is the table generated from src/services/zwd-options.ts', () => {
    const doc = readFileSync(new URL('../../docs/zwd-estimation.md', import.meta.url), 'utf8');
    const start = doc.indexOf(OPTIONS_DOC_BEGIN);
    const end = doc.indexOf(OPTIONS_DOC_END);
    expect(start).toBeGreaterThanOrEqual(0);
    expect(end).toBeGreaterThan(start);
    expect(doc.slice(start, end + OPTIONS_DOC_END.length)).toBe(optionsMarkdown());
  });
});
