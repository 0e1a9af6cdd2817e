/** Writes the option list of docs/zwd-estimation.md from the options table (`npm run docs:options`). */
import { readFileSync, writeFileSync } from 'node:fs';
import { withOptionsTable } from '../src/services/zwd-options.js';

const file = new URL('../docs/zwd-estimation.md', import.meta.url);
writeFileSync(file, withOptionsTable(readFileSync(file, 'utf8')));
console.log('wrote the option list of docs/zwd-estimation.md');
