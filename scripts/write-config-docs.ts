/** Writes README.md's table of environment variables from configSchema (`npm run docs:config`). */
import { readFileSync, writeFileSync } from 'node:fs';
import { withConfigurationTable } from '../src/config.js';

const file = new URL('../README.md', import.meta.url);
writeFileSync(file, withConfigurationTable(readFileSync(file, 'utf8')));
console.log('wrote the configuration table of README.md');
